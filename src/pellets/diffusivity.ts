/**
 * Effective diffusivity of each species in the pellet.
 *
 *   De = (epsilon_p / tau) D,   1/D = 1/D_m + 1/D_K  (when a pore diameter is given),
 *   D_K = (d_pore / 3) sqrt(8 R T / (pi M))
 *
 * Method: the parallel-pore (random pore) model, De = epsilon D / tau (A. Wheeler, Adv. Catal. 3
 * (1951) 249; C.N. Satterfield, Mass Transfer in Heterogeneous Catalysis, MIT Press 1970, ch. 1),
 * with Knudsen and molecular diffusion in series by the Bosanquet interpolation (W.G. Pollard,
 * R.D. Present, Phys. Rev. 73 (1948) 762) and the Knudsen diffusivity of kinetic gas theory. A given
 * effective diffusivity is used as it is. A per-species table that leaves a species out gives that
 * species the smallest value of the table (conservative).
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import { parseFormula } from '../chemistry/formula.js';
import { fullerDiffusivity } from './fuller.js';
import type { PelletSpec } from './types.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** A species as the diffusivity estimates need it. */
export interface DiffusingSpecies {
  name: string;
  /** Chemical formula (needed by Fuller's correlation and the Knudsen term). */
  formula?: string;
}

/** A value per species from one number or a per-species table (smallest value for missing ones). */
function perSpecies(v: number | Record<string, number>, species: readonly DiffusingSpecies[]): Float64Array {
  if (typeof v === 'number') return new Float64Array(species.length).fill(v);
  const fallback = Math.min(...Object.values(v));
  return Float64Array.from(species, (s) => v[s.name] ?? fallback);
}

function formulaOf(s: DiffusingSpecies, path: FieldPath, why: string): string {
  if (!s.formula) {
    throw new RateloomError('E_MISSING_FIELD', `species '${s.name}' has no formula, which ${why} needs`, {
      path, fix: `Give the formula of '${s.name}' in the species list, or the diffusivities directly (m2/s).`,
    });
  }
  return s.formula;
}

/** Molecular diffusivities, m2/s, per species at T (K) and P (Pa). */
export function molecularDiffusivities(p: PelletSpec, species: readonly DiffusingSpecies[], T: number, P: number, path: FieldPath): Float64Array | undefined {
  const m = p.molecularDiffusivity;
  if (m === undefined) return undefined;
  if (typeof m === 'number' || !('estimate' in m)) return perSpecies(m as number | Record<string, number>, species);
  const name = String(m.carrier);
  const carrier = species.find((s) => s.name === name);
  const cf = formulaOf(carrier ?? { name }, [...path, 'molecularDiffusivity', 'carrier'], "Fuller's correlation");
  return Float64Array.from(species, (s) => fullerDiffusivity(formulaOf(s, [...path, 'molecularDiffusivity'], "Fuller's correlation"), cf, T, P, [...path, 'molecularDiffusivity']));
}

/** Knudsen diffusivity, m2/s, in pores of diameter d (m) for molar mass M (kg/mol) at T (K). */
export function knudsenDiffusivity(d: number, M: number, T: number): number {
  return (d / 3) * Math.sqrt((8 * GAS_CONSTANT * T) / (Math.PI * M));
}

/** Effective diffusivities De per species, m2/s, at T (K) and P (Pa; gases with Fuller). */
export function effectiveDiffusivities(p: PelletSpec, species: readonly DiffusingSpecies[], T: number, P: number, path: FieldPath): Float64Array {
  if (p.effectiveDiffusivity !== undefined) return perSpecies(p.effectiveDiffusivity, species);
  const Dm = molecularDiffusivities(p, species, T, P, path);
  if (!Dm || p.tortuosity === undefined) {
    throw new RateloomError('E_MISSING_FIELD', 'no diffusivity is given for the pellet', {
      path: [...path, 'effectiveDiffusivity'],
      fix: 'Give "effectiveDiffusivity" (m2/s), or "molecularDiffusivity" with "tortuosity".',
    });
  }
  const f = p.porosity / p.tortuosity;
  return Float64Array.from(species, (s, j) => {
    let D = Dm[j];
    if (p.poreDiameter !== undefined) {
      const M = parseFormula(formulaOf(s, [...path, 'poreDiameter'], 'the Knudsen term'), [...path, 'poreDiameter']).molarMass;
      D = 1 / (1 / D + 1 / knudsenDiffusivity(p.poreDiameter, M, T));
    }
    return f * D;
  });
}
