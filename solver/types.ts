/**
 * Shared types of the Phasewright solver.
 *
 * Two halves meet here:
 *  - the language (`solver/lang/`): text → parse tree → an elaborated, flat `Circuit`;
 *  - the engine (`solver/engine/`): `Circuit` → modified nodal analysis per frequency → `SolveResult`.
 * The result types mirror the JSON contract of NETLIST.md ("Machine-readable result") exactly;
 * the API and the CLI print them unchanged.
 *
 * The definitions live in solver/types/ by role; this file gathers them so every import reads
 * `solver/types`.
 */

export * from "./types/circuit";
export * from "./types/diagnostics";
export * from "./types/results";
export * from "./types/statements";
export * from "./types/studies";
