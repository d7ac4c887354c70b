import { createHash, randomBytes } from "node:crypto";
import { isUuid } from "@/lib/authz";
import { ApiToken, User } from "@/lib/db";
import { NotFoundError, withDb } from "@/lib/errors";

/** Personal API tokens: "pw_" + 43 url-safe characters; only the sha256 hex is stored. */
export const TOKEN_PREFIX = "pw_";
const TOKEN_SHAPE = /^pw_[A-Za-z0-9_-]{43}$/;

export type ApiTokenSummary = {
  id: string;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
};

export type TokenActor = { userId: string; email: string; name: string };

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function generateToken(): string {
  return TOKEN_PREFIX + randomBytes(32).toString("base64url");
}

function iso(value: unknown): string | null {
  return value instanceof Date ? value.toISOString() : value ? String(value) : null;
}

/** Creates a token for the user and returns its secret once; afterwards only the prefix is known. */
export async function createApiToken(
  userId: string,
  name: string,
): Promise<{ token: string; summary: ApiTokenSummary }> {
  const token = generateToken();
  const row = await withDb(() =>
    ApiToken.create({ userId, name, tokenHash: hashToken(token), prefix: token.slice(0, 8) }),
  );
  return { token, summary: toSummary(row) };
}

function toSummary(row: { get(key: string): unknown }): ApiTokenSummary {
  return {
    id: String(row.get("id")),
    name: String(row.get("name")),
    prefix: String(row.get("prefix")),
    createdAt: iso(row.get("createdAt")) ?? "",
    lastUsedAt: iso(row.get("lastUsedAt")),
    revokedAt: iso(row.get("revokedAt")),
  };
}

/** The user's tokens, newest first, revoked ones included (marked). */
export async function listApiTokens(userId: string): Promise<ApiTokenSummary[]> {
  const rows = await withDb(() => ApiToken.findAll({ where: { userId }, order: [["createdAt", "DESC"]] }));
  return rows.map(toSummary);
}

/** Revokes one of the user's own tokens; someone else's id answers NotFoundError. */
export async function revokeApiToken(userId: string, tokenId: string): Promise<void> {
  if (!isUuid(tokenId)) throw new NotFoundError("Token not found.");
  const [count] = await withDb(() =>
    ApiToken.update({ revokedAt: new Date() }, { where: { id: tokenId, userId, revokedAt: null } }),
  );
  if (count === 0) throw new NotFoundError("Token not found.");
}

/** The owner of a live bearer token, or null (unknown, malformed or revoked). Records the last use. */
export async function verifyBearerToken(token: string): Promise<TokenActor | null> {
  if (!TOKEN_SHAPE.test(token)) return null;
  return withDb(async () => {
    const row = await ApiToken.findOne({ where: { tokenHash: hashToken(token), revokedAt: null } });
    if (!row) return null;
    const user = await User.findByPk(String(row.get("userId")));
    if (!user) return null;
    await row.update({ lastUsedAt: new Date() });
    return {
      userId: String(user.get("id")),
      email: String(user.get("email")),
      name: String(user.get("name")),
    };
  });
}
