/**
 * Multistart least squares: starting points from a Latin hypercube (McKay, Beckman & Conover 1979,
 * "A comparison of three methods for selecting values of input variables in the analysis of output
 * from a computer code", Technometrics 21, 239-245) in the estimation space, inside the bounds, or in
 * a span around the given start where a bound is infinite (log parameters: +- `logSpanDecades`
 * decades; others: +- `linearSpan` x |start|). The generator is the seeded mulberry32 (random.ts),
 * so a seed reproduces the design. The solver (lm.ts) runs from each start and from the given start;
 * converged results are grouped into distinct minima (same when the relative SSR difference is below
 * `ssrTolerance` and every estimation-space coordinate differs by less than
 * `distanceTolerance` x max(1, |x|)), best (lowest SSR) first. The best minimum is returned as a full
 * FitResult. No console output: progress goes through the optional callback.
 */
import { outcome, type Outcome, type Warning } from '../core/outcome';
import { toExternal } from '../core/parameter';
import type { Parameter } from '../core/parameter';
import { assembleFit } from './fit';
import type { FitData, FitOptions, FitResult } from './fit-types';
import type { LmResult } from './lm';
import type { RegressionModel } from './model';
import { mulberry32 } from './random';
import { prepareFit, solveFree, type PreparedFit } from './solve';
import { FIT_STATUS, type FitStatus } from './status';
import { RateloomError } from '../core/errors';

export interface MultistartOptions extends FitOptions {
  /** Number of Latin-hypercube starts, in addition to the given start; default 20. */
  starts?: number;
  /** Seed of the design (32-bit integer); default 1. */
  seed?: number;
  /** Half-span in decades around the start for a log parameter with an infinite bound; default 2. */
  logSpanDecades?: number;
  /** Half-span, as a multiple of |start| (1 if start = 0), for other unbounded parameters; default 1. */
  linearSpan?: number;
  /** Relative SSR difference below which two minima are the same; default 1e-6. */
  ssrTolerance?: number;
  /** Estimation-space distance (relative to max(1, |x|)) below which minima are the same; default 1e-4. */
  distanceTolerance?: number;
  /** Called after each start with (done, total). */
  progress?: (done: number, total: number) => void;
}

export interface Minimum {
  ssr: number;
  /** Parameter values (SI units) of the free parameters. */
  values: { name: string; value: number }[];
  /** Estimation-space coordinates of the free parameters. */
  internal: number[];
  /** How many starts ended here. */
  count: number;
  /** Indices of those starts (0 = the given start). */
  startIndices: number[];
}

export interface MultistartResult extends Outcome<FitStatus> {
  /** Full result at the best minimum. */
  best: FitResult;
  /** Distinct minima from converged runs, lowest SSR first. */
  minima: Minimum[];
  /** Starts run (including the given start). */
  starts: number;
  /** Starts whose run converged. */
  convergedStarts: number;
  /** The starting points used (estimation space, free parameters), index 0 = the given start. */
  design: number[][];
}

/** Latin-hypercube design of `count` points in [lo_j, hi_j]. */
export function latinHypercube(lo: number[], hi: number[], count: number, seed: number): number[][] {
  const rng = mulberry32(seed);
  const d = lo.length;
  const pts = Array.from({ length: count }, () => new Array<number>(d).fill(0));
  for (let j = 0; j < d; j++) {
    const perm = Array.from({ length: count }, (_, i) => i);
    for (let i = count - 1; i > 0; i--) {
      const k = Math.floor(rng.next() * (i + 1));
      [perm[i], perm[k]] = [perm[k], perm[i]];
    }
    for (let i = 0; i < count; i++) pts[i][j] = lo[j] + ((perm[i] + rng.next()) / count) * (hi[j] - lo[j]);
  }
  return pts;
}

/**
 * The starting points of a multistart (estimation space, free parameters): the given start, then
 * `options.starts` Latin-hypercube points (see the file header for the spans); seeded.
 */
export function multistartDesign(prep: PreparedFit, options: MultistartOptions = {}): number[][] {
  const count = options.starts ?? 20;
  if (!Number.isInteger(count) || count < 0) {
    throw new RateloomError('E_VALUE', `starts must be a non-negative integer, got ${count}`, { path: ['starts'] });
  }
  const free = prep.freeIndex;
  const span10 = (options.logSpanDecades ?? 2) * Math.LN10;
  const linSpan = options.linearSpan ?? 1;
  const lo: number[] = [];
  const hi: number[] = [];
  for (const j of free) {
    const p = prep.parameters[j];
    const c = prep.thetaFull[j];
    const half = p.transform === 'log' ? span10 : linSpan * (Math.abs(c) > 0 ? Math.abs(c) : 1);
    lo.push(Number.isFinite(prep.lowerFull[j]) ? prep.lowerFull[j] : c - half);
    hi.push(Number.isFinite(prep.upperFull[j]) ? prep.upperFull[j] : c + half);
  }
  return [Array.from(free, (j) => prep.thetaFull[j]), ...latinHypercube(lo, hi, count, options.seed ?? 1)];
}

