/**
 * Jobs and runners. A method that does a batch of independent pieces of work (the starts of a
 * multistart, the profile of each parameter, chunks of Monte Carlo draws) writes its control flow
 * once, as a generator of steps: it yields a JobBatch and receives the results in job order. A
 * driver hands each batch to a JobRunner: `runStepsHere` runs everything in this thread
 * (synchronously, the serial reference), `runSteps` hands batches to any runner (in-process or a
 * worker pool, src/parallel/runner.ts). No method knows which runner runs its jobs, and every job is
 * deterministic, so the result is the same bit for bit whatever the runner.
 * Method: plain batch-synchronous fork-join over a generator (coroutine) of steps.
 */

/** The outcome of one job: its result, or why it failed. */
export type JobOutcome<R> = { ok: true; value: R } | { ok: false; message: string };

/** Called as jobs of a batch finish, with (jobs done, jobs in the batch). */
export type JobProgress = (done: number, total: number) => void;

/** A batch of independent jobs, as a method hands it to a runner. */
export interface JobBatch<J = unknown, R = unknown> {
  /** The kind of job; a worker pool maps it to the job module that runs it ('fit-start', ...). */
  kind: string;
  /** The jobs; plain data (structured-cloneable) so that a worker can receive them. */
  jobs: readonly J[];
  /** Run one job in this thread: the in-process runner, and the rerun of a job whose worker failed. */
  runHere: (job: J) => R;
  /** Called as jobs finish (done, total); optional. */
  onProgress?: JobProgress;
}

/** Runs batches of independent jobs; results in job order, whatever the order they finish in. */
export interface JobRunner {
  /** Run a batch; one outcome per job, in job order. After `signal` aborts no further job starts. */
  run<J, R>(batch: JobBatch<J, R>, signal?: AbortSignal): Promise<JobOutcome<R>[]>;
}

/** The control flow of a method: yields batches, receives their results, returns the method's result. */
export type JobSteps<T> = Generator<JobBatch, T, unknown[]>;

/** Hand one batch to whoever drives the steps; `yield* batchOf(...)` gives the results in job order. */
export function* batchOf<J, R>(batch: JobBatch<J, R>): Generator<JobBatch, R[], unknown[]> {
  return (yield batch as unknown as JobBatch) as R[];
}

/** Thrown by runSteps when its signal aborted before the method finished. */
export class JobsCancelled extends Error {
  constructor() {
    super('the jobs were cancelled before the method finished');
    this.name = 'JobsCancelled';
  }
}

function runBatchHere(batch: JobBatch): unknown[] {
  const out: unknown[] = [];
  for (const job of batch.jobs) {
    out.push(batch.runHere(job));
    batch.onProgress?.(out.length, batch.jobs.length);
  }
  return out;
}

/** Drive the steps in this thread, synchronously (the serial reference). */
export function runStepsHere<T>(steps: JobSteps<T>): T {
  let next = steps.next();
  while (!next.done) next = steps.next(runBatchHere(next.value));
  return next.value;
}

/**
 * Drive the steps with `runner`. A job that failed on the runner (a worker died, say) is run again
 * here, so a result is never dropped; after `signal` aborts, JobsCancelled is thrown.
 */
export async function runSteps<T>(steps: JobSteps<T>, runner: JobRunner, signal?: AbortSignal): Promise<T> {
  let next = steps.next();
  while (!next.done) {
    const batch = next.value;
    const outcomes = await runner.run(batch, signal);
    if (signal?.aborted) throw new JobsCancelled();
    next = steps.next(outcomes.map((o, i) => (o.ok ? o.value : batch.runHere(batch.jobs[i]))));
  }
  return next.value;
}

/** The in-process runner: every job in this thread, in order (yields to the event loop between jobs). */
export const inProcessRunner: JobRunner = {
  async run<J, R>(batch: JobBatch<J, R>, signal?: AbortSignal): Promise<JobOutcome<R>[]> {
    const out: JobOutcome<R>[] = [];
    for (const job of batch.jobs) {
      if (signal?.aborted) out.push({ ok: false, message: 'cancelled' });
      else {
        try {
          out.push({ ok: true, value: batch.runHere(job) });
        } catch (e) {
          out.push({ ok: false, message: e instanceof Error ? e.message : String(e) });
        }
      }
      batch.onProgress?.(out.length, batch.jobs.length);
      await Promise.resolve();
    }
    return out;
  },
};
