/**
 * The kinetic uncertainty carried into the size.
 *
 * Monte Carlo: parameter vectors z ~ N(z_hat, Cov) in the estimation (transformed) space, drawn as
 * z = z_hat + L e with L the Cholesky factor of Cov and e standard normal (seeded, random.ts);
 * each draw is mapped back to physical values and sized. Percentiles use linear interpolation
 * between order statistics (Hyndman & Fan type 7). Failed draws are counted by reason.
 * Delta method (first-order propagation): g_k = d size / d z_k by central differences with steps
 * of 1e-3 standard deviations, sd = sqrt(g' Cov g), percentiles size_hat + z_p sd (normal
 * approximation); the sensitivities reported are d ln(size)/d z_k = g_k / size_hat.
 * Bands: the first `profileDraws` parameter vectors are rated along the size (conversion of the key
 * species, P5/median/P95 per position) and at the band size itself (outlet state per species,
 * P5/P95), all with the same type-7 percentiles.
 */
import { mean as ssMean, quantileSorted as ssQuantileSorted } from 'simple-statistics';
import { SeededRandom, cholesky, correlatedDraw, normalQuantile } from './random.js';
import { applyInternal, type ParameterMap } from './handoff-load.js';
import type { Sizer, SizeOnce } from './sizer.js';

export interface UncertaintyOptions {
  /** Number of Monte Carlo draws; default 10000 (0 skips Monte Carlo). */
  draws?: number;
  /** Seed of the generator; default 20261201. */
  seed?: number;
  /** Confidence levels as fractions (0.9 = P90); default [0.9, 0.95]. */
  levels?: number[];
  /** Draws used for the conversion band along the size; default 200. */
  profileDraws?: number;
  /** Positions of the band as fractions of the nominal size; default 0, 0.05, ..., 1.5. */
  profileGrid?: number[];
  /** Called as draws finish (done, total); no output of its own. */
  onProgress?: (done: number, total: number) => void;
  /**
   * Size (kg, m3 or s) the bands are normalised to and the outlet band is taken at; default
   * `nominal` (right when the propagated quantity is the size; give the rated size otherwise).
   */
  bandSize?: number;
  /** Called after each Monte Carlo draw (not the delta-method evaluations) with its index, value and status. */
  onDraw?: (index: number, value: number, status: string) => void;
  /**
   * The Monte Carlo quantity and status per draw, computed elsewhere (worker threads) from the same
   * parameter vectors in the same order; when given (and of length `draws`) the draws are not
   * evaluated here (only the first `profileDraws` vectors are drawn, for the bands) and onProgress
   * is not called. Default: evaluate every draw here.
   */
  precomputed?: { values: ArrayLike<number>; statuses: readonly string[] };
}

export interface Percentile {
  /** Level as a fraction (0.9 = P90). */
  level: number;
  value: number;
}

export interface Sensitivity {
  /** Parameter name. */
  name: string;
  /** 'log' or 'none': the space of the derivative. */
  transform: 'log' | 'none';
  /** d ln(quantity) / d z (z = ln value for 'log', the value for 'none'). */
  dLnQuantity: number;
  /** Unit of dLnQuantity: '1' for 'log' parameters, 1/(parameter unit) otherwise. */
  unit: string;
  /** Change of ln(quantity) for +1 standard error of the parameter (dimensionless, comparable across parameters). */
  perStdError: number;
}

export interface UncertaintyResult {
  /** What was propagated: the size (kg, m3, s) or, for a given size, the conversion (1). */
  quantity: 'size' | 'conversion';
  unit: string;
  draws: number;
  succeeded: number;
  /** Failed draws: count and reasons (status -> count); never dropped silently. */
  failed: { count: number; reasons: Record<string, number> };
  median: number;
  mean: number;
  percentiles: Percentile[];
  deltaMethod: { sd: number; percentiles: Percentile[] };
  sensitivities: Sensitivity[];
  /** Conversion of the key species along the normalised size: median and P5/P95 over draws. */
  band?: { x: number[]; median: number[]; p5: number[]; p95: number[]; draws: number; key: string };
  /**
   * Outlet state at the band size over the band draws: P5 and P95 per species (kinetics order), in
   * the state's unit (mol/s for flow reactors, mol/m3 for batch); `draws` counts those that reached it.
   */
  outletBand?: { at: number; p5: number[]; p95: number[]; draws: number };
  /** Distribution of the successful draws: 40 equal bins from the smallest to the largest value. */
  histogram: { start: number; end: number; count: number }[];
  seed: number;
}

/** Equal-width histogram of sorted values (empty for no values). */
export function histogramSorted(sorted: ArrayLike<number>, bins = 40): { start: number; end: number; count: number }[] {
  const n = sorted.length;
  if (!n) return [];
  const lo = sorted[0];
  const hi = sorted[n - 1];
  if (!(hi > lo)) return [{ start: lo, end: hi, count: n }];
  const w = (hi - lo) / bins;
  const out = Array.from({ length: bins }, (_, i) => ({ start: lo + i * w, end: lo + (i + 1) * w, count: 0 }));
  for (let i = 0; i < n; i++) out[Math.min(bins - 1, Math.floor((sorted[i] - lo) / w))].count++;
  return out;
}