/** Run the solver from one design point (estimation space, free parameters). */
export function runStart(prep: PreparedFit, x0: readonly number[]): LmResult {
  const theta = Float64Array.from(prep.thetaFull);
  prep.freeIndex.forEach((j, k) => (theta[j] = x0[k]));
  return solveFree(prep, theta).result;
}

/** The grouping of the starts' results into distinct minima (see the file header). */
export interface StartGroups {
  /** Distinct minima from converged runs, lowest SSR first. */
  minima: Minimum[];
  /** Solver result of the best converged run, or of the lowest-SSR run when none converged. */
  bestLm: LmResult;
  /** Warnings on the multistart (several minima, best found once). */
  warnings: Warning[];
  convergedStarts: number;
}

/**
 * Group the solver results of the design's starts (`results[s]` from `design[s]`) into distinct
 * minima and pick the best; pure, so the starts may have run anywhere (worker threads included).
 */
export function groupStarts(prep: PreparedFit, design: readonly number[][], results: readonly LmResult[], options: MultistartOptions = {}): StartGroups {
  const free = prep.freeIndex;
  const total = design.length;
  const runs = results.map((lm, start) => ({ lm, start }));
  const ssrTol = options.ssrTolerance ?? 1e-6;
  const distTol = options.distanceTolerance ?? 1e-4;
  const ok = runs.filter((r) => r.lm.success).sort((a, b) => a.lm.ssr - b.lm.ssr);
  const groups: { lm: LmResult; starts: number[] }[] = [];
  for (const r of ok) {
    const same = groups.find((g) => {
      const dS = Math.abs(g.lm.ssr - r.lm.ssr) / Math.max(g.lm.ssr, r.lm.ssr, Number.MIN_VALUE);
      if (dS > ssrTol) return false;
      for (let k = 0; k < free.length; k++) {
        if (Math.abs(g.lm.x[k] - r.lm.x[k]) > distTol * Math.max(1, Math.abs(g.lm.x[k]))) return false;
      }
      return true;
    });
    if (same) same.starts.push(r.start);
    else groups.push({ lm: r.lm, starts: [r.start] });
  }
  const minima: Minimum[] = groups.map((g) => ({
    ssr: g.lm.ssr,
    values: free.map((j, k) => ({ name: prep.parameters[j].name, value: toExternal(prep.parameters[j], g.lm.x[k]) })),
    internal: Array.from(g.lm.x),
    count: g.starts.length,
    startIndices: g.starts,
  }));
  // Best converged run, or the lowest-SSR run of all when none converged (its status says so).
  const bestLm = groups.length ? groups[0].lm : runs.slice().sort((a, b) => a.lm.ssr - b.lm.ssr)[0].lm;
  const warnings: Warning[] = [];
  if (groups.length > 1) {
    warnings.push({
      code: 'multiple-minima',
      message: `${groups.length} distinct minima found from ${total} starts; the best has SSR ${groups[0].lm.ssr.toPrecision(6)}, the next ${groups[1].lm.ssr.toPrecision(6)}`,
    });
  }
  if (groups.length && groups[0].starts.length === 1 && total > 1) {
    warnings.push({ code: 'best-found-once', message: 'the best minimum was reached from only one start; more starts may find a better one' });
  }
  return { minima, bestLm, warnings, convergedStarts: ok.length };
}

/** The MultistartResult from the grouped starts and the full fit at the best minimum. */
export function multistartResult(design: number[][], groups: StartGroups, best: FitResult): MultistartResult {
  const total = design.length;
  return {
    ...outcome(FIT_STATUS, best.status, [...best.warnings, ...groups.warnings], `best of ${total} starts (${groups.convergedStarts} converged)`),
    best,
    minima: groups.minima,
    starts: total,
    convergedStarts: groups.convergedStarts,
    design,
  };
}

/** Fit from many starts; see the file header. Bad input throws; the outcome is the best fit's. */
export function multistartFit(
  model: RegressionModel,
  parameters: readonly Parameter[],
  data: FitData,
  options: MultistartOptions = {},
): MultistartResult {
  const count = options.starts ?? 20;
  if (!Number.isInteger(count) || count < 0) {
    throw new RateloomError('E_VALUE', `starts must be a non-negative integer, got ${count}`, { path: ['starts'] });
  }
  const prep = prepareFit(model, parameters, data, options);
  const design = multistartDesign(prep, options);
  const total = design.length;
  const results: LmResult[] = [];
  design.forEach((x0, s) => {
    results.push(runStart(prep, x0));
    options.progress?.(s + 1, total);
  });
  const groups = groupStarts(prep, design, results, options);
  return multistartResult(design, groups, assembleFit(prep, groups.bestLm));
}
