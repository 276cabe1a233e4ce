/**
 * A small pool of worker threads (node:worker_threads) for independent, deterministic jobs:
 * profiles of different parameters, multistart starts, chunks of Monte Carlo draws.
 *
 * A job module (an ES module, TypeScript allowed) exports
 *   setup(context): state         called once per worker with the structured-cloned context
 *   runJob(state, job): result    called per job; job and result are structured-cloned
 * runJobs() hands the jobs out one at a time to the next free worker and returns the outcomes in job
 * order, so the result never depends on the number of workers or on timing; a job that needs random
 * numbers must derive them from its own index (see deriveSeed). With workers <= 1 the same module
 * runs in this thread (no worker), which is the serial reference.
 *
 * Workers load TypeScript through tsx (its ESM hooks are registered in each worker, see BOOTSTRAP). A job that throws, or a
 * worker that dies, gives an outcome { ok: false, message } for that job; nothing is thrown.
 * Method: plain work queue (dynamic scheduling, one job in flight per worker).
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';

/** The outcome of one job: its result, or why it failed. */
export type JobOutcome<R> = { ok: true; value: R } | { ok: false; message: string };

export interface PoolOptions {
  /** Worker threads; default os.availableParallelism() (<= 1 runs the jobs in this thread). */
  workers?: number;
}

/** The shape a job module must export. */
export interface JobModule<C, S, J, R> {
  setup?: (context: C) => S | Promise<S>;
  runJob: (state: S, job: J) => R | Promise<R>;
}

const WORKER_URL = new URL('./worker.ts', import.meta.url).href;
/**
 * Bootstrap of a worker: register tsx's ESM hooks in the worker thread, then import worker.ts.
 * (`execArgv: ['--import', 'tsx']` alone does not reach a .ts worker entry on Node 20.)
 */
const BOOTSTRAP = `import('tsx/esm/api').then((m) => { m.register(); return import(${JSON.stringify(WORKER_URL)}); })`;

/** 32-bit seed of job `index` derived from a base seed (splitmix-style mixing; deterministic). */
export function deriveSeed(seed: number, index: number): number {
  let x = (Math.imul(seed | 0, 0x9e3779b1) ^ Math.imul(index + 1, 0x85ebca6b)) >>> 0;
  x = Math.imul(x ^ (x >>> 16), 0x7feb352d) >>> 0;
  x = Math.imul(x ^ (x >>> 15), 0x846ca68b) >>> 0;
  return (x ^ (x >>> 16)) >>> 0;
}

/** Split `total` items into `chunks` nearly equal consecutive ranges [start, start + count). */
export function chunkRanges(total: number, chunks: number): { start: number; count: number }[] {
  const k = Math.max(1, Math.min(chunks, total));
  const out: { start: number; count: number }[] = [];
  let start = 0;
  for (let i = 0; i < k; i++) {
    const count = Math.floor(total / k) + (i < total % k ? 1 : 0);
    out.push({ start, count });
    start += count;
  }
  return out;
}

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

/** Run jobs in this thread (the serial reference, also used when workers <= 1). */
async function runSerial<C, S, J, R>(moduleUrl: string, context: C, jobs: readonly J[]): Promise<JobOutcome<R>[]> {
  const mod = (await import(moduleUrl)) as JobModule<C, S, J, R>;
  const state = mod.setup ? await mod.setup(context) : (context as unknown as S);
  const out: JobOutcome<R>[] = [];
  for (const job of jobs) {
    try {
      out.push({ ok: true, value: await mod.runJob(state, job) });
    } catch (e) {
      out.push({ ok: false, message: message(e) });
    }
  }
  return out;
}

/**
 * Run `jobs` through the job module at `moduleUrl` (a file URL string) on worker threads.
 * @param context passed once to each worker's setup (structured clone: plain data, typed arrays, Maps)
 * @returns one outcome per job, in job order
 */
export async function runJobs<C, J, R>(
  moduleUrl: string,
  context: C,
  jobs: readonly J[],
  options: PoolOptions = {},
): Promise<JobOutcome<R>[]> {
  const nWorkers = Math.min(options.workers ?? availableParallelism(), jobs.length);
  if (nWorkers <= 1) return runSerial<C, unknown, J, R>(moduleUrl, context, jobs);
  const results: JobOutcome<R>[] = new Array(jobs.length);
  let next = 0;
  const workers: Worker[] = [];
  await new Promise<void>((resolve) => {
    let active = nWorkers;
    const finishWorker = (w: Worker) => {
      void w.terminate();
      if (--active === 0) resolve();
    };
    for (let i = 0; i < nWorkers; i++) {
      const w = new Worker(BOOTSTRAP, { eval: true, workerData: { moduleUrl, context } });
      workers.push(w);
      let current = -1;
      let done = false;
      const feed = () => {
        if (next >= jobs.length) {
          done = true;
          finishWorker(w);
          return;
        }
        current = next++;
        w.postMessage({ index: current, job: jobs[current] });
      };
      w.on('message', (m: { type: 'ready' } | { type: 'result'; index: number; ok: boolean; value?: R; message?: string }) => {
        if (m.type === 'ready') return feed();
        results[m.index] = m.ok ? { ok: true, value: m.value as R } : { ok: false, message: m.message ?? 'job failed' };
        feed();
      });
      const fail = (why: string) => {
        if (done) return;
        done = true;
        if (current >= 0 && results[current] === undefined) results[current] = { ok: false, message: why };
        finishWorker(w);
      };
      w.on('error', (e) => fail(`worker error: ${message(e)}`));
      w.on('exit', (code) => fail(`worker exited with code ${code}`));
    }
  });
  // jobs never handed out (every worker died) are reported, not dropped
  for (let i = 0; i < jobs.length; i++) if (results[i] === undefined) results[i] = { ok: false, message: 'no worker left to run the job' };
  return results;
}
