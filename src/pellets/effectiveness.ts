/**
 * The effectiveness factor a reactor multiplies its intrinsic rates by, at one bulk state: internal
 * (numerical pellet, pellet-bvp.ts, or Bischoff's generalized modulus, generalized.ts) and, when
 * film coefficients are given, overall (film and pellet in series).
 *
 *   film:    k_c,j a (C_b,j - C_s,j) = -sum_i nu_ij eta_i g_i r_i(C_s, T_s)     (a = Sp/Vp)
 *            h a (T_s - T_b) = sum_i (-dH_i) eta_i g_i r_i(C_s, T_s)             (with h and dH)
 *   overall: Omega_i = eta_i r_i(C_s, T_s) / r_i(C_b, T_b)
 *
 * Method: the surface state is found by an outer fixed-point iteration on eta (eta from the
 * current surface state) around an inner Newton solve of the film balances with eta frozen and the
 * exact derivatives of the rates (CompiledKinetics.ratesJacC; temperature by central differences),
 * as in the usual treatment of series resistances (G.F. Froment, K.B. Bischoff, J. De Wilde,
 * Chemical Reactor Analysis and Design, 3rd ed., Wiley 2011, ch. 3). Kinetics stay intrinsic.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { solveLinear } from '../numerics/lu.js';
import type { ShapeExponent } from './analytic.js';
import { generalizedModulus } from './generalized.js';
import { PelletSolver } from './pellet-bvp.js';

/** Everything the evaluator needs, SI. */
export interface PelletModel {
  kinetics: CompiledKinetics;
  a: ShapeExponent;
  /** Diffusion length of the model, m. */
  R: number;
  /** Vp/Sp of the real pellet, m. */
  volumeToSurface: number;
  De: Float64Array;
  rateToPellet: Float64Array;
  /** 'numerical' (collocation, any rate law) or 'generalized' (Bischoff's modulus, an estimate). */
  method: 'numerical' | 'generalized';
  /** Non-isothermal pellet (numerical method only). */
  thermal?: { conductivity: number; enthalpy: Float64Array };
  /** Film coefficients: k_c per species (m/s) and, for the heat film, h (W/(m2 K)) with enthalpies. */
  film?: { kc: Float64Array; h?: number; enthalpy?: Float64Array };
}

export interface EffectivenessResult {
  ok: boolean;
  /** Factor per reaction multiplying the intrinsic rate at bulk conditions. */
  factor: Float64Array;
  /** Internal effectiveness per reaction at the surface state. */
  internal: Float64Array;
  /** Surface concentrations and temperature. */
  surface: Float64Array;
  surfaceTemperature: number;
  detail?: string;
}

export class EffectivenessEvaluator {
  private readonly solver?: PelletSolver;
  private readonly nS: number;
  private readonly nR: number;
  /** Pellet solves done (numerical method), for reports and benchmarks. */
  solves = 0;
  /**
   * Start each pellet solve from the previous converged profile (default true): along a bed the
   * states change little between solves, and Newton then needs two or three iterations instead of
   * five to eight. Callers clear it (`clearWarmStart`) where a pass begins, so that a pass's
   * numbers depend on that pass alone.
   */
  warmStart = true;

  constructor(readonly model: PelletModel, readonly theta: Float64Array) {
    this.nS = model.kinetics.speciesNames.length;
    this.nR = model.kinetics.reactionIds.length;
    if (model.method === 'numerical') {
      this.solver = new PelletSolver(
        { kinetics: model.kinetics, a: model.a, R: model.R, De: model.De, rateToPellet: model.rateToPellet, ...(model.thermal ? { thermal: model.thermal } : {}) },
        theta,
      );
    }
  }

  /** Internal effectiveness per reaction at surface state (Cs, Ts). */
  internal(Cs: Float64Array, Ts: number): { eta: Float64Array; ok: boolean; detail?: string } {
    if (this.solver) {
      this.solves++;
      const s = this.solver.solve(Cs, Ts, { warmStart: this.warmStart });
      return { eta: s.eta, ok: s.success, ...(s.success ? {} : { detail: s.message }) };
    }
    const m = this.model;
    const g = generalizedModulus({ kinetics: m.kinetics, theta: this.theta, Cs, Ts, De: m.De, rateToPellet: m.rateToPellet, a: m.a, volumeToSurface: m.volumeToSurface });
    return { eta: g.eta, ok: true };
  }

  /** Forget the warm-start profile: the next solve starts from a flat profile. */
  clearWarmStart(): void {
    this.solver?.clearWarmStart();
  }

  /** Overall factor at bulk state (Cb, Tb). */
  evaluate(Cb: Float64Array, Tb: number): EffectivenessResult {
    const film = this.model.film;
    if (!film) {
      const r = this.internal(Cb, Tb);
      return { ok: r.ok, factor: r.eta, internal: r.eta, surface: Float64Array.from(Cb), surfaceTemperature: Tb, ...(r.detail ? { detail: r.detail } : {}) };
    }
    return this.withFilm(Cb, Tb, film);
  }

