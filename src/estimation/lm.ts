/**
 * Trust-region Levenberg-Marquardt with variable scaling.
 *
 * Method: J. J. More (1978), "The Levenberg-Marquardt algorithm: implementation and theory", in
 * Numerical Analysis (G. A. Watson, ed.), Springer LNM 630, 105-116; the
 * outer loop, scaling (D = running maximum of the Jacobian column norms), trust-radius update and the
 * ftol / xtol / gtol tests follow MINPACK lmder (More, Garbow & Hillstrom 1980, ANL-80-74). The
 * Levenberg-Marquardt parameter for ||D p|| <= Delta is found by More's safeguarded Newton iteration
 * on phi(alpha) = ||p(alpha)|| - Delta, evaluated through the SVD of J D^-1 (as SciPy's
 * solve_lsq_trust_region does) instead of MINPACK's QR, which also copes with a rank-deficient J.
 *
 * Bounds (in the estimation space) are handled by an active set plus projection: a variable sitting
 * on a bound whose gradient points outward is frozen for the step, the trial point is clamped into
 * the box, and the predicted reduction is computed for the clamped step actually taken, so the
 * acceptance ratio stays honest. The gradient test uses the projected gradient.
 *
 * A failed model evaluation at a trial point (predict returns false, throws, or gives non-finite
 * values) counts as a rejected step: the trust radius shrinks tenfold. If failures shrink the radius
 * to the xtol level, the status is 'model-failure', never a convergence.
 */
import { outcome, type Outcome } from '../core/outcome.js';
import { svd } from '../numerics/svd.js';
import type { LeastSquaresProblem } from './residuals.js';
import { FIT_STATUS, type FitStatus } from './status.js';

export interface LmOptions {
  /** Lower bounds of x in the estimation space; default -Infinity. */
  lower?: Float64Array;
  /** Upper bounds of x in the estimation space; default +Infinity. */
  upper?: Float64Array;
  /** Relative reduction of the sum of squares below which the fit has converged; default 1e-12. */
  ftol?: number;
  /** Relative trust-radius size (vs ||D x||) below which the fit has converged; default 1e-12. */
  xtol?: number;
  /** Largest cosine between residual vector and any Jacobian column at convergence; default 1e-10. */
  gtol?: number;
  /** Maximum accepted iterations; default 200. */
  maxIterations?: number;
  /** Maximum model evaluations (finite-difference ones included); default 200 (n + 1) + 1000. */
  maxEvaluations?: number;
  /** Initial trust radius factor (Delta0 = factor ||D x0||, or factor if zero); default 100. */
  factor?: number;
}

export interface LmResult extends Outcome<FitStatus> {
  /** Final parameters (estimation space). */
  x: Float64Array;
  /** Weighted residuals at x. */
  residuals: Float64Array;
  /** Sum of squared weighted residuals at x. */
  ssr: number;
  /** Accepted iterations. */
  iterations: number;
  /** Model evaluations counted by the problem. */
  evaluations: number;
  /** Indices of parameters that ended on a bound. */
  atBound: number[];
  /** Trial points at which the model could not be evaluated (each counted as a rejected step). */
  failedTrials: number;
}

const EPS = 2.220446049250313e-16;

function norm(v: ArrayLike<number>, n = v.length): number {
  let s = 0;
  for (let i = 0; i < n; i++) s += v[i] * v[i];
  return Math.sqrt(s);
}

/** The solver result at x (copied): status from the table, SSR, parameters on a bound. Shared with card-lm.ts. */
export function lmResult(a: {
  x: Float64Array;
  r: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  status: FitStatus;
  iterations: number;
  evaluations: number;
  failedTrials: number;
  detail?: string;
}): LmResult {
  const atBound: number[] = [];
  for (let j = 0; j < a.x.length; j++) if (a.x[j] <= a.lower[j] || a.x[j] >= a.upper[j]) atBound.push(j);
  let ssr = 0;
  for (let i = 0; i < a.r.length; i++) ssr += a.r[i] * a.r[i];
  return {
    ...outcome(FIT_STATUS, a.status, [], a.detail),
    x: Float64Array.from(a.x),
    residuals: Float64Array.from(a.r),
    ssr,
    iterations: a.iterations,
    evaluations: a.evaluations,
    atBound,
    failedTrials: a.failedTrials,
  };
}

