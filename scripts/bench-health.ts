import { ApiToken, sequelize, User } from "@/lib/db";
import { generateToken, hashToken } from "@/lib/tokens";

// `npm run bench` row (issue 13): health-check latency while 50 heavy previews are in flight at once.
// Needs an app over HTTP: BENCH_OWN_URL (bench.sh serves the .next build against the bench database)
// and creates its own user and token in that database (DATABASE_URL = the bench database).
//
//   npx tsx scripts/bench-health.ts            (with BENCH_OWN_URL and DATABASE_URL set by bench.sh)
const base = process.env.BENCH_OWN_URL;
const CONCURRENT = 50;

/** A heavy preview still under the work budget: 400 points × (1 + 200 Monte Carlo samples) of a 40-section ladder. */
function heavyNetlist(): string {
  const sections = Array.from(
    { length: 40 },
    (_, i) => `R${i}: resistor n${i} n${i + 1} 1k tol=1%\nC${i}: capacitor n${i + 1} gnd 1n tol=5%`,
  );
  return [
    "title health under load",
    "V1: vsource n0 gnd 1",
    ...sections,
    "sweep 10Hz to 10MHz log 66 per decade",
    "show h = volts(n40) / volts(n0)",
    "measure g = db(h) at 1kHz",
    "monte-carlo 200 seed=3",
  ].join("\n");
}

async function benchToken(): Promise<string> {
  const email = "bench-health@bench.test";
  const [user] = await User.findOrCreate({
    where: { email },
    defaults: { email, name: "Bench Health", passwordHash: "!bench-no-login" },
  });
  await ApiToken.destroy({ where: { userId: user.id } });
  const token = generateToken();
  await ApiToken.create({
    userId: user.id,
    name: "bench",
    tokenHash: hashToken(token),
    prefix: token.slice(0, 8),
  });
  return token;
}

const pct = (sorted: number[], p: number) =>
  sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))] ?? 0;

async function main(): Promise<void> {
  if (!base) {
    console.log("health under load: skipped (no app over HTTP: BENCH_OWN_URL unset)");
    return;
  }
  const token = await benchToken();
  const netlist = heavyNetlist();
  const solveOnce = async () => {
    const t0 = performance.now();
    const res = await fetch(`${base}/api/solve`, {
      method: "POST",
      headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
      body: JSON.stringify({ netlist }),
    });
    await res.arrayBuffer();
    return { status: res.status, ms: performance.now() - t0 };
  };
  const warm = await solveOnce();
  console.log(`one heavy preview alone: HTTP ${warm.status}, ${warm.ms.toFixed(0)} ms`);

  const health: number[] = [];
  let done = false;
  const poll = (async () => {
    while (!done) {
      const t0 = performance.now();
      await fetch(`${base}/api/health`).then((r) => r.arrayBuffer());
      health.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 50));
    }
  })();
  const t0 = performance.now();
  const results = await Promise.all(Array.from({ length: CONCURRENT }, solveOnce));
  done = true;
  await poll;
  const wall = performance.now() - t0;
  const statuses = new Map<number, number>();
  for (const r of results) statuses.set(r.status, (statuses.get(r.status) ?? 0) + 1);
  health.sort((a, b) => a - b);
  console.log(
    `${CONCURRENT} concurrent heavy previews: ${(wall / 1000).toFixed(1)} s wall, statuses ${[...statuses]
      .map(([s, n]) => `${n}× ${s}`)
      .join(", ")}`,
  );
  console.log(
    `health during them: ${health.length} checks, median ${pct(health, 0.5).toFixed(1)} ms, p99 ${pct(health, 0.99).toFixed(1)} ms, max ${(health.at(-1) ?? 0).toFixed(1)} ms`,
  );
  await sequelize.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
