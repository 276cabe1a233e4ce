/**
 * The balances of a non-isothermal tubular reactor (packed bed in catalyst mass W, plug flow in
 * volume V), written in molar flows, as separate terms that the right-hand side sums:
 *
 *   mole      dF_j/dx = sum_i nu_ij a_i,       a_i = w_i eta_i r_i(C, T)
 *   momentum  dp/dx   = -alpha/(2p) (F_T/F_T0) (T/T0)                                 (gas, Ergun)
 *   energy    dT/dx   = [ Ua (Ta - T) + sum_i (-dH_i(T)) a_i ] / sum_j F_j Cp_j(T)
 *   coolant   dTa/dx  = +Ua (T - Ta) / (m_c Cp_c)  co-current,  -Ua (T - Ta) / (m_c Cp_c)  counter-current
 *
 * with C_j = C_T0 (F_j/F_T) p (T0/T) for a gas and C_j = F_j / v0 for a liquid; Ua is U a per unit
 * of the coordinate (a = 4/D per m3 of tube; divided by the bulk density per kg of catalyst).
 * Method: steady one-dimensional pseudo-homogeneous plug-flow balances (mole, energy and Ergun
 * momentum balances, common design form; S. Ergun, Chem. Eng. Prog. 48 (1952) 89-94); the energy
 * balance is the enthalpy balance of the flowing mixture with the reaction enthalpy at T
 * (enthalpy.ts). With mode 'isothermal' the layout has no T and the energy term is off: the same
 * code as the cooled model. w_i carries the rate basis into the coordinate; eta_i is the
 * multiplicative rate factor of a pellet model (RateFactor hook; 1 when absent), so kinetics stay
 * intrinsic.
 * Jacobian: forward differences of this right-hand side, column by column, with steps
 * sqrt(eps) max(|y_k|, scale_k) (the documented fallback: the compiled kinetics give dr/dC but not
 * dr/dT). No allocation per call.
 */
import type { CompiledKinetics } from '../../kinetics/compiled.js';
import type { ReactionEnthalpy } from './enthalpy.js';
import type { HeatCapacity } from './heat-capacity.js';
import { cpAt } from './heat-capacity.js';
import { stateLayout, type CoolingMode, type StateLayout } from './layout.js';
import { GAS_CONSTANT } from '../../core/constants.js';

/**
 * Per-reaction multiplicative factor on the intrinsic rate (effectiveness factor of a pellet
 * model): fill eta (length nR) for concentrations C (mol/m3) and temperature T (K) at state y.
 */
export type RateFactor = (C: Float64Array, T: number, eta: Float64Array, y: ArrayLike<number>) => void;

/** A tube run in SI, ready for the balances (see thermal-inputs.ts for the checks). */
export interface ThermalTubeSpec {
  /** Coordinate: catalyst mass W (packed bed, kg) or volume V (plug flow, m3). */
  kind: 'packed-bed' | 'plug-flow';
  gas: boolean;
  mode: CoolingMode;
  /** Inlet temperature, K. */
  T0: number;
  /** Inlet pressure, Pa (gas). */
  P0?: number;
  /** Feed molar flows, mol/s. */
  F0: Float64Array;
  /** Liquid volumetric flow, m3/s (liquid). */
  v0?: number;
  /** Ergun alpha in the coordinate (1/kg or 1/m3); 0 for none. */
  alpha: number;
  /** Per-reaction weight carrying the rate basis into the coordinate. */
  weights: Float64Array;
  /** Reaction enthalpies with their dCp correction. */
  enthalpy: ReactionEnthalpy;
  /** Heat capacity per species (undefined only for a species that never flows). */
  cp: readonly (HeatCapacity | undefined)[];
  /** U a per unit coordinate: W/(K kg) (packed bed) or W/(K m3) (plug flow); 0 adiabatic. */
  Ua: number;
  /** Coolant temperature (constant mode) or coolant inlet temperature (co-/counter-current), K. */
  coolantTemperature: number;
  /** Coolant heat-capacity flow m_c Cp_c, W/K (co-/counter-current). */
  coolantFlowCapacity: number;
  /** Optional pellet effectiveness per reaction. */
  rateFactor?: RateFactor;
  /** Called before each march from the inlet (a rate factor's per-march cache starts afresh). */
  beforeMarch?: () => void;
}

