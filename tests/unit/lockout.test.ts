import http from "node:http";
import { describe, expect, it } from "vitest";
import { installPeerAddressStamp } from "@/lib/peer-address";
import { createLockout } from "@/lib/rate-limit";

describe("createLockout", () => {
  it("free failures cost nothing, then the lock doubles (1 s, 2 s, 4 s …) up to the cap; success resets", () => {
    const lock = createLockout({ free: 3, baseMs: 1000, maxMs: 8000, forgetMs: 3_600_000 });
    const t = 1_000_000;
    expect([lock.fail("a", t), lock.fail("a", t), lock.fail("a", t)]).toEqual([0, 0, 0]);
    expect(lock.lockedFor("a", t)).toBe(0);
    expect(lock.fail("a", t)).toBe(1000);
    expect(lock.lockedFor("a", t + 400)).toBe(600);
    expect([lock.fail("a", t + 2000), lock.fail("a", t + 5000), lock.fail("a", t + 9000)]).toEqual([
      2000, 4000, 8000,
    ]);
    expect(lock.fail("a", t + 20_000)).toBe(8000);
    expect(lock.lockedFor("b", t)).toBe(0);
    lock.reset("a");
    expect(lock.lockedFor("a", t + 20_001)).toBe(0);
  });

  it("forgets failures an hour after the last one", () => {
    const lock = createLockout({ free: 1, baseMs: 1000, maxMs: 60_000, forgetMs: 3_600_000 });
    lock.fail("k", 0);
    lock.fail("k", 0);
    expect(lock.fail("k", 3_600_001)).toBe(0);
  });
});

describe("peer address stamp", () => {
  it("overwrites a client's own X-Forwarded-For and peer header with the socket address", async () => {
    installPeerAddressStamp(false);
    const server = http.createServer((req, res) => {
      res.end(JSON.stringify({ peer: req.headers["x-pw-peer"], xff: req.headers["x-forwarded-for"] }));
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
    const { port } = server.address() as { port: number };
    try {
      const res = await fetch(`http://127.0.0.1:${port}/`, {
        headers: { "x-forwarded-for": "203.0.113.9", "x-pw-peer": "203.0.113.9" },
      });
      const seen = (await res.json()) as { peer: string; xff: string };
      expect(seen.peer).toMatch(/^(::ffff:)?127\.0\.0\.1$/);
      expect(seen.xff).toBe(seen.peer);
    } finally {
      await new Promise<void>((r) => server.close(() => r()));
    }
  });
});
