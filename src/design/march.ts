/**
 * A reusable, allocation-free explicit integrator for the sizing problems of the design module.
 *
 * Method: Dormand-Prince 5(4) embedded Runge-Kutta pair with local extrapolation, the standard
 * error-per-step controller (safety 0.9, factor limits 0.2..10) and the free 4th-order continuous
 * extension for dense output. Reference: J.R. Dormand, P.J. Prince, "A family of embedded
 * Runge-Kutta formulae", J. Comput. Appl. Math. 6 (1980) 19-26; dense output coefficients from
 * L.F. Shampine, "Some practical Runge-Kutta formulas", Math. Comp. 46 (1986) 135-150.
 * Events are located on the dense output with Brent's method (R.P. Brent, "Algorithms for
 * Minimization without Derivatives", 1973, ch. 4).
 *
 * Why it lives here: Monte Carlo sizing integrates the same small system 10,000 times; a
 * `Marcher` owns its work arrays for a given dimension and is reused across draws, so the hot loop
 * does not allocate. It returns the common `OdeResult` shape of numerics/ode-types.ts. Sizing
 * problems are non-stiff (a few species along a bed); a stiffness guard stops with 'max-steps'.
 */
import type { OdeEvent, OdeOptions, OdeResult, OdeRhs, OdeStatus } from '../numerics/ode-types';

const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const B1 = 35 / 384, B3 = 500 / 1113, B4 = 125 / 192, B5 = -2187 / 6784, B6 = 11 / 84;
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
// Shampine's dense output coefficients for Dormand-Prince 5(4).
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

const MESSAGES: Record<OdeStatus, string> = {
  success: 'integration reached the end point',
  event: 'a terminal event stopped the integration',
  'max-steps': 'the step budget was used up before the end point',
  'max-evaluations': 'the evaluation budget was used up before the end point',
  'step-size-too-small': 'the step size fell below the round-off limit',
  'non-finite': 'the right-hand side returned a non-finite value',
  'bad-input': 'the integration input is invalid',
};

/** A Dormand-Prince integrator bound to one state dimension; reuse it for many solves. */
export class Marcher {
  readonly n: number;
  private readonly k: Float64Array[];
  private readonly y: Float64Array;
  private readonly yNew: Float64Array;
  private readonly tmp: Float64Array;
  private readonly rcont: Float64Array[];
  private readonly yi: Float64Array;

  constructor(n: number) {
    this.n = n;
    this.k = Array.from({ length: 7 }, () => new Float64Array(n));
    this.y = new Float64Array(n);
    this.yNew = new Float64Array(n);
    this.tmp = new Float64Array(n);
    this.rcont = Array.from({ length: 5 }, () => new Float64Array(n));
    this.yi = new Float64Array(n);
  }

  /** Dense output at theta in [0,1] of the last accepted step into `out`. */
  private dense(theta: number, out: Float64Array): void {
    const th1 = 1 - theta;
    const [r0, r1, r2, r3, r4] = this.rcont;
    for (let i = 0; i < this.n; i++) {
      out[i] = r0[i] + theta * (r1[i] + th1 * (r2[i] + theta * (r3[i] + th1 * r4[i])));
    }
  }

