/**
 * Adapters from a study fit to pool jobs (pool.ts + study-jobs.ts): profile-likelihood intervals
 * of every free parameter, and multistart starts, run on worker threads. Deterministic: the jobs
 * are built here in a fixed order, and each runs the serial code path.
 */
import type { FitResult } from '../estimation/fit-types.js';
import { latinHypercube } from '../estimation/multistart.js';
import type { Study } from '../study/types.js';
import { runJobs, siblingModule, startPool, type JobOutcome, type JobPool, type PoolOptions } from './pool.js';
import type { ProfileJob, StartJob, StartResult, StudyJob, StudyJobContext, StudyJobResult } from './study-jobs.js';

const JOBS_URL = siblingModule('study-jobs', import.meta.url);

/** Profile jobs for every free parameter of a finished fit (the inputs fitModel gives profileParameter). */
export function profileJobs(fit: FitResult): ProfileJob[] {
  const names = fit.covariance.names;
  const cov = fit.covariance.internal;
  const thetaHat = fit.parameters.map((p) => p.internalValue);
  const jobs: ProfileJob[] = [];
  fit.parameters.forEach((p, j) => {
    if (p.fixed || !cov) return;
    const k = names.indexOf(p.name);
    if (k < 0) return;
    jobs.push({ kind: 'profile', index: j, thetaHat, ssrMin: fit.statistics.ssr, internalStdError: Math.sqrt(cov[k][k]), linear: p.ci.linear });
  });
  return jobs;
}

/** A reusable pool whose workers hold the study model (for several batches: profiles, starts). */
export function startStudyPool(ctx: StudyJobContext, pool: PoolOptions = {}): Promise<JobPool<StudyJob, StudyJobResult>> {
  return startPool<StudyJobContext, StudyJob, StudyJobResult>(JOBS_URL, ctx, pool);
}

/** Start jobs of a multistart design. */
export function startJobs(design: number[][]): StartJob[] {
  return design.map((x) => ({ kind: 'start', x }));
}

/** Run the profiles of a fit of `study` on worker threads; outcomes in parameter order. */
export async function parallelProfiles(ctx: StudyJobContext, fit: FitResult, pool: PoolOptions = {}): Promise<JobOutcome<StudyJobResult>[]> {
  return runJobs<StudyJobContext, ProfileJob, StudyJobResult>(JOBS_URL, ctx, profileJobs(fit), pool);
}

/**
 * Multistart design of multistartFit (the given start, then a seeded Latin hypercube in the
 * estimation space; same spans and defaults), for free parameters with starts `start`.
 */
export function multistartDesign(
  free: { transform: 'log' | 'none'; start: number; lower: number; upper: number }[],
  starts = 20,
  seed = 1,
  logSpanDecades = 2,
  linearSpan = 1,
): number[][] {
  const lo: number[] = [];
  const hi: number[] = [];
  for (const p of free) {
    const half = p.transform === 'log' ? logSpanDecades * Math.LN10 : linearSpan * (Math.abs(p.start) > 0 ? Math.abs(p.start) : 1);
    lo.push(Number.isFinite(p.lower) ? p.lower : p.start - half);
    hi.push(Number.isFinite(p.upper) ? p.upper : p.start + half);
  }
  return [free.map((p) => p.start), ...latinHypercube(lo, hi, starts, seed)];
}

/** Run multistart starts on worker threads; outcomes in design order. */
export async function parallelStarts(ctx: StudyJobContext, design: number[][], pool: PoolOptions = {}): Promise<JobOutcome<StartResult>[]> {
  return runJobs<StudyJobContext, StartJob, StartResult>(JOBS_URL, ctx, startJobs(design), pool);
}

export type { Study };
