/**
 * Reaction enthalpy at temperature T from its value at a reference temperature, corrected by the
 * heat capacities of the species (Kirchhoff's law, common practice):
 *   dH_i(T) = dH_i(Tref) + sum_j nu_ij integral_{Tref}^{T} Cp_j dT,   dCp_i = sum_j nu_ij Cp_j.
 * Species without a heat capacity (ones that never flow) contribute nothing; the caller has refused
 * a missing heat capacity for any species that flows (thermal-inputs.ts).
 */
import { cpAt, cpIntegral, type HeatCapacity } from './heat-capacity.js';

export class ReactionEnthalpy {
  readonly nR: number;
  readonly nS: number;
  constructor(
    /** Stoichiometric matrix nu (nR x nS, row-major). */
    readonly stoich: Float64Array,
    /** dH_i at Tref per reaction, J/mol of extent as written. */
    readonly atReference: Float64Array,
    /** Reference temperature of atReference, K. */
    readonly referenceTemperature: number,
    /** Heat capacity per species (undefined: never flows). */
    readonly cp: readonly (HeatCapacity | undefined)[],
    /** Apply the dCp correction; default true. */
    readonly correct = true,
  ) {
    this.nR = atReference.length;
    this.nS = cp.length;
  }

  /** dH_i(T) for every reaction into out (length nR), J/mol. */
  at(T: number, out: Float64Array): void {
    const { nR, nS, stoich, cp } = this;
    for (let i = 0; i < nR; i++) {
      let v = this.atReference[i];
      if (this.correct) {
        for (let j = 0; j < nS; j++) {
          const c = stoich[i * nS + j];
          const h = cp[j];
          if (c !== 0 && h) v += c * cpIntegral(h, this.referenceTemperature, T);
        }
      }
      out[i] = v;
    }
  }

  /** dCp_i(T) = sum_j nu_ij Cp_j(T), J/(mol K), into out (length nR). */
  deltaCp(T: number, out: Float64Array): void {
    const { nR, nS, stoich, cp } = this;
    for (let i = 0; i < nR; i++) {
      let v = 0;
      for (let j = 0; j < nS; j++) {
        const c = stoich[i * nS + j];
        const h = cp[j];
        if (c !== 0 && h) v += c * cpAt(h, T);
      }
      out[i] = v;
    }
  }
}

