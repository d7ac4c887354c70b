// `npm run bench` row: the adversarial inputs of issue 13 through the whole compile + solve path, each
// with the goal "under 200 ms" (tests/solver/bounds.test.ts checks their answers, not their speed).
import { solveNetlist } from "@/solver/index";

const RC = [
  "title bounds",
  "Vin: vsource in gnd 1",
  "R1: resistor in out 1k",
  "C1: capacitor out gnd 10n",
  "sweep 10Hz to 1MHz log 10 per decade",
  "show H = volts(out) / volts(in)",
].join("\n");

const CASES: [string, string][] = [
  ["200 kB of blanks, then `1`", `${RC}\n${" ".repeat(200_000)}1\n`],
  ["one 200 kB word", `${RC}\n${"w".repeat(200_000)}\n`],
  ["25 000 lines of a misspelt keyword (hints)", `${RC}\n${"swepe 1\n".repeat(25_000)}`],
  ["5 000 nested parentheses", `${RC}\nshow D = ${"(".repeat(5000)}volts(out)${")".repeat(5000)}\n`],
  [
    "3 000-deep let chain",
    [
      "title chain",
      ...Array.from({ length: 3000 }, (_, i) => `let x${i} = x${i + 1} + 1`),
      "let x3000 = 1k",
      RC.split("\n").slice(1).join("\n").replace("resistor in out 1k", "resistor in out x0"),
    ].join("\n"),
  ],
];

const GOAL_MS = 200;
let failed = 0;
console.log("| input | bytes | median ms (5 runs) | goal |");
console.log("|---|---:|---:|---|");
for (const [name, text] of CASES) {
  const times: number[] = [];
  for (let i = 0; i < 5; i++) {
    const t0 = performance.now();
    solveNetlist(text);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const median = times[2] ?? 0;
  const ok = median < GOAL_MS;
  if (!ok) failed++;
  console.log(`| ${name} | ${text.length} | ${median.toFixed(1)} | < ${GOAL_MS} ms ${ok ? "✓" : "✗"} |`);
}
process.exit(failed > 0 ? 1 : 0);
