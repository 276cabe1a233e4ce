/**
 * The kinetic uncertainty carried into the installed cooled tube: for each Monte Carlo parameter
 * vector (the same seeded, correlated draws as uncertainty.ts: z = z_hat + L e), the designed tube
 * (tube count and catalyst per tube fixed) is rated and its hot spot, outlet temperature and
 * conversion recorded; percentiles are type 7 (uncertainty.ts quantileSorted), each with its
 * distribution-free 95 % interval from order statistics (order-statistics.ts). The runaway margin
 * needs a scan of the coolant temperature per draw: it is computed for the first `runawayDraws`
 * vectors (default RUNAWAY_DRAWS; the draws are independent, so these are a random subset of the
 * same distribution) by a local scan around the nominal critical coolant temperature
 * (runaway.ts criticalNear), and its percentiles state how many draws they rest on and their
 * order-statistic intervals, which is the error the subset adds.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { ThermalTube } from '../reactors/thermal/thermal-tube.js';
import type { ThermalTubeSpec } from '../reactors/thermal/tube-balances.js';
import { applyInternal, type ParameterMap } from './handoff-load.js';
import { SeededRandom, cholesky, correlatedDraw } from './random.js';
import { criticalNear } from './runaway.js';
import { quantileInterval, type QuantileInterval } from './order-statistics.js';
import { histogramSorted, quantileSorted, type Percentile } from './uncertainty.js';

export interface DrawSummary {
  /** Draws that gave a value / all draws. */
  succeeded: number;
  draws: number;
  median: number;
  percentiles: Percentile[];
  /** Distribution-free 95 % interval of each percentile (same order as percentiles; null below 2 values). */
  intervals: (QuantileInterval | null)[];
  histogram: { start: number; end: number; count: number }[];
}

export interface ThermalDraws {
  hotSpot: DrawSummary;
  outletTemperature: DrawSummary;
  conversion: DrawSummary;
  /** Runaway margin (K) over the first runawayDraws draws, at P50 and the low levels 1 - level (P5, P10): small margins are the risk. */
  runawayMargin: DrawSummary;
  /** Draws whose march ran away, failed or did not converge, by status. */
  failed: Record<string, number>;
  seed: number;
}

/** Draws given a runaway margin by default (each needs a local scan of about 9 tube solves). */
export const RUNAWAY_DRAWS = 100;

function summarize(values: number[], draws: number, levels: number[]): DrawSummary {
  const ok = Float64Array.from(values.filter(Number.isFinite)).sort();
  const at = [0.5, ...levels];
  return {
    succeeded: ok.length,
    draws,
    median: quantileSorted(ok, 0.5),
    percentiles: at.map((level) => ({ level, value: quantileSorted(ok, level) })),
    intervals: at.map((level) => quantileInterval(ok, level)),
    histogram: histogramSorted(ok),
  };
}

/** Rate the designed tube (spec, size W per tube) over the draws of the hand-off covariance. */
export function thermalDraws(
  spec: ThermalTubeSpec, kinetics: CompiledKinetics, map: ParameterMap, theta: Float64Array, W: number, key: number,
  opts: {
    draws: number; seed: number; levels: number[];
    /** Draws with a runaway margin; default RUNAWAY_DRAWS. */
    runawayDraws?: number;
    /** Nominal critical coolant temperature, K (the centre of each draw's local scan); none: no margins. */
    runawayGuess?: number | null;
    onProgress?: (done: number, total: number) => void;
  },
): ThermalDraws {
  const n = map.free.length;
  const L = cholesky(map.covariance, n);
  const rng = new SeededRandom(opts.seed);
  const z = new Float64Array(n);
  const e = new Float64Array(n);
  const tube = new ThermalTube(spec, kinetics, theta);
  const hot: number[] = [];
  const outT: number[] = [];
  const conv: number[] = [];
  const margins: number[] = [];
  const failed: Record<string, number> = {};
  const guess = opts.runawayGuess ?? null;
  const nRun = guess === null || spec.mode === 'adiabatic' ? 0 : Math.min(opts.runawayDraws ?? RUNAWAY_DRAWS, opts.draws);
  for (let d = 0; d < opts.draws && L; d++) {
    correlatedDraw(rng, map.internal, L, n, e, z);
    applyInternal(map, z, theta);
    const sol = tube.solve(W, { rtol: 1e-7 });
    if (sol.success) {
      hot.push(sol.hotSpot.temperature);
      outT.push(sol.outletTemperature);
      conv.push((spec.F0[key] - sol.outlet[key]) / spec.F0[key]);
    } else failed[sol.status] = (failed[sol.status] ?? 0) + 1;
    if (d < nRun) {
      const c = criticalNear(spec, kinetics, theta, W, guess as number);
      margins.push(c === null ? NaN : c - spec.coolantTemperature);
    }
    if (opts.onProgress && ((d + 1) % 100 === 0 || d + 1 === opts.draws)) opts.onProgress(d + 1, opts.draws);
  }
  if (!L) failed['covariance-not-positive-semidefinite'] = opts.draws;
  theta.set(map.theta);
  return {
    hotSpot: summarize(hot, opts.draws, opts.levels),
    outletTemperature: summarize(outT, opts.draws, opts.levels),
    conversion: summarize(conv, opts.draws, opts.levels),
    // the small margins are the conservative side: P5, P10 (for levels 0.95, 0.9) with P50
    runawayMargin: summarize(margins, nRun, opts.levels.map((l) => Math.round((1 - l) * 1e12) / 1e12).sort()),
    failed,
    seed: opts.seed,
  };
}
