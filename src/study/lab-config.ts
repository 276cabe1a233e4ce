/**
 * The `labData` section resolved against the chemistry and the error models: species indices,
 * the removed-species mask of a dry basis, the internal standard, product/reactant pairs with
 * their stoichiometric factors, and the responses to fit. Mistakes in the section are
 * RateloomErrors naming the field.
 */
import type { Chemistry } from '../chemistry/mechanism.js';
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { stoichiometricFactor } from '../data/lab-arithmetic.js';
import { unitFor } from '../units/index.js';
import type { ErrorModel } from './types.js';
import type { LabDataSpec, LabFitKind } from './lab-types.js';

/** Default largest excess of the measured fractions' sum over 1. */
export const DEFAULT_SUM_TOLERANCE = 0.03;
/** Default tolerance of the element balance closure (|closure - 1|). */
export const DEFAULT_BALANCE_TOLERANCE = 0.05;

export interface LabPair {
  product: number;
  reactant: number;
  factor: number;
  label: string;
}

export interface LabConfig {
  spec: LabDataSpec;
  /** Species index -> fraction column name. */
  columns: { j: number; column: string }[];
  /** Fraction unit factor to mol/mol. */
  unitFactor: number;
  removed: boolean[];
  standard?: number;
  fit: LabFitKind[];
  conversion: number[];
  pairs: LabPair[];
  errorModel: ErrorModel;
  sumTolerance: number;
  balanceTolerance: number;
  /** Elements checked: index into chemistry.elements. */
  elements: number[];
}

const PATH: FieldPath = ['labData'];

function speciesIndex(chem: Chemistry, name: string, path: FieldPath): number {
  const j = chem.speciesNames.indexOf(name);
  if (j >= 0) return j;
  const near = closestName(name, chem.speciesNames);
  throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, { path });
}

/** True when species j is consumed by some reaction. */
function isReactant(chem: Chemistry, j: number): boolean {
  const nS = chem.speciesNames.length;
  for (let i = 0; i < chem.reactionIds.length; i++) if (chem.stoich[i * nS + j] < 0) return true;
  return false;
}

function resolveRemoved(spec: LabDataSpec, chem: Chemistry): boolean[] {
  const removed = chem.speciesNames.map(() => false);
  const basis = spec.basis ?? 'wet';
  if (basis === 'wet' && spec.removed?.length) {
    throw new RateloomError('E_VALUE', "'removed' applies to a dry basis only", { path: [...PATH, 'removed'], fix: "Set basis to 'dry' or drop 'removed'." });
  }
  if (basis === 'dry' && !spec.removed?.length) {
    throw new RateloomError('E_MISSING_FIELD', "a dry basis needs 'removed': the species condensed before the analyser", { path: [...PATH, 'removed'], fix: 'List them, for example "removed": ["H2O"].' });
  }
  (spec.removed ?? []).forEach((name, k) => {
    const j = speciesIndex(chem, name, [...PATH, 'removed', k]);
    if (isReactant(chem, j)) {
      throw new RateloomError('E_VALUE', `the dry basis removes '${name}', a reactant: its conversion could not be followed`, { path: [...PATH, 'removed', k], fix: 'Remove only products or inerts condensed before the analyser (for example water), or report the fractions on a wet basis.' });
    }
    if (spec.fractions[name] !== undefined) {
      throw new RateloomError('E_VALUE', `'${name}' is removed before the analyser, so it cannot have a measured fraction on the dry basis`, { path: [...PATH, 'fractions', name] });
    }
    removed[j] = true;
  });
  return removed;
}

function resolveStandard(spec: LabDataSpec, chem: Chemistry, removed: boolean[]): number | undefined {
  if (spec.standard === undefined) return undefined;
  const path = [...PATH, 'standard'];
  const s = speciesIndex(chem, spec.standard, path);
  const nS = chem.speciesNames.length;
  for (let i = 0; i < chem.reactionIds.length; i++) {
    if (chem.stoich[i * nS + s] !== 0) throw new RateloomError('E_VALUE', `the internal standard '${spec.standard}' takes part in reaction '${chem.reactionIds[i]}'`, { path, fix: 'Use an inert species (for example N2 or Ar) as standard.' });
  }
  if (removed[s]) throw new RateloomError('E_VALUE', `the internal standard '${spec.standard}' is removed before the analyser`, { path });
  if (spec.fractions[spec.standard] === undefined) throw new RateloomError('E_MISSING_FIELD', `the internal standard '${spec.standard}' needs a fraction column`, { path: [...PATH, 'fractions'] });
  return s;
}

