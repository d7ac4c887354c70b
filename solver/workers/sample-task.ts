/**
 * The body of a Monte Carlo worker thread. Messages from the parent (solver/sample-job.ts):
 *  - {type:"setup", jobId, circuit, freqs, names, values, width}: build the per-sample kernel once;
 *  - {type:"task", jobId, from, to}: solve samples from..to−1, answer {type:"done", jobId, batch};
 *  - {type:"release", jobId}: forget the job.
 * Errors are answered as {type:"error", jobId, message}; the parent retries the chunk once on a fresh thread.
 */
import { parentPort } from "node:worker_threads";
import { SampleKernel, solveSampleRange } from "../engine/samples";
import type { Circuit } from "../types";

interface Job {
  kernel: SampleKernel;
  values: Float64Array;
  width: number;
}

type Message =
  | {
      type: "setup";
      jobId: number;
      circuit: Circuit;
      freqs: number[];
      names: string[];
      values: Float64Array;
    }
  | { type: "task"; jobId: number; from: number; to: number }
  | { type: "release"; jobId: number };

const jobs = new Map<number, Job>();
const port = parentPort;

port?.on("message", (msg: Message) => {
  try {
    if (msg.type === "setup") {
      const kernel = new SampleKernel(msg.circuit, msg.freqs, msg.names);
      jobs.set(msg.jobId, { kernel, values: msg.values, width: msg.names.length });
    } else if (msg.type === "task") {
      const job = jobs.get(msg.jobId);
      if (!job) throw new Error(`no job ${msg.jobId} in this worker`);
      const batch = solveSampleRange(job.kernel, job.values, job.width, msg.from, msg.to);
      port.postMessage({ type: "done", jobId: msg.jobId, batch }, [
        batch.values.buffer as ArrayBuffer,
        batch.passed.buffer as ArrayBuffer,
        batch.failed.buffer as ArrayBuffer,
      ]);
    } else if (msg.type === "release") {
      jobs.delete(msg.jobId);
    }
  } catch (error) {
    port.postMessage({
      type: "error",
      jobId: msg.jobId,
      message: error instanceof Error ? error.message : String(error),
    });
  }
});
port?.postMessage({ type: "ready" });