export class TubeBalances {
  readonly layout: StateLayout;
  readonly nS: number;
  readonly nR: number;
  /** Work buffers, reused by every call. */
  readonly C: Float64Array;
  readonly r: Float64Array;
  readonly eta: Float64Array;
  readonly dH: Float64Array;
  private readonly f0: Float64Array;
  private readonly ySh: Float64Array;
  private readonly fSh: Float64Array;
  /** Step scale per state component for the difference Jacobian. */
  readonly scale: Float64Array;
  private readonly cT0: number;
  private readonly FT0: number;

  constructor(
    readonly spec: ThermalTubeSpec,
    readonly kinetics: CompiledKinetics,
    /** Kinetic parameters (physical values); may be overwritten in place between solves. */
    readonly theta: Float64Array,
  ) {
    this.nS = kinetics.speciesNames.length;
    this.nR = kinetics.reactionIds.length;
    this.layout = stateLayout(this.nS, spec.gas && spec.alpha > 0, spec.mode);
    this.C = new Float64Array(this.nS);
    this.r = new Float64Array(this.nR);
    this.eta = new Float64Array(this.nR).fill(1);
    this.dH = new Float64Array(this.nR);
    this.f0 = new Float64Array(this.layout.n);
    this.ySh = new Float64Array(this.layout.n);
    this.fSh = new Float64Array(this.layout.n);
    let FT0 = 0;
    for (let j = 0; j < this.nS; j++) FT0 += spec.F0[j];
    this.FT0 = FT0;
    this.cT0 = spec.gas ? (spec.P0 as number) / (GAS_CONSTANT * spec.T0) : 0;
    this.scale = new Float64Array(this.layout.n).fill(FT0);
    const L = this.layout;
    if (L.p >= 0) this.scale[L.p] = 1;
    if (L.T >= 0) this.scale[L.T] = spec.T0;
    if (L.Ta >= 0) this.scale[L.Ta] = spec.T0;
  }

  /** Inlet state; taStart is the coolant temperature at x = 0 (counter-current: the shooting guess). */
  inlet(out: Float64Array, taStart = this.spec.coolantTemperature): void {
    const L = this.layout;
    out.set(this.spec.F0);
    if (L.p >= 0) out[L.p] = 1;
    if (L.T >= 0) out[L.T] = this.spec.T0;
    if (L.Ta >= 0) out[L.Ta] = taStart;
  }

  /** Temperature at state y, K. */
  temperature(y: ArrayLike<number>): number {
    return this.layout.T >= 0 ? y[this.layout.T] : this.spec.T0;
  }

  /** Concentrations at y (mol/m3) into C. */
  concentrations(y: ArrayLike<number>, C: Float64Array): void {
    const { nS, spec } = this;
    if (!spec.gas) {
      const inv = 1 / (spec.v0 as number);
      for (let j = 0; j < nS; j++) C[j] = y[j] * inv;
      return;
    }
    let FT = 0;
    for (let j = 0; j < nS; j++) FT += y[j];
    const p = this.layout.p >= 0 ? Math.max(y[this.layout.p], 1e-12) : 1;
    const T = this.temperature(y);
    const f = FT > 0 ? (this.cT0 * p * spec.T0) / (FT * T) : 0;
    for (let j = 0; j < nS; j++) C[j] = f * y[j];
  }

  /** Weighted reaction rates a_i = w_i eta_i r_i at y, into this.r. */
  rates(y: ArrayLike<number>): void {
    const T = this.temperature(y);
    this.concentrations(y, this.C);
    this.kinetics.rates(this.C, T, this.theta, this.r);
    if (this.spec.rateFactor) this.spec.rateFactor(this.C, T, this.eta, y);
    const w = this.spec.weights;
    for (let i = 0; i < this.nR; i++) this.r[i] *= w[i] * this.eta[i];
  }

