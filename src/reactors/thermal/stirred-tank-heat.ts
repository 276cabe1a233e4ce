/**
 * The steady non-isothermal stirred tank: every steady state with its stability, and the
 * heat-generated versus heat-removed picture.
 *
 * For a trial outlet temperature T the mole balances are solved at that T,
 *   F_j = F_j0 + sum_i nu_ij xi_i,  xi_i = S a_i(C(F), T)      (S = V or W, a_i = w_i r_i as in the tube),
 * then the heat generated and the heat removed are
 *   G(T) = sum_i (-dH_i(T)) xi_i(T),
 *   R(T) = sum_j F_j0 integral_{T0}^{T} Cp_j dT + UA (T - Ta)
 * (the enthalpy path: heat the feed from T0 to T, react at T; common practice). A steady state is a
 * root of G(T) - R(T); all roots on the scanned interval are found by numerics/roots findAllRoots
 * (uniform scan for sign changes, each refined by Brent's method).
 * Stability: the slope condition of C. van Heerden, "Autothermic processes", Ind. Eng. Chem. 45
 * (1953) 1242-1247: a steady state with dR/dT > dG/dT is stable to temperature disturbances, one
 * with dR/dT < dG/dT is unstable. The condition is necessary, not sufficient (oscillatory
 * instability of the full dynamic system is not examined); the result says so.
 * Gas: C_j = P/(R T) F_j/F_T at the outlet temperature; liquid: C_j = F_j / v0.
 * The mole balance at a fixed T is solved for the outlet flows by damped Newton (numerics/newton.ts,
 * flows bounded below by 0) continued from the previous temperature; it is taken to have one
 * solution at each T (the usual case for rate laws with non-negative orders).
 */
import { outcome, type Outcome, type StatusTable } from '../../core/outcome.js';
import type { CompiledKinetics } from '../../kinetics/compiled.js';
import { findAllRoots } from '../../numerics/roots.js';
import { newton } from '../../numerics/newton.js';
import type { ReactionEnthalpy } from './enthalpy.js';
import { cpAt, cpIntegral, type HeatCapacity } from './heat-capacity.js';
import { GAS_CONSTANT } from '../../core/constants.js';

/** A stirred tank with heat exchange, SI. */
export interface StirredTankHeatSpec {
  gas: boolean;
  /** Feed temperature, K. */
  T0: number;
  /** Pressure, Pa (gas). */
  P?: number;
  /** Feed molar flows, mol/s. */
  F0: Float64Array;
  /** Liquid volumetric flow, m3/s (liquid). */
  v0?: number;
  /** Reactor size: volume (m3) or catalyst mass (kg), matching `weights`. */
  size: number;
  /** Per-reaction weight carrying the rate basis into the size. */
  weights: Float64Array;
  enthalpy: ReactionEnthalpy;
  cp: readonly (HeatCapacity | undefined)[];
  /** U times the exchange area, W/K (0: adiabatic). */
  UA: number;
  /** Coolant (jacket) temperature, K. */
  Ta: number;
}

export interface SteadyState {
  /** Outlet temperature, K. */
  temperature: number;
  /** Outlet molar flows, mol/s. */
  outlet: number[];
  /** Reaction extents, mol/s. */
  extents: number[];
  /** Heat generated at the state, W (equal to the heat removed). */
  heat: number;
  /** dG/dT and dR/dT, W/K. */
  slopes: { generated: number; removed: number };
  /** van Heerden slope condition: dR/dT > dG/dT. */
  stable: boolean;
}

export type StirredHeatStatus = 'ok' | 'incomplete' | 'no-steady-state';

export const STIRRED_HEAT_STATUS: StatusTable<StirredHeatStatus> = {
  ok: { success: true, message: 'every steady state on the scanned temperature range was found' },
  incomplete: { success: false, message: 'some temperatures could not be evaluated; steady states may be missing' },
  'no-steady-state': { success: false, message: 'no steady state was found on the scanned temperature range' },
};

export interface StirredTankHeatResult extends Outcome<StirredHeatStatus> {
  steadyStates: SteadyState[];
  /** Heat generated and removed over the scanned range, W (for the chart). */
  curve: { T: number[]; generated: number[]; removed: number[] };
  /** Scanned temperature range, K. */
  range: [number, number];
  stabilityCriterion: string;
}

