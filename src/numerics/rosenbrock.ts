/**
 * RODAS4: a 6-stage, order 4(3), L-stable and stiffly accurate Rosenbrock method with embedded
 * error estimate (Hairer & Wanner, Solving ODEs II, 2nd ed., sec. IV.7, method RODAS;
 * coefficients of their RODAS code), written in the transformed form of sec. IV.7, eq. (7.25)
 * (no matrix-vector products): with W = I/(h gamma) - J,
 *
 *   W K_i = f(t + alpha_i h, y + sum_j a_ij K_j) + sum_j (c_ij / h) K_j + h gamma_i df/dt,
 *   y1 = y + sum_i m_i K_i,   error = K_6 (stiffly accurate: the last two stages give y1).
 *
 * Step-size control is the standard one for Rosenbrock codes (factor limits 0.2..6, safety 0.9,
 * repeated rejections cut h tenfold). The Jacobian is analytic when given, otherwise forward
 * differences (Hairer & Wanner's increment sqrt(eps max(1e-5, y_j^2))); it is evaluated once per
 * step and reused across rejections. df/dt is a forward difference unless `autonomous` is set.
 * Dense output is the cubic Hermite interpolant from y and f at both ends of the step (order 3);
 * f at the end of a step is also the first stage of the next one, so it costs nothing extra.
 *
 * All work arrays are allocated in the constructor; a step allocates nothing.
 */
import type { OdeJac, OdeRhs } from './ode-types.js';
import { luFactor, luSolve } from './lu.js';
import {
  MAX_NONFINITE_RETRIES,
  allFinite,
  errorNorm,
  initialStep,
  minStep,
  type StepCode,
  type Stepper,
  type StepperSettings,
} from './ode-common.js';

/** RODAS4 coefficients in the transformed form (Hairer & Wanner II, sec. IV.7). */
export const RODAS4 = {
  stages: 6,
  gamma: 0.25,
  /** Abscissae alpha_i (stage times t + alpha_i h). */
  alpha: [0, 0.386, 0.21, 0.63, 1, 1],
  /** gamma_i = sum_j gamma_ij (multiplies h df/dt). */
  gammaSum: [0.25, -0.1043, 0.1035, -0.0362, 0, 0],
  /** a_ij, strictly lower triangular, row by row. */
  a: [
    [],
    [1.544],
    [0.9466785280815826, 0.2557011698983284],
    [3.314825187068521, 2.896124015972201, 0.9986419139977817],
    [1.221224509226641, 6.019134481288629, 12.53708332932087, -0.687886036105895],
    [1.221224509226641, 6.019134481288629, 12.53708332932087, -0.687886036105895, 1],
  ],
  /** c_ij, strictly lower triangular, row by row. */
  c: [
    [],
    [-5.6688],
    [-2.430093356833875, -0.2063599157091915],
    [-0.1073529058151375, -9.594562251023355, -20.47028614809616],
    [7.496443313967647, -10.24680431464352, -33.99990352819905, 11.7089089320616],
    [8.083246795921522, -7.981132988064893, -31.52159432874371, 16.31930543123136, -6.058818238834054],
  ],
  /** Solution weights m_i. */
  m: [1.221224509226641, 6.019134481288629, 12.53708332932087, -0.687886036105895, 1, 1],
  /** Error weights e_i (the difference to the embedded order-3 solution). */
  e: [0, 0, 0, 0, 0, 1],
  /** Order used in the step-size exponent (min of both orders + 1). */
  errorOrder: 4,
} as const;

const FAC_MIN = 0.2;
const FAC_MAX = 6;
const FAC_SAFE = 0.9;
const FAC_REJ = 0.1;

/** Options of the Rosenbrock stepper. */
export interface RosenbrockOptions {
  /** Analytic Jacobian df/dy (n x n row-major); default forward differences. */
  jac?: OdeJac;
  /** f does not depend on t explicitly (skip df/dt); default false. */
  autonomous?: boolean;
  /** Initial step size magnitude (unit of t); default from the HINIT heuristic. */
  initialStep?: number;
}

/** RODAS4 stepper (see file header). */
export class Rosenbrock implements Stepper {
  /** Scalars updated every step live in a typed array so that storing them never boxes a double. */
  private readonly sc = new Float64Array(4); // t, tOld, h, hStep
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
  private get hStep(): number {
    return this.sc[3];
  }
  readonly stiff = true;
  readonly y: Float64Array;

