/**
 * Batch and semibatch vessels with a jacket: the liquid-phase mole and energy balances in time.
 *
 *   dN_j/dt = F_in,j + V sum_i nu_ij a_i,        a_i = w_i r_i(C, T),  C_j = N_j / V
 *   dV/dt   = v_in                                                   (semibatch; 0 for batch)
 *   dT/dt   = [UA (Ta - T) + V sum_i (-dH_i(T)) a_i - sum_j F_in,j integral_{T_in}^{T} Cp_j dT]
 *             / sum_j N_j Cp_j(T)
 * Method: the enthalpy balance of a well-mixed vessel with a jacket at constant temperature and an
 * optional feed at T_in (common practice); the heat capacity of the vessel wall is neglected.
 * Integrated by numerics/integrate (Dormand-Prince 5(4), switching to RODAS4 on stiffness, with
 * its finite-difference Jacobian); the hottest point is located as an event where dT/dt changes
 * sign from + to -. A run passing the runaway cap (default T0 + 1000 K) stops as 'runaway'.
 */
import { outcome, type Outcome } from '../../core/outcome.js';
import type { CompiledKinetics } from '../../kinetics/compiled.js';
import { integrate } from '../../numerics/integrate.js';
import type { OdeEvent } from '../../numerics/ode-types.js';
import type { ReactionEnthalpy } from './enthalpy.js';
import { cpAt, cpIntegral, type HeatCapacity } from './heat-capacity.js';
import { THERMAL_STATUS, type ThermalStatus } from './thermal-tube.js';

export interface BatchHeatSpec {
  /** Initial temperature, K. */
  T0: number;
  /** Initial liquid volume, m3. */
  V0: number;
  /** Initial moles per species, mol. */
  N0: Float64Array;
  /** Per-reaction weight carrying the rate basis (1 per m3; catalyst loading kg/m3 for mass rates). */
  weights: Float64Array;
  enthalpy: ReactionEnthalpy;
  cp: readonly (HeatCapacity | undefined)[];
  /** U times the jacket area, W/K (0: adiabatic). */
  UA: number;
  /** Jacket temperature, K. */
  Ta: number;
  /** Semibatch feed: molar flows (mol/s), volumetric flow (m3/s), temperature (K). */
  feed?: { flows: Float64Array; volumetricFlow: number; temperature: number };
}

export interface BatchHeatResult extends Outcome<ThermalStatus> {
  /** Time reached, s. */
  t: number;
  /** Final moles, mol. */
  moles: number[];
  /** Final temperature, K. */
  temperature: number;
  /** Hottest point: time (s) and temperature (K). */
  hotSpot: { position: number; temperature: number };
  profile?: { t: number[]; T: number[]; N: number[][] };
}

/** Solve a jacketed batch or semibatch vessel for `time` seconds. */
export function solveBatchHeat(
  spec: BatchHeatSpec, kinetics: CompiledKinetics, theta: Float64Array, time: number,
  options: { profile?: ArrayLike<number>; rtol?: number; runawayTemperature?: number } = {},
): BatchHeatResult {
  const nS = kinetics.speciesNames.length;
  const nR = kinetics.reactionIds.length;
  const iV = nS;
  const iT = nS + 1;
  const C = new Float64Array(nS);
  const r = new Float64Array(nR);
  const dH = new Float64Array(nR);
  const nu = kinetics.stoich;
  const fd = spec.feed;
  const rhs = (_t: number, y: Float64Array, out: Float64Array): void => {
    const V = y[iV];
    const T = y[iT];
    for (let j = 0; j < nS; j++) C[j] = Math.max(y[j], 0) / V;
    kinetics.rates(C, T, theta, r);
    spec.enthalpy.at(T, dH);
    let gen = 0;
    for (let j = 0; j < nS; j++) out[j] = fd ? fd.flows[j] : 0;
    for (let i = 0; i < nR; i++) {
      const a = spec.weights[i] * r[i] * V;
      gen -= dH[i] * a;
      for (let j = 0; j < nS; j++) out[j] += nu[i * nS + j] * a;
    }
    let feedHeat = 0;
    let cpN = 0;
    for (let j = 0; j < nS; j++) {
      const h = spec.cp[j];
      if (!h) continue;
      if (fd && fd.flows[j] > 0) feedHeat += fd.flows[j] * cpIntegral(h, fd.temperature, T);
      if (y[j] > 0) cpN += y[j] * cpAt(h, T);
    }
    out[iV] = fd ? fd.volumetricFlow : 0;
    out[iT] = cpN > 0 ? (spec.UA * (spec.Ta - T) + gen - feedHeat) / cpN : 0;
  };
  const y0 = new Float64Array(nS + 2);
  y0.set(spec.N0);
  y0[iV] = spec.V0;
  y0[iT] = spec.T0;
  const tmp = new Float64Array(nS + 2);
  const cap = options.runawayTemperature ?? spec.T0 + 1000;
  const events: OdeEvent[] = [
    { name: 'hot-spot', terminal: false, direction: -1, g: (t, y) => (rhs(t, y, tmp), tmp[iT]) },
    { name: 'runaway', terminal: true, direction: 1, g: (_t, y) => y[iT] - cap },
  ];
  const res = integrate(rhs, 0, y0, time, { rtol: options.rtol ?? 1e-8, atol: 1e-10, events, ...(options.profile ? { tEval: options.profile } : {}) });
  const hot = { position: 0, temperature: spec.T0 };
  const consider = (t: number, y: ArrayLike<number>): void => {
    if (y[iT] > hot.temperature) Object.assign(hot, { position: t, temperature: y[iT] });
  };
  for (const e of res.events) if (e.name === 'hot-spot') consider(e.t, e.y);
  for (let i = 0; i < res.tOut.length; i++) consider(res.tOut[i], res.yOut[i]);
  consider(res.t, res.y);
  const last = res.events.length ? res.events[res.events.length - 1].name : '';
  const status: ThermalStatus = !res.success ? 'integration-failed' : last === 'runaway' ? 'runaway' : 'success';
  return {
    ...outcome(THERMAL_STATUS, status, [], status === 'integration-failed' ? res.message : undefined),
    t: res.t,
    moles: Array.from(res.y.subarray(0, nS)),
    temperature: res.y[iT],
    hotSpot: hot,
    ...(options.profile ? { profile: { t: [...res.tOut], T: res.yOut.map((y) => y[iT]), N: res.yOut.map((y) => Array.from(y.subarray(0, nS))) } } : {}),
  };
}
