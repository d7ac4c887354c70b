/**
 * Phase angles in degrees, the one definition for the engine, the pages and compare (pure; safe in
 * the browser). Every phase Phasewright shows lies in (−180°, 180°].
 */

/** The phase of re + j·im in degrees, in (−180, 180]. */
export function deg(re: number, im: number): number {
  const d = (Math.atan2(im, re) * 180) / Math.PI;
  return d <= -180 ? d + 360 : d;
}

/** Wraps an angle in degrees into (−180, 180]; 0 stays +0. */
export function wrapDeg(x: number): number {
  const w = x - 360 * Math.ceil((x - 180) / 360);
  return w === 0 ? 0 : w;
}