  private readonly f: OdeRhs;
  private readonly jacFn?: OdeJac;
  private readonly autonomous: boolean;
  private readonly n: number;
  private readonly s: StepperSettings;
  private readonly h0?: number;
  private readonly f0: Float64Array; // f(t, y) at the start of the step
  private readonly f1: Float64Array; // f at the end of the last accepted step (dense output)
  private readonly yOld: Float64Array;
  private readonly fOld: Float64Array;
  private readonly ynew: Float64Array;
  private readonly ystage: Float64Array;
  private readonly ftmp: Float64Array;
  private readonly dfdt: Float64Array;
  private readonly K: Float64Array[];
  private readonly J: Float64Array;
  private readonly W: Float64Array;
  private readonly piv: Int32Array;
  private direction = 1;
  private jacCurrent = false; // J and df/dt belong to the current (t, y)
  private rejectLast = false;
  private rejectMore = false;

  constructor(settings: StepperSettings, options: RosenbrockOptions = {}) {
    this.s = settings;
    this.f = settings.f;
    if (options.jac) this.jacFn = options.jac;
    this.autonomous = options.autonomous ?? false;
    if (options.initialStep !== undefined) this.h0 = Math.abs(options.initialStep);
    const n = (this.n = settings.n);
    const mk = () => new Float64Array(n);
    this.y = mk();
    this.f0 = mk();
    this.f1 = mk();
    this.yOld = mk();
    this.fOld = mk();
    this.ynew = mk();
    this.ystage = mk();
    this.ftmp = mk();
    this.dfdt = mk();
    this.K = [];
    for (let i = 0; i < RODAS4.stages; i++) this.K.push(mk());
    this.J = new Float64Array(n * n);
    this.W = new Float64Array(n * n);
    this.piv = new Int32Array(n);
  }

  /** Set the initial point; evaluates f(t0, y0). Returns 'ok' or a failure status. */
  start(t0: number, y0: ArrayLike<number>, tEnd: number): StepCode {
    const { n, s } = this;
    this.direction = tEnd >= t0 ? 1 : -1;
    this.sc[0] = this.sc[1] = t0;
    for (let i = 0; i < n; i++) this.y[i] = y0[i];
    if (s.counters.rhs + 2 > s.maxEvaluations) return 'max-evaluations';
    this.f(t0, this.y, this.f0);
    s.counters.rhs++;
    if (!allFinite(this.f0, n)) return 'non-finite';
    this.sc[2] =
      this.h0 !== undefined && this.h0 > 0
        ? this.direction * Math.min(this.h0, s.hmax)
        : initialStep(this.f, t0, this.y, this.f0, this.direction, 4, s, this.ynew, this.ftmp);
    if (!Number.isFinite(this.h) || this.h === 0) this.sc[2] = this.direction * 1e-6;
    this.jacCurrent = false;
    this.rejectLast = this.rejectMore = false;
    this.sc[3] = 0;
    this.f1.set(this.f0);
    this.fOld.set(this.f0);
    this.yOld.set(this.y);
    return 'ok';
  }

  /** Evaluation cost of the next attempt (for the budget check). */
  private attemptCost(): number {
    let cost = RODAS4.stages; // stages 2..6 plus f at the new point
    if (!this.jacCurrent) {
      cost += this.jacFn ? 0 : this.n;
      cost += this.autonomous ? 0 : 1;
    }
    return cost;
  }

  /** Jacobian and df/dt at the current point. Returns false when they are not finite. */
  private evaluateJacobian(): boolean {
    const { n, s, f, J, y, f0, ftmp, ystage } = this;
    const t = this.t;
    if (this.jacFn) {
      this.jacFn(t, y, J);
      s.counters.jac++;
    } else {
      ystage.set(y);
      for (let j = 0; j < n; j++) {
        const yj = ystage[j];
        const delta = Math.sqrt(Number.EPSILON * Math.max(1e-5, yj * yj));
        ystage[j] = yj + delta;
        f(t, ystage, ftmp);
        ystage[j] = yj;
        const inv = 1 / delta;
        for (let i = 0; i < n; i++) J[i * n + j] = (ftmp[i] - f0[i]) * inv;
      }
      s.counters.rhs += n;
      s.counters.jac++;
    }
    if (this.autonomous) {
      this.dfdt.fill(0);
    } else {
      const delta = Math.sqrt(Number.EPSILON) * Math.max(1e-5, Math.abs(t));
      f(t + delta, y, ftmp);
      s.counters.rhs++;
      for (let i = 0; i < n; i++) this.dfdt[i] = (ftmp[i] - f0[i]) / delta;
    }
    this.jacCurrent = true;
    return allFinite(J, n * n) && allFinite(this.dfdt, n);
  }

