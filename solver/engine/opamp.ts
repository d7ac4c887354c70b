import type { Part } from "../types";

/**
 * Op-amp, output referenced to gnd, output current j (leaving node out into the amplifier) a
 * free unknown. With A(s) = A0/(1 + s·A0/(2πF)) the branch row is
 *   (v_out − rout·j)·(1/A0 + s/(2πF)) − (v+ − v−) = 0,
 * which is affine in s, so it fits G + s·C with no internal node. Ideal (no options): the nullor
 * v+ = v−; `gbw` alone: 1/A0 = 0, i.e. A(s) = 2πF/s; `gain` alone: no s term.
 */
export function stampOpamp(
  p: Part,
  k: number,
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
  const inv = o.gain !== undefined && o.gain > 0 ? 1 / o.gain : 0;
  const tau = o.gbw !== undefined && o.gbw > 0 ? 1 / (2 * Math.PI * o.gbw) : 0;
  const rout = o.rout ?? 0;
  stamp(out, k, 1, 0);
  stamp(k, out, inv, tau);
  stamp(k, k, -rout * inv, -rout * tau);
  stamp(k, inP, -1, 0);
  stamp(k, inN, 1, 0);
  return problems;
}
