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
 * Workers run the compiled JavaScript of the package; from source they load TypeScript through tsx
 * (see bootstrap). A job that throws, or a worker that dies, gives an outcome { ok: false, message } for that job; nothing is thrown.
 * Method: plain work queue (dynamic scheduling, one job in flight per worker).
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { JobOutcome, JobProgress } from '../core/jobs.js';

export interface PoolOptions {
  /** Worker threads; default os.availableParallelism() (<= 1 runs the jobs in this thread). */
  workers?: number;
}

/** The shape a job module must export. */
export interface JobModule<C, S, J, R> {
  setup?: (context: C) => S | Promise<S>;
  /** Run one job; `kind` is the kind of its batch (src/core/jobs.ts) when the pool was given one. */
  runJob: (state: S, job: J, kind?: string) => R | Promise<R>;
}

/**
 * URL of the module `stem` (no extension) beside the module at `base` (its import.meta.url), with
 * the same extension: `.js` in the compiled package (dist/), `.ts` when run from source (tests, tsx).
 */
export function siblingModule(stem: string, base: string): string {
  return new URL(`./${stem}${base.endsWith('.ts') ? '.ts' : '.js'}`, base).href;
}

/**
 * The module a worker thread loads for `url`: for a module of the compiled dist/src/parallel/, its
 * bundled copy in dist/bundle/parallel/ when that exists (scripts/bundle-cli.mjs builds it: one
 * module and a shared chunk instead of ~250 modules, about 0.15 s less CPU per worker start),
 * else `url` itself. Only worker threads use the copies; a pool in this thread imports `url`.
 */
export function workerModule(url: string): string {
  const m = /\/dist\/src\/parallel\/([^/]+\.js)$/.exec(url);
  if (!m) return url;
  const bundled = new URL(`../../bundle/parallel/${m[1]}`, url);
  return existsSync(fileURLToPath(bundled)) ? bundled.href : url;
}

const WORKER_URL = workerModule(siblingModule('worker', import.meta.url));

/**
 * Bootstrap source of a worker. Compiled JavaScript is imported directly; when the worker or the
 * job module is TypeScript (running from source), tsx's ESM hooks are registered in the worker
 * thread first (`execArgv: ['--import', 'tsx']` alone does not reach a .ts worker entry on Node 20).
 */
function bootstrap(moduleUrl: string): string {
  const entry = `import(${JSON.stringify(WORKER_URL)})`;
  if (!WORKER_URL.endsWith('.ts') && !moduleUrl.endsWith('.ts')) return entry;
  return `import('tsx/esm/api').then((m) => { m.register(); return ${entry}; })`;
}

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

/** The outcome of a job that was never started because its batch was cancelled. */
const CANCELLED: JobOutcome<never> = { ok: false, message: 'cancelled' };

/** A started pool: workers with the job module set up, reusable for several batches of jobs. */
export interface JobPool<J, R> {
  /** Worker threads running (0: jobs run in this thread). */
  readonly workers: number;
  /**
   * Run a batch; outcomes in job order. One batch at a time. `onDone` is called as jobs finish;
   * after `signal` aborts no further job is handed out (those jobs are 'cancelled'); `kind` goes to
   * each runJob call.
   */
  run(jobs: readonly J[], onDone?: JobProgress, signal?: AbortSignal, kind?: string): Promise<JobOutcome<R>[]>;
  /** Stop the workers. */
  close(): Promise<void>;
}

interface Slot {
  w: Worker;
  alive: boolean;
  current: number;
  onResult?: (index: number, outcome: JobOutcome<unknown>) => void;
  onDead?: (index: number, why: string) => void;
}

/**
 * Start a pool on the job module at `moduleUrl` (file URL string) with `context` given to every
 * worker's setup; resolves once every worker has run its setup (a worker that fails to start is
 * left out). With workers <= 1 the module runs in this thread.
 */