/**
 * Minimise ||r(x)||^2 from x0 (not mutated). Bad input throws; numerical trouble is a status.
 */
export function levenbergMarquardt(problem: LeastSquaresProblem, x0: Float64Array, options: LmOptions = {}): LmResult {
  const m = problem.m;
  const n = problem.n;
  const ftol = options.ftol ?? 1e-12;
  const xtol = options.xtol ?? 1e-12;
  const gtol = options.gtol ?? 1e-10;
  const maxIter = options.maxIterations ?? 200;
  const maxEval = options.maxEvaluations ?? 200 * (n + 1) + 1000;
  const factor = options.factor ?? 100;
  const lower = options.lower ?? new Float64Array(n).fill(-Infinity);
  const upper = options.upper ?? new Float64Array(n).fill(Infinity);
  const ev0 = problem.evaluations;

  const x = new Float64Array(n);
  for (let j = 0; j < n; j++) x[j] = Math.min(Math.max(x0[j], lower[j]), upper[j]);
  const r = new Float64Array(m);
  const rt = new Float64Array(m);
  const xt = new Float64Array(n);
  const J = new Float64Array(m * n);
  const diag = new Float64Array(n);
  const cn = new Float64Array(n);
  const g = new Float64Array(n);
  const pEff = new Float64Array(n);
  const Jp = new Float64Array(m);

  const finish = (status: FitStatus, iterations: number, detail?: string): LmResult =>
    lmResult({ x, r, lower, upper, status, iterations, evaluations: problem.evaluations - ev0, failedTrials, ...(detail !== undefined ? { detail } : {}) });
  let failedTrials = 0;

  if (!problem.residuals(x, r)) {
    r.fill(0);
    return finish('model-failure', 0, 'the model failed at the starting point');
  }
  let fnorm = norm(r);
  if (n === 0) return finish('converged-gtol', 0, 'no free parameters');

  let iter = 0;
  let par = 0;
  let delta = 0;
  let xnorm = 0;
  let first = true;

  for (;;) {
    if (!problem.jacobian(x, r, J)) return finish('model-failure', iter, 'the Jacobian could not be evaluated');
    if (problem.evaluations - ev0 >= maxEval) return finish('max-evaluations', iter);
    for (let j = 0; j < n; j++) {
      let s = 0;
      let gj = 0;
      for (let i = 0; i < m; i++) {
        const v = J[i * n + j];
        s += v * v;
        gj += v * r[i];
      }
      cn[j] = Math.sqrt(s);
      g[j] = gj; // gradient of ||r||^2 / 2
    }
    if (first) {
      for (let j = 0; j < n; j++) diag[j] = cn[j] === 0 ? 1 : cn[j];
      let s = 0;
      for (let j = 0; j < n; j++) s += (diag[j] * x[j]) ** 2;
      xnorm = Math.sqrt(s);
      delta = xnorm === 0 ? factor : factor * xnorm;
    } else {
      for (let j = 0; j < n; j++) diag[j] = Math.max(diag[j], cn[j]);
    }
    // Active set: a variable on a bound whose descent direction points outward is frozen.
    const free: number[] = [];
    for (let j = 0; j < n; j++) {
      const blockedLow = x[j] <= lower[j] && g[j] > 0;
      const blockedHigh = x[j] >= upper[j] && g[j] < 0;
      if (!blockedLow && !blockedHigh) free.push(j);
    }
    // Gradient test on the projected gradient.
    let gnorm = 0;
    if (fnorm > 0) {
      for (const j of free) if (cn[j] > 0) gnorm = Math.max(gnorm, Math.abs(g[j]) / (cn[j] * fnorm));
    }
    if (gnorm <= gtol) return finish('converged-gtol', iter);
    if (free.length === 0) return finish('converged-gtol', iter, 'every parameter is held by a bound');

    // SVD of the scaled Jacobian restricted to the free variables.
    const nf = free.length;
    const Js = new Float64Array(m * nf);
    for (let i = 0; i < m; i++) for (let k = 0; k < nf; k++) Js[i * nf + k] = J[i * n + free[k]] / diag[free[k]];
    const d = svd(Js, m, nf);
    const uf = new Float64Array(nf);
    for (let k = 0; k < nf; k++) {
      let s = 0;
      for (let i = 0; i < m; i++) s += d.U[i * nf + k] * r[i];
      uf[k] = s;
    }
    const q = new Float64Array(nf);

    let lastWasFailure = false;
    // Inner loop: repeat until a step is accepted.
    for (;;) {
      par = lmParameter(d.s, d.V, uf, delta, par, q, Math.max(m, nf));
      pEff.fill(0);
      for (let k = 0; k < nf; k++) {
        const j = free[k];
        const xj = Math.min(Math.max(x[j] + q[k] / diag[j], lower[j]), upper[j]);
        xt[j] = xj;
        pEff[j] = xj - x[j];
      }
      for (let j = 0; j < n; j++) if (!free.includes(j)) xt[j] = x[j];
      let pnorm = 0;
      for (let j = 0; j < n; j++) pnorm += (diag[j] * pEff[j]) ** 2;
      pnorm = Math.sqrt(pnorm);
      if (first) delta = Math.min(delta, pnorm);

      const ok = problem.residuals(xt, rt);
      let ratio: number;
      let actred: number;
      let prered = 0;
      let fnorm1 = Infinity;
      if (!ok) {
        failedTrials++;
        lastWasFailure = true;
        ratio = -1;
        actred = -1;
        delta = 0.1 * Math.min(delta, pnorm / 0.1);
        par *= 10;
      } else {
        lastWasFailure = false;
        fnorm1 = norm(rt);
        actred = 0.1 * fnorm1 < fnorm ? 1 - (fnorm1 / fnorm) ** 2 : -1;
        // Predicted reduction of the linear model for the clamped step: (||r||^2 - ||r + J p||^2)/||r||^2.
        let rJp = 0;
        let JpJp = 0;
        for (let i = 0; i < m; i++) {
          let s = 0;
          for (let j = 0; j < n; j++) s += J[i * n + j] * pEff[j];
          Jp[i] = s;
          rJp += r[i] * s;
          JpJp += s * s;
        }
        const f2 = fnorm * fnorm;
        prered = f2 > 0 ? Math.max(0, (-2 * rJp - JpJp) / f2) : 0;
        const dirder = f2 > 0 ? rJp / f2 : 0;
        ratio = prered !== 0 ? actred / prered : 0;
        if (ratio <= 0.25) {
          let temp = actred >= 0 ? 0.5 : (0.5 * dirder) / (dirder + 0.5 * actred);
          if (0.1 * fnorm1 >= fnorm || temp < 0.1 || !Number.isFinite(temp)) temp = 0.1;
          delta = temp * Math.min(delta, pnorm / 0.1);
          par /= temp;
        } else if (par === 0 || ratio >= 0.75) {
          delta = pnorm / 0.5;
          par *= 0.5;
        }
      }
      first = false;
      if (ratio >= 1e-4) {
        x.set(xt);
        r.set(rt);
        fnorm = fnorm1;
        let s = 0;
        for (let j = 0; j < n; j++) s += (diag[j] * x[j]) ** 2;
        xnorm = Math.sqrt(s);
        iter++;
      }
      // Convergence tests (MINPACK lmder, info 1-3 and, at machine precision, 6-8).
      if (ok && Math.abs(actred) <= ftol && prered <= ftol && 0.5 * ratio <= 1) return finish('converged-ftol', iter);
      if (delta <= xtol * xnorm) {
        if (lastWasFailure) return finish('model-failure', iter, 'the model failed at every trial point near the estimate');
        return finish('converged-xtol', iter);
      }
      if (problem.evaluations - ev0 >= maxEval) return finish('max-evaluations', iter);
      if (ok && Math.abs(actred) <= EPS && prered <= EPS && 0.5 * ratio <= 1) {
        return finish('converged-ftol', iter, 'no further reduction possible at machine precision');
      }
      if (delta <= EPS * xnorm) {
        if (lastWasFailure) return finish('model-failure', iter, 'the model failed at every trial point near the estimate');
        return finish('converged-xtol', iter, 'no further improvement possible at machine precision');
      }
      if (!(delta > 0)) return finish(lastWasFailure ? 'model-failure' : 'converged-xtol', iter, 'trust radius collapsed');
      if (ratio >= 1e-4) break;
    }
    if (iter >= maxIter) return finish('max-iterations', iter);
  }
}

