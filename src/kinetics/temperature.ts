/**
 * Temperature dependence about a reference temperature T_ref (reparameterised forms, which
 * decorrelate the pre-factor from the energy in regression; Schwaab & Pinto 2007, Chem. Eng. Sci.
 * 62, 2750):
 *   Arrhenius:    k(T) = k_ref * exp(-E/R  * (1/T - 1/T_ref))
 *   van 't Hoff:  K(T) = K_ref * exp(-dH/R * (1/T - 1/T_ref))
 * R: GAS_CONSTANT of src/core/constants.ts (CODATA 2018).
 */
import type { Node, NodeStore } from './expression/ast.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** k(T) = kRef exp(-E/R (1/T - 1/Tref)); E in J/mol, T and Tref in K. */
export function arrhenius(kRef: number, activationEnergy: number, T: number, Tref: number): number {
  return kRef * Math.exp((-activationEnergy / GAS_CONSTANT) * (1 / T - 1 / Tref));
}

/** K(T) = KRef exp(-dH/R (1/T - 1/Tref)); dH in J/mol, T and Tref in K. */
export function vantHoff(KRef: number, enthalpy: number, T: number, Tref: number): number {
  return KRef * Math.exp((-enthalpy / GAS_CONSTANT) * (1 / T - 1 / Tref));
}

/**
 * Tree of ref * exp(-energy/R (1/T - 1/Tref)); just `ref` when energy is undefined.
 * Used for both Arrhenius (energy = E) and van 't Hoff (energy = dH) terms.
 */
export function temperatureFactorNode(
  s: NodeStore,
  ref: Node,
  energy: Node | undefined,
  T: Node,
  Tref: number,
): Node {
  if (!energy) return ref;
  const inv = s.sub(s.div(s.num(1), T), s.num(1 / Tref));
  return s.mul(ref, s.call('exp', [s.mul(s.neg(s.div(energy, s.num(GAS_CONSTANT))), inv)]));
}