export async function startPool<C, J, R>(moduleUrl: string, context: C, options: PoolOptions = {}): Promise<JobPool<J, R>> {
  const nWorkers = options.workers ?? availableParallelism();
  if (nWorkers <= 1) {
    const mod = (await import(moduleUrl)) as JobModule<C, unknown, J, R>;
    const state = mod.setup ? await mod.setup(context) : context;
    return {
      workers: 0,
      async run(jobs, onDone, signal, kind) {
        const out: JobOutcome<R>[] = [];
        for (const job of jobs) {
          try {
            if (signal?.aborted) out.push(CANCELLED);
            else out.push({ ok: true, value: await mod.runJob(state, job, kind) });
          } catch (e) {
            out.push({ ok: false, message: message(e) });
          }
          onDone?.(out.length, jobs.length);
        }
        return out;
      },
      async close() {},
    };
  }
  const slots: Slot[] = [];
  const workerUrl = workerModule(moduleUrl);
  await Promise.all(
    Array.from({ length: nWorkers }, () =>
      new Promise<void>((ready) => {
        const w = new Worker(bootstrap(workerUrl), { eval: true, workerData: { moduleUrl: workerUrl, context } });
        const slot: Slot = { w, alive: false, current: -1 };
        let started = false;
        w.on('message', (m: { type: 'ready' } | { type: 'result'; index: number; ok: boolean; value?: R; message?: string }) => {
          if (m.type === 'ready') {
            started = true;
            slot.alive = true;
            slots.push(slot);
            ready();
            return;
          }
          slot.onResult?.(m.index, m.ok ? { ok: true, value: m.value } : { ok: false, message: m.message ?? 'job failed' });
        });
        const dead = (why: string) => {
          slot.alive = false;
          if (!started) {
            started = true;
            ready();
          } else if (slot.current >= 0) slot.onDead?.(slot.current, why);
        };
        w.on('error', (e) => dead(`worker error: ${message(e)}`));
        w.on('exit', (code) => dead(`worker exited with code ${code}`));
      }),
    ),
  );
  return {
    workers: slots.length,
    run(jobs, onDone, signal, kind) {
      const results: JobOutcome<R>[] = new Array(jobs.length);
      let next = 0;
      let pending = jobs.length;
      return new Promise((resolve) => {
        if (pending === 0) return resolve(results);
        const finish = (index: number, o: JobOutcome<R>) => {
          if (results[index] !== undefined) return;
          results[index] = o;
          pending--;
          onDone?.(jobs.length - pending, jobs.length);
          if (pending === 0) resolve(results);
        };
        const failRest = () => {
          // no live worker left: report the jobs never handed out, never drop them
          if (slots.some((s) => s.alive)) return;
          while (next < jobs.length) finish(next++, { ok: false, message: 'no worker left to run the job' });
        };
        const feed = (slot: Slot) => {
          if (signal?.aborted) while (next < jobs.length) finish(next++, CANCELLED);
          if (!slot.alive || next >= jobs.length) {
            slot.current = -1;
            return;
          }
          slot.current = next++;
          slot.w.postMessage({ index: slot.current, job: jobs[slot.current], kind });
        };
        for (const slot of slots) {
          slot.onResult = (index, o) => {
            finish(index, o as JobOutcome<R>);
            feed(slot);
          };
          slot.onDead = (index, why) => {
            finish(index, { ok: false, message: why });
            failRest();
          };
          feed(slot);
        }
        failRest();
      });
    },
    async close() {
      await Promise.all(slots.map((s) => ((s.alive = false), s.w.terminate())));
    },
  };
}

/**
 * Run `jobs` through the job module at `moduleUrl` (a file URL string) on worker threads started
 * for this call (see startPool for a reusable pool).
 * @param context passed once to each worker's setup (structured clone: plain data, typed arrays, Maps)
 * @returns one outcome per job, in job order
 */
export async function runJobs<C, J, R>(
  moduleUrl: string,
  context: C,
  jobs: readonly J[],
  options: PoolOptions & { onDone?: JobProgress } = {},
): Promise<JobOutcome<R>[]> {
  const workers = Math.min(options.workers ?? availableParallelism(), jobs.length);
  const pool = await startPool<C, J, R>(moduleUrl, context, { workers });
  try {
    return await pool.run(jobs, options.onDone);
  } finally {
    await pool.close();
  }
}
