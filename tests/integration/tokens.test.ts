import { createHash } from "node:crypto";
import { encode } from "next-auth/jwt";
import { describe, expect, it } from "vitest";
import { DELETE } from "@/app/api/tokens/[tokenId]/route";
import { GET, POST } from "@/app/api/tokens/route";
import { ApiToken } from "@/lib/db";
import { env } from "@/lib/env";
import { getActor } from "@/lib/session";
import { createApiToken, listApiTokens, revokeApiToken, verifyBearerToken } from "@/lib/tokens";
import { createFixtures, useTestDb } from "./setup";

useTestDb();

const auth = (token: string) => ({ authorization: `Bearer ${token}` });

/** A browser session cookie for the user, as next-auth writes it. */
async function sessionCookie(user: { id: string; email: string; name: string }) {
  const jwt = await encode({
    token: { sub: user.id, email: user.email, name: user.name, sv: 0 },
    secret: env.NEXTAUTH_SECRET,
  });
  return { cookie: `next-auth.session-token=${jwt}` };
}

describe("API tokens", () => {
  it("stores only the sha256 of the secret and its first 8 characters", async () => {
    const fx = await createFixtures();
    const { token, summary } = await createApiToken(fx.users.designer.id, "nightly sweep");
    expect(token).toMatch(/^pw_[A-Za-z0-9_-]{43}$/);
    const row = await ApiToken.findByPk(summary.id);
    expect(row?.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(row?.prefix).toBe(token.slice(0, 8));
    expect(JSON.stringify(row?.toJSON())).not.toContain(token);
    expect(summary.lastUsedAt).toBeNull();
  });

  it("authenticates a bearer, records its use, and stops after revocation", async () => {
    const fx = await createFixtures();
    const { token, summary } = await createApiToken(fx.users.reviewer.id, "script");
    const req = new Request("http://localhost/api/x", { headers: auth(token) });
    expect(await getActor(req)).toEqual({
      userId: fx.users.reviewer.id,
      email: "reviewer@fixture.test",
      name: "Fixture reviewer",
    });
    expect((await ApiToken.findByPk(summary.id))?.lastUsedAt).toBeInstanceOf(Date);

    await revokeApiToken(fx.users.reviewer.id, summary.id);
    expect(await verifyBearerToken(token)).toBeNull();
    expect(await getActor(req)).toBeNull();
    const [listed] = await listApiTokens(fx.users.reviewer.id);
    expect(listed?.revokedAt).not.toBeNull();
  });

  it("will not revoke someone else's token (404) and leaves it working", async () => {
    const fx = await createFixtures();
    const { token, summary } = await createApiToken(fx.users.owner.id, "owner script");
    await expect(revokeApiToken(fx.users.outsider.id, summary.id)).rejects.toMatchObject({ status: 404 });
    expect((await verifyBearerToken(token))?.userId).toBe(fx.users.owner.id);
  });
});

describe("/api/tokens routes", () => {
  it("creates (secret once), lists (prefix only) and revokes", async () => {
    const fx = await createFixtures();
    const { token: bootstrap } = await createApiToken(fx.users.viewer.id, "bootstrap");
    const session = await sessionCookie(fx.users.viewer);
    // An API token cannot mint tokens (a leaked one would leave children behind its revocation).
    const minted = await POST(
      new Request("http://localhost/api/tokens", {
        method: "POST",
        headers: { ...auth(bootstrap), ...session, "content-type": "application/json" },
        body: JSON.stringify({ name: "child" }),
      }),
      undefined,
    );
    expect(minted.status).toBe(403);
    expect(((await minted.json()) as { error: { message: string } }).error.message).toContain(
      "API tokens cannot create tokens",
    );
    expect(await ApiToken.count()).toBe(1);
    const created = await POST(
      new Request("http://localhost/api/tokens", {
        method: "POST",
        headers: { ...session, "content-type": "application/json" },
        body: JSON.stringify({ name: "ci job" }),
      }),
      undefined,
    );
    expect(created.status).toBe(201);
    const body = (await created.json()) as { token: string; id: string; prefix: string; name: string };
    expect(body.name).toBe("ci job");
    expect(body.prefix).toBe(body.token.slice(0, 8));

    const listRes = await GET(
      new Request("http://localhost/api/tokens", { headers: auth(body.token) }),
      undefined,
    );
    const list = (await listRes.json()) as { tokens: Record<string, unknown>[] };
    expect(list.tokens.map((t) => t.name).sort()).toEqual(["bootstrap", "ci job"]);
    expect(JSON.stringify(list)).not.toContain(body.token);

    const del = await DELETE(
      new Request("http://localhost/api/tokens/x", { method: "DELETE", headers: auth(bootstrap) }),
      {
        params: Promise.resolve({ tokenId: body.id }),
      },
    );
    expect(del.status).toBe(204);
    const after = await GET(
      new Request("http://localhost/api/tokens", { headers: auth(body.token) }),
      undefined,
    );
    expect(after.status).toBe(401);

    const empty = await POST(
      new Request("http://localhost/api/tokens", {
        method: "POST",
        headers: { ...session, "content-type": "application/json" },
        body: JSON.stringify({ name: "  " }),
      }),
      undefined,
    );
    expect(empty.status).toBe(400);
  });
});
