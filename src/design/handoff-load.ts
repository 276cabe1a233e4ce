/**
 * Reading the fitted-kinetics hand-off (handoff.ts): structural validation with typed errors, and
 * the map between the hand-off's free parameters (estimation space, with covariance) and the
 * physical parameter vector of the compiled kinetics.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { toExternal, type Transform } from '../core/parameter.js';
import { checkHandoffRanges } from './handoff-ranges.js';
import { isObj, type Obj } from '../core/record.js';
import { HANDOFF_FORMAT, HANDOFF_VERSION, type FittedKinetics, type HandoffParameter } from './handoff.js';


function req(o: Obj, key: string, path: FieldPath, type: 'string' | 'number' | 'object' | 'array' | 'boolean'): unknown {
  const v = o[key];
  if (v === undefined) {
    const near = closestName(key, Object.keys(o));
    throw new RateloomError('E_MISSING_FIELD', `the hand-off file has no '${key}'`, {
      path: [...path, key],
      fix: near ? `Found '${near}': is it misspelt? The field must be named '${key}'.` : 'Write the hand-off with `rateloom fit`; do not edit it by hand.',
    });
  }
  const ok =
    type === 'array' ? Array.isArray(v) : type === 'object' ? isObj(v) : type === 'number' ? typeof v === 'number' && Number.isFinite(v) : typeof v === type;
  if (!ok) throw new RateloomError('E_TYPE', `'${key}' must be ${type === 'array' ? 'a list' : `a ${type}`}`, { path: [...path, key] });
  return v;
}

/**
 * Validate a parsed hand-off document and return it typed. Checks format, version, species,
 * reactions, parameters (finite values, internal value matching the transform), covariance shape,
 * symmetry and non-negative diagonal, and coverage ranges; then the numbers' ranges
 * (handoff-ranges.ts).
 */
export function parseHandoff(raw: unknown): FittedKinetics {
  if (!isObj(raw)) throw new RateloomError('E_TYPE', 'the hand-off file must hold a JSON object', { path: [] });
  const fmt = req(raw, 'format', [], 'string');
  if (fmt !== HANDOFF_FORMAT) {
    throw new RateloomError('E_SCHEMA', `format '${String(fmt)}' is not '${HANDOFF_FORMAT}'`, {
      path: ['format'],
      fix: 'Pass the fitted-kinetics file written by `rateloom fit` as the first argument (the case file comes second).',
    });
  }
  const ver = req(raw, 'formatVersion', [], 'number');
  if (ver !== HANDOFF_VERSION) {
    throw new RateloomError('E_SCHEMA', `format version ${String(ver)} is not supported (this rateloom reads version ${HANDOFF_VERSION})`, {
      path: ['formatVersion'],
      fix: 'Write the hand-off again with this version of rateloom.',
    });
  }
  const species = req(raw, 'species', [], 'array') as unknown[];
  species.forEach((s, i) => {
    if (!isObj(s) || typeof s.name !== 'string') throw new RateloomError('E_TYPE', 'each species needs a name', { path: ['species', i] });
  });
  const reactions = req(raw, 'reactions', [], 'array') as unknown[];
  if (reactions.length === 0) throw new RateloomError('E_SCHEMA', 'the hand-off has no reactions', { path: ['reactions'] });
  reactions.forEach((r, i) => {
    if (!isObj(r) || typeof r.id !== 'string' || typeof r.equation !== 'string' || !isObj(r.rate)) {
      throw new RateloomError('E_TYPE', 'each reaction needs id, equation and rate', { path: ['reactions', i] });
    }
  });
  const Tref = req(raw, 'referenceTemperature', [], 'number') as number;
  if (!(Tref > 0)) throw new RateloomError('E_VALUE', 'reference temperature must be positive (K)', { path: ['referenceTemperature'] });
  const names = checkParameters(raw);
  checkCovariance(raw, names);
  const cov2 = req(raw, 'coverage', [], 'object') as Obj;
  const T = req(cov2, 'temperature', ['coverage'], 'object') as Obj;
  checkRange(T, ['coverage', 'temperature']);
  if (cov2.pressure !== undefined) checkRange(cov2.pressure, ['coverage', 'pressure']);
  if (cov2.conversion !== undefined) checkRange(cov2.conversion, ['coverage', 'conversion']);
  if (cov2.feedMoleFraction !== undefined) {
    if (!isObj(cov2.feedMoleFraction)) throw new RateloomError('E_TYPE', 'feedMoleFraction must be an object', { path: ['coverage', 'feedMoleFraction'] });
    for (const [k, v] of Object.entries(cov2.feedMoleFraction)) checkRange(v, ['coverage', 'feedMoleFraction', k]);
  }
  checkVerdict(raw);
  checkHandoffRanges(raw);
  return raw as unknown as FittedKinetics;
}

