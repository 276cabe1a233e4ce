/**
 * Damped Newton method for square nonlinear systems F(x) = 0 (algebraic mole balances), after
 * Dennis & Schnabel, Numerical Methods for Unconstrained Optimization and Nonlinear Equations
 * (1983), sec. 6.3 and alg. A6.3.1: the Newton step from an LU solve of J dx = -F, then a
 * backtracking line search on phi(x) = ||F||^2 / 2 with the Armijo condition
 * phi(x + lambda dx) <= (1 - 2 c lambda) phi(x), c = 1e-4, and safeguarded quadratic
 * backtracking (lambda shrinks by a factor in [0.1, 0.5]).
 *
 * Lower bounds (for example non-negative concentrations) are kept by step truncation: the full
 * step is scaled so that no free component moves more than 99 % of the way to its bound, and
 * components sitting on their bound with a step pointing outwards are held there.
 * The Jacobian is analytic when given, else forward differences with increment
 * sqrt(eps) * max(|x_j|, typicalX_j). Convergence is declared only on the residual,
 * max_i |F_i| <= ftol; a step that becomes negligible while the residual is still large is a
 * failure ('line-search-failed'), never a silent success.
 */
import { outcome, type Outcome, type StatusTable } from '../core/outcome.js';
import { luFactor, luSolve, luRcond, norm1 } from './lu.js';

export type NewtonStatus =
  | 'converged'
  | 'max-iterations'
  | 'singular-jacobian'
  | 'line-search-failed'
  | 'non-finite'
  | 'bad-input';

export const NEWTON_STATUS: StatusTable<NewtonStatus> = {
  converged: { success: true, message: 'Newton iteration converged (residual below ftol)' },
  'max-iterations': { success: false, message: 'Newton iteration did not converge within maxIterations' },
  'singular-jacobian': { success: false, message: 'the Jacobian is singular or numerically singular at the current point' },
  'line-search-failed': {
    success: false,
    message: 'the line search could not reduce the residual (the iteration stalled, possibly at a local minimum of ||F||)',
  },
  'non-finite': { success: false, message: 'the residual function returned a non-finite value at the start point' },
  'bad-input': { success: false, message: 'the Newton input is invalid' },
};

/** Residual F(x) written into `out` (length n). */
export type NewtonResidual = (x: Float64Array, out: Float64Array) => void;
/** Jacobian dF/dx, n x n row-major, written into `out`. */
export type NewtonJacobian = (x: Float64Array, out: Float64Array) => void;

export interface NewtonOptions {
  /** Analytic Jacobian; default forward differences. */
  jac?: NewtonJacobian;
  /** Convergence when max_i |F_i| <= ftol (units of F); default 1e-10. */
  ftol?: number;
  /** Relative step size below which the iteration counts as stalled; default 1e-14. */
  xtol?: number;
  /** Maximum Newton iterations; default 100. */
  maxIterations?: number;
  /** Maximum residual evaluations (including finite-difference columns); default 10000. */
  maxEvaluations?: number;
  /** Lower bounds on x (scalar for all components, or per component); default none. */
  lower?: number | ArrayLike<number>;
  /** Typical magnitude of each x_j for finite-difference increments; default 1. */
  typicalX?: number | ArrayLike<number>;
  /** Reciprocal condition estimate below which J counts as singular; default 1e-14. */
  minRcond?: number;
}

export interface NewtonResult extends Outcome<NewtonStatus> {
  /** Final iterate (the best point found; finite). */
  x: Float64Array;
  /** F at x. */
  residual: Float64Array;
  /** max_i |F_i| at x. */
  residualNorm: number;
  iterations: number;
  evaluations: number;
  jacobianEvaluations: number;
}

const ARMIJO_C = 1e-4;
const MIN_LAMBDA = 1e-10;
const BOUND_FRACTION = 0.99;

function expand(v: number | ArrayLike<number> | undefined, n: number, dflt: number): Float64Array | string {
  const out = new Float64Array(n);
  if (v === undefined) return out.fill(dflt);
  if (typeof v === 'number') return out.fill(v);
  if (v.length !== n) return `has ${v.length} entries but x0 has ${n}`;
  for (let i = 0; i < n; i++) out[i] = v[i];
  return out;
}

