/**
 * The pellet reaction-diffusion boundary-value problem for any compiled rate law, solved
 * numerically; gives the internal effectiveness factor of every reaction.
 *
 *   De_j (1/R^2) L C_j + sum_i nu_ij g_i r_i(C, T) = 0,    C_j(1) = C_j,s,  dC_j/dx(0) = 0
 *   lambda (1/R^2) L T + sum_i (-dH_i) g_i r_i(C, T) = 0,  T(1) = T_s       (non-isothermal, optional)
 *   L = d2/dx2 + (a-1)/x d/dx,  x = r/R in [0, 1],  a = 1 slab, 2 cylinder, 3 sphere,
 *   eta_i = a int_0^1 r_i(C(x), T(x)) x^(a-1) dx / r_i(C_s, T_s).
 *
 * g_i converts the compiled rate into mol per m3 of pellet per s (pellet density for a rate per kg).
 * Method: orthogonal collocation in u = x^2 (Villadsen & Stewart 1967; see collocation.ts), whose
 * symmetry condition at the centre is built in; the collocation equations are solved by Newton's
 * method with the exact Jacobian from CompiledKinetics.ratesJacC (temperature derivative of the
 * rates by central differences) and a backtracking line search on the residual norm (J.E. Dennis,
 * R.B. Schnabel, Numerical Methods for Unconstrained Optimization and Nonlinear Equations, 1983,
 * sec. 6.3). eta is integrated by Gauss-Legendre quadrature in x of the rates at the interpolated
 * profile. The number of collocation points grows with the linearised Thiele modulus at the surface.
 * Species no rate depends on are left out of the unknowns (they cannot change eta).
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { luFactor, luSolve } from '../numerics/lu.js';
import { outcome, type Outcome, type StatusTable } from '../core/outcome.js';
import { collocationGrid, gaussLegendre01, interpolationRow, type CollocationGrid } from './collocation.js';
import type { ShapeExponent } from './analytic.js';

export type PelletStatus = 'converged' | 'newton-failed' | 'non-finite';

export const PELLET_STATUS: StatusTable<PelletStatus> = {
  converged: { success: true, message: 'pellet profile converged' },
  'newton-failed': { success: false, message: 'Newton iteration on the pellet profile did not converge' },
  'non-finite': { success: false, message: 'the pellet equations gave a non-finite value' },
};

/** The pellet, as the numerical solver needs it (SI). */
export interface PelletProblem {
  kinetics: CompiledKinetics;
  /** Shape exponent. */
  a: ShapeExponent;
  /** Diffusion length, m (half-thickness of a slab, radius otherwise). */
  R: number;
  /** Effective diffusivity per species, m2/s (length nS, all > 0). */
  De: Float64Array;
  /** Per reaction: factor from the compiled rate to mol/(m3 pellet s) (pellet density for a rate per kg). */
  rateToPellet: Float64Array;
  /** Non-isothermal pellet: effective conductivity W/(m K) and reaction enthalpies J/mol (per reaction). */
  thermal?: { conductivity: number; enthalpy: Float64Array };
}

export interface PelletSolveOptions {
  /** Collocation intervals; default chosen from the surface Thiele modulus (12 to 120). */
  nodes?: number;
  /** Newton iterations; default 60. */
  maxIterations?: number;
  /** Keep the profile at the collocation points; default false. */
  profile?: boolean;
  /**
   * Start Newton from the previous converged profile of this solver (scaled to the new surface
   * state) when it has the same points and unknowns; default false. The caller clears it
   * (`clearWarmStart`) where a pass must not depend on what was solved before.
   */
  warmStart?: boolean;
}

export interface PelletSolution extends Outcome<PelletStatus> {
  /** Internal effectiveness factor per reaction (1 where the surface rate is zero). */
  eta: Float64Array;
  /** Centre temperature, K (the surface temperature for an isothermal pellet). */
  centreTemperature: number;
  /** Centre concentrations, mol/m3. */
  centreConcentrations: Float64Array;
  iterations: number;
  nodes: number;
  /** x = r/R at the points (centre to surface), concentrations (rows per point) and temperatures. */
  profile?: { x: number[]; concentrations: Float64Array[]; temperature: number[] };
}

