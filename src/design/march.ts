/**
 * The integrator of the design module: a thin adapter over the numerics layer's Dormand-Prince 5(4)
 * stepper (numerics/dopri5.ts; J.R. Dormand, P.J. Prince, "A family of embedded Runge-Kutta
 * formulae", J. Comput. Appl. Math. 6 (1980) 19-26) driven by a reusable numerics OdeWorkspace:
 * the same error norm, step control, dense output and event location as integrate().
 *
 * Why it lives here: Monte Carlo sizing integrates the same small system 10,000 times; a
 * `Marcher` keeps one OdeWorkspace (steppers and work arrays per dimension) and is reused across
 * draws, so a solve allocates only its result. Sizing problems are integrated forward with the
 * non-stiff method only (a stiff draw runs into the step budget and reports 'max-steps').
 * brentRoot, the scalar root finder the design module imports from here, runs numerics/roots.ts.
 */
import type { OdeOptions, OdeResult, OdeRhs } from '../numerics/ode-types.js';
import { OdeWorkspace, badInputResult } from '../numerics/integrate.js';
import { brent } from '../numerics/roots.js';

/** A Dormand-Prince integrator bound to one state dimension; reuse it for many solves. */
export class Marcher {
  readonly n: number;
  private readonly ws = new OdeWorkspace();
  /** Options handed to the workspace (refilled per call, never handed out). */
  private readonly opts: OdeOptions = { method: 'nonstiff' };

  constructor(n: number) {
    this.n = n;
  }

  /**
   * Integrate y' = f(t, y) from t0 to t1 (> t0). Options used: rtol, atol (scalar or vector),
   * maxSteps, maxEvaluations, initialStep, maxStep, tEval, events; the method is always 'nonstiff'.
   */
  integrate(f: OdeRhs, t0: number, y0: ArrayLike<number>, t1: number, opts: OdeOptions = {}): OdeResult {
    if (!(t1 > t0) || y0.length !== this.n) {
      return badInputResult(t0, y0, !(t1 > t0) ? `t1 = ${t1} must exceed t0 = ${t0}` : `y0 has ${y0.length} entries, the marcher ${this.n}`);
    }
    const o = this.opts;
    o.rtol = opts.rtol;
    o.atol = opts.atol;
    o.maxSteps = opts.maxSteps;
    o.maxEvaluations = opts.maxEvaluations;
    o.initialStep = opts.initialStep;
    o.maxStep = opts.maxStep;
    o.tEval = opts.tEval;
    o.events = opts.events;
    return this.ws.integrate(f, t0, y0, t1, o);
  }
}

/**
 * Brent's method for a root of g in [a, b] with g(a), g(b) of opposite sign (or one of them zero),
 * by numerics/roots.ts `brent`. `fa`, `fb` are the known end values (used to reject a non-bracket
 * without evaluating). Returns the root and whether it met the tolerance `xtol` (absolute, plus
 * 4 eps |x|) within `maxIter` iterations; x is NaN when [a, b] does not bracket a root.
 */
export function brentRoot(
  g: (x: number) => number,
  a: number,
  b: number,
  fa = g(a),
  fb = g(b),
  xtol = 1e-12,
  maxIter = 200,
): { x: number; converged: boolean; iterations: number } {
  if (fa === 0) return { x: a, converged: true, iterations: 0 };
  if (fb === 0) return { x: b, converged: true, iterations: 0 };
  if (fa * fb > 0) return { x: NaN, converged: false, iterations: 0 };
  const r = brent(g, a, b, { xtol, maxIterations: maxIter });
  if (r.status === 'no-bracket' || r.status === 'bad-input') return { x: NaN, converged: false, iterations: r.iterations };
  return { x: r.x, converged: r.status === 'converged', iterations: r.iterations };
}
