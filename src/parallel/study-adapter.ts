/**
 * Adapters from a study fit to pool jobs (pool.ts + study-jobs.ts): profile-likelihood intervals
 * of every free parameter, and multistart starts, run on worker threads. Deterministic: the jobs
 * are built here in a fixed order, and each runs the serial code path.
 */
import type { FitResult } from '../estimation/fit-types.js';
import { siblingModule, startPool, type JobPool, type PoolOptions } from './pool.js';
import type { ProfileJob, StartJob, StudyJob, StudyJobContext, StudyJobResult } from './study-jobs.js';

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

