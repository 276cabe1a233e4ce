/**
 * Small hand-written CompiledKinetics for design tests: elementary power laws with Arrhenius
 * constants (and an optional reverse term with a constant K_eq), written directly against the
 * contract in src/kinetics/compiled.ts so the design module can be tested on its own.
 */
import type { CompiledKinetics } from '../../src/kinetics/compiled';

export interface FixtureReaction {
  id: string;
  /** Stoichiometric coefficients per species (negative reactants). */
  nu: number[];
  /** Parameter index of k_ref, and of E (J/mol) or -1. */
  k: number;
  E: number;
  /** Parameter index of K_eq (concentration units), or -1 for irreversible. */
  K: number;
  basis: 'volume' | 'mass';
}

export function fixtureKinetics(species: string[], parameterNames: string[], reactions: FixtureReaction[], Tref: number): CompiledKinetics {
  const nS = species.length;
  const nR = reactions.length;
  const stoich = new Float64Array(nR * nS);
  reactions.forEach((r, i) => r.nu.forEach((v, j) => (stoich[i * nS + j] = v)));
  const R = 8.314462618;
  const rate = (C: Float64Array, T: number, th: Float64Array, i: number) => {
    const rx = reactions[i];
    const k = th[rx.k] * (rx.E >= 0 ? Math.exp((-th[rx.E] / R) * (1 / T - 1 / Tref)) : 1);
    let f = 1;
    let b = 1;
    for (let j = 0; j < nS; j++) {
      const c = C[j] > 0 ? C[j] : 0;
      if (rx.nu[j] < 0) f *= c ** -rx.nu[j];
      else if (rx.nu[j] > 0) b *= c ** rx.nu[j];
    }
    return rx.K >= 0 ? k * (f - b / th[rx.K]) : k * f;
  };
  return {
    speciesNames: species,
    reactionIds: reactions.map((r) => r.id),
    parameterNames,
    stoich,
    basis: reactions.map((r) => r.basis),
    referenceTemperature: Tref,
    rates(C, T, th, out) {
      for (let i = 0; i < nR; i++) out[i] = rate(C, T, th, i);
    },
    ratesJacC(C, T, th, out) {
      const Cp = Float64Array.from(C);
      for (let i = 0; i < nR; i++)
        for (let j = 0; j < nS; j++) {
          const h = 1e-7 * Math.max(1, Math.abs(C[j]));
          Cp[j] = C[j] + h;
          out[i * nS + j] = (rate(Cp, T, th, i) - rate(C, T, th, i)) / h;
          Cp[j] = C[j];
        }
    },
    ratesJacP(C, T, th, out) {
      const nP = parameterNames.length;
      const tp = Float64Array.from(th);
      for (let i = 0; i < nR; i++)
        for (let k = 0; k < nP; k++) {
          const h = 1e-7 * Math.max(1, Math.abs(th[k]));
          tp[k] = th[k] + h;
          out[i * nP + k] = (rate(C, T, tp, i) - rate(C, T, th, i)) / h;
          tp[k] = th[k];
        }
    },
  };
}
