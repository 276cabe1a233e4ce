/**
 * Check of the isothermal assumption: the adiabatic temperature rise of the converted feed.
 *
 * dT_ad = sum_i (-dH_i) xi_i / (F_T0 cp_mix), with xi_i the extents of reaction at the outlet
 * (mol/s; from the outlet flows by least squares on nu^T xi = F - F0) and cp_mix the mean molar heat
 * capacity of the feed. For one reaction A -> ... with nu_A = -1 this is the familiar
 * dT_ad = (-dH) X y_A0 / cp_mix. The heat to remove for isothermal operation is
 * Q = sum_i (-dH_i) xi_i (W). Batch: extents per m3 and C_T0 in place of flows.
 */
import type { Warning } from '../core/outcome.js';
import type { DesignSystem } from './system.js';
import { solveDense, fmt } from './sizer.js';

export interface HeatCheck {
  /** Adiabatic temperature rise, K. */
  adiabaticRise: number;
  /** Heat released (to remove) at the design conversion: W for flow reactors, J/m3 for batch. */
  heatDuty: { value: number; unit: 'kW' | 'kJ/m3' };
  /** The formula used. */
  formula: string;
  /** Warning threshold, K. */
  warnAbove: number;
}

/** Extents of reaction from inlet and outlet amounts (least squares). */
export function extents(sys: DesignSystem, y: ArrayLike<number>): Float64Array {
  const { nS, nR } = sys;
  const nu = sys.kinetics.stoich;
  const A = new Float64Array(nR * nR);
  const b = new Float64Array(nR);
  for (let i = 0; i < nR; i++) {
    for (let k = 0; k < nR; k++) {
      let s = 0;
      for (let j = 0; j < nS; j++) s += nu[i * nS + j] * nu[k * nS + j];
      A[i * nR + k] = s;
    }
    let s = 0;
    for (let j = 0; j < nS; j++) s += nu[i * nS + j] * (y[j] - sys.y0[j]);
    b[i] = s;
  }
  if (!solveDense(A, b, nR)) b.fill(NaN);
  return b;
}

/** The adiabatic rise and heat duty at outlet state y, with a warning above the limit. */
export function heatCheck(sys: DesignSystem, y: ArrayLike<number>): { check?: HeatCheck; warnings: Warning[] } {
  const h = sys.kase.heat;
  if (!h) return { warnings: [] };
  const xi = extents(sys, y);
  let Q = 0;
  sys.kinetics.reactionIds.forEach((id, i) => {
    const dH = h.reactionEnthalpy[id];
    if (dH !== undefined) Q += -dH * xi[i];
  });
  let total = 0;
  for (let j = 0; j < sys.nS; j++) total += sys.y0[j];
  const rise = Q / (total * h.heatCapacity);
  const batch = sys.kase.reactor.kind === 'batch';
  const check: HeatCheck = {
    adiabaticRise: rise,
    heatDuty: batch ? { value: Q / 1000, unit: 'kJ/m3' } : { value: Q / 1000, unit: 'kW' },
    formula: 'dT_ad = sum_i (-dH_i) xi_i / (F_T0 cp_mix); one reaction with nu_A = -1: dT_ad = (-dH) X y_A0 / cp_mix',
    warnAbove: h.warnAbove,
  };
  const warnings: Warning[] = [];
  if (Math.abs(rise) > h.warnAbove) {
    warnings.push({
      code: 'W_HEAT',
      message:
        `adiabatic temperature ${rise > 0 ? 'rise' : 'fall'} of ${fmt(Math.abs(rise), 3)} K exceeds ${fmt(h.warnAbove, 3)} K: isothermal operation needs ` +
        `${rise > 0 ? 'heat removal' : 'heat input'} of ${fmt(Math.abs(Q) / 1000, 4)} ${batch ? 'kJ per m3 of batch' : 'kW'}, which someone must design ` +
        '(heat-exchange area, coolant, control and runaway protection are outside this estimate)',
      path: ['heat'],
    });
  }
  return { check, warnings };
}