/**
 * Linear-interpolation percentile of sorted data (type 7, numpy.percentile's default), by
 * simple-statistics' quantileSorted; NaN for no data (simple-statistics throws there).
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  return sorted.length === 0 ? NaN : ssQuantileSorted(sorted as unknown as readonly number[], p);
}

/**
 * Propagate the hand-off covariance to the sized quantity.
 * @param sizer sizer of the case (its theta is restored to the nominal fit on return)
 * @param quantity evaluates the quantity for the sizer's current theta (NaN + reason on failure)
 * @param key key species for the conversion band (or undefined for no band)
 */
export function propagate(
  sizer: Sizer,
  map: ParameterMap,
  quantity: (s: Sizer) => { value: number; status: string },
  nominal: number,
  kind: 'size' | 'conversion',
  unit: string,
  key: number | undefined,
  opts: UncertaintyOptions = {},
): UncertaintyResult {
  const draws = opts.draws ?? 10000;
  const seed = opts.seed ?? 20261201;
  const levels = opts.levels ?? [0.9, 0.95];
  const L = cholesky(map.covariance, map.free.length);
  const mc = monteCarloDraws(sizer, map, quantity, L, draws, seed, opts);
  const ok = mc.ok;
  const g = deltaGradient(sizer, map, quantity);
  const sdQ = deltaStdDev(map, g);
  const S = opts.bandSize ?? nominal;
  const bands = key !== undefined && mc.nBand > 0 && Number.isFinite(S) && S > 0 && L ? uncertaintyBands(sizer, map, mc.zBand, mc.nBand, key, S, opts.profileGrid) : {};
  sizer.sys.theta.set(map.theta);
  return {
    quantity: kind,
    unit,
    draws,
    succeeded: ok.length,
    failed: { count: L ? draws - ok.length : draws, reasons: L ? mc.reasons : { ...mc.reasons, 'not-drawn': draws } },
    median: quantileSorted(ok, 0.5),
    // simple-statistics' mean sums with Kahan-Babuska compensation (exact to the last bits over 10,000 draws).
    mean: ok.length ? ssMean(ok as unknown as readonly number[]) : NaN,
    percentiles: levels.map((level) => ({ level, value: quantileSorted(ok, level) })),
    deltaMethod: { sd: sdQ, percentiles: levels.map((level) => ({ level, value: nominal + normalQuantile(level) * sdQ })) },
    sensitivities: sensitivities(map, g, nominal),
    ...bands,
    histogram: histogramSorted(ok),
    seed,
  };
}

/** The Monte Carlo draws: successful values sorted, failures by reason, and the parameter vectors of the band draws. */
interface MonteCarloDraws {
  ok: Float64Array;
  reasons: Record<string, number>;
  /** Band draws: the first min(profileDraws, draws). */
  nBand: number;
  /** Their parameter vectors z (internal space), one after another (n values each). */
  zBand: Float64Array;
}

/**
 * Draw `draws` parameter vectors (none when the covariance has no Cholesky factor `L`) and evaluate
 * the quantity for each, or take it from `opts.precomputed` (then only the band's vectors are drawn:
 * same stream, same order).
 */
function monteCarloDraws(
  sizer: Sizer,
  map: ParameterMap,
  quantity: (s: Sizer) => { value: number; status: string },
  L: Float64Array | null,
  draws: number,
  seed: number,
  opts: UncertaintyOptions,
): MonteCarloDraws {
  const n = map.free.length;
  const theta = sizer.sys.theta;
  const reasons: Record<string, number> = {};
  const values = new Float64Array(draws);
  let nOk = 0;
  const nBand = Math.min(opts.profileDraws ?? 200, draws);
  const zBand = new Float64Array(nBand * n);
  const z = new Float64Array(n);
  const e = new Float64Array(n);
  const rng = new SeededRandom(seed);
  const pre = opts.precomputed && opts.precomputed.values.length === draws && opts.precomputed.statuses.length === draws ? opts.precomputed : undefined;
  if (!L) countReason(reasons, 'covariance-not-positive-semidefinite');
  for (let d = 0; d < draws && L; d++) {
    if (!pre || d < nBand) {
      correlatedDraw(rng, map.internal, L, n, e, z);
      if (d < nBand) zBand.set(z, d * n);
    }
    let value: number;
    let status: string;
    if (pre) {
      value = pre.values[d];
      status = pre.statuses[d];
    } else {
      applyInternal(map, z, theta);
      const q = quantity(sizer);
      value = q.value;
      status = q.status;
    }
    if (Number.isFinite(value)) values[nOk++] = value;
    else countReason(reasons, status);
    if (opts.onDraw) opts.onDraw(d, value, status);
    if (!pre && opts.onProgress && ((d + 1) % 100 === 0 || d + 1 === draws)) opts.onProgress(d + 1, draws);
  }
  return { ok: values.subarray(0, nOk).sort(), reasons, nBand, zBand };
}

