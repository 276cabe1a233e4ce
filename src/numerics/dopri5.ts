/**
 * Dormand-Prince 5(4) explicit Runge-Kutta method (Dormand & Prince 1980, "A family of embedded
 * Runge-Kutta formulae", J. Comp. Appl. Math. 6), as in Hairer, Norsett & Wanner, Solving ODEs I,
 * 2nd ed., sec. II.5 and their DOPRI5 code: 7 stages with FSAL (6 new evaluations per step),
 * local extrapolation (the 5th-order solution is propagated), PI step-size control (sec. IV.2 of
 * vol. II, beta = 0.04), continuous output of order 4 (Shampine's dense formula, sec. II.6) and
 * the stiffness test of sec. IV.2 of vol. II: h*|lambda| is estimated from the last two stages,
 * which share the abscissa t+h, and compared with the boundary of the stability region (3.25).
 *
 * All stage arrays are allocated once in the constructor; a step allocates nothing. One object can
 * be reused for any number of solves of the same dimension (`reset` rebinds it to new settings), so
 * a caller that solves the same system many times (a fit, a Monte Carlo loop) pays no set-up. The
 * step keeps its scalars and arrays in locals; the last stage and the state are swapped, not
 * copied (FSAL), and the dense-output coefficients are formed only when dense output is asked for.
 */
import type { OdeRhs } from './ode-types.js';
import {
  MAX_NONFINITE_RETRIES,
  allFinite,
  initialStep,
  type StepCode,
  type Stepper,
  type StepperSettings,
} from './ode-common.js';

// Butcher tableau (Hairer, Norsett & Wanner I, table II.5.2).
const C2 = 0.2, C3 = 0.3, C4 = 0.8, C5 = 8 / 9;
const A21 = 0.2;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const A71 = 35 / 384, A73 = 500 / 1113, A74 = 125 / 192, A75 = -2187 / 6784, A76 = 11 / 84;
// Error coefficients: 5th-order weights minus the embedded 4th-order weights.
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
// Dense output (order 4) coefficients.
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

// Step-size control constants of DOPRI5.
const SAFE = 0.9;
const BETA = 0.04;
const EXPO1 = 0.2 - BETA * 0.75;
const FACC1 = 1 / 0.2; // largest decrease 1/5
const FACC2 = 1 / 10; // largest increase 10
/** Boundary of the stability region used by the stiffness test. */
const STIFF_HLAMBDA = 3.25;
/** Consecutive positive stiffness tests before the problem is declared stiff. */
const STIFF_COUNT = 15;

/** Options of the Dormand-Prince stepper. */
export interface Dopri5Options {
  /** Initial step size (magnitude, unit of t); default from the HINIT heuristic. */
  initialStep?: number;
  /** Run the stiffness test every `stiffnessInterval` accepted steps (and always once suspicious); default 1. */
  stiffnessInterval?: number;
  /**
   * h*|lambda| above which a test counts as stiff; default 3.25 (Hairer's DOPRI5, the real-axis
   * stability boundary). The estimate from the two last stages tends to sit near 2.4-2.6 on a
   * stability-limited plateau, so integrate() uses a lower value for its automatic switch.
   */
  stiffnessThreshold?: number;
}

/** Dormand-Prince 5(4) stepper (see file header). */
export class Dopri5 implements Stepper {
  /** Time after the last accepted step. */
  t = 0;
  /** Start of the last accepted step. */
  tOld = 0;
  /** Proposed size of the next step (signed). */
  h = 0;
  /** Last estimate of h*|lambda| from the stiffness test (0 until tested). */
  hLambda = 0;
  stiff = false;
  /** State after the last accepted step (the buffer changes between steps; read it after each). */
  y: Float64Array;

  private hStep = 0;
  private facold = 1e-4;
  private f: OdeRhs;
  private n: number;
  private s: StepperSettings;
  private k1: Float64Array;
  private k2: Float64Array;
  private k3: Float64Array;
  private k4: Float64Array;
  private k5: Float64Array;
  private k6: Float64Array;
  private k7: Float64Array;
  private y1: Float64Array;
  private ysti: Float64Array;
  private rc1: Float64Array;
  private rc2: Float64Array;
  private rc3: Float64Array;
  private rc4: Float64Array;
  private rc5: Float64Array;
  /** True once rc1..rc5 hold the dense-output coefficients of the last accepted step. */
  private denseReady = true;
  private direction = 1;
  private reject = false;
  private accepted = 0;
  private iasti = 0;
  private nonsti = 0;
  private stiffnessInterval = 1;
  private stiffnessThreshold = STIFF_HLAMBDA;
  private h0 = 0;

