/**
 * Solves the designs of `phasewright check` in parallel on worker threads, up to `jobs` at once;
 * outcomes come back in the order the files were given. The workers run this same bundled file
 * (cli/main.ts hands a non-main thread to `serveWorker`). Run from TypeScript sources (tests, tsx)
 * there is no bundle to start, and the designs are solved one after another in this thread.
 */
import { parentPort, Worker, workerData } from "node:worker_threads";
import { type DesignOutcome, solveDesign } from "./design";

interface Job {
  index: number;
  file: string;
  cwd: string;
  keep: boolean;
}

/** The bundled command file when running from it (dist-cli/phasewright.mjs), else null. */
function bundleUrl(): URL | null {
  const url = import.meta.url;
  return typeof url === "string" && url.endsWith(".mjs") ? new URL(url) : null;
}

/** Worker side: solve each job posted and answer with its outcome. */
export function serveWorker(): void {
  if (workerData?.role !== "phasewright-design" || !parentPort) return;
  const port = parentPort;
  port.on("message", (job: Job) => {
    port.postMessage({ index: job.index, outcome: solveDesign(job.file, job.cwd, job.keep) });
  });
}

function solveInThread(files: string[], cwd: string, keep: boolean): Promise<DesignOutcome[]> {
  return Promise.resolve(files.map((f) => solveDesign(f, cwd, keep)));
}

/**
 * Every design's outcome, in the order of `files`. `jobs` threads at most (1 = this thread only).
 * A worker that dies leaves its design to be solved in this thread.
 */
export async function solveAll(
  files: string[],
  cwd: string,
  options: { jobs: number; keep: boolean },
): Promise<DesignOutcome[]> {
  const url = bundleUrl();
  const threads = Math.min(options.jobs, files.length);
  if (!url || threads <= 1) return solveInThread(files, cwd, options.keep);
  const outcomes: (DesignOutcome | undefined)[] = new Array(files.length);
  let next = 0;
  const startWorker = () =>
    new Promise<void>((resolve) => {
      const worker = new Worker(url, { workerData: { role: "phasewright-design" } });
      const give = () => {
        if (next >= files.length) {
          void worker.terminate();
          resolve();
          return;
        }
        const index = next++;
        worker.postMessage({ index, file: files[index]!, cwd, keep: options.keep } satisfies Job);
      };
      worker.on("message", (m: { index: number; outcome: DesignOutcome }) => {
        outcomes[m.index] = m.outcome;
        give();
      });
      worker.on("error", () => resolve());
      worker.on("exit", () => resolve());
      give();
    });
  await Promise.all(Array.from({ length: threads }, startWorker));
  // Anything a failed worker left undone is solved here.
  return files.map((f, i) => outcomes[i] ?? solveDesign(f, cwd, options.keep));
}
