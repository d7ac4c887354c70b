/** The RC ladder of the bench as netlist text: a 1 V source, then sections of series 1 kΩ, shunt 10 nF. */
export function ladderNetlist(sections: number): string {
  const lines = [`title RC ladder, ${sections} sections`, "Vin: vsource n0 gnd 1"];
  for (let i = 1; i <= sections; i++) {
    lines.push(`R${i}: resistor n${i - 1} n${i} 1k`, `C${i}: capacitor n${i} gnd 10n`);
  }
  // 3 decades × 333 per decade + 1 = 1 000 log points, both ends included.
  lines.push("sweep 10Hz to 10kHz log 333 per decade", `show H = volts(n${sections}) / volts(n0)`);
  lines.push("measure corner = crossing(H, half-power)", "check corner > 1Hz");
  return `${lines.join("\n")}\n`;
}
