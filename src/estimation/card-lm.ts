/**
 * Wrapper around the card package ml-levenberg-marquardt (v5; damped Gauss-Newton after
 * K. Levenberg 1944 and D. W. Marquardt 1963, "An algorithm for least-squares estimation of nonlinear
 * parameters", J. SIAM 11(2), 431-441), giving it the same interface and status table as lm.ts.
 *
 * How the package treats `weights` (read from its source, proven in tests/estimation/card-lm.test.ts):
 * check_options turns each weight w_i into weightSquare_i = 1 / w_i^2. The error it minimises and uses
 * to keep the best point is sum (y_i - f_i)^2 / weightSquare_i = sum (w_i (y_i - f_i))^2, so there
 * w_i MULTIPLIES the residual (w_i acts as 1/sigma_i). But its step solves
 * (J' diag(weightSquare) J + lambda I) dp = J' diag(weightSquare) r, i.e. there the squared residuals
 * are weighted by 1/w_i^2 (w_i acts as sigma_i). The two disagree unless all w_i are equal, so a
 * weighted fit through `weights` is neither weighted solution in general. This wrapper therefore
 * never uses `weights`: it hands the package the already weighted residuals r_i = (y_i - f_i)/sigma_i
 * from residuals.ts (data y = 0, "model" f_i = -r_i, unit weights), so both parts see the same
 * objective sum r_i^2.
 *
 * The package returns no Jacobian, covariance or status. The wrapper supplies the Jacobian through
 * `jacobianFunction` (exact, or the relative-step finite differences of residuals.ts instead of the
 * package's absolute step 0.1), and derives a status afterwards: the MINPACK gradient test
 * (max cosine between r and the Jacobian columns <= gtol) at the returned point gives
 * 'converged-gtol'. The package is run in rounds of `roundIterations`, restarting from its best
 * point; 'converged-ftol' needs both the actual relative error change over the last whole round and
 * the relative reduction predicted by a full Gauss-Newton step (||P_J r||^2/||r||^2, MINPACK's
 * prered) to be <= ftol. Otherwise the run is 'max-iterations', or 'model-failure' when the package
 * stopped early on a non-finite error. Covariance and statistics are
 * computed by fit.ts from a Jacobian recomputed at the solution, as for every solver.
 *
 * The package is not the default solver; see solve.ts for why.
 */
import { levenbergMarquardt as cardLm } from 'ml-levenberg-marquardt';
import { svd, svdRank } from '../numerics/svd.js';
import { lmResult, type LmOptions, type LmResult } from './lm.js';
import type { LeastSquaresProblem } from './residuals.js';
import type { FitStatus } from './status.js';

export interface CardLmOptions extends LmOptions {
  /** Initial damping of the package; default 1e-2 (the package default). */
  damping?: number;
  /** Package iterations per round between error-change checks; default 25. */
  roundIterations?: number;
}

