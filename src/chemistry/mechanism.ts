/**
 * Validated chemistry: species, reactions, the stoichiometric matrix and the element matrix.
 * Element conservation is checked per reaction (sum over species of nu_ij * a_ej = 0 for every
 * element e) whenever every species of the reaction has a formula.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import type { ReactionEquationSpec, SpeciesSpec } from './spec.js';
import { parseFormula } from './formula.js';
import { formatEquation, parseEquation } from './equation.js';

/** Validated chemistry. Matrices are row-major Float64Arrays. */
export interface Chemistry {
  readonly speciesNames: readonly string[];
  readonly reactionIds: readonly string[];
  /** Per reaction: '<=>' (true) or '->' (false). */
  readonly reversible: readonly boolean[];
  /** Per reaction: the equation in normal form, e.g. '2 A + B <=> C'. */
  readonly equations: readonly string[];
  /** Net stoichiometric matrix nu (nR x nS): products minus reactants. */
  readonly stoich: Float64Array;
  /** Reactant-side coefficients (nR x nS, non-negative); default forward orders. */
  readonly reactantCoefficients: Float64Array;
  /** Product-side coefficients (nR x nS, non-negative); default reverse orders. */
  readonly productCoefficients: Float64Array;
  /** Elements appearing in any formula, in order of first appearance. */
  readonly elements: readonly string[];
  /** Atoms of element e in species j (nE x nS); 0 for species without a formula. */
  readonly elementMatrix: Float64Array;
  /** Per species: true when a formula was given. */
  readonly hasFormula: readonly boolean[];
  /** Per species: molar mass in kg/mol (given, or from the formula); undefined when unknown. */
  readonly molarMass: readonly (number | undefined)[];
  /** Per species: declared inert (takes part in no reaction). */
  readonly inert: readonly boolean[];
}

const NAME_RE = /^[A-Za-z][A-Za-z0-9_]*$/;
/** Relative tolerance of the element balance (decimal coefficients are typed by hand). */
const BALANCE_RTOL = 1e-9;

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(12)));
}

/**
 * Validate species and reactions and build the matrices.
 * @param species species list (names unique, letters/digits/'_', starting with a letter).
 * @param reactions reaction list (ids unique); each equation may name declared species only.
 * @param path path of the enclosing object (errors point at path.species[i] / path.reactions[i]).
 */
