/**
 * Multistart least squares: starting points from a Latin hypercube (McKay, Beckman & Conover 1979,
 * "A comparison of three methods for selecting values of input variables in the analysis of output
 * from a computer code", Technometrics 21, 239-245) in the estimation space, inside the bounds, or in
 * a span around the given start where a bound is infinite (log parameters: +- `logSpanDecades`
 * decades; others: +- `linearSpan` x |start|). The generator is the seeded mulberry32 (random.ts),
 * so a seed reproduces the design. The given start is always start 0 of the design, so the user's
 * own start is always run and listed. The solver (lm.ts) runs from each start; each end point then
 * gets the fit's verdict (verdict.ts, without profiles), and every start is listed with its end
 * point, SSR and status. Only ends that reached a genuine minimum (verdict trustworthy, or failing
 * only for misfit or identifiability: `minimumFound`) are candidates; ends at a degenerate solution
 * (model identically zero, parameters at overflow), at a singular point, or where the search failed
 * are marked and never chosen while a candidate exists. Candidates are grouped into distinct minima
 * (same when the relative SSR difference is below `ssrTolerance` and every estimation-space
 * coordinate differs by less than `distanceTolerance` x max(1, |x|)), best (lowest SSR) first. The
 * best minimum is returned as a full FitResult. No console output: progress goes through the
 * optional callback.
 */
import { outcome, type Outcome, type Warning } from '../core/outcome.js';
import { toExternal } from '../core/parameter.js';
import type { Parameter } from '../core/parameter.js';
import { assembleFit, fitSteps } from './fit.js';
import { batchOf, runStepsHere, type JobSteps } from '../core/jobs.js';
import type { FitData, FitOptions, FitResult } from './fit-types.js';
import { minimumFound } from './verdict.js';
import type { LmResult } from './lm.js';
import type { RegressionModel } from './model.js';
import { mulberry32 } from './random.js';
import { prepareFit, solveFree, type PreparedFit } from './solve.js';
import { FIT_STATUS, type FitStatus } from './status.js';
import { RateloomError } from '../core/errors.js';

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

/** One start of a multistart and where it ended. */
export interface StartRun {
  /** Position in the design (0 = the given start). */
  index: number;
  /** Starting values of the free parameters (SI). */
  start: { name: string; value: number }[];
  /** End point of the free parameters (SI). */
  end: { name: string; value: number }[];
  /** Weighted SSR at the end point. */
  ssr: number;
  /** Status of the end point: the solver's convergence code when its verdict is trustworthy, else the verdict status ('degenerate', 'misfit', ...). */
  status: FitStatus;
  iterations: number;
  /** The end point is a genuine minimum and took part in the choice of the best. */
  candidate: boolean;
  /** Position in `minima` of the minimum it reached; null when not a candidate. */
  minimum: number | null;
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
  /** Every start with its end point, SSR and status, in design order. */
  runs: StartRun[];
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
  /** Distinct minima from candidate ends, lowest SSR first. */
  minima: Minimum[];
  /** Solver result of the best candidate, or (none) of the lowest-SSR end that is no degenerate or failed one, or of all. */
  bestLm: LmResult;
  /** Every start, in design order. */
  runs: StartRun[];
  /** Warnings on the multistart (several minima, best found once, starts not chosen). */
  warnings: Warning[];
  convergedStarts: number;
}

const named = (prep: PreparedFit, x: ArrayLike<number>) => prep.freeIndex.map((j, k) => ({ name: prep.parameters[j].name, value: toExternal(prep.parameters[j], x[k]) }));

/** The same minimum: relative SSR difference and every coordinate within the tolerances. */
function sameMinimum(a: LmResult, b: LmResult, ssrTol: number, distTol: number): boolean {
  const dS = Math.abs(a.ssr - b.ssr) / Math.max(a.ssr, b.ssr, Number.MIN_VALUE);
  if (dS > ssrTol) return false;
  for (let k = 0; k < a.x.length; k++) if (Math.abs(a.x[k] - b.x[k]) > distTol * Math.max(1, Math.abs(a.x[k]))) return false;
  return true;
}