  constructor(settings: StepperSettings, options: Dopri5Options = {}) {
    this.s = settings;
    this.f = settings.f;
    const n = (this.n = settings.n);
    this.y = new Float64Array(n);
    this.k1 = new Float64Array(n);
    this.k2 = new Float64Array(n);
    this.k3 = new Float64Array(n);
    this.k4 = new Float64Array(n);
    this.k5 = new Float64Array(n);
    this.k6 = new Float64Array(n);
    this.k7 = new Float64Array(n);
    this.y1 = new Float64Array(n);
    this.ysti = new Float64Array(n);
    this.rc1 = new Float64Array(n);
    this.rc2 = new Float64Array(n);
    this.rc3 = new Float64Array(n);
    this.rc4 = new Float64Array(n);
    this.rc5 = new Float64Array(n);
    this.reset(settings, options);
  }

  /**
   * Rebind the stepper to new settings and options (same dimension n as at construction) so that
   * one object serves many solves without allocating; call start() next.
   */
  reset(settings: StepperSettings, options: Dopri5Options = {}): void {
    if (settings.n !== this.n) throw new RangeError(`Dopri5.reset: dimension ${settings.n} differs from ${this.n}`);
    this.s = settings;
    this.f = settings.f;
    this.stiffnessInterval = Math.max(1, Math.floor(options.stiffnessInterval ?? 1));
    this.stiffnessThreshold = options.stiffnessThreshold ?? STIFF_HLAMBDA;
    this.h0 = options.initialStep !== undefined ? Math.abs(options.initialStep) : 0;
  }

  /** Dimension of the state. */
  get dimension(): number {
    return this.n;
  }

  /** Set the initial point; evaluates f(t0, y0). Returns 'ok' or a failure status. */
  start(t0: number, y0: ArrayLike<number>, tEnd: number): StepCode {
    const n = this.n;
    const s = this.s;
    const y = this.y;
    const k1 = this.k1;
    this.direction = tEnd >= t0 ? 1 : -1;
    this.t = this.tOld = t0;
    this.hLambda = 0;
    this.stiff = false;
    this.accepted = this.iasti = this.nonsti = 0;
    for (let i = 0; i < n; i++) y[i] = y0[i];
    if (s.counters.rhs + 2 > s.maxEvaluations) return 'max-evaluations';
    this.f(t0, y, k1);
    s.counters.rhs++;
    if (!allFinite(k1, n)) return 'non-finite';
    let h =
      this.h0 > 0
        ? this.direction * Math.min(this.h0, s.hmax)
        : initialStep(this.f, t0, y, k1, this.direction, 5, s, this.y1, this.k2);
    // a rejected HINIT probe is harmless; start from a tiny step if it overflowed
    if (!Number.isFinite(h) || h === 0) h = this.direction * 1e-6;
    this.h = h;
    this.hStep = 0;
    this.denseReady = true;
    this.reject = false;
    this.facold = 1e-4;
    return 'ok';
  }

