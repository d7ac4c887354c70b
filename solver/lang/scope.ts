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
    this.prepare(name);
    if (slot.state !== "new") return slot.state === "done" ? slot.value : "error";
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

  /** Names of this scope's unevaluated lets that a let's expression mentions. */
  private pendingDeps(name: string): string[] {
    const expr = this.slots.get(name)?.statement.expr;
    const words =
      expr === undefined || expr.kind === "number"
        ? []
        : expr.kind === "name"
          ? [expr.name]
          : expr.tokens.filter((t) => t.kind === "word").map((t) => t.text);
    return words.filter((w) => !this.fixed.has(w) && this.slots.get(w)?.state === "new");
  }

  /**
   * Evaluates the lets `name` depends on, deepest first, with an explicit stack: a 3 000-deep chain
   * `let a1 = a0 + 1 …` would otherwise recurse lookup → evaluate → lookup past the call stack.
   * On a name met again on the current path the pre-pass stops; the recursive lookup reports the cycle.
   */
  private prepare(root: string): void {
    const onPath = new Set<string>([root]);
    const path: { name: string; deps: string[]; next: number }[] = [
      { name: root, deps: this.pendingDeps(root), next: 0 },
    ];
    while (path.length > 0) {
      const top = path[path.length - 1]!;
      if (top.next < top.deps.length) {
        const dep = top.deps[top.next++]!;
        // A cycle: leave it to the recursive lookup, which names it from the first let met.
        if (onPath.has(dep)) return;
        if (this.slots.get(dep)?.state === "new") {
          onPath.add(dep);
          path.push({ name: dep, deps: this.pendingDeps(dep), next: 0 });
        }
        continue;
      }
      path.pop();
      onPath.delete(top.name);
      const slot = this.slots.get(top.name);
      if (top.name !== root && slot?.state === "new") this.lookup(top.name, slot.statement.name.span);
    }
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
