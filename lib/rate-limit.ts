/**
 * In-memory sliding-window rate limiter (per process). Each key keeps the timestamps of its
 * recent attempts; an attempt is refused when `limit` attempts already fall inside the window.
 */
export type RateLimitResult = { ok: boolean; remaining: number; retryAfterMs: number };

export type RateLimiter = {
  hit(key: string, now?: number): RateLimitResult;
  reset(key: string): void;
  size(): number;
};

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

/** Sign-in attempts: 5 per minute per e-mail + client address. */
export const signInLimiter = createRateLimiter({ limit: 5, windowMs: 60_000 });
/** Account creation: 10 per 10 minutes per client address. */
export const signUpLimiter = createRateLimiter({ limit: 10, windowMs: 600_000 });

/** The client address as seen through the proxy headers ("local" when absent). */
export function clientIp(headers: Headers): string {
  const forwarded = headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || headers.get("x-real-ip")?.trim() || "local";
}

export function signInKey(email: string, ip: string): string {
  return `${email.trim().toLowerCase()}|${ip}`;
}

/**
 * Counts a credential sign-in attempt. Under the limit → null (let next-auth handle it); over it →
 * a 429 answer in the API's error shape, with Retry-After and the `url` next-auth's client reads.
 */
export function throttleSignIn(
  headers: Headers,
  email: string,
  baseUrl: string,
  now?: number,
): Response | null {
  const verdict = signInLimiter.hit(signInKey(email, clientIp(headers)), now);
  if (verdict.ok) return null;
  const retryAfterSeconds = Math.max(1, Math.ceil(verdict.retryAfterMs / 1000));
  return Response.json(
    {
      error: {
        code: "rate_limited",
        message: `Too many sign-in attempts. Wait ${retryAfterSeconds} seconds and try again.`,
        details: { retryAfterSeconds },
      },
      url: `${baseUrl}/signin?error=rate_limited`,
    },
    { status: 429, headers: { "Retry-After": String(retryAfterSeconds) } },
  );
}