  /**
   * Integrate y' = f(t, y) from t0 to t1 (> t0). Options used: rtol, atol (scalar or vector),
   * maxSteps, maxEvaluations, initialStep, tEval, events (Brent location on the dense output).
   */
  integrate(f: OdeRhs, t0: number, y0: ArrayLike<number>, t1: number, opts: OdeOptions = {}): OdeResult {
    const n = this.n;
    const rtol = opts.rtol ?? 1e-8;
    const atolS = typeof opts.atol === 'number' ? opts.atol : 1e-10;
    const atolV = typeof opts.atol === 'object' ? opts.atol : undefined;
    const maxSteps = opts.maxSteps ?? 100000;
    const maxEval = opts.maxEvaluations ?? 2000000;
    const events: OdeEvent[] = opts.events ?? [];
    const tEval = opts.tEval;
    const [k1, k2, k3, k4, k5, k6, k7] = this.k;
    const { y, yNew, tmp, yi } = this;
    for (let i = 0; i < n; i++) y[i] = y0[i];
    const tOut: number[] = [];
    const yOut: Float64Array[] = [];
    const fired: { name: string; t: number; y: Float64Array }[] = [];
    let nEval = 0;
    let steps = 0;
    let rejected = 0;
    const finish = (status: OdeStatus, t: number, yy: Float64Array): OdeResult => ({
      status,
      success: status === 'success' || status === 'event',
      message: MESSAGES[status],
      warnings: [],
      t,
      y: Float64Array.from(yy),
      tOut,
      yOut,
      events: fired,
      stats: { rhsEvaluations: nEval, jacobianEvaluations: 0, steps, rejectedSteps: rejected, method: 'nonstiff', luDecompositions: 0 },
    });
    if (!(t1 > t0) || y0.length !== n) return finish('bad-input', t0, y);
    let iEval = 0;
    if (tEval) {
      while (iEval < tEval.length && tEval[iEval] < t0) iEval++;
      if (iEval < tEval.length && tEval[iEval] === t0) {
        tOut.push(t0);
        yOut.push(Float64Array.from(y));
        iEval++;
      }
    }
    const gPrev = new Float64Array(events.length);
    for (let e = 0; e < events.length; e++) gPrev[e] = events[e].g(t0, y);

    f(t0, y, k1);
    nEval++;
    const sc = (i: number, a: number, b: number) => (atolV ? atolV[i] : atolS) + rtol * Math.max(Math.abs(a), Math.abs(b));
    // Initial step (Hairer-Norsett-Wanner, Solving ODE I, sec. II.4).
    let h = opts.initialStep ?? 0;
    if (!(h > 0)) {
      let d0 = 0, d1 = 0;
      for (let i = 0; i < n; i++) {
        const s = sc(i, y[i], y[i]);
        d0 += (y[i] / s) ** 2;
        d1 += (k1[i] / s) ** 2;
      }
      d0 = Math.sqrt(d0 / n);
      d1 = Math.sqrt(d1 / n);
      h = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 * (t1 - t0) : 0.01 * d0 / d1;
      h = Math.min(h, t1 - t0);
    }
    let t = t0;
    let facOld = 1e-4;
    while (t < t1) {
      if (steps + rejected >= maxSteps) return finish('max-steps', t, y);
      if (nEval >= maxEval) return finish('max-evaluations', t, y);
      if (h < 1e-14 * Math.max(Math.abs(t), 1e-300) * 4) return finish('step-size-too-small', t, y);
      let last = false;
      if (t + h >= t1) {
        h = t1 - t;
        last = true;
      }
      for (let i = 0; i < n; i++) tmp[i] = y[i] + h * A21 * k1[i];
      f(t + C2 * h, tmp, k2);
      for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
      f(t + C3 * h, tmp, k3);
      for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
      f(t + C4 * h, tmp, k4);
      for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
      f(t + C5 * h, tmp, k5);
      for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
      f(t + h, tmp, k6);
      for (let i = 0; i < n; i++) yNew[i] = y[i] + h * (B1 * k1[i] + B3 * k3[i] + B4 * k4[i] + B5 * k5[i] + B6 * k6[i]);
      f(t + h, yNew, k7);
      nEval += 6;
      let err = 0;
      let finite = true;
      for (let i = 0; i < n; i++) {
        const ei = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
        const s = sc(i, y[i], yNew[i]);
        err += (ei / s) ** 2;
        if (!Number.isFinite(yNew[i])) finite = false;
      }
      err = Math.sqrt(err / n);
      if (!finite || !Number.isFinite(err)) {
        // Shrink hard; a non-finite value inside a tiny step is a real failure.
        if (h < 1e-12 * Math.max(1, Math.abs(t))) return finish('non-finite', t, y);
        h *= 0.1;
        rejected++;
        continue;
      }
      // Lund-stabilised controller (beta = 0.04) as in Hairer's DOPRI5.
      const fac11 = err ** (0.2 - 0.04 * 0.75);
      let fac = fac11 / facOld ** 0.04 / 0.9;
      fac = Math.max(0.1, Math.min(5, fac));
      if (err > 1) {
        h /= Math.min(5, fac11 / 0.9);
        rejected++;
        continue;
      }
      facOld = Math.max(err, 1e-4);
      steps++;
      // Dense output coefficients for the accepted step [t, t+h].
      const [r0, r1, r2, r3, r4] = this.rcont;
      for (let i = 0; i < n; i++) {
        const dy = yNew[i] - y[i];
        const bspl = h * k1[i] - dy;
        r0[i] = y[i];
        r1[i] = dy;
        r2[i] = bspl;
        r3[i] = dy - h * k7[i] - bspl;
        r4[i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
      }
      const tNew = last ? t1 : t + h;
      // Events: first sign change in the step, located by Brent on the dense output.
      let stopAt = -1;
      let stopIdx = -1;
      for (let e = 0; e < events.length; e++) {
        const ev = events[e];
        const gN = ev.g(tNew, yNew);
        const g0 = gPrev[e];
        const dir = ev.direction ?? 0;
        const crosses = (g0 < 0 && gN >= 0 && dir >= 0) || (g0 > 0 && gN <= 0 && dir <= 0);
        if (crosses) {
          const gth = (th: number) => {
            this.dense(th, yi);
            return ev.g(t + th * h, yi);
          };
          const th = brent01(gth, g0, gN);
          const te = t + th * h;
          if (stopAt < 0 || te < stopAt) {
            if (ev.terminal ?? true) {
              stopAt = te;
              stopIdx = e;
            } else {
              this.dense(th, yi);
              fired.push({ name: ev.name, t: te, y: Float64Array.from(yi) });
            }
          }
        }
        gPrev[e] = gN;
      }
      const tEnd = stopAt >= 0 ? stopAt : tNew;
      if (tEval) {
        while (iEval < tEval.length && tEval[iEval] <= tEnd) {
          const th = h > 0 ? (tEval[iEval] - t) / h : 1;
          this.dense(Math.min(1, Math.max(0, th)), yi);
          tOut.push(tEval[iEval]);
          yOut.push(Float64Array.from(yi));
          iEval++;
        }
      }
      if (stopAt >= 0) {
        this.dense((stopAt - t) / h, yi);
        fired.push({ name: events[stopIdx].name, t: stopAt, y: Float64Array.from(yi) });
        return finish('event', stopAt, yi);
      }
      t = tNew;
      for (let i = 0; i < n; i++) {
        y[i] = yNew[i];
        k1[i] = k7[i];
      }
      h = h / fac;
      if (last) break;
    }
    return finish('success', t1, y);
  }
}

/** Brent's root finder on [0,1] for a sign-changing g with known end values; returns theta. */
export function brent01(g: (x: number) => number, ga: number, gb: number): number {
  return brentRoot(g, 0, 1, ga, gb, 1e-13, 100).x;
}

/**
 * Brent's method (inverse quadratic interpolation, secant and bisection) for a root of g in [a,b]
 * with g(a), g(b) of opposite sign (or one of them zero). Returns the root and whether it met the
 * tolerance `xtol` (absolute, plus 4 eps |x|) within `maxIter` iterations.
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
  let c = a, fc = fa, d = b - a, e = d;
  for (let it = 1; it <= maxIter; it++) {
    if (fb * fc > 0) {
      c = a; fc = fa; d = b - a; e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b; b = c; c = a;
      fa = fb; fb = fc; fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return { x: b, converged: true, iterations: it };
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number, q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc, r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m; e = m;
      }
    } else {
      d = m; e = m;
    }
    a = b; fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = g(b);
  }
  return { x: b, converged: false, iterations: maxIter };
}