/** Options of the steady-state search. */
export interface StirredHeatOptions {
  /**
   * Scanned range, K; default the temperatures the tank can reach: [min(T0, Ta) - 1.2 dT_ad - 1,
   * max(T0, Ta) + 1.2 dT_ad + 20] with dT_ad = sum_i |dH_i(T0)| xi_max,i / sum_j F_j0 Cp_j(T0) the
   * adiabatic change at complete reaction (xi_max,i from the fed reactant that runs out first), and
   * at least 1 K.
   */
  range?: [number, number];
  /** Scan intervals; default 400. */
  intervals?: number;
  /** Points of the returned curve; default 121. */
  curvePoints?: number;
}

/**
 * The mole balances at a fixed temperature, F_j = F_j0 + sum_i nu_ij S a_i(C(F), T), solved for the
 * outlet flows (lower bound 0, so Newton never leaves the physical region) and continued from the
 * last answer; the extents are xi_i = S a_i at the solution.
 */
class FixedTemperatureBalance {
  private readonly nS: number;
  private readonly nR: number;
  /** Number of reactions. */
  get nRx(): number {
    return this.nR;
  }
  private readonly C: Float64Array;
  private readonly r: Float64Array;
  private readonly FT0: number;
  private last: Float64Array;
  constructor(private readonly spec: StirredTankHeatSpec, private readonly kin: CompiledKinetics, private readonly theta: Float64Array) {
    this.nS = kin.speciesNames.length;
    this.nR = kin.reactionIds.length;
    this.C = new Float64Array(this.nS);
    this.r = new Float64Array(this.nR);
    this.FT0 = spec.F0.reduce((a, b) => a + b, 0);
    this.last = Float64Array.from(spec.F0);
  }

  /** Extents S a_i at flows F and temperature T into xi. */
  extents(F: ArrayLike<number>, T: number, xi: Float64Array): void {
    const { nS, spec } = this;
    let f = 1 / (spec.v0 as number);
    if (spec.gas) {
      let FT = 0;
      for (let j = 0; j < nS; j++) FT += Math.max(F[j], 0);
      f = FT > 0 ? (spec.P as number) / (GAS_CONSTANT * T * FT) : 0;
    }
    for (let j = 0; j < nS; j++) this.C[j] = Math.max(F[j], 0) * f;
    this.kin.rates(this.C, T, this.theta, this.r);
    for (let i = 0; i < this.nR; i++) xi[i] = spec.size * spec.weights[i] * this.r[i];
  }

  /** Residual of the flows, each scaled by F_T0 plus the size of its reaction terms. */
  private residual(T: number, F: Float64Array, out: Float64Array, xi: Float64Array): void {
    const { nS, nR } = this;
    const nu = this.kin.stoich;
    this.extents(F, T, xi);
    for (let j = 0; j < nS; j++) {
      let v = F[j] - this.spec.F0[j];
      let size = this.FT0;
      for (let i = 0; i < nR; i++) {
        const t = nu[i * nS + j] * xi[i];
        v -= t;
        size += Math.abs(t);
      }
      out[j] = v / size;
    }
  }

  /** Outlet flows at T (null when Newton fails from the last answer and from the feed). */
  solve(T: number): Float64Array | null {
    const xi = new Float64Array(this.nR);
    const G = (x: Float64Array, out: Float64Array): void => this.residual(T, x, out, xi);
    for (const start of [this.last, this.spec.F0]) {
      const res = newton(G, start, { ftol: 1e-12, lower: 0, typicalX: 1e-9 * this.FT0, maxIterations: 200 });
      if (res.success) {
        this.last = Float64Array.from(res.x);
        return this.last;
      }
    }
    return null;
  }
}

/** The extents at flows F and temperature T (a new array). */
function extentsAt(bal: FixedTemperatureBalance, F: ArrayLike<number>, T: number): Float64Array {
  const xi = new Float64Array(bal.nRx);
  bal.extents(F, T, xi);
  return xi;
}

/** Heat generated minus heat removed at T, and both parts, W. */
function heatTerms(spec: StirredTankHeatSpec, xi: Float64Array, T: number, dH: Float64Array): { G: number; R: number } {
  spec.enthalpy.at(T, dH);
  let G = 0;
  for (let i = 0; i < xi.length; i++) G -= dH[i] * xi[i];
  let R = spec.UA * (T - spec.Ta);
  spec.cp.forEach((h, j) => {
    if (h && spec.F0[j] > 0) R += spec.F0[j] * cpIntegral(h, spec.T0, T);
  });
  return { G, R };
}

