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
  const table = readSpecies(species, path);
  const matrices = readReactions(reactions, table, path);
  const { elements, elementMatrix } = buildElementMatrix(table.formulaCounts);
  checkElementBalance(matrices, table.hasFormula, elements, elementMatrix, path);
  return {
    speciesNames: table.names,
    reactionIds: matrices.ids,
    reversible: matrices.reversible,
    equations: matrices.equations,
    stoich: matrices.stoich,
    reactantCoefficients: matrices.reac,
    productCoefficients: matrices.prod,
    elements,
    elementMatrix,
    hasFormula: table.hasFormula,
    molarMass: table.molarMass,
    inert: table.inert,
  };
}

/** The validated species list, one entry per species in declaration order. */
interface SpeciesTable {
  names: string[];
  hasFormula: boolean[];
  molarMass: (number | undefined)[];
  inert: boolean[];
  /** Atoms per element of each species' formula ({} without a formula). */
  formulaCounts: Record<string, number>[];
}

/** The validated reactions and their coefficient matrices (nR x nS, row-major). */
interface ReactionMatrices {
  ids: string[];
  reversible: boolean[];
  equations: string[];
  stoich: Float64Array;
  reac: Float64Array;
  prod: Float64Array;
}

/** Wording of the name checks of species names and reaction ids. */
const NAME_KINDS = {
  species: { field: 'name', label: 'species name', owner: 'species', twice: 'is declared twice', example: "'H2O' or 'ethanol'", unique: 'Give every species a unique name.' },
  reaction: { field: 'id', label: 'reaction id', owner: 'reaction id', twice: 'is used twice', example: "'r1'", unique: 'Give every reaction a unique id.' },
} as const;

/**
 * Check that a species name or reaction id is well formed and not taken yet; record it in `seen`.
 * @param p path of the entry (the error points at its name or id field).
 */
function checkNewName(name: unknown, entry: number, seen: Map<string, number>, kind: keyof typeof NAME_KINDS, p: FieldPath): string {
  const k = NAME_KINDS[kind];
  if (typeof name !== 'string' || !NAME_RE.test(name)) {
    throw new RateloomError('E_VALUE', `${k.label} '${String(name)}' is not valid`, {
      path: [...p, k.field],
      fix: `Use letters, digits and '_' only, starting with a letter (for example ${k.example}).`,
    });
  }
  if (seen.has(name)) {
    throw new RateloomError('E_VALUE', `${k.owner} '${name}' ${k.twice} (entries ${seen.get(name)} and ${entry})`, { path: [...p, k.field], fix: k.unique });
  }
  seen.set(name, entry);
  return name;
}

/** Names, formulas, molar masses (kg/mol) and inert flags of the species. */
function readSpecies(species: readonly SpeciesSpec[], path: FieldPath): SpeciesTable {
  const table: SpeciesTable = { names: [], hasFormula: [], molarMass: [], inert: [], formulaCounts: [] };
  const seen = new Map<string, number>();
  species.forEach((s, j) => {
    const p = [...path, 'species', j];
    const name = checkNewName(s?.name, j, seen, 'species', p);
    const f = s.formula !== undefined ? parseFormula(s.formula, [...p, 'formula']) : undefined;
    table.names.push(name);
    table.hasFormula.push(f !== undefined);
    table.molarMass.push(s.molarMass !== undefined ? checkedMolarMass(name, s.molarMass, p) : f?.molarMass);
    table.inert.push(s.inert === true);
    table.formulaCounts.push(f ? (f.counts as Record<string, number>) : {});
  });
  return table;
}

/** A given molar mass (kg/mol), which must be a positive finite number. */
function checkedMolarMass(name: string, molarMass: unknown, p: FieldPath): number {
  if (typeof molarMass !== 'number' || !(molarMass > 0) || !Number.isFinite(molarMass)) {
    throw new RateloomError('E_VALUE', `species '${name}' has molar mass ${String(molarMass)}; it must be a positive number in kg/mol`, {
      path: [...p, 'molarMass'],
      fix: 'Give the molar mass in kg/mol (water: 0.018015), or leave it out and give a formula.',
    });
  }
  return molarMass;
}

