import { createHash } from "node:crypto";

/** The hash of a run's netlist (`runs.netlist_hash`): SHA-256 of its UTF-8 text, lowercase hex. */
export function sha256Hex(text: string): string {
  return createHash("sha256").update(text, "utf8").digest("hex");
}