  step(tEnd: number): StepCode {
    const n = this.n;
    const s = this.s;
    const f = this.f;
    const c = s.counters;
    const atol = s.atol;
    const rtol = s.rtol;
    const hmax = s.hmax;
    const maxSteps = s.maxSteps;
    const maxEvaluations = s.maxEvaluations;
    const y = this.y;
    const y1 = this.y1;
    const k1 = this.k1;
    const k2 = this.k2;
    const k3 = this.k3;
    const k4 = this.k4;
    const k5 = this.k5;
    const k6 = this.k6;
    const k7 = this.k7;
    const ysti = this.ysti;
    const dir = this.direction;
    const t = this.t;
    let hProp = this.h;
    let reject = this.reject;
    let nonFinite = 0;
    for (;;) {
      if (c.steps >= maxSteps) return this.stop('max-steps', hProp, reject);
      if (c.rhs + 6 > maxEvaluations) return this.stop('max-evaluations', hProp, reject);
      let h = hProp;
      if (Math.abs(h) > hmax) h = dir * hmax;
      let last = false;
      if (dir * (t + 1.01 * h - tEnd) >= 0) {
        h = tEnd - t;
        last = true;
      }
      // smallest step at t: the rounding level of t (minStep of ode-common.ts, inlined)
      if (Math.abs(h) < 16 * Number.EPSILON * Math.max(Math.abs(t), Math.abs(t + h))) return this.stop(nonFinite > 0 ? 'non-finite' : 'step-size-too-small', hProp, reject);
      c.steps++;
      c.rhs += 6;

      for (let i = 0; i < n; i++) y1[i] = y[i] + h * A21 * k1[i];
      f(t + C2 * h, y1, k2);
      for (let i = 0; i < n; i++) y1[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
      f(t + C3 * h, y1, k3);
      for (let i = 0; i < n; i++) y1[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
      f(t + C4 * h, y1, k4);
      for (let i = 0; i < n; i++) y1[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
      f(t + C5 * h, y1, k5);
      for (let i = 0; i < n; i++)
        ysti[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
      const tph = last ? tEnd : t + h;
      f(tph, ysti, k6);
      for (let i = 0; i < n; i++)
        y1[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i]);
      f(tph, y1, k7);

      // error estimate (weighted RMS of the difference of the 5th and 4th order solutions);
      // a non-finite k7 makes the sum non-finite too unless h is 0, which minStep excludes
      let err = 0;
      let k7finite = true;
      for (let i = 0; i < n; i++) {
        const k7i = k7[i];
        if (k7i - k7i !== 0) k7finite = false;
        const e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7i);
        const sk = atol[i] + rtol * Math.max(Math.abs(y[i]), Math.abs(y1[i]));
        err += (e / sk) * (e / sk);
      }
      err = Math.sqrt(err / n);
      if (!(err - err === 0) || !k7finite) {
        // non-finite trial: reject and shrink hard
        c.rejected++;
        if (++nonFinite > MAX_NONFINITE_RETRIES) return this.stop('non-finite', hProp, reject);
        hProp = h * 0.1;
        reject = true;
        continue;
      }

      const fac11 = Math.pow(err, EXPO1);
      let fac = fac11 / Math.pow(this.facold, BETA);
      fac = Math.max(FACC2, Math.min(FACC1, fac / SAFE));
      let hnew = h / fac;
      if (err <= 1) {
        this.facold = Math.max(err, 1e-4);
        this.accepted++;
        if (this.iasti !== 0 || this.accepted % this.stiffnessInterval === 0) this.stiffnessTest(h);
        // FSAL: the new state and its derivative are y1 and k7; swap the buffers instead of copying
        this.y = y1;
        this.y1 = y;
        this.k1 = k7;
        this.k7 = k1;
        this.denseReady = false;
        this.tOld = t;
        this.t = tph;
        this.hStep = h;
        if (Math.abs(hnew) > hmax) hnew = dir * hmax;
        if (reject) hnew = dir * Math.min(Math.abs(hnew), Math.abs(h));
        this.reject = false;
        // keep the unclipped step proposal when the last step was shortened to hit tEnd
        this.h = last && Math.abs(hnew) < Math.abs(hProp) ? hProp : hnew;
        return 'ok';
      }
      hProp = h / Math.min(FACC1, fac11 / SAFE);
      reject = true;
      c.rejected++;
    }
  }

  /** Leave step() without an accepted step: keep the step proposal for a later call. */
  private stop(code: StepCode, hProp: number, reject: boolean): StepCode {
    this.h = hProp;
    this.reject = reject;
    return code;
  }

  /** Hairer's stiffness detection: h*lambda from the two stages at t+h (before the FSAL swap). */
  private stiffnessTest(h: number): void {
    const { n, k6, k7, y1, ysti } = this;
    let stnum = 0;
    let stden = 0;
    for (let i = 0; i < n; i++) {
      const a = k7[i] - k6[i];
      const b = y1[i] - ysti[i];
      stnum += a * a;
      stden += b * b;
    }
    if (stden > 0) this.hLambda = Math.abs(h) * Math.sqrt(stnum / stden);
    if (this.hLambda > this.stiffnessThreshold) {
      this.nonsti = 0;
      this.iasti++;
      if (this.iasti >= STIFF_COUNT) this.stiff = true;
    } else {
      this.nonsti++;
      if (this.nonsti === 6) this.iasti = 0;
    }
  }

  /**
   * Dense-output coefficients on the last accepted step [tOld, t]. After the FSAL swap y1 holds
   * the state at tOld, k7 the derivative there and k1 the derivative at t; k3..k6 are the stages.
   */
  private formDense(): void {
    const { n, rc1, rc2, rc3, rc4, rc5, y, y1, k3, k4, k5, k6 } = this;
    const k1o = this.k7;
    const k7n = this.k1;
    const h = this.hStep;
    for (let i = 0; i < n; i++) {
      const ydiff = y[i] - y1[i];
      const bspl = h * k1o[i] - ydiff;
      rc1[i] = y1[i];
      rc2[i] = ydiff;
      rc3[i] = bspl;
      rc4[i] = ydiff - h * k7n[i] - bspl;
      rc5[i] = h * (D1 * k1o[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7n[i]);
    }
    this.denseReady = true;
  }

  /**
   * Continuous output of order 4 on the last accepted step, for tOld <= s <= t. Valid until the
   * next call of step().
   */
  dense(s: number, out: Float64Array): void {
    const n = this.n;
    if (this.hStep === 0) {
      for (let i = 0; i < n; i++) out[i] = this.y[i];
      return;
    }
    if (!this.denseReady) this.formDense();
    const { rc1, rc2, rc3, rc4, rc5 } = this;
    const theta = (s - this.tOld) / this.hStep;
    const theta1 = 1 - theta;
    for (let i = 0; i < n; i++) {
      out[i] = rc1[i] + theta * (rc2[i] + theta1 * (rc3[i] + theta * (rc4[i] + theta1 * rc5[i])));
    }
  }
}