/** Parse the equations into the reactant, product and net coefficient matrices. */
function readReactions(reactions: readonly ReactionEquationSpec[], table: SpeciesTable, path: FieldPath): ReactionMatrices {
  const { names, inert } = table;
  const nS = names.length;
  const nR = reactions.length;
  const m: ReactionMatrices = { ids: [], reversible: [], equations: [], stoich: new Float64Array(nR * nS), reac: new Float64Array(nR * nS), prod: new Float64Array(nR * nS) };
  const seen = new Map<string, number>();
  reactions.forEach((r, i) => {
    const p = [...path, 'reactions', i];
    const id = checkNewName(r?.id, i, seen, 'reaction', p);
    m.ids.push(id);
    const eq = parseEquation(r.equation, names, [...p, 'equation']);
    m.reversible.push(eq.reversible);
    m.equations.push(formatEquation(eq));
    for (const t of eq.reactants) m.reac[i * nS + names.indexOf(t.species)] = t.coefficient;
    for (const t of eq.products) m.prod[i * nS + names.indexOf(t.species)] = t.coefficient;
    for (let j = 0; j < nS; j++) {
      m.stoich[i * nS + j] = m.prod[i * nS + j] - m.reac[i * nS + j];
      if (inert[j] && (m.reac[i * nS + j] !== 0 || m.prod[i * nS + j] !== 0)) {
        throw new RateloomError('E_VALUE', `species '${names[j]}' is declared inert but appears in reaction ${id}`, {
          path: [...path, 'species', j, 'inert'],
          fix: `Remove '${names[j]}' from the equation of ${id} or drop its inert flag.`,
        });
      }
    }
  });
  return m;
}

/** Elements in order of first appearance and the atoms of each in each species (nE x nS). */
function buildElementMatrix(formulaCounts: readonly Record<string, number>[]): { elements: string[]; elementMatrix: Float64Array } {
  const nS = formulaCounts.length;
  const elements: string[] = [];
  for (const c of formulaCounts) for (const el of Object.keys(c)) if (!elements.includes(el)) elements.push(el);
  const elementMatrix = new Float64Array(elements.length * nS);
  formulaCounts.forEach((c, j) => {
    for (const [el, n] of Object.entries(c)) elementMatrix[elements.indexOf(el) * nS + j] = n;
  });
  return { elements, elementMatrix };
}

/** E_UNBALANCED for the first element not conserved by a reaction whose species all have formulas. */
function checkElementBalance(m: ReactionMatrices, hasFormula: readonly boolean[], elements: readonly string[], elementMatrix: Float64Array, path: FieldPath): void {
  const nS = hasFormula.length;
  for (let i = 0; i < m.ids.length; i++) {
    let allKnown = true;
    for (let j = 0; j < nS; j++) {
      if ((m.reac[i * nS + j] !== 0 || m.prod[i * nS + j] !== 0) && !hasFormula[j]) allKnown = false;
    }
    if (!allKnown) continue;
    for (let e = 0; e < elements.length; e++) {
      let left = 0;
      let right = 0;
      for (let j = 0; j < nS; j++) {
        left += m.reac[i * nS + j] * elementMatrix[e * nS + j];
        right += m.prod[i * nS + j] * elementMatrix[e * nS + j];
      }
      if (Math.abs(left - right) > BALANCE_RTOL * Math.max(1, left, right)) {
        const diff = right - left;
        throw new RateloomError(
          'E_UNBALANCED',
          `reaction ${m.ids[i]} is unbalanced in ${elements[e]}: reactants ${fmt(left)}, products ${fmt(right)} ` +
            `(products have ${fmt(Math.abs(diff))} ${diff > 0 ? 'more' : 'fewer'} ${elements[e]} atoms)`,
          {
            path: [...path, 'reactions', i, 'equation'],
            details: { reaction: m.ids[i], element: elements[e], reactants: left, products: right },
          },
        );
      }
    }
  }
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