/** Warnings about the starts: several minima, best reached once, ends that were never candidates. */
function startWarnings(groups: { lm: LmResult; starts: number[] }[], runs: StartRun[]): Warning[] {
  const warnings: Warning[] = [];
  if (groups.length > 1) {
    warnings.push({
      code: 'multiple-minima',
      message: `${groups.length} distinct minima found from ${runs.length} starts; the best has SSR ${groups[0].lm.ssr.toPrecision(6)}, the next ${groups[1].lm.ssr.toPrecision(6)}`,
    });
  }
  if (groups.length && groups[0].starts.length === 1 && runs.length > 1) {
    warnings.push({ code: 'best-found-once', message: 'the best minimum was reached from only one start; more starts may find a better one' });
  }
  const rejected = runs.filter((r) => !r.candidate);
  if (rejected.length) {
    const counts = new Map<string, number>();
    for (const r of rejected) counts.set(r.status, (counts.get(r.status) ?? 0) + 1);
    warnings.push({
      code: 'starts-not-chosen',
      message: `${rejected.length} of ${runs.length} starts ended where no trustworthy minimum is (${[...counts].map(([k, n]) => `${n} ${k}`).join(', ')}) and were not chosen`,
      path: rejected.map((r) => r.index),
    });
  }
  return warnings;
}

/**
 * Judge every start's end point (its verdict, without profiles), group the candidates into
 * distinct minima and pick the best; pure, so the starts may have run anywhere (worker threads
 * included).
 */
export function groupStarts(prep: PreparedFit, design: readonly number[][], results: readonly LmResult[], options: MultistartOptions = {}): StartGroups {
  const judged = results.map((lm, index) => ({ lm, index, fit: assembleFit(prep, lm, false) }));
  const ssrTol = options.ssrTolerance ?? 1e-6;
  const distTol = options.distanceTolerance ?? 1e-4;
  const candidates = judged.filter((r) => minimumFound(r.fit)).sort((a, b) => a.lm.ssr - b.lm.ssr);
  const groups: { lm: LmResult; starts: number[] }[] = [];
  const minimumOf = new Map<number, number>();
  for (const r of candidates) {
    let g = groups.findIndex((x) => sameMinimum(x.lm, r.lm, ssrTol, distTol));
    if (g < 0) g = groups.push({ lm: r.lm, starts: [] }) - 1;
    groups[g].starts.push(r.index);
    minimumOf.set(r.index, g);
  }
  const minima: Minimum[] = groups.map((g) => ({ ssr: g.lm.ssr, values: named(prep, g.lm.x), internal: Array.from(g.lm.x), count: g.starts.length, startIndices: g.starts }));
  const runs: StartRun[] = judged.map((r) => ({
    index: r.index,
    start: named(prep, design[r.index]),
    end: named(prep, r.lm.x),
    ssr: r.lm.ssr,
    status: r.fit.status,
    iterations: r.lm.iterations,
    candidate: minimumOf.has(r.index),
    minimum: minimumOf.get(r.index) ?? null,
  }));
  const bySsr = (xs: typeof judged) => xs.slice().sort((a, b) => a.lm.ssr - b.lm.ssr)[0];
  const usable = judged.filter((r) => !['degenerate', 'model-failure', 'no-search'].includes(r.fit.verdict.status));
  const bestLm = groups.length ? groups[0].lm : (bySsr(usable) ?? bySsr(judged)).lm;
  return { minima, bestLm, runs, warnings: startWarnings(groups, runs), convergedStarts: judged.filter((r) => r.lm.success).length };
}

/** The MultistartResult from the grouped starts and the full fit at the best minimum. */
export function multistartResult(design: number[][], groups: StartGroups, best: FitResult): MultistartResult {
  const total = design.length;
  return {
    ...outcome(FIT_STATUS, best.status, [...best.warnings, ...groups.warnings], `best of ${total} starts (${groups.minima.reduce((n, m) => n + m.count, 0)} reached a minimum)`),
    best,
    minima: groups.minima,
    starts: total,
    convergedStarts: groups.convergedStarts,
    design,
    runs: groups.runs,
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
  return runStepsHere(multistartSteps(prepareFit(model, parameters, data, options), options));
}

/**
 * multistartFit as steps (src/core/jobs.ts): the starts as one batch of 'fit-start' jobs, the
 * grouping here, then the full fit (with its profile jobs) at the best minimum.
 */
export function* multistartSteps(prep: PreparedFit, options: MultistartOptions = {}): JobSteps<MultistartResult> {
  const design = multistartDesign(prep, options);
  const results = yield* batchOf<number[], LmResult>({
    kind: 'fit-start',
    jobs: design,
    runHere: (x0) => runStart(prep, x0),
    ...(options.progress ? { onProgress: options.progress } : {}),
  });
  const groups = groupStarts(prep, design, results, options);
  return multistartResult(design, groups, yield* fitSteps(prep, groups.bestLm));
}
