/**
 * Size one reactor for one parameter vector: the workhorse under the nominal sizing, the Monte
 * Carlo draws and the finite-difference sensitivities.
 *
 * Flow reactors and batch: the mole balances (system.ts) are integrated in the size coordinate with
 * a terminal event where the target is met (conversion X_A = (F_A0 - F_A)/F_A0 reaches the target,
 * or the net production F_P - F_P0 reaches the target), a second terminal event where the pressure
 * runs out (u = p^2 = 0), and an upper size bound 1e6 times the initial-rate estimate.
 * Stirred tank: the algebraic balance F_j = F_j0 + S sum_i nu_ij r_i(C(F)) written in reaction
 * extents xi (F = F0 + nu^T xi, xi = S r(F)); for the target the extents are solved together with
 * the size S by Newton's method with a finite-difference Jacobian and step halving.
 */
import type { DesignSystem } from './system.js';
import { Marcher } from './march.js';
import type { OdeEvent } from '../numerics/ode-types.js';

export type SizeOnceStatus = 'sized' | 'target-unreachable' | 'pressure-exhausted' | 'integration-failed';

export interface SizeOnce {
  status: SizeOnceStatus;
  /** Size (kg, m3 or s); NaN unless sized (or rated for a given size). */
  size: number;
  /** Outlet state (flows mol/s or concentrations mol/m3, then u = p^2 when modelled). */
  y: Float64Array;
  /** Where the pressure ran out (size unit), for 'pressure-exhausted'. */
  exhaustedAt?: number;
  /** Detail for a failure. */
  detail?: string;
}

/** Tolerances used by a Sizer. */
export interface SizerOptions {
  /** Relative tolerance of the integration; default 1e-9. */
  rtol?: number;
  /** Absolute tolerance relative to the largest inlet amount; default 1e-12. */
  atolScale?: number;
  /** Step budget per solve; default 200000. */
  maxSteps?: number;
}

export class Sizer {
  readonly sys: DesignSystem;
  private readonly marcher: Marcher;
  private readonly rtol: number;
  private readonly atol: Float64Array;
  private readonly maxSteps: number;
  private readonly key: number;
  private readonly dy: Float64Array;

  constructor(sys: DesignSystem, opts: SizerOptions = {}) {
    this.sys = sys;
    this.marcher = new Marcher(sys.dim);
    this.rtol = opts.rtol ?? 1e-9;
    const scale = Math.max(...Array.from(sys.y0.subarray(0, sys.nS)));
    this.atol = new Float64Array(sys.dim).fill((opts.atolScale ?? 1e-12) * scale);
    if (sys.hasPressure) this.atol[sys.nS] = 1e-12;
    this.maxSteps = opts.maxSteps ?? 200000;
    const t = sys.kase.target;
    this.key = t.kind === 'size' ? -1 : sys.kase.species.indexOf(t.species);
    this.dy = new Float64Array(sys.dim);
  }

  /** Conversion of species j at state y (fraction of its inlet amount consumed). */
  conversion(y: ArrayLike<number>, j: number): number {
    const a0 = this.sys.y0[j];
    return a0 > 0 ? (a0 - y[j]) / a0 : 0;
  }

  /** g(y) of the target: >= 0 once the target is met. */
  targetGap(y: ArrayLike<number>): number {
    const t = this.sys.kase.target;
    if (t.kind === 'conversion') return this.conversion(y, this.key) - t.value;
    if (t.kind === 'production') return (y[this.key] - this.sys.y0[this.key]) / t.value - 1;
    return 0;
  }

  /** Initial-rate estimate of the size needed for the target (may be Infinity). */
  initialEstimate(): number {
    const s = this.sys;
    s.rhs(0, s.y0, this.dy);
    const t = s.kase.target;
    if (t.kind === 'size') return t.value;
    const need = t.kind === 'conversion' ? t.value * s.y0[this.key] : t.value;
    const rate = Math.abs(this.dy[this.key]);
    return rate > 0 ? need / rate : Infinity;
  }

  private events(withTarget: boolean): OdeEvent[] {
    const ev: OdeEvent[] = [];
    if (withTarget) ev.push({ name: 'target', g: (_t, y) => this.targetGap(y), direction: 1, terminal: true });
    if (this.sys.hasPressure) ev.push({ name: 'pressure', g: (_t, y) => y[this.sys.nS], direction: -1, terminal: true });
    return ev;
  }

