import bcrypt from "bcryptjs";
import { encode } from "next-auth/jwt";
import { describe, expect, it } from "vitest";
import { authOptions, registerUser, verifyCredentials } from "@/lib/auth";
import { authorizeProject, authorizeRun, authorizeTeam } from "@/lib/authz";
import { Membership, Run, Team, User } from "@/lib/db";
import { env } from "@/lib/env";
import {
  type AppError,
  BadRequestError,
  ForbiddenError,
  NotFoundError,
  UnauthorizedError,
} from "@/lib/errors";
import { clientAddress, throttleSignIn } from "@/lib/rate-limit";
import { getActor, requireActor } from "@/lib/session";
import { bumpSessionVersion } from "@/lib/session-version";
import { changeMemberRole } from "@/lib/teams";
import { createFixtures, FIXTURE_PASSWORD, useTestDb } from "./setup";

useTestDb();

async function expectAppError(p: Promise<unknown>, cls: new (...a: never[]) => AppError, status: number) {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(cls);
  expect((err as AppError).status).toBe(status);
  return err as AppError;
}

describe("credentials", () => {
  it("accepts the right password, in any e-mail case", async () => {
    const fx = await createFixtures();
    const user = await verifyCredentials("  Designer@Fixture.TEST ", FIXTURE_PASSWORD);
    expect(user).toEqual({
      id: fx.users.designer.id,
      email: "designer@fixture.test",
      name: "Fixture designer",
      sessionVersion: 0,
    });
  });

  it("answers null alike for a wrong password and an unknown e-mail", async () => {
    await createFixtures();
    expect(await verifyCredentials("designer@fixture.test", "not-the-password")).toBeNull();
    expect(await verifyCredentials("nobody@fixture.test", FIXTURE_PASSWORD)).toBeNull();
  });
});

describe("registerUser", () => {
  it("stores a bcrypt hash and gives the new user a team they own", async () => {
    const { userId, teamId } = await registerUser({
      name: "Grace Ohm",
      email: "grace@lab.test",
      password: "a long enough secret",
    });
    const user = await User.findByPk(userId);
    expect(user?.email).toBe("grace@lab.test");
    expect(user?.passwordHash).not.toContain("a long enough secret");
    expect(user?.passwordHash).toMatch(/^\$2[aby]\$10\$/);
    expect(await bcrypt.compare("a long enough secret", user!.passwordHash)).toBe(true);
    const team = await Team.findByPk(teamId);
    expect(team?.name).toBe("Grace's workbench");
    expect(team?.slug).toMatch(/^grace-s-workbench-[0-9a-f]{6}$/);
    const membership = await Membership.findOne({ where: { teamId, userId } });
    expect(membership?.role).toBe("owner");
    expect(await verifyCredentials("grace@lab.test", "a long enough secret")).not.toBeNull();
  });

  it("refuses a taken e-mail on the email field and creates nothing", async () => {
    await createFixtures();
    const err = await expectAppError(
      registerUser({ name: "Copy", email: "owner@fixture.test", password: "another secret 1" }),
      BadRequestError,
      400,
    );
    expect((err.details?.fields as Record<string, string[]> | undefined)?.email?.[0]).toMatch(
      /already exists/,
    );
    expect(await User.count()).toBe(5);
    expect(await Team.count()).toBe(2);
  });
});