const grids = new Map<string, CollocationGrid>();
function grid(N: number, a: number): CollocationGrid {
  const key = `${N}:${a}`;
  let g = grids.get(key);
  if (!g) grids.set(key, (g = collocationGrid(N, a)));
  return g;
}

/**
 * Collocation intervals for a linearised Thiele modulus phi (PelletSolver.gridModulus; steeper
 * profiles need more points): N = ceil(8 + phi/2), from 8 to 120. Measured against the first-order closed forms (all
 * three shapes) and a 160-point solve of second-order pellets, for phi from 0.5 to 212: relative
 * error of eta below 1e-8 (tests/pellets/eta.test.ts checks it against the closed forms).
 */
export function nodesFor(phi: number): number {
  const n = Math.ceil(8 + 0.5 * (Number.isFinite(phi) ? phi : 224));
  return Math.min(120, Math.max(8, n));
}

/** The pellet problem bound to one parameter vector; solve it for many surface states. */
export class PelletSolver {
  readonly nS: number;
  readonly nR: number;
  /** Unknowns per point in the current solve: active species (+1 with the temperature). */
  private m = 0;
  /** Species solved for in the current solve (those some rate depends on), by component. */
  private act: Int32Array = new Int32Array(0);
  private readonly thermalIndex: boolean;
  private readonly r: Float64Array;
  private readonly r2: Float64Array;
  private readonly jc: Float64Array;
  /** Full concentration vector at a point (passive species at their surface value). */
  private readonly Cpt: Float64Array;
  private fixedT = 0;
  /** Per component c and reaction i: coefficient times the balance's scale R^2/D (current solve). */
  private cs: Float64Array = new Float64Array(0);
  /** Newton workspaces, reallocated when the number of unknowns changes. */
  private ws?: NewtonWorkspace;
  /** The last converged profile relative to its surface state (warm start), with its grid and unknowns. */
  private warm?: { N: number; act: string; ratio: Float64Array };

  constructor(readonly problem: PelletProblem, readonly theta: Float64Array) {
    const k = problem.kinetics;
    this.nS = k.speciesNames.length;
    this.nR = k.reactionIds.length;
    this.thermalIndex = problem.thermal !== undefined;
    this.r = new Float64Array(this.nR);
    this.r2 = new Float64Array(this.nR);
    this.jc = new Float64Array(this.nR * this.nS);
    this.Cpt = new Float64Array(this.nS);
  }

  /** Linearised Thiele modulus at the surface: R sqrt(max_j |dS_j/dC_j| / De_j). */
  surfaceModulus(Cs: Float64Array, Ts: number): number {
    const { kinetics, R, De, rateToPellet } = this.problem;
    const { nS, nR, jc } = this;
    kinetics.ratesJacC(Cs, Ts, this.theta, jc);
    let worst = 0;
    for (let j = 0; j < nS; j++) {
      let d = 0;
      for (let i = 0; i < nR; i++) d += kinetics.stoich[i * nS + j] * rateToPellet[i] * jc[i * nS + j];
      worst = Math.max(worst, Math.abs(d) / De[j]);
    }
    return R * Math.sqrt(worst);
  }

  /**
   * The modulus that sets the number of points: the largest linearised modulus at the surface state
   * scaled by 1, 1/4 and 1/20. Inside the pellet the concentrations fall, and a saturating rate
   * (Langmuir-Hinshelwood) or an order below one is steepest there, not at the surface.
   */
  private gridModulus(Cs: Float64Array, Ts: number): number {
    let phi = this.surfaceModulus(Cs, Ts);
    const C = this.Cpt;
    for (const f of [0.25, 0.05]) {
      for (let j = 0; j < this.nS; j++) C[j] = f * Cs[j];
      phi = Math.max(phi, this.surfaceModulus(C, Ts));
    }
    return phi;
  }

