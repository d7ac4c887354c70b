import { env } from "@/lib/env";

/**
 * Limits on guessing (issue 13: the old limiter keyed on X-Forwarded-For, which the client sets).
 * Everything here is keyed on what the client cannot forge: the account (e-mail) and the peer
 * address (the TCP peer; a forwarding header only with TRUST_PROXY behind a known proxy). In memory,
 * per process: with several app processes, each keeps its own count.
 */
export type RateLimitResult = { ok: boolean; remaining: number; retryAfterMs: number };

export type RateLimiter = {
  hit(key: string, now?: number): RateLimitResult;
  reset(key: string): void;
  size(): number;
};

/** Sliding window: an attempt is refused when `limit` attempts already fall inside the window. */
export function createRateLimiter(opts: { limit: number; windowMs: number; maxKeys?: number }): RateLimiter {
  const { limit, windowMs, maxKeys = 10_000 } = opts;
  const hits = new Map<string, number[]>();

  function prune(now: number): void {
    for (const [key, times] of hits) {
      if ((times.at(-1) ?? 0) <= now - windowMs) hits.delete(key);
    }
  }

  return {
    hit(key, now = Date.now()) {
      if (hits.size > maxKeys) prune(now);
      const times = (hits.get(key) ?? []).filter((t) => t > now - windowMs);
      if (times.length >= limit) {
        hits.set(key, times);
        const oldest = times[0] ?? now;
        return { ok: false, remaining: 0, retryAfterMs: Math.max(0, oldest + windowMs - now) };
      }
      times.push(now);
      hits.set(key, times);
      return { ok: true, remaining: limit - times.length, retryAfterMs: 0 };
    },
    reset(key) {
      hits.delete(key);
    },
    size() {
      return hits.size;
    },
  };
}

export type Lockout = {
  /** Milliseconds the key is still locked (0 when free). */
  lockedFor(key: string, now?: number): number;
  /** Counts a failure; returns the lock it starts (0 while failures are still free). */
  fail(key: string, now?: number): number;
  reset(key: string): void;
};

/**
 * Exponential lock after repeated failures: the first `free` failures cost nothing; failure number
 * free + k (k ≥ 1) locks the key for baseMs·2^(k−1) (capped at maxMs). Failures are forgotten `forgetMs` after the
 * last one, or on reset (a successful sign-in of the account).
 */
export function createLockout(opts: {
  free: number;
  baseMs: number;
  maxMs: number;
  forgetMs: number;
  maxKeys?: number;
}): Lockout {
  const { free, baseMs, maxMs, forgetMs, maxKeys = 50_000 } = opts;
  const state = new Map<string, { failures: number; last: number; until: number }>();
  const current = (key: string, now: number) => {
    const s = state.get(key);
    if (s && s.last + forgetMs <= now && s.until <= now) {
      state.delete(key);
      return undefined;
    }
    return s;
  };
  return {
    lockedFor(key, now = Date.now()) {
      return Math.max(0, (current(key, now)?.until ?? 0) - now);
    },
    fail(key, now = Date.now()) {
      if (state.size > maxKeys) for (const k of state.keys()) current(k, now);
      const s = current(key, now) ?? { failures: 0, last: now, until: 0 };
      s.failures += 1;
      s.last = now;
      const over = s.failures - free;
      const lock = over > 0 ? Math.min(maxMs, baseMs * 2 ** (over - 1)) : 0;
      s.until = Math.max(s.until, now + lock);
      state.set(key, s);
      return lock;
    },
    reset(key) {
      state.delete(key);
    },
  };
}

/** Per account: 5 free failures, then 1 s, 2 s, 4 s … up to 15 min; forgotten after an hour. */
export const accountLockout = createLockout({
  free: 5,
  baseMs: 1000,
  maxMs: 15 * 60_000,
  forgetMs: 3_600_000,
});
/** Per peer address (many accounts, one machine): 20 free failures, then doubling up to an hour. */
export const peerLockout = createLockout({ free: 20, baseMs: 1000, maxMs: 3_600_000, forgetMs: 3_600_000 });
/** Password-reset requests: 10 per 10 minutes per peer address (each account: one a minute, lib/password-reset.ts). */
export const resetLimiter = createRateLimiter({ limit: 10, windowMs: 600_000 });
/** Account creation: 10 per 10 minutes per peer address. */
export const signUpLimiter = createRateLimiter({ limit: 10, windowMs: 600_000 });

/** Header carrying the TCP peer address, set by lib/peer-address.ts from the socket (a client's copy is overwritten). */
export const PEER_HEADER = "x-pw-peer";

/**
 * The client's address: with TRUST_PROXY, the first X-Forwarded-For entry (the proxy is trusted to
 * overwrite it); otherwise the socket's peer address, never a header the client wrote.
 */
export function clientAddress(headers: Headers, trustProxy = env.TRUST_PROXY): string {
  if (trustProxy) {
    const forwarded = headers.get("x-forwarded-for")?.split(",")[0]?.trim();
    if (forwarded) return forwarded;
  }
  return headers.get(PEER_HEADER)?.trim() || "unknown-peer";
}

const accountKey = (email: string) => `account:${email.trim().toLowerCase()}`;
const peerKey = (address: string) => `peer:${address}`;

/** How long a sign-in for this account from this address must wait (0 = go ahead). */
export function signInWait(headers: Headers, email: string, now?: number): number {
  return Math.max(
    accountLockout.lockedFor(accountKey(email), now),
    peerLockout.lockedFor(peerKey(clientAddress(headers)), now),
  );
}

/** A reset through the mailbox proves the owner: the account's failed sign-ins are forgotten. */
export function forgetAccountFailures(email: string): void {
  accountLockout.reset(accountKey(email));
}

/** Records a sign-in outcome: a failure counts against the account and the address; success frees the account. */
export function recordSignIn(headers: Headers, email: string, ok: boolean, now?: number): void {
  if (ok) {
    accountLockout.reset(accountKey(email));
    return;
  }
  accountLockout.fail(accountKey(email), now);
  peerLockout.fail(peerKey(clientAddress(headers)), now);
}

/**
 * Gate before next-auth sees a credential sign-in: while the account or the address is locked → a 429
 * answer in the API's error shape, with Retry-After and the `url` next-auth's client reads; else null.
 */
export function throttleSignIn(
  headers: Headers,
  email: string,
  baseUrl: string,
  now?: number,
): Response | null {
  const wait = signInWait(headers, email, now);
  if (wait <= 0) return null;
  const retryAfterSeconds = Math.max(1, Math.ceil(wait / 1000));
  return Response.json(
    {
      error: {
        code: "rate_limited",
        message: `Too many failed sign-ins. Wait ${retryAfterSeconds} seconds and try again.`,
        details: { retryAfterSeconds },
      },
      url: `${baseUrl}/signin?error=rate_limited`,
    },
    { status: 429, headers: { "Retry-After": String(retryAfterSeconds) } },
  );
}
