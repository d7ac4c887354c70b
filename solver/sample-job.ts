/**
 * One Monte Carlo job on the worker pool (solver/sample-pool.ts): the samples cut into chunks,
 * handed out as threads become free, put back in any order (the pipeline sorts them). A failed
 * chunk is retried once on a fresh thread; a second failure, or no fresh thread, rejects with a
 * `SampleFault`; an abort ends the threads busy with the job and rejects with the signal's reason.
 */
import type { SampleBatch } from "./engine/samples";
import { SampleFault, type SampleJob } from "./pipeline";
import type { PoolWorker, WorkerReply } from "./sample-pool";

type Chunk = { from: number; to: number; tries: number };

/** One Monte Carlo job on the pool: its chunks, the threads busy with them, and how it settles. */
export class PoolJob {
  private readonly chunks: Chunk[] = [];
  private readonly batches: SampleBatch[] = [];
  private readonly busy = new Map<PoolWorker, Chunk>();
  private readonly used: Set<PoolWorker>;
  private readonly setup: object;
  private readonly promise: Promise<SampleBatch[]>;
  private settle!: { resolve: (b: SampleBatch[]) => void; reject: (e: unknown) => void };
  private settled = false;
  private done = 0;
  private retrying = 0;

  constructor(
    readonly id: number,
    private readonly job: SampleJob,
    private readonly workers: PoolWorker[],
    /** A fresh thread for a retried chunk (null when none starts). */
    private readonly freshWorker: () => Promise<PoolWorker | null>,
  ) {
    const total = job.draws.samples;
    const size = Math.max(10, Math.ceil(total / (workers.length * 8)));
    for (let s = 0; s < total; s += size)
      this.chunks.push({ from: s, to: Math.min(total, s + size), tries: 0 });
    const { names, values } = job.draws;
    this.setup = { type: "setup", jobId: this.id, circuit: job.circuit, freqs: job.freqs, names, values };
    this.used = new Set(workers);
    this.promise = new Promise((resolve, reject) => {
      this.settle = { resolve, reject };
    });
  }

  /** Hand the job to its threads (or settle at once when already aborted). */
  start(): Promise<SampleBatch[]> {
    if (this.job.signal?.aborted) this.abort();
    else {
      for (const w of this.workers) w.worker.postMessage(this.setup);
      for (const w of this.workers) this.dispatch(w);
    }
    return this.promise;
  }

  /** A thread's answer for this job. */
  reply(w: PoolWorker, reply: WorkerReply): void {
    if (reply.type === "error") this.failed(w, reply.message);
    if (reply.type !== "done" || !this.busy.has(w)) return;
    this.busy.delete(w);
    w.onFail = undefined;
    this.batches.push(reply.batch);
    this.done += reply.batch.to - reply.batch.from;
    this.job.onProgress?.(this.done, this.job.draws.samples);
    this.dispatch(w);
  }

  /** End the threads still busy with this job's chunks (nobody will read their answer) and reject. */
  abort(): void {
    for (const w of this.busy.keys()) {
      w.onFail = undefined;
      void w.worker.terminate();
    }
    this.busy.clear();
    this.finish(this.job.signal?.reason ?? new Error("cancelled"));
  }

  /** Tell every thread that worked for the job to forget it. */
  release(): void {
    for (const w of this.used) if (!w.dead) w.worker.postMessage({ type: "release", jobId: this.id });
  }

  private finish(error?: unknown): void {
    if (this.settled) return;
    this.settled = true;
    for (const w of this.busy.keys()) w.onFail = undefined;
    if (error !== undefined) this.settle.reject(error);
    else this.settle.resolve(this.batches);
  }

  private dispatch(w: PoolWorker, chunk = this.chunks.shift()): void {
    if (this.settled) return;
    if (!chunk) {
      if (this.busy.size === 0 && this.retrying === 0) this.finish();
      return;
    }
    this.busy.set(w, chunk);
    w.onFail = (reason) => this.failed(w, reason);
    w.worker.postMessage({ type: "task", jobId: this.id, from: chunk.from, to: chunk.to });
  }

  /** A failed chunk gets one more try on a fresh thread; a second failure fails the job. */
  private failed(w: PoolWorker, reason: string): void {
    const chunk = this.busy.get(w);
    this.busy.delete(w);
    w.onFail = undefined;
    if (this.settled || !chunk) return;
    const samples = `samples ${chunk.from + 1}–${chunk.to}`;
    if (chunk.tries >= 1) {
      this.finish(new SampleFault(`${samples} failed twice: ${reason}`));
      return;
    }
    chunk.tries++;
    this.retrying++;
    if (!w.dead) void w.worker.terminate();
    void this.freshWorker().then((fresh) => {
      this.retrying--;
      if (this.settled) {
        if (fresh) void fresh.worker.terminate();
        return;
      }
      if (!fresh)
        return this.finish(new SampleFault(`${samples} failed and no fresh thread started: ${reason}`));
      this.used.add(fresh);
      fresh.worker.postMessage(this.setup);
      this.dispatch(fresh, chunk);
    });
  }
}
