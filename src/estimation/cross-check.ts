/**
 * Cross-check of a least-squares optimum by an independent solver: the card package
 * ml-levenberg-marquardt (damped Gauss-Newton after K. Levenberg 1944 and D. W. Marquardt 1963,
 * "An algorithm for least-squares estimation of nonlinear parameters", J. SIAM 11(2), 431-441;
 * wrapped in card-lm.ts) is started from the reported estimates and run to its own convergence on
 * the same model and data. The agreement is measured as the number of significant digits the two
 * estimates share (-log10 of the largest relative difference) and the relative difference of the
 * weighted SSR.
 *
 * What it proves: the package's own iteration, which shares no code with the default solver
 * (lm.ts), finds no point with a lower SSR near the reported estimates, and stops where they are to
 * the digits shown. What it does not prove: that the minimum is global (that is the multistart's
 * job), that the model or the data are right, or that the predictions are integrated accurately
 * (the study cross-check re-integrates them with odex for that).
 */
import type { FitData, FitResult } from './fit-types.js';
import { fitModel } from './fit.js';
import type { RegressionModel } from './model.js';
import { ResidualProblem } from './residuals.js';
import { applyWhitening } from './whiten.js';

/** Weighted SSR of `model` at theta (estimation space) as a fit computes it (whitening included); null when the model fails. */
export function weightedSsr(model: RegressionModel, data: FitData, theta: Float64Array): number | null {
  const problem = new ResidualProblem({ model, measured: data.measured, sigma: data.sigma, thetaFull: theta, freeIndex: [], ...(data.whiten?.length ? { whiten: data.whiten } : {}) });
  const r = new Float64Array(model.nObservations);
  if (!problem.residuals(new Float64Array(0), r)) return null;
  let ssr = 0;
  for (let i = 0; i < r.length; i++) ssr += r[i] * r[i];
  return ssr;
}

/**
 * Weighted SSR of given predictions (one per observation, as the model orders them): the scaled
 * residuals (y - f) / sigma, whitened within correlated blocks, squared and summed, as
 * ResidualProblem.residuals forms them.
 */
export function ssrOfPredictions(data: FitData, predictions: ArrayLike<number>): number {
  const r = Float64Array.from(data.measured, (y, i) => (y - predictions[i]) * (1 / data.sigma[i]));
  if (data.whiten?.length) applyWhitening(data.whiten, r);
  let ssr = 0;
  for (let i = 0; i < r.length; i++) ssr += r[i] * r[i];
  return ssr;
}

/** Significant digits shared by a and b: -log10 |a - b| / |b|, 16 when equal, 0 at most 1 apart. */
export function sharedDigits(a: number, b: number): number {
  if (a === b) return 16;
  const rel = Math.abs(a - b) / Math.max(Math.abs(b), Number.MIN_VALUE);
  return Math.max(0, Math.min(16, -Math.log10(rel)));
}

/** One parameter: the reported estimate and the package's. */
export interface EstimateAgreement {
  name: string;
  unit: string;
  reported: number;
  recheck: number;
  /** |recheck - reported| / |reported|. */
  relativeDifference: number;
}

/** The optimum re-solved by ml-levenberg-marquardt from the reported estimates. */
export interface OptimumCrossCheck {
  /** The package's status (card-lm.ts): 'converged-gtol', 'converged-ftol', 'max-iterations', ... */
  solverStatus: string;
  solverMessage: string;
  iterations: number;
  estimates: EstimateAgreement[];
  /** Fewest significant digits shared by a reported and a re-solved free estimate. */
  digits: number;
  ssrReported: number;
  ssrRecheck: number;
  ssrRelativeDifference: number;
}

/** Re-solve the optimum of `fit` (a fit of `model` to `data`) with the card package. */
export function crossCheckOptimum(model: RegressionModel, data: FitData, fit: FitResult): OptimumCrossCheck {
  const again = fitModel(model, fit.parameters, data, { solver: 'card', profile: false });
  const estimates: EstimateAgreement[] = [];
  fit.parameters.forEach((p, i) => {
    if (p.fixed) return;
    const q = again.parameters[i];
    estimates.push({ name: p.name, unit: p.unit, reported: p.value, recheck: q.value, relativeDifference: Math.abs(q.value - p.value) / Math.max(Math.abs(p.value), Number.MIN_VALUE) });
  });
  const digits = Math.min(16, ...estimates.map((e) => sharedDigits(e.recheck, e.reported)));
  const ssrReported = fit.statistics.ssr;
  const ssrRecheck = again.statistics.ssr;
  return {
    solverStatus: again.statistics.solverStatus,
    solverMessage: again.statistics.solverMessage,
    iterations: again.statistics.iterations,
    estimates,
    digits,
    ssrReported,
    ssrRecheck,
    ssrRelativeDifference: Math.abs(ssrRecheck - ssrReported) / Math.max(Math.abs(ssrReported), Number.MIN_VALUE),
  };
}