/**
 * Levenberg-Marquardt parameter alpha and scaled step q (written into `q`) with ||q|| ~ Delta for
 * min ||Js q + r|| given the SVD Js = U S V' and uf = U' r (More 1978, section 5, via the SVD).
 */
function lmParameter(
  s: Float64Array,
  V: Float64Array,
  uf: Float64Array,
  delta: number,
  initialAlpha: number,
  q: Float64Array,
  rows: number,
): number {
  const n = s.length;
  const threshold = EPS * rows * s[0];
  const fullRank = s[n - 1] > threshold;
  const suf = new Float64Array(n);
  for (let k = 0; k < n; k++) suf[k] = s[k] * uf[k];
  const stepFor = (alpha: number): void => {
    for (let i = 0; i < n; i++) {
      let v = 0;
      for (let k = 0; k < n; k++) {
        const den = s[k] * s[k] + alpha;
        if (den > 0 && s[k] > (alpha === 0 ? threshold : 0)) v += (V[i * n + k] * suf[k]) / den;
      }
      q[i] = -v;
    }
  };
  if (fullRank) {
    stepFor(0);
    if (norm(q) <= delta) return 0;
  }
  const phiAnd = (alpha: number): [number, number] => {
    let pn = 0;
    let d3 = 0;
    for (let k = 0; k < n; k++) {
      const den = s[k] * s[k] + alpha;
      if (den <= 0) continue;
      pn += (suf[k] / den) ** 2;
      d3 += (suf[k] * suf[k]) / (den * den * den);
    }
    pn = Math.sqrt(pn);
    return [pn - delta, pn > 0 ? -d3 / pn : 0];
  };
  let alphaUpper = norm(suf) / delta;
  let alphaLower = 0;
  if (fullRank) {
    const [phi0, dphi0] = phiAnd(0);
    alphaLower = dphi0 !== 0 ? -phi0 / dphi0 : 0;
  }
  let alpha =
    initialAlpha > 0 && fullRank ? initialAlpha : Math.max(0.001 * alphaUpper, Math.sqrt(alphaLower * alphaUpper));
  for (let it = 0; it < 10; it++) {
    if (alpha < alphaLower || alpha > alphaUpper) alpha = Math.max(0.001 * alphaUpper, Math.sqrt(alphaLower * alphaUpper));
    const [phi, dphi] = phiAnd(alpha);
    if (phi < 0) alphaUpper = alpha;
    if (dphi === 0) break;
    const ratio = phi / dphi;
    alphaLower = Math.max(alphaLower, alpha - ratio);
    alpha -= ((phi + delta) * ratio) / delta;
    if (Math.abs(phi) < 0.01 * delta) break;
  }
  if (!(alpha > 0)) alpha = Math.max(alphaLower, EPS * (s[0] * s[0] || 1));
  stepFor(alpha);
  const qn = norm(q);
  if (qn > 0) for (let i = 0; i < n; i++) q[i] *= delta / qn;
  return alpha;
}
