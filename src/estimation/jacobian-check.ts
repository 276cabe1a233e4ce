/**
 * Check a model's exact Jacobian against central differences: the checked fallback behind the
 * exact sensitivities (common practice; see e.g. Nocedal & Wright, Numerical Optimization, 2nd ed.,
 * sec. 8.1, on derivative checking). Step h_k = step * max(1, |theta_k|) in the estimation space.
 */
import type { RegressionModel } from './model.js';

export interface JacobianCheck {
  /** Exact Jacobian from the model (n x p, row-major). */
  exact: Float64Array;
  /** Central-difference Jacobian (n x p, row-major). */
  central: Float64Array;
  /** Largest |exact - central| / max(|central|, floor * column max) over all entries. */
  maxRelativeDifference: number;
  /** False when the model could not be evaluated at theta or at a shifted point. */
  ok: boolean;
}

export interface JacobianCheckOptions {
  /** Relative step; default 1e-5. */
  step?: number;
  /** Floor of the denominator, as a fraction of the column's largest exact entry; default 1e-6. */
  floor?: number;
}

export function checkJacobian(model: RegressionModel, theta: Float64Array, options: JacobianCheckOptions = {}): JacobianCheck {
  const n = model.nObservations;
  const p = theta.length;
  const step = options.step ?? 1e-5;
  const floor = options.floor ?? 1e-6;
  const exact = new Float64Array(n * p);
  const central = new Float64Array(n * p);
  let ok = !!model.jacobian && model.jacobian(theta, new Float64Array(n), exact);
  const plus = new Float64Array(n);
  const minus = new Float64Array(n);
  let maxRel = 0;
  for (let k = 0; k < p; k++) {
    const h = step * Math.max(1, Math.abs(theta[k]));
    const tp = theta.slice();
    const tm = theta.slice();
    tp[k] += h;
    tm[k] -= h;
    ok = model.predict(tp, plus) && ok;
    ok = model.predict(tm, minus) && ok;
    let colMax = 0;
    for (let i = 0; i < n; i++) colMax = Math.max(colMax, Math.abs(exact[i * p + k]));
    for (let i = 0; i < n; i++) {
      const fd = (plus[i] - minus[i]) / (2 * h);
      central[i * p + k] = fd;
      const denom = Math.max(Math.abs(fd), floor * colMax);
      if (denom > 0) maxRel = Math.max(maxRel, Math.abs(exact[i * p + k] - fd) / denom);
    }
  }
  return { exact, central, maxRelativeDifference: maxRel, ok };
}
