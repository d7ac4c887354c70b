/**
 * The body of a preview worker thread: {id, netlist, options} → {id, result} with the solver's JSON
 * result (never throws: the solver answers errors as data; anything else is {id, fault}).
 * Imports the solver by relative path only (no app aliases inside a worker).
 */
import { parentPort } from "node:worker_threads";
import { type SolveOptions, solveNetlist } from "../../solver/index";

type Task = { id: number; netlist: string; options: SolveOptions };

parentPort?.on("message", (task: Task) => {
  try {
    const result = solveNetlist(task.netlist, task.options);
    parentPort?.postMessage({ id: task.id, result });
  } catch (err) {
    parentPort?.postMessage({ id: task.id, fault: err instanceof Error ? err.message : String(err) });
  }
});
parentPort?.postMessage({ ready: true });
