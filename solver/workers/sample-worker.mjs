// Entry of a Monte Carlo worker thread (node:worker_threads). The solver is TypeScript: register
// tsx's loaders (ES modules and CommonJS) in this thread — loader hooks of the parent do not
// reach a worker — then load the task module. See solver/parallel.ts.
import { register as registerCjs } from "tsx/cjs/api";
import { register } from "tsx/esm/api";

register();
registerCjs();
await import("./sample-task.ts");