describe("session", () => {
  async function cookieFor(claims: Record<string, unknown>, secret = env.NEXTAUTH_SECRET) {
    return encode({ token: claims, secret });
  }

  it("reads the actor from next-auth's session cookie", async () => {
    const fx = await createFixtures();
    const token = await cookieFor({ sub: fx.users.viewer.id, email: "a@b.test", name: "Ada", sv: 0 });
    const req = new Request("http://localhost/api/x", {
      headers: { cookie: `other=1; next-auth.session-token=${token}` },
    });
    expect(await getActor(req)).toEqual({ userId: fx.users.viewer.id, email: "a@b.test", name: "Ada" });
  });

  it("joins a chunked cookie", async () => {
    const fx = await createFixtures();
    const token = await cookieFor({ sub: fx.users.owner.id, email: "c@d.test", name: "Chunk", sv: 0 });
    const half = Math.floor(token.length / 2);
    const cookie = `next-auth.session-token.0=${token.slice(0, half)}; next-auth.session-token.1=${token.slice(half)}`;
    expect((await getActor(new Request("http://localhost/", { headers: { cookie } })))?.userId).toBe(
      fx.users.owner.id,
    );
  });

  it("session version: sign out everywhere and a role change end older sessions at once; unknown users have none", async () => {
    const fx = await createFixtures();
    const asCookie = async (sub: string, sv: number) => ({
      headers: {
        cookie: `next-auth.session-token=${await cookieFor({ sub, email: "x@y.test", name: "X", sv })}`,
      },
    });
    const reviewer = fx.users.reviewer.id;
    expect(await getActor(new Request("http://localhost/", await asCookie(reviewer, 0)))).not.toBeNull();
    await bumpSessionVersion(reviewer); // what Settings → "Sign out everywhere" does
    expect(await getActor(new Request("http://localhost/", await asCookie(reviewer, 0)))).toBeNull();
    expect(await getActor(new Request("http://localhost/", await asCookie(reviewer, 1)))).not.toBeNull();
    // A role change by an owner ends the member's sessions too.
    const membership = await Membership.findOne({ where: { teamId: fx.team.id, userId: reviewer } });
    await changeMemberRole(fx.users.owner.id, fx.team.id, String(membership?.id), "viewer");
    expect(await getActor(new Request("http://localhost/", await asCookie(reviewer, 1)))).toBeNull();
    expect((await User.findByPk(reviewer))?.sessionVersion).toBe(2);
    // Sign-in puts the current version into the token.
    const jwt = authOptions.callbacks?.jwt;
    const user = await verifyCredentials("reviewer@fixture.test", FIXTURE_PASSWORD);
    const claims = await jwt?.({ token: {}, user: user as never, account: null, trigger: "signIn" } as never);
    expect(claims?.sv).toBe(2);
    expect(await getActor(new Request("http://localhost/", await asCookie("u-1", 0)))).toBeNull();
    expect(
      await getActor(
        new Request("http://localhost/", await asCookie("6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7e", 0)),
      ),
    ).toBeNull();
  });

  it("rejects a cookie sealed with another secret, and no cookie at all", async () => {
    const forged = await cookieFor({ sub: "u-2" }, "some-other-secret-of-enough-length");
    const req = new Request("http://localhost/", {
      headers: { cookie: `next-auth.session-token=${forged}` },
    });
    expect(await getActor(req)).toBeNull();
    await expectAppError(requireActor(new Request("http://localhost/")), UnauthorizedError, 401);
  });

  it("rejects an unknown bearer token", async () => {
    const req = new Request("http://localhost/", {
      headers: { authorization: `Bearer pw_${"x".repeat(43)}` },
    });
    expect(await getActor(req)).toBeNull();
  });
});

describe("sign-in protection (issue 13: 25 guesses with rotating X-Forwarded-For, then the right one, got in)", () => {
  const authorize = (email: string, password: string, headers: Record<string, string>) => {
    const provider = authOptions.providers[0] as unknown as {
      options: { authorize: (c: unknown, r: unknown) => Promise<unknown> };
    };
    return provider.options.authorize({ email, password }, { headers });
  };

  it("rotating the forwarding header changes nothing: the account locks, then even the right password fails", async () => {
    await createFixtures();
    const peer = { "x-pw-peer": "192.0.2.10" };
    let signedIn = 0;
    for (let i = 0; i < 25; i++) {
      const headers = { ...peer, "x-forwarded-for": `198.51.100.${i + 1}` };
      if (await authorize("designer@fixture.test", `guess-${i}`, headers)) signedIn++;
    }
    expect(signedIn).toBe(0);
    const rightPassword = await authorize("designer@fixture.test", FIXTURE_PASSWORD, {
      ...peer,
      "x-forwarded-for": "203.0.113.99",
    });
    expect(rightPassword).toBeNull();
    // The route's gate answers 429 with Retry-After and the URL next-auth's client follows.
    const res = throttleSignIn(
      new Headers({ "x-pw-peer": "192.0.2.77", "x-forwarded-for": "203.0.113.5" }),
      "Designer@Fixture.test",
      "http://app.test",
    );
    expect(res?.status).toBe(429);
    expect(Number(res?.headers.get("Retry-After"))).toBeGreaterThanOrEqual(1);
    const body = (await res?.json()) as { error: { code: string }; url: string };
    expect(body.error.code).toBe("rate_limited");
    expect(body.url).toBe("http://app.test/signin?error=rate_limited");
    // Another account from another machine is not held back.
    expect(
      await authorize("viewer@fixture.test", FIXTURE_PASSWORD, { "x-pw-peer": "192.0.2.11" }),
    ).toMatchObject({
      email: "viewer@fixture.test",
    });
  });

  it("one machine guessing across many accounts is locked by its peer address, whatever header it sends", async () => {
    await createFixtures();
    const peer = "192.0.2.20";
    for (let i = 0; i < 21; i++) {
      await authorize(`nobody-${i}@fixture.test`, "wrong", {
        "x-pw-peer": peer,
        "x-forwarded-for": `10.0.0.${i}`,
      });
    }
    expect(await authorize("owner@fixture.test", FIXTURE_PASSWORD, { "x-pw-peer": peer })).toBeNull();
    expect(
      await authorize("owner@fixture.test", FIXTURE_PASSWORD, { "x-pw-peer": "192.0.2.21" }),
    ).toMatchObject({
      email: "owner@fixture.test",
    });
  });

  it("the forwarding header counts only with TRUST_PROXY; otherwise the socket's peer address", () => {
    const h = new Headers({ "x-forwarded-for": "198.51.100.1, 10.0.0.1", "x-pw-peer": "127.0.0.1" });
    expect(clientAddress(h, false)).toBe("127.0.0.1");
    expect(clientAddress(h, true)).toBe("198.51.100.1");
    expect(clientAddress(new Headers({ "x-forwarded-for": "198.51.100.1" }), false)).toBe("unknown-peer");
  });
});