function countReason(reasons: Record<string, number>, reason: string): void {
  reasons[reason] = (reasons[reason] ?? 0) + 1;
}

/** Delta method: g_k = d quantity / d z_k by central differences, steps of 1e-3 standard deviations (1e-6 relative for a zero variance). */
function deltaGradient(sizer: Sizer, map: ParameterMap, quantity: (s: Sizer) => { value: number; status: string }): Float64Array {
  const n = map.free.length;
  const theta = sizer.sys.theta;
  const g = new Float64Array(n);
  const z = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const sd = Math.sqrt(map.covariance[k * n + k]);
    const h = sd > 0 ? 1e-3 * sd : 1e-6 * Math.max(1, Math.abs(map.internal[k]));
    z.set(map.internal);
    z[k] += h;
    applyInternal(map, z, theta);
    const up = quantity(sizer).value;
    z[k] -= 2 * h;
    applyInternal(map, z, theta);
    const dn = quantity(sizer).value;
    g[k] = (up - dn) / (2 * h);
  }
  return g;
}

/** sd = sqrt(g' Cov g); NaN when a derivative could not be computed. */
function deltaStdDev(map: ParameterMap, g: Float64Array): number {
  const n = g.length;
  if (!g.every(Number.isFinite)) return NaN;
  let varQ = 0;
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) varQ += g[i] * map.covariance[i * n + k] * g[k];
  return Math.sqrt(Math.max(varQ, 0));
}

/** d ln(quantity)/d z_k = g_k / nominal per free parameter, and per standard error. */
function sensitivities(map: ParameterMap, g: Float64Array, nominal: number): Sensitivity[] {
  const n = map.free.length;
  return map.free.map((name, k) => ({
    name,
    transform: map.transform[k],
    dLnQuantity: g[k] / nominal,
    perStdError: (g[k] / nominal) * Math.sqrt(Math.max(map.covariance[k * n + k], 0)),
    unit: map.transform[k] === 'log' || map.units[k] === '1' ? '1' : `1/(${map.units[k]})`,
  }));
}

/**
 * Conversion band along the normalised size (positions `grid` x S) and outlet band at the band size
 * S, over the band draws' parameter vectors `zBand`; each draw rated in one integration through the
 * grid and S (a stirred tank: one solve per position).
 */
function uncertaintyBands(sizer: Sizer, map: ParameterMap, zBand: Float64Array, nBand: number, key: number, S: number, profileGrid?: number[]): Pick<UncertaintyResult, 'band' | 'outletBand'> {
  const n = map.free.length;
  const theta = sizer.sys.theta;
  const nS = sizer.sys.nS;
  const grid = profileGrid ?? Array.from({ length: 31 }, (_, i) => i * 0.05);
  const pos = grid.map((f) => f * S);
  // Positions evaluated in one integration per draw: the grid and the band size, ascending.
  const evalPos = Array.from(new Set([...pos, S])).sort((a, b) => a - b);
  const gridAt = pos.map((p) => evalPos.indexOf(p));
  const atS = evalPos.indexOf(S);
  const conv: number[][] = grid.map(() => []);
  const outs: number[][] = Array.from({ length: nS }, () => []);
  const pushOutlet = (y: ArrayLike<number>) => {
    for (let j = 0; j < nS; j++) outs[j].push(Math.max(y[j], 0));
  };
  for (let d = 0; d < nBand; d++) {
    applyInternal(map, zBand.subarray(d * n, (d + 1) * n), theta);
    if (sizer.sys.kase.reactor.kind === 'stirred-tank') {
      pos.forEach((p, i) => {
        const r = p > 0 ? sizer.rate(p) : { status: 'sized', y: sizer.sys.y0 };
        if (r.status === 'sized') conv[i].push(sizer.conversion(r.y, key));
      });
      const r = sizer.rate(S);
      if (r.status === 'sized') pushOutlet(r.y);
    } else {
      const r = sizer.rate(evalPos[evalPos.length - 1], evalPos) as SizeOnce & { profile?: { x: number[]; y: Float64Array[] } };
      const ys = r.profile?.y ?? [];
      gridAt.forEach((k, i) => {
        if (k < ys.length) conv[i].push(sizer.conversion(ys[k], key));
      });
      if (atS < ys.length) pushOutlet(ys[atS]);
    }
  }
  const q = (a: number[], p: number) => quantileSorted(a.sort((x, y) => x - y), p);
  const band = { x: grid, median: conv.map((a) => q(a, 0.5)), p5: conv.map((a) => q(a, 0.05)), p95: conv.map((a) => q(a, 0.95)), draws: nBand, key: sizer.sys.kase.species[key] };
  if (outs[0].length === 0) return { band };
  return { band, outletBand: { at: S, p5: outs.map((a) => q(a, 0.05)), p95: outs.map((a) => q(a, 0.95)), draws: outs[0].length } };
}
