import type { Part } from "../types";

/** Key in MnaSystem.branchIndex of an op-amp's internal unknown (its second pole's input). */
export const pole2Key = (name: string) => `${name}#pole2`;

/**
 * Op-amp, output referenced to gnd, output current j (leaving node out into the amplifier) a
 * free unknown. With A(s) = A0/(1 + s·A0/(2πF)) the branch row is
 *   (v_out − rout·j)·(1/A0 + s/(2πF)) − (v+ − v−) = 0,
 * which is affine in s, so it fits G + s·C with no internal node. Ideal (no options): the nullor
 * v+ = v−; `gbw` alone: 1/A0 = 0, i.e. A(s) = 2πF/s; `gain` alone: no s term.
 *
 * With `pole2` = F2 (LANGUAGE-NEXT §6) A(s) = A0/((1 + s·A0/(2πF))·(1 + s/(2πF2))), whose inverse
 * is quadratic in s; an internal unknown y (`m`, the first stage's output) keeps every row affine:
 *   row m (the control row):  y·(1/A0 + s/(2πF)) − (v+ − v−) = 0
 *   row k (the output row):   (v_out − rout·j)·(1 + s/(2πF2)) − y = 0.
 * The control row is where an input noise voltage `en` enters (noise.ts): `controlRow` says which.
 */
export function stampOpamp(
  p: Part,
  k: number,
  m: number,
  inP: number,
  inN: number,
  out: number,
  stamp: (r: number, c: number, g: number, cap: number) => void,
): string[] {
  const o = p.opamp ?? {};
  const problems: string[] = [];
  if (o.gain !== undefined && !(o.gain > 0)) problems.push(`${p.name}: gain must be positive`);
  if (o.gbw !== undefined && !(o.gbw > 0)) problems.push(`${p.name}: gbw must be positive`);
  if (o.rout !== undefined && !(o.rout >= 0)) problems.push(`${p.name}: rout must not be negative`);
  if (o.pole2 !== undefined && !(o.pole2 > 0)) problems.push(`${p.name}: pole2 must be positive`);
  if (o.pole2 !== undefined && o.gain === undefined && o.gbw === undefined)
    problems.push(`${p.name}: pole2= needs gbw= or gain= (an ideal op-amp has no poles to add to)`);
  const inv = o.gain !== undefined && o.gain > 0 ? 1 / o.gain : 0;
  const tau = o.gbw !== undefined && o.gbw > 0 ? 1 / (2 * Math.PI * o.gbw) : 0;
  const rout = o.rout ?? 0;
  stamp(out, k, 1, 0);
  if (o.pole2 !== undefined && m >= 0) {
    const tau2 = 1 / (2 * Math.PI * o.pole2);
    stamp(m, m, inv, tau);
    stamp(m, inP, -1, 0);
    stamp(m, inN, 1, 0);
    stamp(k, out, 1, tau2);
    stamp(k, k, -rout, -rout * tau2);
    stamp(k, m, -1, 0);
    return problems;
  }
  stamp(k, out, inv, tau);
  stamp(k, k, -rout * inv, -rout * tau);
  stamp(k, inP, -1, 0);
  stamp(k, inN, 1, 0);
  return problems;
}

/** The row of an op-amp's input difference (v+ − v−): where its `en` enters. */
export function controlRow(p: Part, branchIndex: Map<string, number>): number {
  return branchIndex.get(pole2Key(p.name)) ?? branchIndex.get(p.name)!;
}