  /** Size for the case target with the system's current theta (and alpha). */
  size(): SizeOnce {
    const s = this.sys;
    if (s.kase.target.kind === 'size') return this.rate(s.kase.target.value);
    if (s.kase.reactor.kind === 'stirred-tank') return this.sizeStirredTank();
    const est = this.initialEstimate();
    if (!Number.isFinite(est) || !(est > 0)) {
      return { status: 'target-unreachable', size: NaN, y: Float64Array.from(s.y0), detail: 'the net rate toward the target is zero at the inlet' };
    }
    const res = this.marcher.integrate(s.rhs, 0, s.y0, est * 1e6, {
      rtol: this.rtol,
      atol: this.atol,
      maxSteps: this.maxSteps,
      events: this.events(true),
    });
    if (res.status === 'event') {
      const e = res.events[res.events.length - 1];
      if (e.name === 'target') return { status: 'sized', size: e.t, y: e.y };
      return { status: 'pressure-exhausted', size: NaN, y: e.y, exhaustedAt: e.t };
    }
    if (res.status === 'success') {
      return { status: 'target-unreachable', size: NaN, y: res.y, detail: `the target was not reached within ${fmt(est * 1e6)} ${s.unit}` };
    }
    return { status: 'integration-failed', size: NaN, y: res.y, detail: res.message };
  }

  /**
   * Rate a reactor of the given size: outlet state. Optional positions (size unit) return the state
   * there too (profile). Status 'sized' on success.
   */
  rate(size: number, positions?: ArrayLike<number>): SizeOnce & { profile?: { x: number[]; y: Float64Array[] } } {
    const s = this.sys;
    if (s.kase.reactor.kind === 'stirred-tank') return this.rateStirredTank(size);
    const res = this.marcher.integrate(s.rhs, 0, s.y0, size, {
      rtol: this.rtol,
      atol: this.atol,
      maxSteps: this.maxSteps,
      events: this.events(false),
      ...(positions ? { tEval: positions } : {}),
    });
    const profile = positions ? { x: res.tOut, y: res.yOut } : undefined;
    if (res.status === 'success') return { status: 'sized', size, y: res.y, ...(profile ? { profile } : {}) };
    if (res.status === 'event') {
      return { status: 'pressure-exhausted', size: NaN, y: res.y, exhaustedAt: res.t, ...(profile ? { profile } : {}) };
    }
    return { status: 'integration-failed', size: NaN, y: res.y, detail: res.message };
  }

  // ---- Stirred tank (algebraic) -------------------------------------------------------------

  private stState(xi: Float64Array, out: Float64Array): void {
    const s = this.sys;
    for (let j = 0; j < s.nS; j++) {
      let v = s.y0[j];
      for (let i = 0; i < s.nR; i++) v += s.kinetics.stoich[i * s.nS + j] * xi[i];
      out[j] = v;
    }
  }

  /** Residuals of the stirred-tank balance in extents: res_i = xi_i - S r_i (scaled by F_T0). */
  private stResidual(xi: Float64Array, S: number, y: Float64Array, r: Float64Array, res: Float64Array): void {
    this.stState(xi, y);
    this.sys.ratesAt(y, r);
    for (let i = 0; i < this.sys.nR; i++) res[i] = xi[i] - S * r[i];
  }

