/**
 * A lookup table read with netlist text as the key: no prototype, so a word such as `constructor`
 * or `toString` finds nothing instead of a built-in of every JavaScript object.
 */
export function table<T>(entries: Record<string, T>): Readonly<Partial<Record<string, T>>> {
  return Object.freeze(Object.assign(Object.create(null) as Record<string, T>, entries));
}

/** `record[key]` when the record has that key itself (not through its prototype). */
export function own<T>(record: Readonly<Record<string, T>>, key: string): T | undefined {
  return Object.hasOwn(record, key) ? record[key] : undefined;
}
