/**
 * Weighted residuals, defined in exactly one place:
 *
 *   r_i = (measured_i - predicted_i) / sigma_i,     dr_i/dtheta_j = -(dpred_i/dtheta_j) / sigma_i.
 *
 * The objective of every solver is sum r_i^2 and every Jacobian is the Jacobian of these r_i, so
 * objective and Jacobian can never disagree about weights or sign.
 *
 * A `ResidualProblem` maps the vector x of FREE parameters (estimation space) into the model's full
 * theta (fixed parameters held at their estimation-space values), evaluates predictions, and returns
 * residuals and the residual Jacobian over the free parameters. The Jacobian is the model's exact
 * one when it provides `jacobian`, else forward differences with the relative step of MINPACK's
 * fdjac2 (h_j = sqrt(eps) |x_j|, or sqrt(eps) when x_j = 0; More, Garbow & Hillstrom 1980, ANL-80-74),
 * or central differences (h_j = eps^(1/3) max(|x_j|, 1)) on request. A step that leaves the bounds
 * is taken to the other side. With blocks of correlated observations (`whiten`, see whiten.ts) the
 * residuals and the Jacobian are those of the whitened problem, r = L^-1 e. All buffers are
 * preallocated: the residual loop does not allocate.
 */
import type { Warning } from '../core/outcome.js';
import type { PredictionFailure, RegressionModel } from './model.js';
import { applyWhitening, unwhiten, type WhitenBlock } from './whiten.js';

/** A least-squares problem in the free parameters: what the solvers see. */
export interface LeastSquaresProblem {
  /** Number of residuals. */
  readonly m: number;
  /** Number of free parameters. */
  readonly n: number;
  /** Residuals at x into `out`; false when the model cannot be evaluated at x. */
  residuals(x: Float64Array, out: Float64Array): boolean;
  /** Residual Jacobian (m x n row-major) at x given r = residuals(x); false on failure. */
  jacobian(x: Float64Array, r: Float64Array, J: Float64Array): boolean;
  /** Number of model evaluations so far (predictions, including finite-difference ones). */
  readonly evaluations: number;
}

export interface ResidualProblemInit {
  model: RegressionModel;
  measured: Float64Array;
  sigma: Float64Array;
  /** Full theta in the model's order (estimation space); the values of fixed entries are used. */
  thetaFull: Float64Array;
  /** Indices into theta of the free parameters, in the order of x. */
  freeIndex: readonly number[];
  /** Lower bounds of x (estimation space), used only to keep finite-difference steps inside. */
  lower?: Float64Array;
  /** Upper bounds of x (estimation space). */
  upper?: Float64Array;
  /** 'forward' (default) or 'central' finite differences when the model has no Jacobian. */
  differences?: 'forward' | 'central';
  /** Ignore the model's exact Jacobian and use finite differences; default false. */
  forceFiniteDifferences?: boolean;
  /** Blocks of correlated observations (whiten.ts): residuals and Jacobian are whitened; default none. */
  whiten?: readonly WhitenBlock[];
}

const SQRT_EPS = Math.sqrt(2.220446049250313e-16);
const CBRT_EPS = Math.cbrt(2.220446049250313e-16);

/** The standard residual problem built on a RegressionModel. */
export class ResidualProblem implements LeastSquaresProblem {
  readonly m: number;
  readonly n: number;
  evaluations = 0;
  /** Failure messages of the most recent failed evaluation. */
  readonly failures: PredictionFailure[] = [];
  /** Every failed evaluation so far, per run: how often and the first message (see failureWarning). */
  readonly failureLog = new Map<string, { count: number; message: string }>();
  /** Number of failed evaluations so far. */
  failedEvaluations = 0;
  private readonly model: RegressionModel;
  private readonly measured: Float64Array;
  private readonly invSigma: Float64Array;
  private readonly theta: Float64Array;
  private readonly freeIndex: readonly number[];
  private readonly pred: Float64Array;
  private readonly pred2: Float64Array;
  private readonly xTmp: Float64Array;
  private readonly Jfull: Float64Array | undefined;
  private readonly lower: Float64Array | undefined;
  private readonly upper: Float64Array | undefined;
  private readonly central: boolean;
  private readonly exact: boolean;
  private readonly whiten: readonly WhitenBlock[];
  private readonly rRaw: Float64Array;

