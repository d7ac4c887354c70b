/**
 * The options of a primitive part (`key=value` on its line or in its preset): each key's checks and
 * the field of the `Part` it sets (NETLIST.md "Parts"). Errors point at the option's value.
 */
import type { NetlistError, Part } from "../types";
import type { ValueNode } from "./ast";

/** Set option `key` = `v` on `part`; false (with an error) when the key is unknown or the value out of range. */
export function applyOption(
  part: Part,
  key: string,
  v: number,
  node: ValueNode,
  errors: NetlistError[],
): boolean {
  const fail = (message: string, hint?: string) => {
    errors.push(hint === undefined ? { ...node.span, message } : { ...node.span, message, hint });
    return false;
  };
  const unit = node.kind === "number" ? node.unit : null;
  switch (key) {
    case "tol":
      if (v < 0) return fail("a tolerance can't be negative");
      if (unit !== "%" && v >= 1)
        return fail(
          `tol=${v} would be ${v * 100} %`,
          `write tol=${v}% for ${v} percent, or a fraction such as tol=0.01`,
        );
      if (v >= 1) return fail("a tolerance must stay below 100 %");
      part.tol = v;
      return true;
    case "phase":
      part.phaseDeg = v;
      return true;
    case "gain": {
      const gain = unit === "dB" ? 10 ** (v / 20) : v;
      if (!(gain > 0)) return fail("an opamp's gain must be above zero");
      part.opamp = { ...part.opamp, gain };
      return true;
    }
    case "gbw":
      if (!(v > 0)) return fail("a gain-bandwidth product must be above zero");
      part.opamp = { ...part.opamp, gbw: v };
      return true;
    case "rout":
      if (v < 0) return fail("an output resistance can't be negative");
      part.opamp = { ...part.opamp, rout: v };
      return true;
    case "pole2":
      if (!(v > 0)) return fail("a second pole's frequency must be above zero");
      part.opamp = { ...part.opamp, pole2: v };
      return true;
    case "en":
    case "in":
      if (!(v >= 0)) return fail(`a noise density (${key}=) can't be negative`);
      part.opamp = { ...part.opamp, [key]: v };
      return true;
    case "fc":
      if (!(v >= 0)) return fail("a 1/f noise corner can't be negative");
      part.opamp = { ...part.opamp, fc: v };
      return true;
    case "swing":
      if (!(v > 0))
        return fail("an output swing must be above zero", "swing=12V: the output stays within ±12 V");
      part.opamp = { ...part.opamp, swing: v };
      return true;
    case "is":
      if (!(v > 0 && v < 1)) return fail("a diode's saturation current must be above zero and below 1 A");
      if (part.diode) part.diode.is = v;
      return true;
    case "n":
      if (!(v >= 0.5 && v <= 10)) return fail("a diode's emission coefficient must lie between 0.5 and 10");
      if (part.diode) part.diode.n = v;
      return true;
  }
  return fail(`unknown option \`${key}\``);
}