export function buildChemistry(
  species: readonly SpeciesSpec[],
  reactions: readonly ReactionEquationSpec[],
  path: FieldPath = [],
): Chemistry {
  if (!Array.isArray(species) || species.length === 0) {
    throw new RateloomError('E_MISSING_FIELD', 'no species are declared', { path: [...path, 'species'] });
  }
  const names: string[] = [];
  const index = new Map<string, number>();
  const hasFormula: boolean[] = [];
  const molarMass: (number | undefined)[] = [];
  const inert: boolean[] = [];
  const formulaCounts: Record<string, number>[] = [];
  species.forEach((s, j) => {
    const p = [...path, 'species', j];
    if (typeof s?.name !== 'string' || !NAME_RE.test(s.name)) {
      throw new RateloomError('E_VALUE', `species name '${String(s?.name)}' is not valid`, {
        path: [...p, 'name'],
        fix: "Use letters, digits and '_' only, starting with a letter (for example 'H2O' or 'ethanol').",
      });
    }
    if (index.has(s.name)) {
      throw new RateloomError('E_VALUE', `species '${s.name}' is declared twice (entries ${index.get(s.name)} and ${j})`, {
        path: [...p, 'name'],
        fix: 'Give every species a unique name.',
      });
    }
    index.set(s.name, j);
    names.push(s.name);
    let counts: Record<string, number> = {};
    let mm: number | undefined;
    if (s.formula !== undefined) {
      const f = parseFormula(s.formula, [...p, 'formula']);
      counts = f.counts as Record<string, number>;
      mm = f.molarMass;
    }
    if (s.molarMass !== undefined) {
      if (typeof s.molarMass !== 'number' || !(s.molarMass > 0) || !Number.isFinite(s.molarMass)) {
        throw new RateloomError('E_VALUE', `species '${s.name}' has molar mass ${String(s.molarMass)}; it must be a positive number in kg/mol`, {
          path: [...p, 'molarMass'],
        });
      }
      mm = s.molarMass;
    }
    hasFormula.push(s.formula !== undefined);
    molarMass.push(mm);
    inert.push(s.inert === true);
    formulaCounts.push(counts);
  });

  const nS = names.length;
  const nR = reactions.length;
  const ids: string[] = [];
  const idIndex = new Map<string, number>();
  const reversible: boolean[] = [];
  const equations: string[] = [];
  const stoich = new Float64Array(nR * nS);
  const reac = new Float64Array(nR * nS);
  const prod = new Float64Array(nR * nS);
  reactions.forEach((r, i) => {
    const p = [...path, 'reactions', i];
    if (typeof r?.id !== 'string' || !NAME_RE.test(r.id)) {
      throw new RateloomError('E_VALUE', `reaction id '${String(r?.id)}' is not valid`, {
        path: [...p, 'id'],
        fix: "Use letters, digits and '_' only, starting with a letter (for example 'r1').",
      });
    }
    if (idIndex.has(r.id)) {
      throw new RateloomError('E_VALUE', `reaction id '${r.id}' is used twice (entries ${idIndex.get(r.id)} and ${i})`, {
        path: [...p, 'id'],
        fix: 'Give every reaction a unique id.',
      });
    }
    idIndex.set(r.id, i);
    ids.push(r.id);
    const eq = parseEquation(r.equation, names, [...p, 'equation']);
    reversible.push(eq.reversible);
    equations.push(formatEquation(eq));
    for (const t of eq.reactants) reac[i * nS + (index.get(t.species) as number)] = t.coefficient;
    for (const t of eq.products) prod[i * nS + (index.get(t.species) as number)] = t.coefficient;
    for (let j = 0; j < nS; j++) {
      stoich[i * nS + j] = prod[i * nS + j] - reac[i * nS + j];
      if (inert[j] && (reac[i * nS + j] !== 0 || prod[i * nS + j] !== 0)) {
        throw new RateloomError('E_VALUE', `species '${names[j]}' is declared inert but appears in reaction ${r.id}`, {
          path: [...path, 'species', j, 'inert'],
          fix: `Remove '${names[j]}' from the equation of ${r.id} or drop its inert flag.`,
        });
      }
    }
  });

  // element matrix
  const elements: string[] = [];
  for (const c of formulaCounts) for (const el of Object.keys(c)) if (!elements.includes(el)) elements.push(el);
  const nE = elements.length;
  const elementMatrix = new Float64Array(nE * nS);
  formulaCounts.forEach((c, j) => {
    for (const [el, n] of Object.entries(c)) elementMatrix[elements.indexOf(el) * nS + j] = n;
  });

  // element balance per reaction (only when every participating species has a formula)
  for (let i = 0; i < nR; i++) {
    let allKnown = true;
    for (let j = 0; j < nS; j++) {
      if ((reac[i * nS + j] !== 0 || prod[i * nS + j] !== 0) && !hasFormula[j]) allKnown = false;
    }
    if (!allKnown) continue;
    for (let e = 0; e < nE; e++) {
      let left = 0;
      let right = 0;
      for (let j = 0; j < nS; j++) {
        left += reac[i * nS + j] * elementMatrix[e * nS + j];
        right += prod[i * nS + j] * elementMatrix[e * nS + j];
      }
      if (Math.abs(left - right) > BALANCE_RTOL * Math.max(1, left, right)) {
        const diff = right - left;
        throw new RateloomError(
          'E_UNBALANCED',
          `reaction ${ids[i]} is unbalanced in ${elements[e]}: reactants ${fmt(left)}, products ${fmt(right)} ` +
            `(products have ${fmt(Math.abs(diff))} ${diff > 0 ? 'more' : 'fewer'} ${elements[e]} atoms)`,
          {
            path: [...path, 'reactions', i, 'equation'],
            details: { reaction: ids[i], element: elements[e], reactants: left, products: right },
          },
        );
      }
    }
  }

  return {
    speciesNames: names,
    reactionIds: ids,
    reversible,
    equations,
    stoich,
    reactantCoefficients: reac,
    productCoefficients: prod,
    elements,
    elementMatrix,
    hasFormula,
    molarMass,
    inert,
  };
}

/** Index of a species by name, or an E_UNKNOWN_SPECIES error naming the closest declared name. */
export function speciesIndex(chem: Pick<Chemistry, 'speciesNames'>, name: string, path: FieldPath = []): number {
  const j = chem.speciesNames.indexOf(name);
  if (j >= 0) return j;
  const near = closestName(name, chem.speciesNames);
  throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, {
    path,
    fix: near ? `Write '${near}' or declare '${name}' in the species list.` : `Declare '${name}' in the species list.`,
    details: { species: name, ...(near ? { closest: near } : {}) },
  });
}

/**
 * Per-element change between two amount vectors: residual_e = sum_j a_ej (after_j - before_j),
 * in the same unit as the amounts (mol or mol/s). Species without a formula do not contribute.
 * Zero (to rounding) for any change produced by balanced reactions.
 * @returns a Float64Array in the order of chemistry.elements.
 */
export function elementBalanceResidual(
  chem: Pick<Chemistry, 'elements' | 'elementMatrix' | 'speciesNames'>,
  amountsBefore: ArrayLike<number>,
  amountsAfter: ArrayLike<number>,
): Float64Array {
  const nS = chem.speciesNames.length;
  const nE = chem.elements.length;
  if (amountsBefore.length !== nS || amountsAfter.length !== nS) {
    throw new RateloomError('E_VALUE', `amount vectors must have one entry per species (${nS}), got ${amountsBefore.length} and ${amountsAfter.length}`);
  }
  const out = new Float64Array(nE);
  for (let e = 0; e < nE; e++) {
    let s = 0;
    for (let j = 0; j < nS; j++) s += chem.elementMatrix[e * nS + j] * (amountsAfter[j] - amountsBefore[j]);
    out[e] = s;
  }
  return out;
}