  constructor(init: ResidualProblemInit) {
    this.model = init.model;
    this.m = init.model.nObservations;
    this.n = init.freeIndex.length;
    this.measured = init.measured;
    this.invSigma = new Float64Array(this.m);
    for (let i = 0; i < this.m; i++) this.invSigma[i] = 1 / init.sigma[i];
    this.theta = Float64Array.from(init.thetaFull);
    this.freeIndex = init.freeIndex;
    this.pred = new Float64Array(this.m);
    this.pred2 = new Float64Array(this.m);
    this.xTmp = new Float64Array(this.n);
    this.exact = !!init.model.jacobian && !init.forceFiniteDifferences;
    this.Jfull = this.exact ? new Float64Array(this.m * this.theta.length) : undefined;
    this.lower = init.lower;
    this.upper = init.upper;
    this.central = init.differences === 'central';
    this.whiten = init.whiten ?? [];
    this.rRaw = new Float64Array(this.whiten.length ? this.m : 0);
  }

  /** Whether the exact model Jacobian is used. */
  get usesExactJacobian(): boolean {
    return this.exact;
  }

  private load(x: Float64Array): void {
    for (let j = 0; j < this.n; j++) this.theta[this.freeIndex[j]] = x[j];
  }

  /** Predictions at x into `out`; false on model failure. */
  predict(x: Float64Array, out: Float64Array): boolean {
    this.load(x);
    this.evaluations++;
    this.failures.length = 0;
    let ok: boolean;
    try {
      ok = this.model.predict(this.theta, out, this.failures);
    } catch (e) {
      ok = false;
      this.failures.push({ run: '*', message: e instanceof Error ? e.message : String(e) });
    }
    if (ok) {
      for (let i = 0; i < this.m; i++) {
        if (!Number.isFinite(out[i])) {
          this.failures.push({ run: '*', message: `prediction ${i} is not finite` });
          ok = false;
          break;
        }
      }
    }
    if (!ok) this.logFailure();
    return ok;
  }

  private logFailure(): void {
    this.failedEvaluations++;
    if (this.failures.length === 0) this.failures.push({ run: '*', message: 'the model could not be evaluated' });
    const seen = new Set<string>();
    for (const f of this.failures) {
      if (seen.has(f.run)) continue;
      seen.add(f.run);
      const e = this.failureLog.get(f.run);
      if (e) e.count++;
      else this.failureLog.set(f.run, { count: 1, message: f.message });
    }
  }

  /**
   * One warning naming every run whose model evaluation failed at some parameter values during
   * the solve (those trial steps were rejected), or undefined when none failed.
   */
  failureWarning(): Warning | undefined {
    if (this.failureLog.size === 0) return undefined;
    const runs = [...this.failureLog.keys()];
    const shown = runs.slice(0, 8).map((r) => {
      const e = this.failureLog.get(r)!;
      return `${r === '*' ? 'model' : `run ${r}`} (${e.count}x: ${e.message.length > 160 ? `${e.message.slice(0, 157)}...` : e.message})`;
    });
    const more = runs.length > 8 ? `; and ${runs.length - 8} more run(s)` : '';
    return {
      code: 'model-evaluation-failed',
      message: `${this.failedEvaluations} of ${this.evaluations} model evaluations failed (a failed trial step is rejected and the trust region shrinks); failing: ${shown.join('; ')}${more}`,
      path: runs,
    };
  }