function resolvePairs(spec: LabDataSpec, chem: Chemistry): LabPair[] {
  return (spec.selectivity ?? []).map((p, k) => {
    const path = [...PATH, 'selectivity', k];
    const product = speciesIndex(chem, p.product, [...path, 'product']);
    const reactant = speciesIndex(chem, p.reactant, [...path, 'reactant']);
    const factor = p.factor ?? stoichiometricFactor(chem.stoich, chem.speciesNames.length, product, reactant);
    if (factor === null || !(factor > 0)) {
      throw new RateloomError('E_VALUE', `no reaction consumes '${p.reactant}' and forms '${p.product}', so the stoichiometric factor is unknown`, { path, fix: "Give 'factor' (|nu_reactant| / nu_product) or pick a pair joined by a reaction." });
    }
    return { product, reactant, factor, label: `${p.product}/${p.reactant}` };
  });
}

function resolveFit(spec: LabDataSpec, standard: number | undefined, pairs: LabPair[]): LabFitKind[] {
  const fit = spec.fit ?? [standard !== undefined ? 'fraction-ratio' : 'outlet-fraction'];
  fit.forEach((k, i) => {
    const needsStd = k === 'fraction-ratio' || k === 'conversion' || k === 'selectivity' || k === 'yield';
    if (needsStd && standard === undefined) throw new RateloomError('E_MISSING_FIELD', `fitting '${k}' from fractions needs an internal standard`, { path: [...PATH, 'fit', i], fix: "Name the inert in 'standard', or fit 'outlet-fraction'." });
    if ((k === 'selectivity' || k === 'yield') && !pairs.length) throw new RateloomError('E_MISSING_FIELD', `fitting '${k}' needs product/reactant pairs in 'selectivity'`, { path: [...PATH, 'selectivity'] });
  });
  return fit;
}

function resolveErrorModel(spec: LabDataSpec, models: Record<string, ErrorModel>, fallback: string): ErrorModel {
  const name = spec.errorModel ?? fallback;
  const m = models[name];
  const path = [...PATH, 'errorModel'];
  if (!m) throw new RateloomError('E_VALUE', `error model '${name}' is not defined in errorModels`, { path, fix: `Use one of: ${Object.keys(models).join(', ')}.` });
  if (m.kind === 'replicates') throw new RateloomError('E_VALUE', `error model '${name}' estimates sigma from replicates; fractions need an absolute and/or relative sigma on the fraction`, { path });
  if (m.unit !== undefined && m.unit !== '1') throw new RateloomError('E_UNIT', `error model '${name}' has an absolute sigma in ${m.unit}, but fractions are dimensionless`, { path: ['errorModels', name, 'absolute', 'unit'], fix: "Give it in '1', '%' or 'ppm'." });
  return m;
}

/** Resolve the labData section; `fallbackModel` is the name used when it names none. */
export function resolveLabConfig(spec: LabDataSpec, chem: Chemistry, keyReactant: number, models: Record<string, ErrorModel>, fallbackModel: string): LabConfig {
  const unitFactor = unitFor('dimensionless', spec.unit ?? '1', { path: [...PATH, 'unit'] }).factor;
  const removed = resolveRemoved(spec, chem);
  if (!Object.keys(spec.fractions).length) throw new RateloomError('E_MISSING_FIELD', 'labData needs at least one fraction column', { path: [...PATH, 'fractions'] });
  const columns = Object.entries(spec.fractions).map(([name, column]) => ({ j: speciesIndex(chem, name, [...PATH, 'fractions', name]), column }));
  const standard = resolveStandard(spec, chem, removed);
  const pairs = resolvePairs(spec, chem);
  const conversion = (spec.conversion ?? [chem.speciesNames[keyReactant]]).map((n, k) => speciesIndex(chem, n, [...PATH, 'conversion', k]));
  const elements = (spec.balance?.elements ?? chem.elements).map((e, k) => {
    const i = chem.elements.indexOf(e);
    if (i < 0) throw new RateloomError('E_VALUE', `element '${e}' appears in no species formula`, { path: [...PATH, 'balance', 'elements', k] });
    return i;
  });
  return {
    spec,
    columns,
    unitFactor,
    removed,
    ...(standard !== undefined ? { standard } : {}),
    fit: resolveFit(spec, standard, pairs),
    conversion,
    pairs,
    errorModel: resolveErrorModel(spec, models, fallbackModel),
    sumTolerance: spec.sumTolerance ?? DEFAULT_SUM_TOLERANCE,
    balanceTolerance: spec.balance?.tolerance ?? DEFAULT_BALANCE_TOLERANCE,
    elements,
  };
}
