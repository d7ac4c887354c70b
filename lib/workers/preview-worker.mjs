// Entry of a preview worker thread (lib/preview-pool.ts). The solver is TypeScript: register tsx's
// loaders in this thread (a parent's loader hooks do not reach a worker), then load the task module,
// as solver/workers/sample-worker.mjs does.
import { register as registerCjs } from "tsx/cjs/api";
import { register } from "tsx/esm/api";

register();
registerCjs();
await import("./preview-task.ts");
