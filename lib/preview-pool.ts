import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { AppError } from "@/lib/errors";
import { type SolveOptions, type SolveResult, solveNetlist } from "@/solver";

/**
 * Live previews solve on a small pool of worker threads, so a heavy one never blocks the event loop
 * that answers health checks and pages (issue 13). At most POOL_SIZE previews solve at once; the rest
 * wait in order (up to MAX_WAITING, then 503). A preview past PREVIEW_TIMEOUT_MS ends its thread and
 * answers 503. Without the worker entry (lib/workers/preview-worker.mjs, or PHASEWRIGHT_PREVIEW_WORKER)
 * or when no thread starts, previews solve in the request's own thread as before.
 * An urgent preview (the sweep-first answer, lib/preview-stages.ts) waits ahead of the others, and a
 * preview whose request is gone (its `signal` aborted: the user typed on) leaves the line unsolved.
 */
export const POOL_SIZE = Math.max(1, Math.min(2, availableParallelism() - 1));
export const MAX_WAITING = 64;
export const PREVIEW_TIMEOUT_MS = 30_000;

type Task = {
  id: number;
  netlist: string;
  options: SolveOptions;
  urgent: boolean;
  resolve: (r: SolveResult) => void;
  reject: (e: Error) => void;
};
type Slot = { worker: Worker; ready: Promise<boolean>; task: Task | null; timer?: NodeJS.Timeout };

const slots: Slot[] = [];
const waiting: Task[] = [];
let nextId = 1;
let unavailable = false;

function entry(): string | null {
  const candidates = [
    process.env.PHASEWRIGHT_PREVIEW_WORKER,
    path.join(process.cwd(), "lib", "workers", "preview-worker.mjs"),
  ];
  return candidates.find((c): c is string => !!c && existsSync(c)) ?? null;
}

function busy(): Error {
  return new AppError(
    503,
    "busy",
    "Previews are busy right now. Try again in a moment, or save it as a run.",
  );
}

/** The caller is gone (an answer nobody reads): a plain error, not a fault of ours. */
function cancelled(): Error {
  return new AppError(503, "cancelled", "The preview was cancelled: its request ended.");
}

function finish(slot: Slot): void {
  if (slot.timer) clearTimeout(slot.timer);
  slot.task = null;
  pump();
}

function startSlot(file: string): Slot {
  const worker = new Worker(file);
  worker.unref();
  const slot: Slot = { worker, task: null, ready: Promise.resolve(false) };
  slot.ready = new Promise<boolean>((resolve) => {
    worker.once("message", () => resolve(true));
    worker.once("error", () => resolve(false));
    worker.once("exit", () => resolve(false));
  });
  worker.on("message", (m: { id?: number; result?: SolveResult; fault?: string }) => {
    const task = slot.task;
    if (!task || m.id !== task.id) return;
    if (m.result) task.resolve(m.result);
    else task.reject(new AppError(500, "internal", "The preview failed on our side."));
    finish(slot);
  });
  const die = () => {
    const i = slots.indexOf(slot);
    if (i >= 0) slots.splice(i, 1);
    if (slot.timer) clearTimeout(slot.timer);
    const task = slot.task;
    slot.task = null;
    // A thread lost mid-preview: solve that one here rather than failing it.
    if (task) runInline(task);
    pump();
  };
  worker.on("error", die);
  worker.on("exit", die);
  return slot;
}

function runInline(task: Task): void {
  try {
    task.resolve(solveNetlist(task.netlist, task.options));
  } catch (err) {
    task.reject(err instanceof Error ? err : new Error(String(err)));
  }
}

function dispatch(slot: Slot, task: Task): void {
  slot.task = task;
  slot.timer = setTimeout(() => {
    slot.task = null;
    task.reject(
      new AppError(503, "timeout", "The preview took too long. Save it as a run: it will be queued."),
    );
    void slot.worker.terminate();
  }, PREVIEW_TIMEOUT_MS);
  slot.timer.unref();
  slot.worker.postMessage({ id: task.id, netlist: task.netlist, options: task.options });
}

function pump(): void {
  while (waiting.length > 0) {
    const file = entry();
    if (!file || unavailable) {
      for (const t of waiting.splice(0)) runInline(t);
      return;
    }
    while (slots.length < POOL_SIZE) slots.push(startSlot(file));
    const idle = slots.find((s) => s.task === null);
    if (!idle) return;
    const task = waiting.shift()!;
    idle.task = task; // reserve while it starts
    void idle.ready.then((ok) => {
      if (!ok) {
        unavailable = true;
        idle.task = null;
        runInline(task);
        pump();
        return;
      }
      dispatch(idle, task);
    });
  }
}

export interface PreviewTaskOptions {
  /** Waits ahead of the previews that are not urgent (behind earlier urgent ones). */
  urgent?: boolean;
  /** When it aborts before a thread takes the preview, the preview is dropped (rejects with `cancelled`). */
  signal?: AbortSignal;
}

/** Solves a preview on the pool (or inline when no thread can start). */
export function solvePreview(
  netlist: string,
  options: SolveOptions,
  { urgent = false, signal }: PreviewTaskOptions = {},
): Promise<SolveResult> {
  if (waiting.length >= MAX_WAITING) return Promise.reject(busy());
  if (signal?.aborted) return Promise.reject(cancelled());
  return new Promise<SolveResult>((resolve, reject) => {
    const task: Task = { id: nextId++, netlist, options, urgent, resolve, reject };
    if (signal) {
      const drop = () => {
        const i = waiting.indexOf(task);
        if (i < 0) return;
        waiting.splice(i, 1);
        reject(cancelled());
      };
      signal.addEventListener("abort", drop, { once: true });
      const done = () => signal.removeEventListener("abort", drop);
      task.resolve = (r) => {
        done();
        resolve(r);
      };
      task.reject = (e) => {
        done();
        reject(e);
      };
    }
    const at = urgent ? waiting.findIndex((t) => !t.urgent) : -1;
    if (at < 0) waiting.push(task);
    else waiting.splice(at, 0, task);
    pump();
  });
}
