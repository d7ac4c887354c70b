import type { Transaction } from "sequelize";
import { isUuid } from "@/lib/authz";
import { User } from "@/lib/db";

/**
 * Server-side session versions (issue 13: 30-day JWT sessions could not be revoked). Each session token
 * carries `sv`, the user's `session_version` when it was issued; a token whose `sv` differs from the
 * stored one is no longer a session. "Sign out everywhere" (Settings) and a role change bump it. Reads
 * are cached per process for a few seconds (one indexed query per user and window); a bump in this
 * process clears its cache entry at once, other processes follow within CACHE_MS.
 */
export const CACHE_MS = 5_000;
const cache = new Map<string, { version: number | null; at: number }>();

/** The stored session version, or null for a user that no longer exists. */
export async function currentSessionVersion(userId: string, now = Date.now()): Promise<number | null> {
  if (!isUuid(userId)) return null;
  const hit = cache.get(userId);
  if (hit && now - hit.at < CACHE_MS) return hit.version;
  const user = await User.findByPk(userId, { attributes: ["sessionVersion"] });
  const version = user ? user.sessionVersion : null;
  if (cache.size > 50_000) cache.clear();
  cache.set(userId, { version, at: now });
  return version;
}

/** Ends every session of the user (the next request of each is signed out). */
export async function bumpSessionVersion(userId: string, transaction?: Transaction): Promise<void> {
  await User.increment("sessionVersion", { where: { id: userId }, ...(transaction ? { transaction } : {}) });
  cache.delete(userId);
}