/** Every steady state of the stirred tank with its stability, and the G(T), R(T) curves. */
export function stirredTankSteadyStates(
  spec: StirredTankHeatSpec, kinetics: CompiledKinetics, theta: Float64Array, options: StirredHeatOptions = {},
): StirredTankHeatResult {
  const bal = new FixedTemperatureBalance(spec, kinetics, theta);
  const dH = new Float64Array(kinetics.reactionIds.length);
  const range = options.range ?? reachableRange(spec, kinetics);
  let bad = 0;
  const h = (T: number): number => {
    const F = bal.solve(T);
    if (!F) return (bad++, NaN);
    const t = heatTerms(spec, extentsAt(bal, F, T), T, dH);
    return t.G - t.R;
  };
  const scan = findAllRoots(h, range[0], range[1], { intervals: options.intervals ?? 400, xtol: 1e-9 });
  const states = scan.roots.map((T) => describeState(spec, bal, dH, T));
  const curve = heatCurve(spec, bal, dH, range, options.curvePoints ?? 121);
  const status: StirredHeatStatus = scan.status !== 'ok' || bad > 0 ? 'incomplete' : states.length === 0 ? 'no-steady-state' : 'ok';
  return {
    ...outcome(STIRRED_HEAT_STATUS, status, scan.warnings, bad > 0 ? `${bad} temperatures had no mole-balance solution` : undefined),
    steadyStates: states,
    curve,
    range,
    stabilityCriterion: 'slope condition dR/dT > dG/dT (van Heerden, Ind. Eng. Chem. 45 (1953) 1242); necessary, oscillatory instability not examined',
  };
}

/** The default scan range (see StirredHeatOptions.range). */
export function reachableRange(spec: StirredTankHeatSpec, kinetics: CompiledKinetics): [number, number] {
  const nS = kinetics.speciesNames.length;
  const dH = new Float64Array(kinetics.reactionIds.length);
  spec.enthalpy.at(spec.T0, dH);
  let FT = 0;
  let cpF = 0;
  spec.cp.forEach((h, j) => {
    FT += spec.F0[j];
    if (h && spec.F0[j] > 0) cpF += spec.F0[j] * cpAt(h, spec.T0);
  });
  let q = 0;
  for (let i = 0; i < dH.length; i++) {
    let xi = Infinity;
    for (let j = 0; j < nS; j++) {
      const nu = kinetics.stoich[i * nS + j];
      if (nu < 0 && spec.F0[j] > 0) xi = Math.min(xi, spec.F0[j] / -nu);
    }
    q += Math.abs(dH[i]) * (Number.isFinite(xi) ? xi : FT);
  }
  const rise = cpF > 0 ? q / cpF : 800;
  const Ta = spec.UA > 0 ? spec.Ta : spec.T0;
  return [Math.max(Math.min(spec.T0, Ta) - 1.2 * rise - 1, 1), Math.max(spec.T0, Ta) + 1.2 * rise + 20];
}

function describeState(spec: StirredTankHeatSpec, bal: FixedTemperatureBalance, dH: Float64Array, T: number): SteadyState {
  const d = 1e-4 * T;
  const at = (t: number): { G: number; R: number } => {
    const Ft = bal.solve(t);
    return Ft ? heatTerms(spec, extentsAt(bal, Ft, t), t, dH) : { G: NaN, R: NaN };
  };
  const up = at(T + d);
  const dn = at(T - d);
  const F = Float64Array.from(bal.solve(T) ?? spec.F0.map(() => NaN));
  const xi = extentsAt(bal, F, T);
  const mid = heatTerms(spec, xi, T, dH);
  const dG = (up.G - dn.G) / (2 * d);
  const dR = (up.R - dn.R) / (2 * d);
  return { temperature: T, outlet: [...F], extents: [...xi], heat: mid.G, slopes: { generated: dG, removed: dR }, stable: dR > dG };
}

function heatCurve(spec: StirredTankHeatSpec, bal: FixedTemperatureBalance, dH: Float64Array, range: [number, number], n: number): StirredTankHeatResult['curve'] {
  const out = { T: [] as number[], generated: [] as number[], removed: [] as number[] };
  for (let k = 0; k < n; k++) {
    const T = range[0] + ((range[1] - range[0]) * k) / (n - 1);
    const F = bal.solve(T);
    if (!F) continue;
    const t = heatTerms(spec, extentsAt(bal, F, T), T, dH);
    out.T.push(T);
    out.generated.push(t.G);
    out.removed.push(t.R);
  }
  return out;
}