  residuals(x: Float64Array, out: Float64Array): boolean {
    if (!this.predict(x, this.pred)) return false;
    for (let i = 0; i < this.m; i++) out[i] = (this.measured[i] - this.pred[i]) * this.invSigma[i];
    if (this.whiten.length) applyWhitening(this.whiten, out);
    return true;
  }

  jacobian(x: Float64Array, r: Float64Array, J: Float64Array): boolean {
    if (!this.whiten.length) return this.rawJacobian(x, r, J);
    // Differences need the unwhitened residuals at x; the Jacobian is whitened column by column.
    this.rRaw.set(r);
    unwhiten(this.whiten, this.rRaw);
    if (!this.rawJacobian(x, this.rRaw, J)) return false;
    applyWhitening(this.whiten, J, this.n);
    return true;
  }

  /** Jacobian of the scaled, unwhitened residuals e = (y - f) / sigma, given e at x. */
  private rawJacobian(x: Float64Array, r: Float64Array, J: Float64Array): boolean {
    const m = this.m;
    const n = this.n;
    if (this.exact && this.Jfull && this.model.jacobian) {
      this.load(x);
      this.evaluations++;
      this.failures.length = 0;
      const nt = this.theta.length;
      let ok: boolean;
      try {
        ok = this.model.jacobian(this.theta, this.pred, this.Jfull, this.failures);
      } catch (e) {
        ok = false;
        this.failures.push({ run: '*', message: e instanceof Error ? e.message : String(e) });
      }
      if (!ok) {
        this.logFailure();
        return false;
      }
      for (let i = 0; i < m; i++) {
        for (let j = 0; j < n; j++) {
          const v = -this.Jfull[i * nt + this.freeIndex[j]] * this.invSigma[i];
          if (!Number.isFinite(v)) {
            this.failures.push({ run: '*', message: `the derivative of prediction ${i} is not finite` });
            this.logFailure();
            return false;
          }
          J[i * n + j] = v;
        }
      }
      return true;
    }
    const xt = this.xTmp;
    for (let j = 0; j < n; j++) {
      xt.set(x);
      const xj = x[j];
      const lo = this.lower ? this.lower[j] : -Infinity;
      const hi = this.upper ? this.upper[j] : Infinity;
      if (this.central) {
        const h = CBRT_EPS * Math.max(Math.abs(xj), 1);
        let hp = h;
        let hm = h;
        if (xj + hp > hi) hp = 0;
        if (xj - hm < lo) hm = 0;
        if (hp === 0 && hm === 0) return false;
        if (hp > 0) {
          xt[j] = xj + hp;
          if (!this.predict(xt, this.pred)) return false;
        }
        if (hm > 0) {
          xt[j] = xj - hm;
          if (!this.predict(xt, this.pred2)) return false;
        }
        for (let i = 0; i < m; i++) {
          // r(x + hp) and r(x - hm); a side blocked by a bound uses r(x) itself (one-sided difference).
          const rp = hp > 0 ? (this.measured[i] - this.pred[i]) * this.invSigma[i] : r[i];
          const rm = hm > 0 ? (this.measured[i] - this.pred2[i]) * this.invSigma[i] : r[i];
          J[i * n + j] = (rp - rm) / (hp + hm);
        }
      } else {
        let h = SQRT_EPS * Math.abs(xj);
        if (h === 0) h = SQRT_EPS;
        if (xj + h > hi) h = -h;
        xt[j] = xj + h;
        let ok = this.predict(xt, this.pred);
        if (!ok && xj - h >= lo && xj - h <= hi) {
          h = -h;
          xt[j] = xj + h;
          ok = this.predict(xt, this.pred);
        }
        if (!ok) return false;
        const hx = xt[j] - xj; // the step actually represented in floating point
        for (let i = 0; i < m; i++) {
          const rp = (this.measured[i] - this.pred[i]) * this.invSigma[i];
          J[i * n + j] = (rp - r[i]) / hx;
        }
      }
    }
    return true;
  }
}