  /**
   * Species some rate depends on: a non-zero d r_i / d C_j at the surface state or at two other
   * positive states. The rest (inerts, products no rate contains) cannot change eta and are not
   * solved for; the profile reports them at their surface value.
   */
  private activeSpecies(Cs: Float64Array, Ts: number): Int32Array {
    const { nS, nR, jc, Cpt } = this;
    let mean = 0;
    for (let j = 0; j < nS; j++) mean += Cs[j] / nS;
    const used = new Uint8Array(nS);
    for (const [f, g] of [[1, 0], [0.5, 0.1], [0.1, 0.5]]) {
      for (let j = 0; j < nS; j++) Cpt[j] = f * Cs[j] + g * mean + (f === 1 ? 0 : 1e-3 * (j + 1) * mean);
      this.problem.kinetics.ratesJacC(Cpt, Ts, this.theta, jc);
      for (let i = 0; i < nR; i++) for (let j = 0; j < nS; j++) if (jc[i * nS + j] !== 0) used[j] = 1;
    }
    const act: number[] = [];
    for (let j = 0; j < nS; j++) if (used[j]) act.push(j);
    return Int32Array.from(act);
  }

  /** Solve for surface concentrations Cs (mol/m3) and temperature Ts (K). */
  solve(Cs: Float64Array, Ts: number, options: PelletSolveOptions = {}): PelletSolution {
    const N = options.nodes ?? nodesFor(this.gridModulus(Cs, Ts));
    const g = grid(N, this.problem.a);
    this.act = this.activeSpecies(Cs, Ts);
    this.m = this.act.length + (this.thermalIndex ? 1 : 0);
    this.fixedT = Ts;
    this.Cpt.set(Cs);
    this.cs = this.coefficients();
    const maxIt = options.maxIterations ?? 60;
    let z = this.initial(N, Cs, Ts);
    const warm = options.warmStart === true && this.warmGuess(N, Cs, Ts, z);
    let res = this.m === 0 ? { status: 'converged' as const, iterations: 0 } : this.newton(g, z, Cs, Ts, maxIt);
    if (warm && res.status !== 'converged') {
      // the previous profile was a poor guess here: start again from the flat profile
      z = this.initial(N, Cs, Ts);
      const again = this.newton(g, z, Cs, Ts, maxIt);
      res = { status: again.status, iterations: res.iterations + again.iterations };
    }
    if (res.status === 'converged') this.keepWarm(N, z, Cs, Ts);
    return this.finish(g, z, Cs, Ts, res, options.profile === true);
  }

  /** Forget the warm-start profile (a new pass starts from flat profiles). */
  clearWarmStart(): void {
    this.warm = undefined;
  }

  /** Per component and reaction: stoichiometric (or enthalpy) coefficient times the scale R^2/D. */
  private coefficients(): Float64Array {
    const { m, nR } = this;
    const cs = new Float64Array(m * nR);
    for (let c = 0; c < m; c++) for (let i = 0; i < nR; i++) cs[c * nR + i] = this.coef(c, i) * this.scaleOf(c);
    return cs;
  }

  /** The warm-start guess into z: the last profile scaled by the new surface values; false when none fits. */
  private warmGuess(N: number, Cs: Float64Array, Ts: number, z: Float64Array): boolean {
    const w = this.warm;
    if (!w || w.N !== N || w.act !== this.act.join(',')) return false;
    const { m, act } = this;
    for (let k = 0; k < N; k++) {
      for (let c = 0; c < act.length; c++) z[k * m + c] = w.ratio[k * m + c] * Cs[act[c]];
      if (this.thermalIndex) z[k * m + act.length] = Ts + w.ratio[k * m + act.length];
    }
    return true;
  }

