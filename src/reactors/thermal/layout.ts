/**
 * The state layout of a tubular reactor, declared once: molar flows F_0..F_{nS-1}, then (when
 * modelled) the pressure ratio p = P/P0, the temperature T and the coolant temperature Ta.
 * Every balance term and every reader of the state takes its indices from here.
 */

/** How heat leaves or enters the tube. */
export type CoolingMode = 'isothermal' | 'adiabatic' | 'constant-coolant' | 'co-current' | 'counter-current';

export interface StateLayout {
  /** Number of species (flows occupy 0..nS-1). */
  readonly nS: number;
  /** Index of p = P/P0, or -1 without a pressure drop. */
  readonly p: number;
  /** Index of T (K), or -1 when isothermal. */
  readonly T: number;
  /** Index of the coolant temperature Ta (K), or -1 without a coolant balance. */
  readonly Ta: number;
  /** State length. */
  readonly n: number;
}

/** The layout for nS species, with or without pressure, in the given cooling mode. */
export function stateLayout(nS: number, pressure: boolean, mode: CoolingMode): StateLayout {
  let n = nS;
  const p = pressure ? n++ : -1;
  const T = mode === 'isothermal' ? -1 : n++;
  const Ta = mode === 'co-current' || mode === 'counter-current' ? n++ : -1;
  return { nS, p, T, Ta, n };
}
