/**
 * Monte Carlo sizing draws on worker threads (pool.ts + mc-jobs.ts). The parameter vectors are
 * drawn here, in one stream, exactly as design/uncertainty.ts propagate draws them (seeded normal
 * generator, z = z_hat + L e with L the Cholesky factor of the hand-off covariance), then cut into
 * consecutive chunks; the sizes come back in draw order. So the values, and every statistic of
 * them, equal the serial run's for any number of workers or chunks.
 */
import { loadCase } from '../design/case.js';
import { parameterMap, parseHandoff } from '../design/handoff-load.js';
import { kineticsFromHandoff } from '../design/kinetics.js';
import { SeededRandom, cholesky, correlatedDraw } from '../design/random.js';
import { chunkRanges, runJobs, siblingModule, type PoolOptions } from './pool.js';
import type { McContext, McJob, McJobResult } from './mc-jobs.js';

const JOBS_URL = siblingModule('mc-jobs', import.meta.url);

export interface McDrawOptions extends PoolOptions {
  /** Number of draws; default 10000. */
  draws?: number;
  /** Seed; default the case's uncertainty.seed (as sizeReactor). */
  seed?: number;
  /** Chunks the draws are cut into; default 4 x workers (at least 1). */
  chunks?: number;
}

export interface McDrawResult {
  status: 'ok' | 'covariance-not-positive-semidefinite' | 'jobs-failed';
  message: string;
  /** Size per draw in draw order; NaN for a failed draw. */
  values: Float64Array;
  /** Failed draws by reason. */
  failed: Record<string, number>;
}

/** The parameter vectors of propagate's Monte Carlo loop (draws x n, row-major), or null if Cov is not PSD. */
export function monteCarloVectors(handoffRaw: unknown, caseRaw: unknown, draws: number, seedIn?: number): { z: Float64Array; n: number } | null {
  const h = parseHandoff(handoffRaw);
  const dk = kineticsFromHandoff(h);
  const seed = seedIn ?? loadCase(caseRaw, dk.kinetics.speciesNames, dk.kinetics.reactionIds).uncertainty.seed;
  const map = parameterMap(h, dk.kinetics.parameterNames);
  const n = map.free.length;
  const L = cholesky(map.covariance, n);
  if (!L) return null;
  const rng = new SeededRandom(seed);
  const z = new Float64Array(draws * n);
  const e = new Float64Array(n);
  for (let d = 0; d < draws; d++) correlatedDraw(rng, map.internal, L, n, e, z, d * n);
  return { z, n };
}

/** Size every Monte Carlo draw of a case on worker threads; see the file header. */
export async function parallelDraws(ctx: McContext, options: McDrawOptions = {}): Promise<McDrawResult> {
  const draws = options.draws ?? 10000;
  const vec = monteCarloVectors(ctx.handoff, ctx.case, draws, options.seed);
  const values = new Float64Array(draws).fill(NaN);
  if (!vec) {
    return { status: 'covariance-not-positive-semidefinite', message: 'the hand-off covariance is not positive semidefinite', values, failed: { 'covariance-not-positive-semidefinite': draws } };
  }
  const workers = options.workers ?? 2;
  const ranges = chunkRanges(draws, options.chunks ?? Math.max(1, 4 * workers));
  const jobs: McJob[] = ranges.map((r) => ({ z: vec.z.slice(r.start * vec.n, (r.start + r.count) * vec.n), count: r.count }));
  const outcomes = await runJobs<McContext, McJob, McJobResult>(JOBS_URL, ctx, jobs, { workers });
  const failed: Record<string, number> = {};
  let jobFailures = 0;
  outcomes.forEach((o, c) => {
    const r = ranges[c];
    if (!o.ok) {
      jobFailures++;
      failed[o.message] = (failed[o.message] ?? 0) + r.count;
      return;
    }
    values.set(o.value.values, r.start);
    o.value.statuses.forEach((s) => {
      if (s !== 'sized') failed[s] = (failed[s] ?? 0) + 1;
    });
  });
  return jobFailures
    ? { status: 'jobs-failed', message: `${jobFailures} of ${jobs.length} chunks failed`, values, failed }
    : { status: 'ok', message: `${draws} draws in ${jobs.length} chunks`, values, failed };
}