  /**
   * Newton on z = (xi, S) (target) or z = xi (given size) with an FD Jacobian and step halving.
   * Unknowns are scaled by F_T0 (extents) and the initial estimate (size).
   */
  private stNewton(given?: number): SizeOnce {
    const s = this.sys;
    const nR = s.nR;
    const withSize = given === undefined;
    const n = nR + (withSize ? 1 : 0);
    let FT0 = 0;
    for (let j = 0; j < s.nS; j++) FT0 += s.y0[j];
    const est = withSize ? this.initialEstimate() : given!;
    if (!Number.isFinite(est) || !(est > 0)) {
      return { status: 'target-unreachable', size: NaN, y: Float64Array.from(s.y0), detail: 'the net rate toward the target is zero at the inlet' };
    }
    const y = new Float64Array(s.nS);
    const r = new Float64Array(nR);
    const xi = new Float64Array(nR);
    const z = new Float64Array(n);
    const F = new Float64Array(n);
    const Fp = new Float64Array(n);
    const J = new Float64Array(n * n);
    const dz = new Float64Array(n);
    const zt = new Float64Array(n);
    const t = s.kase.target;
    const residual = (zz: Float64Array, out: Float64Array): boolean => {
      for (let i = 0; i < nR; i++) xi[i] = zz[i] * FT0;
      const S = withSize ? Math.exp(zz[nR]) * est : given!;
      this.stResidual(xi, S, y, r, out);
      for (let i = 0; i < nR; i++) out[i] /= FT0;
      if (withSize) out[nR] = t.kind === 'conversion' ? this.conversion(y, this.key) - t.value : (y[this.key] - s.y0[this.key]) / FT0 - t.value / FT0;
      for (let k = 0; k < n; k++) if (!Number.isFinite(out[k])) return false;
      return true;
    };
    // Start: extents from the single-step estimate (rates at the inlet times the size guess, damped).
    s.ratesAt(s.y0, r);
    for (let i = 0; i < nR; i++) z[i] = (0.5 * est * r[i]) / FT0;
    if (withSize) z[nR] = 0;
    if (!residual(z, F)) return { status: 'integration-failed', size: NaN, y, detail: 'non-finite balance at the start' };
    let norm = l2(F);
    for (let it = 0; it < 100; it++) {
      if (norm < 1e-13) break;
      for (let k = 0; k < n; k++) {
        const h = 1e-7 * Math.max(1e-3, Math.abs(z[k]));
        zt.set(z);
        zt[k] += h;
        if (!residual(zt, Fp)) return { status: 'integration-failed', size: NaN, y, detail: 'non-finite balance' };
        for (let m = 0; m < n; m++) J[m * n + k] = (Fp[m] - F[m]) / h;
      }
      for (let m = 0; m < n; m++) dz[m] = -F[m];
      if (!solveDense(J, dz, n)) return { status: 'integration-failed', size: NaN, y, detail: 'singular stirred-tank Jacobian' };
      let lam = 1;
      let ok = false;
      for (let h = 0; h < 30; h++) {
        for (let k = 0; k < n; k++) zt[k] = z[k] + lam * dz[k];
        if (residual(zt, Fp) && l2(Fp) < (1 - 1e-4 * lam) * norm) {
          ok = true;
          break;
        }
        lam /= 2;
      }
      if (!ok) return { status: 'integration-failed', size: NaN, y, detail: 'the stirred-tank balance did not converge (Newton stalled)' };
      z.set(zt);
      F.set(Fp);
      norm = l2(F);
    }
    if (!(norm < 1e-10)) return { status: 'integration-failed', size: NaN, y, detail: `the stirred-tank balance did not converge (residual ${norm.toExponential(2)})` };
    residual(z, F);
    for (let j = 0; j < s.nS; j++) {
      if (y[j] < -1e-9 * FT0) return { status: 'target-unreachable', size: NaN, y, detail: 'the balance needs a negative outlet flow' };
    }
    const S = withSize ? Math.exp(z[nR]) * est : given!;
    return { status: 'sized', size: S, y: Float64Array.from(y) };
  }

  private sizeStirredTank(): SizeOnce {
    return this.stNewton();
  }

  private rateStirredTank(size: number): SizeOnce {
    return this.stNewton(size);
  }
}

function l2(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return Math.sqrt(s);
}

/** Solve A x = b in place (b becomes x) by Gaussian elimination with partial pivoting. */
export function solveDense(A: Float64Array, b: Float64Array, n: number): boolean {
  const a = Float64Array.from(A);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r * n + c]) > Math.abs(a[p * n + c])) p = r;
    if (!(Math.abs(a[p * n + c]) > 1e-300)) return false;
    if (p !== c) {
      for (let k = 0; k < n; k++) {
        const t = a[c * n + k];
        a[c * n + k] = a[p * n + k];
        a[p * n + k] = t;
      }
      const t = b[c];
      b[c] = b[p];
      b[p] = t;
    }
    for (let r = c + 1; r < n; r++) {
      const f = a[r * n + c] / a[c * n + c];
      if (f === 0) continue;
      for (let k = c; k < n; k++) a[r * n + k] -= f * a[c * n + k];
      b[r] -= f * b[c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let v = b[r];
    for (let k = r + 1; k < n; k++) v -= a[r * n + k] * b[k];
    b[r] = v / a[r * n + r];
  }
  return true;
}

export function fmt(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return String(x);
  return Number(x.toPrecision(digits)).toString();
}
