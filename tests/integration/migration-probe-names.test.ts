import { describe, expect, it } from "vitest";
import { sequelize } from "@/lib/db";
import { sha256Hex } from "@/lib/runs";
import { compile } from "@/solver";
import { createMigrator } from "../../scripts/lib/migrator";
import { insertRun, smallResult } from "./runs-fixtures";
import { createFixtures, useTestDb } from "./setup";

/** Migration 202612022010-netlist-probe-names: stored netlists in the earlier probe/ground spellings. */
const NAME = "202612022010-netlist-probe-names";
const OLD =
  "title Old divider, 50% # v(x) stays\r\nV1: vsource in 0 1\r\nR1: resistor in out 1k\r\nR2: resistor out 0 1k\r\nshow v(out)\r\nshow H = v(out) / i(R1)\r\n";
const NEW =
  "title Old divider, 50% # v(x) stays\r\nV1: vsource in gnd 1\r\nR1: resistor in out 1k\r\nR2: resistor out gnd 1k\r\nshow volts(out)\r\nshow H = volts(out) / amps(R1)\r\n";

useTestDb();

async function stored(id: string) {
  const [rows] = await sequelize.query(
    "SELECT netlist, netlist_hash, result::text AS result FROM runs WHERE id = :id",
    {
      replacements: { id },
    },
  );
  const row = (rows as { netlist: string; netlist_hash: string; result: string }[])[0]!;
  return { netlist: row.netlist, hash: row.netlist_hash, result: JSON.parse(row.result) };
}

describe(`migration ${NAME}`, () => {
  it("rewrites old-form netlists, their hash and unnamed trace names; numbers and new-form runs unchanged", async () => {
    const fx = await createFixtures();
    const old = await insertRun(fx.project.id, fx.users.designer.id, { netlist: OLD });
    const fresh = await insertRun(fx.project.id, fx.users.designer.id, { netlist: NEW });
    // The fixture result, with the trace names an old solve gave: "v(out)" (unnamed) and "H".
    const before = smallResult();
    const result = {
      ...before,
      traces: [{ ...before.traces[0]!, name: "v(out)" }, before.traces[0]!],
      warnings: [{ line: null, message: "unrelated v(x) words stay" }],
    };
    await sequelize.query("UPDATE runs SET result = CAST(:r AS json) WHERE id = :id", {
      replacements: { id: old.id, r: JSON.stringify(result) },
    });
    const freshBefore = await stored(fresh.id);

    const migrator = createMigrator(sequelize);
    // Going down to this step also undoes the later ones; up brings them all back in order.
    const undone = (await migrator.down({ to: NAME })).map((m) => m.name);
    expect(undone.at(-1)).toBe(NAME);
    expect((await migrator.up()).map((m) => m.name)).toEqual([...undone].reverse());

    const after = await stored(old.id);
    expect(after.netlist).toBe(NEW);
    expect(after.hash).toBe(sha256Hex(NEW));
    expect(after.hash).toMatch(/^[0-9a-f]{64}$/);
    expect(compile(after.netlist).ok).toBe(true);
    expect(after.result.traces.map((t: { name: string }) => t.name)).toEqual(["volts(out)", "H"]);
    expect(after.result.traces[0].re).toEqual(before.traces[0]!.re);
    expect(after.result.traces[0].im).toEqual(before.traces[0]!.im);
    expect(after.result.measures).toEqual(before.measures);
    expect(after.result.warnings).toEqual(result.warnings);
    // A run already in the new spelling is left exactly as it was.
    expect(await stored(fresh.id)).toEqual(freshBefore);

    // Down is a no-op; up again changes nothing (the rewrite is idempotent).
    await migrator.down({ to: NAME });
    await migrator.up();
    expect(await stored(old.id)).toEqual(after);
  });
});