  /** Store the converged profile relative to its surface state: C / C_s (0 where C_s is 0) and T - T_s. */
  private keepWarm(N: number, z: Float64Array, Cs: Float64Array, Ts: number): void {
    const { m, act } = this;
    const ratio = new Float64Array(N * m);
    for (let k = 0; k < N; k++) {
      for (let c = 0; c < act.length; c++) {
        const s = Cs[act[c]];
        ratio[k * m + c] = s > 0 ? z[k * m + c] / s : 0;
      }
      if (this.thermalIndex) ratio[k * m + act.length] = z[k * m + act.length] - Ts;
    }
    this.warm = { N, act: act.join(','), ratio };
  }

  private initial(N: number, Cs: Float64Array, Ts: number): Float64Array {
    const { m, act } = this;
    const z = new Float64Array(N * m);
    for (let k = 0; k < N; k++) {
      for (let c = 0; c < act.length; c++) z[k * m + c] = Cs[act[c]];
      if (this.thermalIndex) z[k * m + act.length] = Ts;
    }
    return z;
  }

  /** Surface value of component c. */
  private surfaceValue(c: number, Cs: Float64Array, Ts: number): number {
    return c < this.act.length ? Cs[this.act[c]] : Ts;
  }

  /** Rates at point k into `out`, per m3 of pellet (before the stoichiometry); returns T there. */
  private pointRates(z: Float64Array, k: number, out: Float64Array, dT = 0): number {
    const { m, act, Cpt } = this;
    for (let c = 0; c < act.length; c++) Cpt[act[c]] = z[k * m + c];
    const T = (this.thermalIndex ? z[k * m + act.length] : this.fixedT) + dT;
    this.problem.kinetics.rates(Cpt, T, this.theta, out);
    for (let i = 0; i < this.nR; i++) out[i] *= this.problem.rateToPellet[i];
    return T;
  }

  /** Coefficient of reaction i in the balance of component c, and the balance's scale R^2/D. */
  private coef(c: number, i: number): number {
    const k = this.problem.kinetics;
    return c < this.act.length ? k.stoich[i * this.nS + this.act[c]] : -this.problem.thermal!.enthalpy[i];
  }
  private scaleOf(c: number): number {
    const { R, De, thermal } = this.problem;
    return c < this.act.length ? (R * R) / De[this.act[c]] : (R * R) / thermal!.conductivity;
  }

  /** Residual F(z), scaled so that the diffusion operator has unit coefficient. */
  residual(g: CollocationGrid, z: Float64Array, Cs: Float64Array, Ts: number, F: Float64Array): void {
    const { N, L } = g;
    const { m, nR, r } = this;
    const n1 = N + 1;
    for (let k = 0; k < N; k++) {
      this.pointRates(z, k, r);
      for (let c = 0; c < m; c++) {
        let s = L[k * n1 + N] * this.surfaceValue(c, Cs, Ts);
        for (let l = 0; l < N; l++) s += L[k * n1 + l] * z[l * m + c];
        let src = 0;
        for (let i = 0; i < nR; i++) src += this.cs[c * nR + i] * r[i];
        F[k * m + c] = s + src;
      }
    }
  }

  /** Jacobian dF/dz (n x n row-major, n = N m). */
  private jacobian(g: CollocationGrid, z: Float64Array, J: Float64Array): void {
    const { N, L } = g;
    const { m, nS, nR, jc, r, Cpt, act } = this;
    const { kinetics, rateToPellet } = this.problem;
    const n = N * m;
    const n1 = N + 1;
    J.fill(0);
    for (let k = 0; k < N; k++) {
      for (let c = 0; c < m; c++) for (let l = 0; l < N; l++) J[(k * m + c) * n + l * m + c] = L[k * n1 + l];
      const T = this.pointRates(z, k, r);
      kinetics.ratesJacC(Cpt, T, this.theta, jc);
      const cs = this.cs;
      for (let c = 0; c < m; c++) {
        const row = (k * m + c) * n + k * m;
        for (let q = 0; q < act.length; q++) {
          let d = 0;
          for (let i = 0; i < nR; i++) d += cs[c * nR + i] * rateToPellet[i] * jc[i * nS + act[q]];
          J[row + q] += d;
        }
      }
      if (this.thermalIndex) this.temperatureColumn(z, k, J, n);
    }
  }

