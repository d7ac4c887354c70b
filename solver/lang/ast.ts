/** The parse tree of a netlist: statements as written, before names are resolved or values evaluated. */
import type { Level, MeasureFunction, PartKind, SourceSpan } from "../types";
import type { Unit } from "./numbers";
import type { Token } from "./tokens";

export interface Named {
  name: string;
  span: SourceSpan;
}

/** A value as written: a number, a name (let, block parameter, or an IEC code such as R47), or `(expr)`. */
export type ValueNode =
  | { kind: "number"; value: number; unit: Unit | null; span: SourceSpan }
  | { kind: "name"; name: string; span: SourceSpan }
  | { kind: "expr"; tokens: Token[]; span: SourceSpan };

export interface OptionNode {
  key: string;
  keySpan: SourceSpan;
  value: ValueNode;
}

export type ProbeNode =
  | { op: "num"; value: number; span: SourceSpan }
  | { op: "v"; node: Named; ref?: Named; span: SourceSpan }
  | { op: "i"; part: Named; span: SourceSpan }
  | { op: "neg"; arg: ProbeNode; span: SourceSpan }
  | { op: "+" | "-" | "*" | "/"; left: ProbeNode; right: ProbeNode; span: SourceSpan };

export type SweepNode =
  | { kind: "log"; start: ValueNode; stop: ValueNode; perDecade: ValueNode }
  | { kind: "linear"; start: ValueNode; stop: ValueNode; points: ValueNode }
  | { kind: "list"; points: ValueNode[] };

export type LevelNode = { level: Level; span: SourceSpan };

interface Base {
  span: SourceSpan;
}

export interface PartStatement extends Base {
  type: "part";
  name: Named;
  kind: Named;
  /** Node names in terminal order (for ccvs/cccs the third entry is the sensing part's name). */
  terminals: Named[];
  value: ValueNode | null;
  options: OptionNode[];
}

export interface LetStatement extends Base {
  type: "let";
  name: Named;
  expr: ValueNode;
}

export interface BlockStatement extends Base {
  type: "block";
  name: Named;
  terminals: Named[];
  params: OptionNode[];
  body: (PartStatement | LetStatement)[];
}

export interface PresetStatement extends Base {
  type: "preset";
  name: Named;
  kind: Named & { base: PartKind | null };
  options: OptionNode[];
}

export type Statement =
  | PartStatement
  | LetStatement
  | BlockStatement
  | PresetStatement
  | { type: "title"; text: string; span: SourceSpan }
  | { type: "sweep"; sweep: SweepNode; span: SourceSpan }
  | { type: "show"; name: Named; probe: ProbeNode; text: string; span: SourceSpan }
  | { type: "loop"; name: Named; node: Named; before: Named[]; method?: Named; span: SourceSpan }
  | {
      type: "measure";
      name: Named;
      fn: MeasureFunction;
      target: Named;
      /** `amplitude(PROBE)` / `thd(PROBE)`: the probe as written (target is its text). */
      probe?: ProbeNode;
      level?: LevelNode;
      at?: ValueNode;
      band?: { from: ValueNode; to: ValueNode };
      span: SourceSpan;
    }
  | {
      type: "check";
      measure: Named;
      op: "<" | "<=" | ">" | ">=" | "between";
      value: ValueNode;
      value2?: ValueNode;
      expression: string;
      span: SourceSpan;
    }
  | {
      type: "vary";
      target: Named;
      values: ValueNode[] | { mode: "log" | "linear"; from: ValueNode; to: ValueNode; count: ValueNode };
      span: SourceSpan;
    }
  | { type: "monte-carlo"; samples: ValueNode; seed?: ValueNode; dist?: Named; span: SourceSpan }
  | { type: "poles"; span: SourceSpan }
  | { type: "sensitivity"; measure: Named; span: SourceSpan }
  | { type: "noise"; name: Named; probe: ProbeNode; text: string; input?: Named; span: SourceSpan }
  | { type: "zeros"; probe: ProbeNode; text: string; span: SourceSpan }
  | { type: "temperature"; kelvin: number; span: SourceSpan }
  | { type: "steady"; loop: Named; harmonics?: ValueNode; from?: ValueNode; span: SourceSpan };

export interface ParseTree {
  statements: Statement[];
}
