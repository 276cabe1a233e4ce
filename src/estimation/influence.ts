/**
 * Outlying and influential observations, with thresholds calibrated so that a correctly specified
 * model rarely raises the warning (tests/estimation/influence.test.ts and the slow coverage study
 * measure the false-warning rate over replicate fits; the limit is 5 %, the rules aim at 1 %).
 *
 * - Outlier test: the externally studentised residual t_i = r_i sqrt((n-p-1)/(n-p-r_i^2)) (r_i the
 *   internally studentised one) against the Bonferroni bound t(1 - alpha/(2n); n-p-1), or the
 *   normal quantile z(1 - alpha/(2n)) when sigma is known (Weisberg 2005, "Applied Linear
 *   Regression", 3rd ed., section 9.1.3, outlier test with the Bonferroni correction; from
 *   memory). alpha is the family-wise rate of false warnings, default 0.01.
 * - Influence: Cook's distance D_i (Cook 1977, Technometrics 19, 15-18) above the median of
 *   F(p, n - p), the mark Cook & Weisberg (1982, "Residuals and Influence in Regression", section
 *   3.5) give for a deletion that moves the estimate to the edge of its 50 % confidence region.
 *   D_i = r_i^2 h_i / (p (1 - h_i)): at a high-leverage run (h_i near 0.5, common with a few runs
 *   and correlated responses) ordinary noise passes that mark in a fifth of the fits, so on its
 *   own it is no test. An observation is therefore named only when it fails the outlier test; the
 *   reason then says whether dropping it would also move the estimates beyond that mark. (The
 *   old rule, D_i > 4/n, fired on nearly every correct fit with many observations.)
 */
import { fQuantile, normalQuantile, studentTQuantile } from './distributions.js';
import type { InfluentialObservation } from './fit-types.js';

export interface InfluenceOptions {
  /** Family-wise rate of false outlier warnings on correct data (Bonferroni over n); default 0.01. */
  outlierLevel?: number;
}

export interface InfluenceThresholds {
  /** Cook's distance above which dropping the observation moves the estimates notably: median of F(p, n - p). */
  cooks: number;
  /** |externally studentised residual| above which an observation is an outlier. */
  studentized: number;
}

/** The thresholds for n observations and p free parameters (null when n - p - 1 < 1). */
export function influenceThresholds(n: number, p: number, sigmaKnown: boolean, options: InfluenceOptions = {}): InfluenceThresholds | null {
  if (p < 1 || n - p - 1 < 1) return null;
  const alpha = options.outlierLevel ?? 0.01;
  const q = 1 - alpha / (2 * n);
  return {
    cooks: fQuantile(0.5, p, n - p),
    studentized: sigmaKnown ? normalQuantile(q) : studentTQuantile(q, n - p - 1),
  };
}

/** Externally studentised residual from the internal one (exact for a linear model); null passes through. */
export function externalStudentized(internal: number | null, n: number, p: number, sigmaKnown: boolean): number | null {
  if (internal === null) return null;
  if (sigmaKnown) return internal;
  const dof = n - p;
  const den = dof - internal * internal;
  if (!(den > 0) || dof - 1 < 1) return internal >= 0 ? Infinity : -Infinity;
  return internal * Math.sqrt((dof - 1) / den);
}

/** Observations that fail the outlier test, with the reason (and their influence) in words. */
export function findInfluential(
  studentized: readonly (number | null)[],
  cooks: readonly (number | null)[],
  n: number,
  p: number,
  sigmaKnown: boolean,
  options: InfluenceOptions = {},
): InfluentialObservation[] {
  const t = influenceThresholds(n, p, sigmaKnown, options);
  if (!t) return [];
  const out: InfluentialObservation[] = [];
  for (let i = 0; i < studentized.length; i++) {
    const ext = externalStudentized(studentized[i], n, p, sigmaKnown);
    if (ext === null || !(Math.abs(ext) > t.studentized)) continue;
    const cook = cooks[i];
    const moves = cook !== null && cook > t.cooks;
    const reason =
      `|studentized residual| ${Math.abs(ext).toFixed(2)} > Bonferroni bound ${t.studentized.toFixed(2)}` +
      (cook === null ? '' : moves
        ? `; Cook's distance ${cook.toFixed(3)} > median of F(${p}, ${n - p}) = ${t.cooks.toFixed(3)}: dropping it moves the estimates beyond their 50% confidence region`
        : `; Cook's distance ${cook.toFixed(3)}: dropping it changes the estimates little`);
    out.push({ index: i, cooksDistance: cook, studentizedResidual: studentized[i], movesEstimates: moves, reason });
  }
  return out;
}
