/**
 * Range and consistency checks of a hand-off's numbers, after its structure (handoff-load.ts):
 * a hand-off edited by hand (a rate constant of 1e300, a covered temperature of 1e308 K, a feed
 * mole fraction above 1, an interval whose ends are swapped, a standard error of a log parameter
 * so wide that a Monte Carlo draw overflows) is refused with E_VALUE naming the field, even when
 * its content hash was computed again, and even with --accept-untrustworthy: such numbers cannot
 * be sized at all. The limits are those a fit can produce: the verdict's overflow marks
 * (estimation/verdict.ts) and the physical ranges of lab data (data/ranges.ts).
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import { outsideRange, PHYSICAL_RANGES, type PhysicalRange } from '../data/ranges.js';
import { LOG_OVERFLOW, VALUE_OVERFLOW } from '../estimation/verdict.js';
import { isObj, type Obj } from '../core/record.js';

const FIX = 'Write the hand-off again with `rateloom fit`; do not edit its numbers by hand.';

function refuse(problem: string, path: FieldPath): never {
  throw new RateloomError('E_VALUE', problem, { path, fix: FIX });
}

/** A number inside a physical range, or refused naming the field. */
function physical(v: unknown, r: PhysicalRange, what: string, path: FieldPath): void {
  const m = typeof v === 'number' ? outsideRange(v, r, what) : `${what} is not a number`;
  if (m) refuse(m, path);
}

/** A fraction from 0 to 1 (a feed mole fraction, the top of a conversion range). */
function fraction(v: unknown, what: string, path: FieldPath): void {
  if (!(typeof v === 'number' && v >= 0 && v <= 1)) refuse(`${what} ${String(v)} is not a fraction from 0 to 1`, path);
}

/** Parameter values below overflow, standard errors and intervals consistent. */
function checkParameterNumbers(params: Obj[]): void {
  params.forEach((p, i) => {
    const path = ['parameters', i];
    const value = p.value as number;
    const log = p.transform === 'log';
    if (Math.abs(value) >= VALUE_OVERFLOW || (log && !(value > 0 && Math.abs(Math.log(value)) <= LOG_OVERFLOW))) {
      refuse(`parameter '${String(p.name)}' = ${value} lies beyond what a fit can produce (|value| < ${VALUE_OVERFLOW}${log ? `, a log parameter above 0 with |ln value| <= ${LOG_OVERFLOW}` : ''})`, [...path, 'value']);
    }
    const se = p.stdError;
    if (se !== null && se !== undefined && !(typeof se === 'number' && se >= 0 && Number.isFinite(se))) refuse(`standard error ${String(se)} of '${String(p.name)}' must be a number >= 0 or null`, [...path, 'stdError']);
    if (isObj(p.ci)) for (const kind of ['linear', 'profile'] as const) checkInterval(p.ci[kind], String(p.name), [...path, 'ci', kind]);
  });
}

/** An interval [lo, hi] with lo <= hi (an open profile end is null). */
function checkInterval(ci: unknown, name: string, path: FieldPath): void {
  if (ci === undefined || ci === null) return;
  const ends = Array.isArray(ci) && ci.length === 2 && ci.every((x) => x === null || (typeof x === 'number' && Number.isFinite(x)));
  if (!ends) refuse(`the interval of '${name}' must be two numbers [low, high]`, path);
  const [lo, hi] = ci as (number | null)[];
  if (lo !== null && hi !== null && lo > hi) refuse(`the interval of '${name}' has its low end ${lo} above its high end ${hi}`, path);
}

/** Variances in the estimation space small enough that a draw of +-8 standard deviations stays finite. */
function checkVariances(raw: Obj, params: Obj[]): void {
  const cov = raw.covariance as { names: string[]; matrix: number[][] };
  cov.names.forEach((n, i) => {
    const log = params.find((p) => p.name === n)?.transform === 'log';
    const sd = Math.sqrt(cov.matrix[i][i]);
    if (sd > (log ? LOG_OVERFLOW / 8 : VALUE_OVERFLOW)) refuse(`the variance of '${n}' (standard deviation ${sd}${log ? ' in ln' : ''}) is too large to draw from`, ['covariance', 'matrix', i, i]);
  });
}

/** The covered ranges: physical temperatures and pressures, fractions, species that exist. */
function checkCoverage(raw: Obj): void {
  const cov = raw.coverage as Obj;
  const T = cov.temperature as Obj;
  physical(T.min, PHYSICAL_RANGES.temperature, 'covered temperature', ['coverage', 'temperature', 'min']);
  physical(T.max, PHYSICAL_RANGES.temperature, 'covered temperature', ['coverage', 'temperature', 'max']);
  if (isObj(cov.pressure)) {
    physical(cov.pressure.min, PHYSICAL_RANGES.pressure, 'covered pressure', ['coverage', 'pressure', 'min']);
    physical(cov.pressure.max, PHYSICAL_RANGES.pressure, 'covered pressure', ['coverage', 'pressure', 'max']);
  }
  if (isObj(cov.conversion)) fraction(cov.conversion.max, 'covered conversion', ['coverage', 'conversion', 'max']);
  if (isObj(cov.feedMoleFraction)) {
    const species = new Set((raw.species as Obj[]).map((s) => s.name));
    for (const [k, r] of Object.entries(cov.feedMoleFraction)) {
      if (!species.has(k)) refuse(`the covered feed names '${k}', which is not a species of the hand-off`, ['coverage', 'feedMoleFraction', k]);
      fraction((r as Obj).min, 'covered feed mole fraction', ['coverage', 'feedMoleFraction', k, 'min']);
      fraction((r as Obj).max, 'covered feed mole fraction', ['coverage', 'feedMoleFraction', k, 'max']);
    }
  }
}

/**
 * Check the numbers of a hand-off whose structure parseHandoff has checked: reference
 * temperature, parameter values, standard errors, intervals, variances and covered ranges.
 */
export function checkHandoffRanges(raw: Obj): void {
  physical(raw.referenceTemperature, PHYSICAL_RANGES.temperature, 'reference temperature', ['referenceTemperature']);
  const params = raw.parameters as Obj[];
  checkParameterNumbers(params);
  checkVariances(raw, params);
  checkCoverage(raw);
}
