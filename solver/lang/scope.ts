/** Name scopes for values: global lets, and per block instance its parameters and local lets. */
import type { NetlistError, SourceSpan } from "../types";
import type { LetStatement } from "./ast";
import { evaluate, type Scope } from "./expr";

type Slot = { state: "new" | "busy" | "done" | "error"; value: number; statement: LetStatement };

/**
 * Lets evaluated on first use, in any order; a name met again while it is being evaluated is a
 * circular definition. `fixed` values (block parameters, overrides) win over lets of the same name.
 */
export class LetScope implements Scope {
  private readonly slots = new Map<string, Slot>();
  private readonly stack: string[] = [];

  constructor(
    lets: LetStatement[],
    private readonly fixed: Map<string, number>,
    private readonly parent: Scope | null,
    private readonly errors: NetlistError[],
  ) {
    for (const statement of lets) {
      if (!this.slots.has(statement.name.name))
        this.slots.set(statement.name.name, { state: "new", value: 0, statement });
    }
  }

  lookup(name: string, at: SourceSpan): number | "error" | undefined {
    const fixed = this.fixed.get(name);
    if (fixed !== undefined) return fixed;
    const slot = this.slots.get(name);
    if (slot === undefined) return this.parent?.lookup(name, at);
    if (slot.state === "done") return slot.value;
    if (slot.state === "error") return "error";
    if (slot.state === "busy") {
      const cycle = [...this.stack.slice(this.stack.indexOf(name)), name].join(" → ");
      this.errors.push({
        ...slot.statement.name.span,
        message: `\`${name}\` is defined in terms of itself`,
        hint: cycle,
      });
      slot.state = "error";
      return "error";
    }
    slot.state = "busy";
    this.stack.push(name);
    const value = evaluate(slot.statement.expr, this, this.errors);
    this.stack.pop();
    if (slot.state === "busy") slot.state = value === null ? "error" : "done";
    if (value === null || slot.state === "error") {
      slot.state = "error";
      return "error";
    }
    slot.value = value;
    return value;
  }

  *names(): Iterable<string> {
    yield* this.fixed.keys();
    yield* this.slots.keys();
    if (this.parent) yield* this.parent.names();
  }

  /** Evaluate every let so that each one's errors are reported even when it is unused. */
  evaluateAll(): void {
    for (const [name, slot] of this.slots) this.lookup(name, slot.statement.name.span);
  }
}
