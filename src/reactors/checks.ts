/**
 * Input checks shared by all reactor models. Bad input throws RateloomError naming the field
 * (paths like ['runs', runId, 'temperature'] or ['reactor', 'membrane', 'permeation', 'H2']) and
 * the fix; numerical trouble never throws (see the status on ReactorSolution).
 * Method: plain range checks; no external reference.
 */
import { InternalError, RateloomError, closestName, type FieldPath } from '../core/errors.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { ReactorOptions, ReactorSpec, RunConditions } from './types.js';

/** Path of a field of a run. */
export function runPath(run: RunConditions, ...rest: (string | number)[]): FieldPath {
  return ['runs', run.id, ...rest];
}

function bad(problem: string, path: FieldPath, fix: string, code: 'E_VALUE' | 'E_MISSING_FIELD' = 'E_VALUE'): never {
  throw new RateloomError(code, problem, { path, fix });
}

/**
 * The checks every reactor model runs first, in this order: the compiled kinetics are usable, the
 * parameter vector (when given) has one finite value per parameter, the temperature is positive.
 */
export function checkRunInputs(run: RunConditions, kinetics: CompiledKinetics, theta?: Float64Array): void {
  checkKinetics(kinetics);
  if (theta) checkTheta(kinetics, theta);
  checkTemperature(run);
}

/** Temperature finite and > 0 (K). */
function checkTemperature(run: RunConditions): void {
  const T = run.temperature;
  if (!(Number.isFinite(T) && T > 0)) {
    bad(`run '${run.id}' has temperature ${T} K; it must be a positive absolute temperature`, runPath(run, 'temperature'),
      'Give the temperature in kelvin as a number above 0 (for example 523.15 for 250 degC).');
  }
}

/** Inlet pressure present (when required) and > 0 (Pa). Returns it, or undefined when absent and not required. */
export function checkPressure(run: RunConditions, required: boolean): number | undefined {
  const P = run.pressure;
  if (P === undefined) {
    if (required) {
      bad(`run '${run.id}' is gas phase but has no pressure`, runPath(run, 'pressure'),
        'Give the inlet total pressure in Pa (for example 101325).', 'E_MISSING_FIELD');
    }
    return undefined;
  }
  if (!(Number.isFinite(P) && P > 0)) {
    bad(`run '${run.id}' has pressure ${P} Pa; it must be positive`, runPath(run, 'pressure'),
      'Give the total pressure in Pa as a number above 0.');
  }
  return P;
}

/** A per-species vector: present, of length nS, finite and non-negative, with a positive sum when asked. */
export function checkSpeciesVector(
  run: RunConditions,
  field: 'feed' | 'initialConcentrations',
  kinetics: CompiledKinetics,
  needPositiveTotal: boolean,
): Float64Array {
  const v = run[field];
  const nS = kinetics.speciesNames.length;
  const what = field === 'feed' ? 'feed molar flows (mol/s)' : 'initial concentrations (mol/m3)';
  if (!v) bad(`run '${run.id}' has no ${what}`, runPath(run, field), `Give the ${what} for every species.`, 'E_MISSING_FIELD');
  if (v.length !== nS) {
    bad(`run '${run.id}' gives ${v.length} ${what} for ${nS} species`, runPath(run, field),
      `Give one value per species, in the order ${kinetics.speciesNames.join(', ')}.`);
  }
  let total = 0;
  for (let j = 0; j < nS; j++) {
    if (!(Number.isFinite(v[j]) && v[j] >= 0)) {
      bad(`run '${run.id}' has ${field} ${v[j]} for species '${kinetics.speciesNames[j]}'; it must be >= 0`,
        runPath(run, field, kinetics.speciesNames[j]), 'Give a finite non-negative value (0 for an absent species).');
    }
    total += v[j];
  }
  if (needPositiveTotal && !(total > 0)) {
    bad(`run '${run.id}' has ${what} that are all zero`, runPath(run, field), 'Give at least one positive value.');
  }
  return v;
}

/** A positive finite scalar field of the run (size, volumetricFlow, initialVolume, catalystMass). */
export function checkPositive(
  run: RunConditions,
  field: 'size' | 'volumetricFlow' | 'initialVolume' | 'catalystMass',
  unit: string,
  allowZero = false,
): number {
  const v = run[field];
  if (v === undefined) {
    bad(`run '${run.id}' has no ${field}`, runPath(run, field), `Give ${field} in ${unit}.`, 'E_MISSING_FIELD');
  }
  const ok = Number.isFinite(v) && (allowZero ? v >= 0 : v > 0);
  if (!ok) {
    bad(`run '${run.id}' has ${field} ${v} ${unit}; it must be ${allowZero ? 'non-negative' : 'positive'}`,
      runPath(run, field), `Give ${field} as a ${allowZero ? 'non-negative' : 'positive'} number in ${unit}.`);
  }
  return v;
}

