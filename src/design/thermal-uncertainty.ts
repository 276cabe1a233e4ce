/**
 * The kinetic uncertainty carried into the installed cooled tube: for each Monte Carlo parameter
 * vector (the same seeded, correlated draws as uncertainty.ts: z = z_hat + L e), the designed tube
 * (tube count and catalyst per tube fixed) is rated and its hot spot, outlet temperature and
 * conversion recorded; percentiles are type 7 (uncertainty.ts quantileSorted). The runaway margin
 * (runaway.ts) is computed for the first `runawayDraws` vectors only, since each needs a scan of
 * the coolant temperature; its percentiles say how many draws they rest on.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { ThermalTube } from '../reactors/thermal/thermal-tube.js';
import type { ThermalTubeSpec } from '../reactors/thermal/tube-balances.js';
import { applyInternal, type ParameterMap } from './handoff-load.js';
import { SeededRandom, cholesky, correlatedDraw } from './random.js';
import { runawayMargin } from './runaway.js';
import { histogramSorted, quantileSorted, type Percentile } from './uncertainty.js';

export interface DrawSummary {
  /** Draws that gave a value / all draws. */
  succeeded: number;
  draws: number;
  median: number;
  percentiles: Percentile[];
  histogram: { start: number; end: number; count: number }[];
}

export interface ThermalDraws {
  hotSpot: DrawSummary;
  outletTemperature: DrawSummary;
  conversion: DrawSummary;
  /** Runaway margin (K) over the first draws. */
  runawayMargin: DrawSummary;
  /** Draws whose march ran away, failed or did not converge, by status. */
  failed: Record<string, number>;
  seed: number;
}

function summarize(values: number[], draws: number, levels: number[]): DrawSummary {
  const ok = Float64Array.from(values.filter(Number.isFinite)).sort();
  return {
    succeeded: ok.length,
    draws,
    median: quantileSorted(ok, 0.5),
    percentiles: [0.5, ...levels].map((level) => ({ level, value: quantileSorted(ok, level) })),
    histogram: histogramSorted(ok),
  };
}

/** Rate the designed tube (spec, size W per tube) over the draws of the hand-off covariance. */
export function thermalDraws(
  spec: ThermalTubeSpec, kinetics: CompiledKinetics, map: ParameterMap, theta: Float64Array, W: number, key: number,
  opts: { draws: number; seed: number; levels: number[]; runawayDraws?: number; onProgress?: (done: number, total: number) => void },
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
  const nRun = Math.min(opts.runawayDraws ?? 20, opts.draws);
  for (let d = 0; d < opts.draws && L; d++) {
    correlatedDraw(rng, map.internal, L, n, e, z);
    applyInternal(map, z, theta);
    const sol = tube.solve(W, { rtol: 1e-7 });
    if (sol.success) {
      hot.push(sol.hotSpot.temperature);
      outT.push(sol.outletTemperature);
      conv.push((spec.F0[key] - sol.outlet[key]) / spec.F0[key]);
    } else failed[sol.status] = (failed[sol.status] ?? 0) + 1;
    if (d < nRun && spec.mode !== 'adiabatic') {
      const m = runawayMargin(spec, kinetics, theta, W, { below: 30, above: 50, step: 2 });
      margins.push(m.margin ?? NaN);
    }
    if (opts.onProgress && ((d + 1) % 100 === 0 || d + 1 === opts.draws)) opts.onProgress(d + 1, opts.draws);
  }
  if (!L) failed['covariance-not-positive-semidefinite'] = opts.draws;
  theta.set(map.theta);
  return {
    hotSpot: summarize(hot, opts.draws, opts.levels),
    outletTemperature: summarize(outT, opts.draws, opts.levels),
    conversion: summarize(conv, opts.draws, opts.levels),
    runawayMargin: summarize(margins, nRun, opts.levels),
    failed,
    seed: opts.seed,
  };
}
