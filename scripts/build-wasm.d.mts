/** Types of scripts/build-wasm.mjs for the tests that import it. */
export function generated(): Promise<string>;