/** Solve F(x) = 0 from x0 by damped Newton (see file header). Never throws for numerical trouble. */
export function newton(F: NewtonResidual, x0: ArrayLike<number>, options: NewtonOptions = {}): NewtonResult {
  const n = x0.length;
  const ftol = options.ftol ?? 1e-10;
  const xtol = options.xtol ?? 1e-14;
  const maxIt = options.maxIterations ?? 100;
  const maxEval = options.maxEvaluations ?? 10000;
  const minRcond = options.minRcond ?? 1e-14;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = x0[i];
  const Fx = new Float64Array(n);
  let evaluations = 0;
  let jacEvals = 0;
  let iterations = 0;
  const warnings: { code: string; message: string }[] = [];
  const result = (status: NewtonStatus, detail?: string): NewtonResult => {
    let nrm = 0;
    for (let i = 0; i < n; i++) nrm = Math.max(nrm, Math.abs(Fx[i]));
    return {
      ...outcome(NEWTON_STATUS, status, warnings, detail),
      x: Float64Array.from(x),
      residual: Float64Array.from(Fx),
      residualNorm: nrm,
      iterations,
      evaluations,
      jacobianEvaluations: jacEvals,
    };
  };
  const bad = (msg: string): NewtonResult => ({ ...result('bad-input', msg), residualNorm: Infinity });

  if (n === 0) return bad('x0 is empty');
  for (let i = 0; i < n; i++) if (!Number.isFinite(x[i])) return bad(`x0[${i}] is not finite`);
  if (!(ftol > 0) || !(xtol > 0) || !(maxIt >= 1) || !(maxEval >= 1)) return bad('ftol, xtol, maxIterations and maxEvaluations must be positive');
  const lowerE = expand(options.lower, n, -Infinity);
  if (typeof lowerE === 'string') return bad(`lower ${lowerE}`);
  const typX = expand(options.typicalX, n, 1);
  if (typeof typX === 'string') return bad(`typicalX ${typX}`);
  const lower = lowerE;
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(lower[i])) return bad(`lower[${i}] is NaN`);
    if (x[i] < lower[i]) {
      warnings.push({ code: 'x0-clamped', message: `x0[${i}] = ${x[i]} was below its lower bound and was raised to ${lower[i]}` });
      x[i] = lower[i]; // start inside the feasible set
    }
  }

  const J = new Float64Array(n * n);
  const piv = new Int32Array(n);
  const dx = new Float64Array(n);
  const xt = new Float64Array(n);
  const Ft = new Float64Array(n);
  const work = new Float64Array(n);
  const sq = (v: Float64Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += v[i] * v[i];
    return s;
  };
  const maxAbs = (v: Float64Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) s = Math.max(s, Math.abs(v[i]));
    return s;
  };
  const finite = (v: Float64Array) => {
    for (let i = 0; i < n; i++) if (!Number.isFinite(v[i])) return false;
    return true;
  };

  F(x, Fx);
  evaluations++;
  if (!finite(Fx)) {
    Fx.fill(0);
    return { ...result('non-finite', 'F(x0) is not finite'), residualNorm: Infinity, residual: new Float64Array(n) };
  }
  let phi = 0.5 * sq(Fx);

  for (;;) {
    if (maxAbs(Fx) <= ftol) return result('converged');
    if (iterations >= maxIt) return result('max-iterations', `after ${iterations} iterations, max |F| = ${maxAbs(Fx).toExponential(3)}`);
    if (evaluations + (options.jac ? 1 : n + 1) > maxEval) {
      return result('max-iterations', `evaluation budget ${maxEval} used up after ${iterations} iterations`);
    }
    iterations++;
    // Jacobian
    if (options.jac) {
      options.jac(x, J);
      jacEvals++;
    } else {
      for (let j = 0; j < n; j++) {
        const xj = x[j];
        const hj = Math.sqrt(Number.EPSILON) * Math.max(Math.abs(xj), Math.abs(typX[j]), 1e-300);
        x[j] = xj + hj;
        const hActual = x[j] - xj;
        F(x, work);
        evaluations++;
        x[j] = xj;
        for (let i = 0; i < n; i++) J[i * n + j] = (work[i] - Fx[i]) / hActual;
      }
      jacEvals++;
    }
    if (!finite(J)) return result('singular-jacobian', 'the Jacobian has non-finite entries');
    const anorm = norm1(J, n);
    const info = luFactor(J, n, piv);
    if (info !== 0) return result('singular-jacobian', info > 0 ? `zero pivot in column ${info - 1}` : 'non-finite Jacobian');
    const rcond = luRcond(J, n, piv, anorm);
    if (rcond < minRcond) return result('singular-jacobian', `reciprocal condition estimate ${rcond.toExponential(2)}`);
    for (let i = 0; i < n; i++) dx[i] = -Fx[i];
    luSolve(J, n, piv, dx);
    if (!finite(dx)) return result('singular-jacobian', 'the Newton step overflowed');

    // bounds: hold active components, truncate the rest
    let alphaMax = 1;
    for (let i = 0; i < n; i++) {
      if (dx[i] < 0 && lower[i] > -Infinity) {
        const room = x[i] - lower[i];
        if (room <= 0) dx[i] = 0;
        else if (x[i] + dx[i] < lower[i]) alphaMax = Math.min(alphaMax, (BOUND_FRACTION * room) / -dx[i]);
      }
    }
    for (let i = 0; i < n; i++) dx[i] *= alphaMax;

    // stalled?
    let rel = 0;
    for (let i = 0; i < n; i++) rel = Math.max(rel, Math.abs(dx[i]) / Math.max(Math.abs(x[i]), Math.abs(typX[i])));
    if (rel <= xtol) return result('line-search-failed', `the step became negligible while max |F| = ${maxAbs(Fx).toExponential(3)}`);

    // backtracking line search on phi
    // directional derivative of phi along the (possibly truncated) Newton step: -2 phi * alphaMax
    const slope = -2 * phi * alphaMax;
    let lambda = 1;
    let accepted = false;
    let prevLambda = 1;
    let prevPhi = 0;
    for (let ls = 0; ls < 60; ls++) {
      for (let i = 0; i < n; i++) {
        const v = x[i] + lambda * dx[i];
        xt[i] = v < lower[i] ? lower[i] : v;
      }
      if (evaluations >= maxEval) break;
      F(xt, Ft);
      evaluations++;
      const phiT = finite(Ft) ? 0.5 * sq(Ft) : Infinity;
      if (phiT <= phi + ARMIJO_C * lambda * slope) {
        accepted = true;
        x.set(xt);
        Fx.set(Ft);
        phi = phiT;
        break;
      }
      if (lambda < MIN_LAMBDA) break;
      let next: number;
      if (!Number.isFinite(phiT)) next = 0.1 * lambda;
      else if (ls === 0) next = -slope / (2 * (phiT - phi - slope));
      else {
        // cubic backtracking (Dennis & Schnabel A6.3.1)
        const r1 = phiT - phi - lambda * slope;
        const r2 = prevPhi - phi - prevLambda * slope;
        const a = (r1 / (lambda * lambda) - r2 / (prevLambda * prevLambda)) / (lambda - prevLambda);
        const b = (-prevLambda * r1 / (lambda * lambda) + lambda * r2 / (prevLambda * prevLambda)) / (lambda - prevLambda);
        if (a === 0) next = -slope / (2 * b);
        else {
          const disc = b * b - 3 * a * slope;
          next = disc < 0 ? 0.5 * lambda : b <= 0 ? (-b + Math.sqrt(disc)) / (3 * a) : -slope / (b + Math.sqrt(disc));
        }
      }
      if (!Number.isFinite(next)) next = 0.5 * lambda;
      prevLambda = lambda;
      prevPhi = phiT;
      lambda = Math.min(0.5 * lambda, Math.max(0.1 * lambda, next));
    }
    if (!accepted) {
      if (evaluations >= maxEval) return result('max-iterations', `evaluation budget ${maxEval} used up in the line search`);
      return result('line-search-failed', `no sufficient decrease along the Newton step at max |F| = ${maxAbs(Fx).toExponential(3)}`);
    }
  }
}