describe("authorization against the database", () => {
  it("answers 404 across teams, for unknown and non-UUID ids; 403 for a member without the right", async () => {
    const fx = await createFixtures();
    const { owner, viewer, reviewer, outsider } = fx.users;
    const run = await Run.create({
      projectId: fx.project.id,
      authorId: fx.users.designer.id,
      title: "Bridge check",
      netlist: "title x",
      netlistHash: "0".repeat(64),
      solverVersion: "test",
      status: "ok",
    });

    expect(await authorizeTeam(owner.id, fx.team.id, "team:manage")).toEqual({ role: "owner" });
    const p = await authorizeProject(reviewer.id, fx.project.id, "run:review");
    expect(p.role).toBe("reviewer");
    expect(p.project.id).toBe(fx.project.id);
    const r = await authorizeRun(viewer.id, run.id, "run:read");
    expect([r.role, r.run.id, r.project.id]).toEqual(["viewer", run.id, fx.project.id]);

    await expectAppError(authorizeTeam(outsider.id, fx.team.id, "team:read"), NotFoundError, 404);
    await expectAppError(authorizeProject(outsider.id, fx.project.id, "project:read"), NotFoundError, 404);
    await expectAppError(authorizeRun(outsider.id, run.id, "run:read"), NotFoundError, 404);
    await expectAppError(authorizeProject(owner.id, fx.otherProject.id, "project:read"), NotFoundError, 404);
    await expectAppError(
      authorizeRun(owner.id, "9d5e0c2a-1111-4222-8333-444455556666", "run:read"),
      NotFoundError,
      404,
    );
    await expectAppError(authorizeProject(owner.id, "not-a-uuid", "project:read"), NotFoundError, 404);
    await expectAppError(authorizeTeam(owner.id, "42", "team:read"), NotFoundError, 404);

    await expectAppError(authorizeProject(viewer.id, fx.project.id, "run:create"), ForbiddenError, 403);
    await expectAppError(authorizeRun(reviewer.id, run.id, "run:request_review"), ForbiddenError, 403);
    await expectAppError(authorizeTeam(fx.users.designer.id, fx.team.id, "team:manage"), ForbiddenError, 403);
  });
});

describe("next-auth's redirect callback", () => {
  it("keeps same-origin destinations and sends every bypass shape to /projects", async () => {
    const redirect = authOptions.callbacks?.redirect;
    if (!redirect) throw new Error("no redirect callback");
    const baseUrl = "http://localhost:3000";
    const go = (url: string) => redirect({ url, baseUrl });
    expect(await go("/runs/abc")).toBe(`${baseUrl}/runs/abc`);
    expect(await go(`${baseUrl}/invite/tok_123456789012345678901`)).toBe(
      `${baseUrl}/invite/tok_123456789012345678901`,
    );
    for (const shape of ["/%09/evil.test", "/%0A/x", "//evil.test", "/\\evil.test", "https://evil.test/"]) {
      expect(await go(shape)).toBe(`${baseUrl}/projects`);
    }
  });
});
