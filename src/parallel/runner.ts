/**
 * The worker-pool JobRunner (src/core/jobs.ts): each kind of job maps to a job module (setup +
 * runJob, see pool.ts) and the plain-data context its workers set up from. One pool per job module,
 * started at its first batch and reused for the later batches. Jobs go out one at a time to the
 * next free worker and come back in job order, so results never depend on the worker count.
 * Method: dynamic work queue over node:worker_threads (pool.ts).
 */
import type { JobBatch, JobOutcome, JobRunner } from '../core/jobs.js';
import { startPool, type JobPool } from './pool.js';

/** Where the workers find a kind of job: the job module (file URL) and the context of its setup. */
export interface JobModuleRef {
  moduleUrl: string;
  context: unknown;
}

/** A worker-pool runner; close() stops its workers. */
export interface WorkerRunner extends JobRunner {
  /** Start the workers of a kind of job now (they boot while this thread works); optional. */
  prestart(kind: string): void;
  close(): Promise<void>;
}

/**
 * A runner on `workers` worker threads for the kinds of job in `modules`; a batch of a kind not
 * listed runs in this thread.
 */
export function workerRunner(modules: Readonly<Record<string, JobModuleRef>>, workers: number): WorkerRunner {
  const pools = new Map<string, Promise<JobPool<unknown, unknown>>>();
  const poolFor = (ref: JobModuleRef) => {
    let p = pools.get(ref.moduleUrl);
    if (!p) {
      p = startPool<unknown, unknown, unknown>(ref.moduleUrl, ref.context, { workers });
      pools.set(ref.moduleUrl, p);
    }
    return p;
  };
  return {
    async run<J, R>(batch: JobBatch<J, R>, signal?: AbortSignal): Promise<JobOutcome<R>[]> {
      const ref = modules[batch.kind];
      if (!ref) return batch.jobs.map((job) => ({ ok: true as const, value: batch.runHere(job) }));
      const pool = await poolFor(ref);
      return (await pool.run(batch.jobs, batch.onProgress, signal, batch.kind)) as JobOutcome<R>[];
    },
    prestart(kind: string) {
      const ref = modules[kind];
      if (ref) void poolFor(ref);
    },
    async close() {
      const all = [...pools.values()];
      pools.clear();
      await Promise.all(all.map(async (p) => (await p).close()));
    },
  };
}
