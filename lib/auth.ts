import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { UniqueConstraintError } from "sequelize";
import { sequelize, User } from "@/lib/db";
import { env } from "@/lib/env";
import { BadRequestError, withDb } from "@/lib/errors";
import { deliverSoon } from "@/lib/mail/outbox";
import { recordSignIn, signInWait } from "@/lib/rate-limit";
import { safeCallback } from "@/lib/safe-callback";
import { createTeamWithOwner } from "@/lib/teams";
import { type SignUpInput, signInSchema } from "@/lib/validations/auth";
import { issueVerification } from "@/lib/verification";

/** One message whether the e-mail is unknown or the password wrong, so accounts can't be probed. */

let dummyHash: string | undefined;

/** Who signed in; `sessionVersion` goes into the session token as `sv` (lib/session-version.ts). */
export type SignedInUser = { id: string; email: string; name: string; sessionVersion: number };

/** Checks an e-mail and password against the stored bcrypt hash. */
export async function verifyCredentials(email: string, password: string): Promise<SignedInUser | null> {
  const user = await withDb(() => User.findOne({ where: { email: email.trim().toLowerCase() } }));
  if (!user) {
    // Spend comparable time on unknown e-mails.
    dummyHash ??= await bcrypt.hash("no-such-account", 10);
    await bcrypt.compare(password, dummyHash);
    return null;
  }
  const ok = await bcrypt.compare(password, String(user.get("passwordHash")));
  if (!ok) return null;
  return {
    id: String(user.get("id")),
    email: String(user.get("email")),
    name: String(user.get("name")),
    sessionVersion: Number(user.get("sessionVersion") ?? 0),
  };
}

function toHeaders(raw: Record<string, unknown> | undefined): Headers {
  const h = new Headers();
  for (const [k, v] of Object.entries(raw ?? {})) if (typeof v === "string") h.set(k, v);
  return h;
}

/**
 * A credential check behind the lockouts of lib/rate-limit.ts: while the account or the peer address is
 * locked, not even the right password signs in; every failure counts against both, success frees the account.
 */
export async function guardedSignIn(
  headers: Headers,
  email: string,
  password: string,
): Promise<SignedInUser | null> {
  if (signInWait(headers, email) > 0) return null;
  const user = await verifyCredentials(email, password);
  recordSignIn(headers, email, user !== null);
  return user;
}

export const authOptions: NextAuthOptions = {
  secret: env.NEXTAUTH_SECRET,
  session: { strategy: "jwt", maxAge: 30 * 24 * 60 * 60 },
  // Secure (and __Secure-) cookies whenever the public origin is https.
  useSecureCookies: env.NEXTAUTH_URL.startsWith("https://"),
  pages: { signIn: "/signin", error: "/signin" },
  providers: [
    CredentialsProvider({
      name: "E-mail",
      credentials: {
        email: { label: "E-mail", type: "email" },
        password: { label: "Password", type: "password" },
      },
      async authorize(credentials, req) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) return null;
        return guardedSignIn(toHeaders(req?.headers), parsed.data.email, parsed.data.password);
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        token.name = user.name;
        token.email = user.email;
        token.sv = (user as Partial<SignedInUser>).sessionVersion ?? 0;
      }
      return token;
    },
    /** Only same-origin destinations after sign-in and sign-out (lib/safe-callback.ts). */
    redirect({ url, baseUrl }) {
      return `${baseUrl}${safeCallback(url, { origin: baseUrl, fallback: "/projects" })}`;
    },
    session({ session, token }) {
      return { ...session, user: { ...session.user, id: token.sub } };
    },
  },
};

/** bcrypt cost 10: the library's usual default, about 70 ms per hash here (common practice). */
export const BCRYPT_COST = 10;
export const EMAIL_TAKEN = "An account with this e-mail already exists. Sign in instead.";

/**
 * Creates a user (e-mail lower-cased, password hashed, address not yet verified) and a personal team
 * the user owns, and writes the verification e-mail, in one transaction. A taken e-mail → BadRequestError with `fields.email`.
 */
export async function registerUser(input: SignUpInput): Promise<{ userId: string; teamId: string }> {
  const taken = () => new BadRequestError(EMAIL_TAKEN, { fields: { email: [EMAIL_TAKEN] } });
  if (await withDb(() => User.findOne({ where: { email: input.email }, attributes: ["id"] }))) throw taken();
  const passwordHash = await bcrypt.hash(input.password, BCRYPT_COST);
  try {
    const created = await withDb(() =>
      sequelize.transaction(async (transaction) => {
        const user = await User.create(
          { name: input.name, email: input.email, passwordHash },
          { transaction },
        );
        const first = input.name.split(/\s+/)[0] || input.name;
        const team = await createTeamWithOwner(user.id, `${first}'s workbench`, transaction);
        await issueVerification(user, transaction);
        return { userId: user.id, teamId: team.id };
      }),
    );
    deliverSoon();
    return created;
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw taken();
    throw err;
  }
}