/** Minimise sum r_i^2 with the card package; same inputs and result shape as levenbergMarquardt. */
export function cardLevenbergMarquardt(problem: LeastSquaresProblem, x0: Float64Array, options: CardLmOptions = {}): LmResult {
  const m = problem.m;
  const n = problem.n;
  const ev0 = problem.evaluations;
  const gtol = options.gtol ?? 1e-10;
  const maxIterations = options.maxIterations ?? 200;
  const lower = options.lower ?? new Float64Array(n).fill(-Infinity);
  const upper = options.upper ?? new Float64Array(n).fill(Infinity);
  const r = new Float64Array(m);
  const J = new Float64Array(m * n);
  const xb = new Float64Array(n);
  const xs = Array.from({ length: m }, (_, i) => i);
  const zeros = new Array<number>(m).fill(0);
  let failed = false;

  const finish = (x: Float64Array, status: FitStatus, iterations: number, detail?: string): LmResult => {
    const ok = problem.residuals(x, r);
    if (!ok) r.fill(0);
    return lmResult({ x, r, lower, upper, status: ok ? status : 'model-failure', iterations, evaluations: problem.evaluations - ev0, failedTrials: failed ? 1 : 0, ...(detail !== undefined ? { detail } : {}) });
  };

  if (n === 0) return finish(Float64Array.from(x0), 'converged-gtol', 0, 'no free parameters');
  if (!problem.residuals(x0, r)) return finish(Float64Array.from(x0), 'model-failure', 0, 'the model failed at the starting point');

  // "Model" f_i(x) = -r_i(x) against data y = 0: the package's residual y - f is then r_i.
  const parameterized = (params: number[]) => {
    for (let j = 0; j < n; j++) xb[j] = params[j];
    const rr = new Float64Array(m);
    const ok = problem.residuals(xb, rr);
    if (!ok) failed = true;
    return (i: number): number => (ok ? -rr[i] : NaN);
  };
  // d f_i / d x_j = -d r_i / d x_j.
  const jacobianFunction = (params: number[]) => {
    for (let j = 0; j < n; j++) xb[j] = params[j];
    const rr = new Float64Array(m);
    const JJ = new Float64Array(m * n);
    const ok = problem.residuals(xb, rr) && problem.jacobian(xb, rr, JJ);
    if (!ok) failed = true;
    return (i: number): number[] => {
      const row = new Array<number>(n);
      for (let j = 0; j < n; j++) row[j] = ok ? -JJ[i * n + j] : NaN;
      return row;
    };
  };

  // The package has no convergence test of its own: run it in rounds and watch the error change.
  const round = Math.max(1, Math.min(options.roundIterations ?? 25, maxIterations));
  const ftol = options.ftol ?? 1e-12;
  let xCur = Array.from(x0);
  let errPrev = Infinity;
  let used = 0;
  let relChange = Infinity;
  let stoppedEarly = false;
  while (used < maxIterations) {
    const out = cardLm({ x: xs, y: zeros }, parameterized, {
      initialValues: xCur,
      minValues: Array.from(lower),
      maxValues: Array.from(upper),
      maxIterations: Math.min(round, maxIterations - used),
      errorTolerance: 0,
      damping: options.damping ?? 1e-2,
      jacobianFunction,
    });
    used += out.iterations;
    xCur = out.parameterValues;
    relChange = Number.isFinite(errPrev) && errPrev > 0 ? (errPrev - out.parameterError) / errPrev : Infinity;
    errPrev = out.parameterError;
    if (out.iterations < round && used < maxIterations) {
      stoppedEarly = true;
      break;
    }
    if (relChange <= ftol) break;
  }
  const x = Float64Array.from(xCur);
  // Status: gradient test, then the error-change test (see the header).
  if (!problem.residuals(x, r) || !problem.jacobian(x, r, J)) {
    return finish(x, 'model-failure', used, 'the model could not be evaluated at the returned point');
  }
  let fnorm = 0;
  for (let i = 0; i < m; i++) fnorm += r[i] * r[i];
  fnorm = Math.sqrt(fnorm);
  let gnorm = 0;
  for (let j = 0; j < n; j++) {
    let cn = 0;
    let g = 0;
    for (let i = 0; i < m; i++) {
      cn += J[i * n + j] ** 2;
      g += J[i * n + j] * r[i];
    }
    const blocked = (x[j] <= lower[j] && g > 0) || (x[j] >= upper[j] && g < 0);
    if (cn > 0 && fnorm > 0 && !blocked) gnorm = Math.max(gnorm, Math.abs(g) / (Math.sqrt(cn) * fnorm));
  }
  // Predicted relative reduction of a full Gauss-Newton step: ||P_J r||^2 / ||r||^2 (MINPACK's prered).
  const d = svd(J, m, n);
  const rank = svdRank(d);
  let proj = 0;
  for (let k = 0; k < rank; k++) {
    let u = 0;
    for (let i = 0; i < m; i++) u += d.U[i * n + k] * r[i];
    proj += u * u;
  }
  const prered = fnorm > 0 ? proj / (fnorm * fnorm) : 0;
  const detail = `package iterations ${used}, last-round relative error change ${relChange.toExponential(2)}, predicted ${prered.toExponential(2)}, scaled gradient ${gnorm.toExponential(2)}`;
  if (gnorm <= gtol) return finish(x, 'converged-gtol', used, detail);
  if (Math.abs(relChange) <= ftol && prered <= ftol) return finish(x, 'converged-ftol', used, detail);
  if (stoppedEarly || failed) return finish(x, 'model-failure', used, `${detail}; stopped on a failed evaluation`);
  return finish(x, 'max-iterations', used, detail);
}