  step(tEnd: number): StepCode {
    const { n, s, f, y, f0, K, W, J, piv, ynew, ystage, dfdt } = this;
    const c = s.counters;
    const dir = this.direction;
    const { stages, gamma, alpha, gammaSum, a, m, errorOrder } = RODAS4;
    let nonFinite = 0; // consecutive failed trials with non-finite values or a singular W
    let lastSingular = false;
    for (;;) {
      if (c.steps >= s.maxSteps) return 'max-steps';
      if (c.rhs + this.attemptCost() > s.maxEvaluations) return 'max-evaluations';
      const t = this.t;
      let h = this.h;
      if (Math.abs(h) > s.hmax) h = dir * s.hmax;
      let last = false;
      if (dir * (t + 1.01 * h - tEnd) >= 0) {
        h = tEnd - t;
        last = true;
      }
      if (Math.abs(h) < minStep(t, h)) return nonFinite > 0 && !lastSingular ? 'non-finite' : 'step-size-too-small';
      c.steps++;
      if (!this.jacCurrent && !this.evaluateJacobian()) return 'non-finite';

      // W = I/(h gamma) - J, factorised
      const diag = 1 / (h * gamma);
      for (let i = 0; i < n * n; i++) W[i] = -J[i];
      for (let i = 0; i < n; i++) W[i * n + i] += diag;
      c.lu++;
      const info = luFactor(W, n, piv);
      let ok = info === 0;

      for (let st = 0; ok && st < stages; st++) {
        const Ks = K[st];
        if (st === 0) {
          Ks.set(f0);
        } else {
          const row = a[st];
          for (let i = 0; i < n; i++) {
            let v = y[i];
            for (let j = 0; j < st; j++) v += row[j] * K[j][i];
            ystage[i] = v;
          }
          const ts = alpha[st] === 1 && last ? tEnd : t + alpha[st] * h;
          f(ts, ystage, Ks);
          c.rhs++;
        }
        const crow = RODAS4.c[st];
        for (let j = 0; j < st; j++) {
          const cj = crow[j] / h;
          const Kj = K[j];
          for (let i = 0; i < n; i++) Ks[i] += cj * Kj[i];
        }
        const g = gammaSum[st];
        if (g !== 0 && !this.autonomous) for (let i = 0; i < n; i++) Ks[i] += h * g * dfdt[i];
        luSolve(W, n, piv, Ks);
        if (!allFinite(Ks, n)) ok = false;
      }

      let err = Infinity;
      if (ok) {
        for (let i = 0; i < n; i++) {
          let v = y[i];
          for (let j = 0; j < stages; j++) v += m[j] * K[j][i];
          ynew[i] = v;
        }
        // error = K_6 (e = [0,0,0,0,0,1])
        err = errorNorm(K[stages - 1], y, ynew, s.rtol, s.atol, n);
      }
      if (!ok || !Number.isFinite(err)) {
        c.rejected++;
        lastSingular = info !== 0;
        if (++nonFinite > MAX_NONFINITE_RETRIES) return lastSingular ? 'step-size-too-small' : 'non-finite';
        this.sc[2] = h * 0.25;
        this.rejectLast = true;
        continue;
      }

      const fac = Math.min(FAC_MAX, Math.max(FAC_MIN, FAC_SAFE / Math.pow(err, 1 / errorOrder)));
      let hnew = h * fac;
      if (err <= 1) {
        // f at the new point: dense output now, first stage next step
        const tNew = last ? tEnd : t + h;
        f(tNew, ynew, this.ftmp);
        c.rhs++;
        if (!allFinite(this.ftmp, n)) {
          c.rejected++;
          if (++nonFinite > MAX_NONFINITE_RETRIES) return 'non-finite';
          this.sc[2] = h * 0.25;
          this.rejectLast = true;
          continue;
        }
        this.yOld.set(y);
        this.fOld.set(f0);
        y.set(ynew);
        f0.set(this.ftmp);
        this.f1.set(this.ftmp);
        this.sc[1] = t;
        this.sc[0] = tNew;
        this.sc[3] = h;
        this.jacCurrent = false;
        if (Math.abs(hnew) > s.hmax) hnew = dir * s.hmax;
        if (this.rejectLast) hnew = dir * Math.min(Math.abs(hnew), Math.abs(h));
        this.rejectLast = this.rejectMore = false;
        this.sc[2] = last && Math.abs(hnew) < Math.abs(this.h) ? this.h : hnew;
        return 'ok';
      }
      if (this.rejectMore) hnew = h * FAC_REJ;
      this.rejectMore = this.rejectLast;
      this.rejectLast = true;
      c.rejected++;
      this.sc[2] = hnew;
    }
  }

  /** Cubic Hermite interpolation on the last accepted step. */
  dense(sT: number, out: Float64Array): void {
    const { n, yOld, fOld, y, f1 } = this;
    const h = this.hStep;
    if (h === 0) {
      out.set(y);
      return;
    }
    const th = (sT - this.tOld) / h;
    const th2 = th * th;
    const th3 = th2 * th;
    const h00 = 2 * th3 - 3 * th2 + 1;
    const h10 = th3 - 2 * th2 + th;
    const h01 = -2 * th3 + 3 * th2;
    const h11 = th3 - th2;
    for (let i = 0; i < n; i++) out[i] = h00 * yOld[i] + h10 * h * fOld[i] + h01 * y[i] + h11 * h * f1[i];
  }
}