/** Parameter vector length and finiteness. */
function checkTheta(kinetics: CompiledKinetics, theta: Float64Array): void {
  const nP = kinetics.parameterNames.length;
  if (theta.length !== nP) {
    bad(`parameter vector has ${theta.length} values for ${nP} parameters`, ['parameters'],
      `Give one value per parameter, in the order ${kinetics.parameterNames.join(', ')}.`);
  }
  for (let k = 0; k < nP; k++) {
    if (!Number.isFinite(theta[k])) {
      bad(`parameter '${kinetics.parameterNames[k]}' has the non-finite value ${theta[k]}`,
        ['parameters', kinetics.parameterNames[k], 'value'], 'Give a finite value.');
    }
  }
}

/** A tolerance option, when given: finite and > 0. */
function checkTolerance(v: number | undefined, key: 'rtol' | 'atol'): void {
  if (v !== undefined && !(Number.isFinite(v) && v > 0)) {
    bad(`option ${key} is ${v}; it must be positive`, ['options', key], `Give ${key} as a small positive number.`);
  }
}

/** Options: tolerances and profile points inside [0, size], ascending. */
export function checkOptions(options: ReactorOptions, size: number): void {
  checkTolerance(options.rtol, 'rtol');
  checkTolerance(options.atol, 'atol');
  const pts = options.profilePoints;
  if (pts) {
    let prev = -Infinity;
    for (let i = 0; i < pts.length; i++) {
      const x = pts[i];
      if (!(Number.isFinite(x) && x >= 0 && x <= size * (1 + 1e-12) && x >= prev)) {
        bad(`profile point ${x} is not ascending inside [0, ${size}]`, ['options', 'profilePoints', i],
          'Give ascending positions between 0 and the reactor size.');
      }
      prev = x;
    }
  }
}

/** Profile positions: the given points, or `count` evenly spaced points from 0 to size. */
export function profilePositions(options: ReactorOptions, size: number, count = 50): number[] {
  if (options.profilePoints) return Array.from(options.profilePoints, (x) => Math.min(x, size));
  const out: number[] = [];
  for (let i = 0; i < count; i++) out.push((size * i) / (count - 1));
  return out;
}

/** Bulk density when given: finite and > 0 (kg/m3). */
export function bulkDensity(spec: ReactorSpec): number | undefined {
  const rb = spec.bulkDensity;
  if (rb === undefined) return undefined;
  if (!(Number.isFinite(rb) && rb > 0)) {
    bad(`reactor bulkDensity is ${rb}; it must be positive`, ['reactor', 'bulkDensity'], 'Give the bed bulk density in kg/m3.');
  }
  return rb;
}

/**
 * Per-reaction weights that turn rates into the balance coordinate. `volumeWeight` multiplies
 * volume-basis rates, `massWeight` mass-basis rates; a weight of undefined means that basis is
 * not allowed here, and `refuse` explains why and how to fix it.
 */
export function basisWeights(
  kinetics: CompiledKinetics,
  volumeWeight: number | undefined,
  massWeight: number | undefined,
  refuse: { volume: [FieldPath, string, string]; mass: [FieldPath, string, string] },
): Float64Array {
  const nR = kinetics.reactionIds.length;
  const w = new Float64Array(nR);
  for (let i = 0; i < nR; i++) {
    const b = kinetics.basis[i];
    const v = b === 'mass' ? massWeight : volumeWeight;
    if (v === undefined) {
      const [path, problem, fix] = b === 'mass' ? refuse.mass : refuse.volume;
      bad(`reaction '${kinetics.reactionIds[i]}': ${problem}`, path, fix);
    }
    w[i] = v;
  }
  return w;
}

/** Structural consistency of the compiled kinetics (sizes of the stoichiometric matrix and basis list). */
function checkKinetics(kinetics: CompiledKinetics): void {
  const nS = kinetics.speciesNames.length;
  const nR = kinetics.reactionIds.length;
  if (kinetics.stoich.length !== nS * nR || kinetics.basis.length !== nR) {
    throw new InternalError('compiled kinetics has inconsistent sizes (stoichiometric matrix or basis list)');
  }
}

/** Species names in a membrane description must be declared species. Returns index per name. */
export function speciesIndex(kinetics: CompiledKinetics, name: string, path: FieldPath): number {
  const j = kinetics.speciesNames.indexOf(name);
  if (j < 0) {
    const near = closestName(name, kinetics.speciesNames);
    throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, {
      path,
      fix: `Use one of the declared species: ${kinetics.speciesNames.join(', ')}.`,
      ...(near ? { details: { closest: near } } : {}),
    });
  }
  return j;
}