/** Parameters: unique names, finite values, a known transform, internal value matching it. */
function checkParameters(raw: Obj): Set<string> {
  const params = req(raw, 'parameters', [], 'array') as unknown[];
  const names = new Set<string>();
  params.forEach((p, i) => {
    const path = ['parameters', i];
    if (!isObj(p)) throw new RateloomError('E_TYPE', 'each parameter must be an object', { path });
    const name = req(p, 'name', path, 'string') as string;
    if (names.has(name)) throw new RateloomError('E_SCHEMA', `parameter '${name}' appears twice`, { path: [...path, 'name'] });
    names.add(name);
    const value = req(p, 'value', path, 'number') as number;
    const tr = req(p, 'transform', path, 'string') as Transform;
    if (tr !== 'none' && tr !== 'log') throw new RateloomError('E_VALUE', `transform '${tr}' must be 'none' or 'log'`, { path: [...path, 'transform'] });
    const internal = req(p, 'internalValue', path, 'number') as number;
    if (Math.abs(toExternal({ transform: tr }, internal) - value) > 1e-9 * Math.max(Math.abs(value), 1e-300)) {
      throw new RateloomError('E_VALUE', `parameter '${name}': internalValue ${internal} does not map to value ${value} under transform '${tr}'`, {
        path: [...path, 'internalValue'],
        fix: 'Write the hand-off again with `rateloom fit`; it was edited inconsistently.',
      });
    }
    req(p, 'fixed', path, 'boolean');
  });
  return names;
}

/** Covariance: names of known parameters, a square matrix of finite numbers, symmetric, diagonal >= 0. */
function checkCovariance(raw: Obj, names: Set<string>): void {
  const cov = req(raw, 'covariance', [], 'object') as Obj;
  const cnames = req(cov, 'names', ['covariance'], 'array') as unknown[];
  const matrix = req(cov, 'matrix', ['covariance'], 'array') as unknown[];
  const n = cnames.length;
  cnames.forEach((c, i) => {
    if (typeof c !== 'string' || !names.has(c)) {
      const near = typeof c === 'string' ? closestName(c, names) : undefined;
      throw new RateloomError('E_UNKNOWN_PARAMETER', `covariance names '${String(c)}', which is not a parameter`, {
        path: ['covariance', 'names', i],
        ...(near ? { fix: `Did you mean '${near}'?` } : {}),
      });
    }
  });
  if (matrix.length !== n) throw new RateloomError('E_SCHEMA', `covariance matrix has ${matrix.length} rows for ${n} names`, { path: ['covariance', 'matrix'] });
  matrix.forEach((row, i) => {
    if (!Array.isArray(row) || row.length !== n || !row.every((v) => typeof v === 'number' && Number.isFinite(v))) {
      throw new RateloomError('E_SCHEMA', `covariance row ${i} must hold ${n} finite numbers`, { path: ['covariance', 'matrix', i] });
    }
  });
  const M = matrix as number[][];
  for (let i = 0; i < n; i++) {
    if (M[i][i] < 0) throw new RateloomError('E_VALUE', `covariance diagonal ${i} is negative`, { path: ['covariance', 'matrix', i, i] });
    for (let j = 0; j < i; j++) {
      if (Math.abs(M[i][j] - M[j][i]) > 1e-8 * Math.sqrt(Math.abs(M[i][i] * M[j][j])) + 1e-300) {
        throw new RateloomError('E_VALUE', `covariance is not symmetric at (${i}, ${j})`, { path: ['covariance', 'matrix', i, j] });
      }
    }
  }
}

