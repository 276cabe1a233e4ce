/**
 * Dormand-Prince 5(4) explicit Runge-Kutta method (Dormand & Prince 1980, "A family of embedded
 * Runge-Kutta formulae", J. Comp. Appl. Math. 6), as in Hairer, Norsett & Wanner, Solving ODEs I,
 * 2nd ed., sec. II.5 and their DOPRI5 code: 7 stages with FSAL (6 new evaluations per step),
 * local extrapolation (the 5th-order solution is propagated), PI step-size control (sec. IV.2 of
 * vol. II, beta = 0.04), continuous output of order 4 (Shampine's dense formula, sec. II.6) and
 * the stiffness test of sec. IV.2 of vol. II: h*|lambda| is estimated from the last two stages,
 * which share the abscissa t+h, and compared with the boundary of the stability region (3.25).
 *
 * All stage arrays are allocated once in the constructor; a step allocates nothing.
 */
import type { OdeRhs } from './ode-types';
import {
  MAX_NONFINITE_RETRIES,
  allFinite,
  initialStep,
  minStep,
  type StepCode,
  type Stepper,
  type StepperSettings,
} from './ode-common';

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
  /** Scalars updated every step live in a typed array so that storing them never boxes a double. */
  private readonly sc = new Float64Array(6); // t, tOld, h, hLambda, hStep, facold
  get t(): number {
    return this.sc[0];
  }
  get tOld(): number {
    return this.sc[1];
  }
  /** Proposed size of the next step (signed). */
  get h(): number {
    return this.sc[2];
  }
  /** Last estimate of h*|lambda| from the stiffness test (0 until tested). */
  get hLambda(): number {
    return this.sc[3];
  }
  private get hStep(): number {
    return this.sc[4];
  }
  private get facold(): number {
    return this.sc[5];
  }
  stiff = false;
  readonly y: Float64Array;

  private readonly f: OdeRhs;
  private readonly n: number;
  private readonly s: StepperSettings;
  private readonly k1: Float64Array;
  private readonly k2: Float64Array;
  private readonly k3: Float64Array;
  private readonly k4: Float64Array;
  private readonly k5: Float64Array;
  private readonly k6: Float64Array;
  private readonly k7: Float64Array;
  private readonly y1: Float64Array;
  private readonly ysti: Float64Array;
  private readonly rc1: Float64Array;
  private readonly rc2: Float64Array;
  private readonly rc3: Float64Array;
  private readonly rc4: Float64Array;
  private readonly rc5: Float64Array;
  private direction = 1;
  private reject = false;
  private accepted = 0;
  private iasti = 0;
  private nonsti = 0;
  private readonly stiffnessInterval: number;
  private readonly stiffnessThreshold: number;
  private readonly h0?: number;

  constructor(settings: StepperSettings, options: Dopri5Options = {}) {
    this.s = settings;
    this.f = settings.f;
    const n = (this.n = settings.n);
    const mk = () => new Float64Array(n);
    this.y = mk();
    this.k1 = mk();
    this.k2 = mk();
    this.k3 = mk();
    this.k4 = mk();
    this.k5 = mk();
    this.k6 = mk();
    this.k7 = mk();
    this.y1 = mk();
    this.ysti = mk();
    this.rc1 = mk();
    this.rc2 = mk();
    this.rc3 = mk();
    this.rc4 = mk();
    this.rc5 = mk();
    this.stiffnessInterval = Math.max(1, Math.floor(options.stiffnessInterval ?? 1));
    this.stiffnessThreshold = options.stiffnessThreshold ?? STIFF_HLAMBDA;
    if (options.initialStep !== undefined) this.h0 = Math.abs(options.initialStep);
  }

  /** Set the initial point; evaluates f(t0, y0). Returns 'ok' or a failure status. */
  start(t0: number, y0: ArrayLike<number>, tEnd: number): StepCode {
    const { n, s } = this;
    this.direction = tEnd >= t0 ? 1 : -1;
    this.sc[0] = this.sc[1] = t0;
    for (let i = 0; i < n; i++) this.y[i] = y0[i];
    if (s.counters.rhs + 2 > s.maxEvaluations) return 'max-evaluations';
    this.f(t0, this.y, this.k1);
    s.counters.rhs++;
    if (!allFinite(this.k1, n)) return 'non-finite';
    this.sc[2] =
      this.h0 !== undefined && this.h0 > 0
        ? this.direction * Math.min(this.h0, s.hmax)
        : initialStep(this.f, t0, this.y, this.k1, this.direction, 5, s, this.y1, this.k2);
    // a rejected HINIT probe is harmless; start from a tiny step if it overflowed
    if (!Number.isFinite(this.h) || this.h === 0) this.sc[2] = this.direction * 1e-6;
    this.sc[4] = 0;
    for (let i = 0; i < n; i++) {
      this.rc1[i] = this.y[i];
      this.rc2[i] = this.rc3[i] = this.rc4[i] = this.rc5[i] = 0;
    }
    this.reject = false;
    this.sc[5] = 1e-4;
    return 'ok';
  }

  step(tEnd: number): StepCode {
    const { n, s, f, y, k1, k2, k3, k4, k5, k6, k7, y1, ysti } = this;
    const c = s.counters;
    const dir = this.direction;
    let nonFinite = 0;
    for (;;) {
      if (c.steps >= s.maxSteps) return 'max-steps';
      if (c.rhs + 6 > s.maxEvaluations) return 'max-evaluations';
      const t = this.t;
      let h = this.h;
      if (Math.abs(h) > s.hmax) h = dir * s.hmax;
      const remaining = tEnd - t;
      let last = false;
      if (dir * (t + 1.01 * h - tEnd) >= 0) {
        h = remaining;
        last = true;
      }
      if (Math.abs(h) < minStep(t, h)) return nonFinite > 0 ? 'non-finite' : 'step-size-too-small';
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

      // error estimate (weighted RMS of the difference of the 5th and 4th order solutions)
      let err = 0;
      for (let i = 0; i < n; i++) {
        const e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
        const sk = s.atol[i] + s.rtol * Math.max(Math.abs(y[i]), Math.abs(y1[i]));
        err += (e / sk) * (e / sk);
      }
      err = Math.sqrt(err / n);
      if (!Number.isFinite(err) || !allFinite(k7, n)) {
        // non-finite trial: reject and shrink hard
        c.rejected++;
        if (++nonFinite > MAX_NONFINITE_RETRIES) return 'non-finite';
        this.sc[2] = h * 0.1;
        this.reject = true;
        continue;
      }

      const fac11 = Math.pow(err, EXPO1);
      let fac = fac11 / Math.pow(this.facold, BETA);
      fac = Math.max(FACC2, Math.min(FACC1, fac / SAFE));
      let hnew = h / fac;
      if (err <= 1) {
        this.sc[5] = Math.max(err, 1e-4);
        this.accepted++;
        this.stiffnessTest(h);
        // dense output coefficients on [t, t+h]
        const { rc1, rc2, rc3, rc4, rc5 } = this;
        for (let i = 0; i < n; i++) {
          const ydiff = y1[i] - y[i];
          const bspl = h * k1[i] - ydiff;
          rc1[i] = y[i];
          rc2[i] = ydiff;
          rc3[i] = bspl;
          rc4[i] = ydiff - h * k7[i] - bspl;
          rc5[i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
          y[i] = y1[i];
          k1[i] = k7[i];
        }
        this.sc[1] = t;
        this.sc[0] = tph;
        this.sc[4] = h;
        if (Math.abs(hnew) > s.hmax) hnew = dir * s.hmax;
        if (this.reject) hnew = dir * Math.min(Math.abs(hnew), Math.abs(h));
        this.reject = false;
        // keep the unclipped step proposal when the last step was shortened to hit tEnd
        this.sc[2] = last && Math.abs(hnew) < Math.abs(this.h) ? this.h : hnew;
        return 'ok';
      }
      hnew = h / Math.min(FACC1, fac11 / SAFE);
      this.reject = true;
      c.rejected++;
      this.sc[2] = hnew;
    }
  }

  /** Hairer's stiffness detection: h*lambda from the two stages at t+h. */
  private stiffnessTest(h: number): void {
    if (this.accepted % this.stiffnessInterval !== 0 && this.iasti === 0) return;
    const { n, k6, k7, y1, ysti } = this;
    let stnum = 0;
    let stden = 0;
    for (let i = 0; i < n; i++) {
      stnum += (k7[i] - k6[i]) ** 2;
      stden += (y1[i] - ysti[i]) ** 2;
    }
    if (stden > 0) this.sc[3] = Math.abs(h) * Math.sqrt(stnum / stden);
    if (this.hLambda > this.stiffnessThreshold) {
      this.nonsti = 0;
      this.iasti++;
      if (this.iasti >= STIFF_COUNT) this.stiff = true;
    } else {
      this.nonsti++;
      if (this.nonsti === 6) this.iasti = 0;
    }
  }

  /** Continuous output of order 4 on the last accepted step. */
  dense(s: number, out: Float64Array): void {
    const { n, rc1, rc2, rc3, rc4, rc5 } = this;
    if (this.hStep === 0) {
      for (let i = 0; i < n; i++) out[i] = this.y[i];
      return;
    }
    const theta = (s - this.tOld) / this.hStep;
    const theta1 = 1 - theta;
    for (let i = 0; i < n; i++) {
      out[i] = rc1[i] + theta * (rc2[i] + theta1 * (rc3[i] + theta * (rc4[i] + theta1 * rc5[i])));
    }
  }
}