  private withFilm(Cb: Float64Array, Tb: number, film: NonNullable<PelletModel['film']>): EffectivenessResult {
    const Cs = Float64Array.from(Cb);
    let Ts = Tb;
    let eta: Float64Array = new Float64Array(this.nR).fill(1);
    let ok = true;
    let detail: string | undefined;
    for (let outer = 0; outer < 50; outer++) {
      const r = this.internal(Cs, Ts);
      if (!r.ok) {
        ok = false;
        detail = r.detail;
      }
      let change = 0;
      for (let i = 0; i < this.nR; i++) change = Math.max(change, Math.abs(r.eta[i] - eta[i]));
      eta = r.eta;
      const inner = this.filmNewton(Cb, Tb, Cs, Ts, eta, film);
      Ts = inner.Ts;
      if (!inner.ok) {
        ok = false;
        detail = 'the film balances did not converge';
      }
      if (change < 1e-9 && outer > 0) break;
    }
    const rb = new Float64Array(this.nR);
    const rs = new Float64Array(this.nR);
    this.model.kinetics.rates(Cb, Tb, this.theta, rb);
    this.model.kinetics.rates(Cs, Ts, this.theta, rs);
    const factor = Float64Array.from(eta, (e, i) => (rb[i] === 0 ? 1 : (e * rs[i]) / rb[i]));
    return { ok, factor, internal: eta, surface: Cs, surfaceTemperature: Ts, ...(detail ? { detail } : {}) };
  }

  /** Newton on the film balances with eta frozen; Cs updated in place. */
  private filmNewton(Cb: Float64Array, Tb: number, Cs: Float64Array, Ts0: number, eta: Float64Array, film: NonNullable<PelletModel['film']>): { ok: boolean; Ts: number } {
    const { nS, nR } = this;
    const heat = film.h !== undefined && film.enthalpy !== undefined;
    const n = nS + (heat ? 1 : 0);
    const ap = 1 / this.model.volumeToSurface;
    const kin = this.model.kinetics;
    const g = this.model.rateToPellet;
    const r = new Float64Array(nR);
    const r2 = new Float64Array(nR);
    const jc = new Float64Array(nR * nS);
    const F = new Float64Array(n);
    const J = new Float64Array(n * n);
    let Ts = Ts0;
    const cmax = Math.max(...Cb, 1e-300);
    const resid = (C: Float64Array, T: number, out: Float64Array): void => {
      kin.rates(C, T, this.theta, r);
      for (let j = 0; j < nS; j++) {
        let s = 0;
        for (let i = 0; i < nR; i++) s += kin.stoich[i * nS + j] * eta[i] * g[i] * r[i];
        out[j] = film.kc[j] * ap * (Cb[j] - C[j]) + s;
      }
      if (heat) {
        let q = 0;
        for (let i = 0; i < nR; i++) q -= film.enthalpy![i] * eta[i] * g[i] * r[i];
        out[nS] = film.h! * ap * (T - Tb) - q;
      }
    };
    for (let it = 0; it < 100; it++) {
      resid(Cs, Ts, F);
      kin.ratesJacC(Cs, Ts, this.theta, jc);
      J.fill(0);
      for (let j = 0; j < nS; j++) {
        J[j * n + j] = -film.kc[j] * ap;
        for (let q = 0; q < nS; q++) {
          let d = 0;
          for (let i = 0; i < nR; i++) d += kin.stoich[i * nS + j] * eta[i] * g[i] * jc[i * nS + q];
          J[j * n + q] += d;
        }
      }
      if (heat) this.heatRows(Cs, Ts, eta, film, ap, J, n, r, r2, jc);
      const sol = solveLinear(J, Float64Array.from(F, (v) => -v), n);
      if (!sol.success) return { ok: false, Ts };
      let step = 0;
      let lam = 1;
      for (let j = 0; j < nS; j++) if (Cs[j] + sol.x[j] < 0) lam = Math.min(lam, (0.9 * Cs[j]) / -sol.x[j]);
      for (let j = 0; j < nS; j++) {
        Cs[j] += lam * sol.x[j];
        step = Math.max(step, Math.abs(lam * sol.x[j]) / cmax);
      }
      if (heat) Ts += lam * sol.x[nS];
      if (step < 1e-12) return { ok: true, Ts };
    }
    return { ok: false, Ts };
  }

  /** Temperature derivatives of the film balances (central differences in T) and the heat row. */
  private heatRows(Cs: Float64Array, Ts: number, eta: Float64Array, film: NonNullable<PelletModel['film']>, ap: number, J: Float64Array, n: number, r: Float64Array, r2: Float64Array, jc: Float64Array): void {
    const { nS, nR } = this;
    const kin = this.model.kinetics;
    const g = this.model.rateToPellet;
    const h = 1e-6 * Ts;
    kin.rates(Cs, Ts + h, this.theta, r);
    kin.rates(Cs, Ts - h, this.theta, r2);
    for (let j = 0; j < nS; j++) {
      let d = 0;
      for (let i = 0; i < nR; i++) d += (kin.stoich[i * nS + j] * eta[i] * g[i] * (r[i] - r2[i])) / (2 * h);
      J[j * n + nS] = d;
    }
    let dq = 0;
    for (let i = 0; i < nR; i++) dq -= (film.enthalpy![i] * eta[i] * g[i] * (r[i] - r2[i])) / (2 * h);
    J[nS * n + nS] = film.h! * ap - dq;
    kin.ratesJacC(Cs, Ts, this.theta, jc);
    for (let q = 0; q < nS; q++) {
      let d = 0;
      for (let i = 0; i < nR; i++) d -= film.enthalpy![i] * eta[i] * g[i] * jc[i * nS + q];
      J[nS * n + q] = -d;
    }
  }
}
