/**
 * Binary gas diffusivity by Fuller's correlation:
 *
 *   D_AB = 1.0e-3 T^1.75 sqrt(1/M_A + 1/M_B) / (P (sum_v,A^(1/3) + sum_v,B^(1/3))^2)   [cm2/s]
 *
 * with T in K, P in atm, M in g/mol and sum_v the molecule's diffusion volume (sum of atomic
 * increments, or a tabulated value for simple molecules). Source: E.N. Fuller, P.D. Schettler,
 * J.C. Giddings, "A new method for prediction of binary gas-phase diffusion coefficients", Ind.
 * Eng. Chem. 58 (1966) 18-27, with the increments revised by Fuller, Ensley and Giddings, J. Phys.
 * Chem. 73 (1969) 3679 (values from memory as tabulated by B.E. Poling, J.M. Prausnitz,
 * J.P. O'Connell, The Properties of Gases and Liquids, 5th ed., 2001, Table 11-1). Typical error a
 * few per cent for non-polar gases at low pressure. Here in SI: m2/s from T in K and P in Pa.
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import { parseFormula } from '../chemistry/formula.js';
import { STANDARD_ATMOSPHERE } from '../core/constants.js';

/** Atomic diffusion-volume increments (Fuller et al. 1969). */
const ATOMIC: Readonly<Record<string, number>> = { C: 15.9, H: 2.31, O: 6.11, N: 4.54, F: 14.7, Cl: 21.0, Br: 21.9, I: 29.8, S: 22.9 };

/** Diffusion volumes of simple molecules, by formula (Fuller et al. 1969). */
const MOLECULES: Readonly<Record<string, number>> = {
  He: 2.67, Ne: 5.98, Ar: 16.2, Kr: 24.5, Xe: 32.7, H2: 6.12, N2: 18.5, O2: 16.3,
  CO: 18.0, CO2: 26.9, N2O: 35.9, NH3: 20.7, H2O: 13.1, SF6: 71.3, Cl2: 38.4, Br2: 69.0, SO2: 41.8,
};

/** Canonical key of element counts (sorted), so 'OC' and 'CO' match. */
function key(counts: Record<string, number>): string {
  return Object.keys(counts).sort().map((e) => `${e}${counts[e]}`).join('');
}
const MOLECULE_KEYS = new Map(Object.entries(MOLECULES).map(([f, v]) => [key(parseFormula(f).counts), v]));

/** Diffusion volume of a molecule from its formula; throws when an element has no increment. */
export function diffusionVolume(formula: string, path: FieldPath = []): number {
  const counts = parseFormula(formula, path).counts;
  const known = MOLECULE_KEYS.get(key(counts));
  if (known !== undefined) return known;
  let v = 0;
  for (const [el, n] of Object.entries(counts)) {
    const inc = ATOMIC[el];
    if (inc === undefined) {
      throw new RateloomError('E_VALUE', `Fuller's correlation has no diffusion volume for element ${el} (formula ${formula})`, {
        path, fix: 'Give the molecular diffusivity of this species directly (m2/s).',
      });
    }
    v += n * inc;
  }
  return v;
}

/** Molar mass in g/mol from a formula. */
function gramsPerMol(formula: string, path: FieldPath): number {
  return parseFormula(formula, path).molarMass * 1000;
}

/**
 * D_AB in m2/s for gases A and B (formulas) at temperature T (K) and pressure P (Pa).
 */
export function fullerDiffusivity(formulaA: string, formulaB: string, T: number, P: number, path: FieldPath = []): number {
  const MA = gramsPerMol(formulaA, path);
  const MB = gramsPerMol(formulaB, path);
  const s = Math.cbrt(diffusionVolume(formulaA, path)) + Math.cbrt(diffusionVolume(formulaB, path));
  const cm2s = (1.0e-3 * T ** 1.75 * Math.sqrt(1 / MA + 1 / MB)) / ((P / STANDARD_ATMOSPHERE) * s * s);
  return cm2s * 1e-4;
}