  /** d(source)/dT at point k by central differences, added to the temperature column. */
  private temperatureColumn(z: Float64Array, k: number, J: Float64Array, n: number): void {
    const { m, nR, r, r2 } = this;
    const h = 1e-6 * z[k * m + this.act.length];
    this.pointRates(z, k, r, h);
    this.pointRates(z, k, r2, -h);
    for (let c = 0; c < m; c++) {
      let d = 0;
      for (let i = 0; i < nR; i++) d += (this.cs[c * nR + i] * (r[i] - r2[i])) / (2 * h);
      J[(k * m + c) * n + k * m + this.act.length] += d;
    }
  }

  /** Damped Newton on the collocation equations; z is updated in place. */
  private newton(g: CollocationGrid, z: Float64Array, Cs: Float64Array, Ts: number, maxIt: number): { status: PelletStatus; iterations: number } {
    const n = g.N * this.m;
    if (this.ws?.n !== n) this.ws = newtonWorkspace(n);
    const { F, Ft, J, dz, zt, piv } = this.ws;
    const scale = this.scales(Cs, Ts);
    this.residual(g, z, Cs, Ts, F);
    let f0 = norm2(F);
    let prev = Infinity;
    for (let it = 1; it <= maxIt; it++) {
      if (!Number.isFinite(f0)) return { status: 'non-finite', iterations: it };
      this.jacobian(g, z, J);
      if (luFactor(J, n, piv) !== 0) return { status: 'newton-failed', iterations: it };
      for (let q = 0; q < n; q++) dz[q] = -F[q];
      luSolve(J, n, piv, dz);
      let full = 0;
      for (let q = 0; q < n; q++) full = Math.max(full, Math.abs(dz[q]) / scale[q % this.m]);
      if (full < 1e-11) {
        for (let q = 0; q < n; q++) z[q] += dz[q];
        return { status: 'converged', iterations: it };
      }
      let lam = 1;
      let f1 = Infinity;
      for (let half = 0; half < 30; half++) {
        for (let q = 0; q < n; q++) zt[q] = z[q] + lam * dz[q];
        this.residual(g, zt, Cs, Ts, Ft);
        f1 = norm2(Ft);
        if (f1 <= (1 - 1e-4 * lam) * f0 || f1 === 0) break;
        lam /= 2;
      }
      z.set(zt);
      F.set(Ft);
      f0 = f1;
      if (lam * full < 1e-11 || f0 === 0) return { status: 'converged', iterations: it };
      // Quadratic convergence: with K = |dz_k| / |dz_(k-1)|^2 the error left after a full step dz_k
      // is about K |dz_k|^2 (Dennis & Schnabel, thm. 5.2.1); stop when that is below 1e-12.
      if (lam === 1 && full < 1e-5 && prev < 1 && (full / (prev * prev)) * full * full < 1e-12) return { status: 'converged', iterations: it };
      prev = lam === 1 ? full : Infinity;
    }
    return { status: 'newton-failed', iterations: maxIt };
  }

  /** Per-component scale of the unknowns (for the step test): the largest surface concentration, and Ts. */
  private scales(Cs: Float64Array, Ts: number): Float64Array {
    const s = new Float64Array(this.m);
    let cmax = 0;
    for (let j = 0; j < this.nS; j++) cmax = Math.max(cmax, Math.abs(Cs[j]));
    s.fill(Math.max(cmax, 1e-300));
    if (this.thermalIndex) s[this.act.length] = Ts;
    return s;
  }

