import { expect } from "vitest";
import { type CompileResult, compile } from "@/solver/lang";
import type { Circuit, NetlistError } from "@/solver/types";

/** Compile and insist on success; returns the circuit. */
export function circuitOf(text: string, overrides?: Parameters<typeof compile>[1]): Circuit {
  const r: CompileResult = compile(text, overrides);
  if (!r.ok)
    expect.fail(
      `expected no errors, got:\n${r.errors.map((e) => `${e.line}:${e.column} ${e.message}`).join("\n")}`,
    );
  return r.circuit;
}

/** Compile and insist on failure; returns the errors. */
export function errorsOf(text: string): NetlistError[] {
  const r = compile(text);
  if (r.ok) expect.fail("expected errors, the netlist compiled");
  return r.errors;
}

/** A small valid circuit to append statements to. */
export const DIVIDER = "Vin: vsource in gnd 1\nR1: resistor in out 10k\nC1: capacitor out gnd 10n\n";