/** The lab reactor, the fit's verdict, the covariance status and the content hash are present. */
function checkVerdict(raw: Obj): void {
  req(raw, 'labReactor', [], 'object');
  const verdict = req(raw, 'verdict', [], 'object') as Obj;
  req(verdict, 'trustworthy', ['verdict'], 'boolean');
  req(verdict, 'status', ['verdict'], 'string');
  const cs = req(raw, 'covarianceStatus', [], 'string');
  if (cs !== 'positive-definite' && cs !== 'singular' && cs !== 'unavailable') {
    throw new RateloomError('E_VALUE', `covarianceStatus '${String(cs)}' must be 'positive-definite', 'singular' or 'unavailable'`, { path: ['covarianceStatus'] });
  }
  req(raw, 'contentHash', [], 'string');
}

function checkRange(v: unknown, path: FieldPath): void {
  if (!isObj(v) || typeof v.min !== 'number' || typeof v.max !== 'number' || !(v.min <= v.max)) {
    throw new RateloomError('E_SCHEMA', 'a coverage range needs numbers min <= max', { path });
  }
}

/** How the free (covaried) parameters enter the physical parameter vector. */
export interface ParameterMap {
  /** Physical parameter values in the kinetics order (the nominal fit). */
  theta: Float64Array;
  /** Names of the free parameters (covariance order). */
  free: string[];
  /** Index of each free parameter in theta. */
  index: Int32Array;
  transform: Transform[];
  /** SI unit of each free parameter. */
  units: string[];
  /** Nominal values in the estimation space. */
  internal: Float64Array;
  /** Covariance in the estimation space, n x n row-major. */
  covariance: Float64Array;
}

/**
 * Build the parameter map for a compiled-kinetics parameter order. Throws when the kinetics need
 * a parameter the hand-off does not give.
 */
export function parameterMap(h: FittedKinetics, parameterNames: readonly string[]): ParameterMap {
  const byName = new Map<string, HandoffParameter>(h.parameters.map((p) => [p.name, p]));
  const theta = new Float64Array(parameterNames.length);
  parameterNames.forEach((n, k) => {
    const p = byName.get(n);
    if (!p) {
      throw new RateloomError('E_UNKNOWN_PARAMETER', `the rate laws use parameter '${n}', which the hand-off does not give`, {
        path: ['parameters'],
        fix: 'Write the hand-off again with `rateloom fit`.',
      });
    }
    theta[k] = p.value;
  });
  const free = [...h.covariance.names];
  const index = new Int32Array(free.length);
  const transform: Transform[] = [];
  const units: string[] = [];
  const internal = new Float64Array(free.length);
  free.forEach((n, i) => {
    const k = parameterNames.indexOf(n);
    if (k < 0) throw new RateloomError('E_UNKNOWN_PARAMETER', `covaried parameter '${n}' is not used by the rate laws`, { path: ['covariance', 'names', i] });
    const p = byName.get(n)!;
    index[i] = k;
    transform.push(p.transform);
    units.push(p.unit);
    internal[i] = p.internalValue;
  });
  const covariance = new Float64Array(free.length * free.length);
  h.covariance.matrix.forEach((row, i) => row.forEach((v, j) => (covariance[i * free.length + j] = v)));
  return { theta, free, index, transform, units, internal, covariance };
}

/** Write theta = nominal with the free parameters at the estimation-space values z (in place). */
export function applyInternal(map: ParameterMap, z: ArrayLike<number>, theta: Float64Array): void {
  theta.set(map.theta);
  for (let i = 0; i < map.free.length; i++) theta[map.index[i]] = map.transform[i] === 'log' ? Math.exp(z[i]) : z[i];
}