  /** The right-hand side: the sum of the terms of the layout. */
  readonly rhs = (_x: number, y: Float64Array, out: Float64Array): void => {
    this.rates(y);
    this.moleTerm(out);
    const L = this.layout;
    if (L.p >= 0) this.momentumTerm(y, out);
    if (L.T >= 0) this.energyTerm(y, out);
    if (L.Ta >= 0) this.coolantTerm(y, out);
  };

  /** dF_j/dx = sum_i nu_ij a_i (rates already in this.r). */
  moleTerm(out: Float64Array): void {
    const { nS, nR, r } = this;
    const nu = this.kinetics.stoich;
    for (let j = 0; j < nS; j++) out[j] = 0;
    for (let i = 0; i < nR; i++) {
      const a = r[i];
      if (a === 0) continue;
      for (let j = 0; j < nS; j++) out[j] += nu[i * nS + j] * a;
    }
  }

  /** dp/dx = -alpha/(2p) (F_T/F_T0) (T/T0). */
  momentumTerm(y: Float64Array, out: Float64Array): void {
    let FT = 0;
    for (let j = 0; j < this.nS; j++) FT += y[j];
    const p = Math.max(y[this.layout.p], 1e-12);
    out[this.layout.p] = (-this.spec.alpha / (2 * p)) * (FT / this.FT0) * (this.temperature(y) / this.spec.T0);
  }

  /** Coolant temperature seen by the tube at y (K); NaN when adiabatic. */
  coolantAt(y: ArrayLike<number>): number {
    const m = this.spec.mode;
    if (m === 'constant-coolant') return this.spec.coolantTemperature;
    if (this.layout.Ta >= 0) return y[this.layout.Ta];
    return NaN;
  }

  /** dT/dx = [Ua (Ta - T) + sum_i (-dH_i(T)) a_i] / sum_j F_j Cp_j(T). */
  energyTerm(y: Float64Array, out: Float64Array): void {
    const { nS, nR, r, dH, spec } = this;
    const T = y[this.layout.T];
    spec.enthalpy.at(T, dH);
    let gen = 0;
    for (let i = 0; i < nR; i++) gen -= dH[i] * r[i];
    const Ta = this.coolantAt(y);
    const exchange = spec.mode === 'adiabatic' ? 0 : spec.Ua * (Ta - T);
    let cpF = 0;
    for (let j = 0; j < nS; j++) {
      const h = spec.cp[j];
      if (h && y[j] > 0) cpF += y[j] * cpAt(h, T);
    }
    out[this.layout.T] = cpF > 0 ? (exchange + gen) / cpF : 0;
  }

  /** dTa/dx: co-current +Ua (T - Ta)/(m_c Cp_c); counter-current (coolant runs against x) the negative. */
  coolantTerm(y: Float64Array, out: Float64Array): void {
    const d = (this.spec.Ua * (y[this.layout.T] - y[this.layout.Ta])) / this.spec.coolantFlowCapacity;
    out[this.layout.Ta] = this.spec.mode === 'counter-current' ? -d : d;
  }

  /** df/dy by forward differences (see the file header), n x n row-major. */
  readonly jac = (x: number, y: Float64Array, out: Float64Array): void => {
    const n = this.layout.n;
    const f0 = this.f0;
    const ys = this.ySh;
    this.rhs(x, y, f0);
    ys.set(y);
    for (let k = 0; k < n; k++) {
      const h = 1.4901161193847656e-8 * Math.max(Math.abs(y[k]), this.scale[k] * 1e-6);
      ys[k] = y[k] + h;
      const hk = ys[k] - y[k];
      this.rhs(x, ys, this.fSh);
      for (let i = 0; i < n; i++) out[i * n + k] = (this.fSh[i] - f0[i]) / hk;
      ys[k] = y[k];
    }
  };
}