  /** Effectiveness factors by quadrature, plus centre values and the optional profile. */
  private finish(g: CollocationGrid, z: Float64Array, Cs: Float64Array, Ts: number, res: { status: PelletStatus; iterations: number }, keepProfile: boolean): PelletSolution {
    const { nR, act } = this;
    const { a, kinetics, rateToPellet } = this.problem;
    const N = g.N;
    const q = quadratureFor(g);
    const C = Float64Array.from(Cs);
    const r = new Float64Array(nR);
    const acc = new Float64Array(nR);
    for (let p = 0; p < q.x.length; p++) {
      const x = q.x[p];
      const row = q.rows[p];
      for (let c = 0; c < act.length; c++) C[act[c]] = this.interpolate(z, N, row, c, Cs, Ts);
      const T = this.thermalIndex ? this.interpolate(z, N, row, act.length, Cs, Ts) : Ts;
      kinetics.rates(C, T, this.theta, r);
      const wx = q.w[p] * (a === 1 ? 1 : a === 2 ? x : x * x);
      for (let i = 0; i < nR; i++) acc[i] += wx * r[i];
    }
    kinetics.rates(Cs, Ts, this.theta, r);
    const eta = new Float64Array(nR);
    for (let i = 0; i < nR; i++) eta[i] = r[i] === 0 || rateToPellet[i] === 0 ? 1 : (a * acc[i]) / r[i];
    const centreConcentrations = Float64Array.from(Cs);
    for (let c = 0; c < act.length; c++) centreConcentrations[act[c]] = N > 0 ? z[c] : Cs[act[c]];
    const sol: PelletSolution = {
      ...outcome(PELLET_STATUS, res.status),
      eta,
      centreTemperature: this.thermalIndex ? z[act.length] : Ts,
      centreConcentrations,
      iterations: res.iterations,
      nodes: N,
    };
    if (keepProfile) sol.profile = this.profileOf(g, z, Cs, Ts);
    return sol;
  }

  private interpolate(z: Float64Array, N: number, row: Float64Array, c: number, Cs: Float64Array, Ts: number): number {
    let v = row[N] * this.surfaceValue(c, Cs, Ts);
    for (let l = 0; l < N; l++) v += row[l] * z[l * this.m + c];
    return v;
  }

  private profileOf(g: CollocationGrid, z: Float64Array, Cs: Float64Array, Ts: number): NonNullable<PelletSolution['profile']> {
    const N = g.N;
    const { act, m } = this;
    const x: number[] = [];
    const concentrations: Float64Array[] = [];
    const temperature: number[] = [];
    for (let l = 0; l <= N; l++) {
      x.push(Math.sqrt(g.u[l]));
      const C = Float64Array.from(Cs);
      if (l < N) for (let c = 0; c < act.length; c++) C[act[c]] = z[l * m + c];
      concentrations.push(C);
      temperature.push(this.thermalIndex && l < N ? z[l * m + act.length] : Ts);
    }
    return { x, concentrations, temperature };
  }
}

/** Gauss-Legendre points (N + 8 of them) of a grid with the grid's interpolation row at each. */
interface GridQuadrature {
  x: Float64Array;
  w: Float64Array;
  rows: Float64Array[];
}
const quadratures = new WeakMap<CollocationGrid, GridQuadrature>();
function quadratureFor(g: CollocationGrid): GridQuadrature {
  let q = quadratures.get(g);
  if (!q) {
    const { x, w } = gaussLegendre01(g.N + 8);
    const rows = Array.from(x, (xp) => {
      const row = new Float64Array(g.N + 1);
      interpolationRow(g, xp * xp, row);
      return row;
    });
    quadratures.set(g, (q = { x, w, rows }));
  }
  return q;
}

/** Newton's work arrays for n unknowns. */
interface NewtonWorkspace {
  n: number;
  F: Float64Array;
  Ft: Float64Array;
  J: Float64Array;
  dz: Float64Array;
  zt: Float64Array;
  piv: Int32Array;
}
function newtonWorkspace(n: number): NewtonWorkspace {
  return { n, F: new Float64Array(n), Ft: new Float64Array(n), J: new Float64Array(n * n), dz: new Float64Array(n), zt: new Float64Array(n), piv: new Int32Array(n) };
}

function norm2(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i] * v[i];
  return Math.sqrt(s);
}
