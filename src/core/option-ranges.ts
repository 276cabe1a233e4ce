/**
 * Allowed ranges of the numeric options, in one table shared by the library's entry points
 * (options objects) and the command line (flags): a count, a seed or a level outside its range is
 * refused at once with a typed error naming the option, the range and an example, instead of
 * running out of memory (`--starts 1e9`), dying in an array allocation (`--draws 1e12`) or
 * spawning thousands of threads. The upper bounds are generous limits of common practice, chosen
 * so that the largest allowed request still fits in memory on a laptop.
 */
import { RateloomError, type FieldPath } from './errors.js';

/** The accepted values of one numeric option. */
export interface OptionRange {
  /** Whole numbers only. */
  integer: boolean;
  /** Smallest accepted value (refused itself when `minOpen`). */
  min: number;
  /** Largest accepted value (refused itself when `maxOpen`). */
  max: number;
  minOpen?: boolean;
  maxOpen?: boolean;
  /** What the number is, for messages. */
  what: string;
  /** A typical value, for the fix. */
  example: string;
}

/** Every numeric option of the entry points and commands, by its option name. */
export const OPTION_RANGES = {
  /** Latin-hypercube starts of a multistart fit, besides the given start. */
  starts: { integer: true, min: 0, max: 1000, what: 'multistart starts', example: '20' },
  /** Seed of a pseudo-random generator (32-bit, as mulberry32 takes it). */
  seed: { integer: true, min: 0, max: 2 ** 32 - 1, what: 'random seed', example: '7' },
  /** Accepted solver steps per start. */
  maxIterations: { integer: true, min: 1, max: 100_000, what: 'solver iterations per start', example: '500' },
  /** Confidence level of intervals (a fraction). */
  level: { integer: false, min: 0, max: 1, minOpen: true, maxOpen: true, what: 'confidence level', example: '0.95' },
  /** Monte Carlo draws of a sizing (the case file's uncertainty.draws has the same range). */
  draws: { integer: true, min: 0, max: 10_000_000, what: 'Monte Carlo draws', example: '10000' },
  /** Parameter draws the run planner averages its criterion over (0 = local design). */
  planDraws: { integer: true, min: 0, max: 10_000, what: 'parameter draws of the plan criterion', example: '20' },
  /** Simulated outcomes per rival rate-law set behind a discrimination plan's expected posterior probabilities. */
  posteriorDraws: { integer: true, min: 1, max: 1_000_000, what: 'simulated outcomes per rival rate-law set', example: '400' },
  /** Runs to plan. */
  runs: { integer: true, min: 1, max: 1000, what: 'runs to plan', example: '8' },
  /** Worker threads (1 = serial). */
  workers: { integer: true, min: 1, max: 64, what: 'worker threads', example: '2' },
} as const satisfies Record<string, OptionRange>;

export type OptionName = keyof typeof OPTION_RANGES;

/** The range in words: "a whole number from 0 to 1000", "a number above 0 and below 1". */
export function rangeText(r: OptionRange): string {
  if (typeof r !== 'object' || r === null || typeof r.min !== 'number' || typeof r.max !== 'number') {
    throw new RateloomError('E_TYPE', `rangeText(): argument 'r' must be an OptionRange, not ${shown(r)}`, { path: ['arguments', 'r'], fix: 'Pass one of the values of OPTION_RANGES.' });
  }
  const lo = `${r.minOpen ? 'above' : 'from'} ${r.min}`;
  const hi = `${r.maxOpen ? 'below' : 'to'} ${r.max}`;
  return `${r.integer ? 'a whole number' : 'a number'} ${lo}${r.minOpen || r.maxOpen ? ' and' : ''} ${hi}`;
}

/** Why `value` is not an accepted value of `name`, or undefined when it is. */
export function optionProblem(name: OptionName, value: unknown): string | undefined {
  if (typeof name !== 'string' || !Object.hasOwn(OPTION_RANGES, name)) {
    throw new RateloomError('E_TYPE', `argument 'name' must be one of ${Object.keys(OPTION_RANGES).join(', ')}, not ${shown(name)}`, { path: ['arguments', 'name'], fix: 'Pass the name of an option in OPTION_RANGES.' });
  }
  const r: OptionRange = OPTION_RANGES[name];
  const ok =
    typeof value === 'number' &&
    Number.isFinite(value) &&
    (!r.integer || Number.isInteger(value)) &&
    (r.minOpen ? value > r.min : value >= r.min) &&
    (r.maxOpen ? value < r.max : value <= r.max);
  return ok ? undefined : `${r.what} must be ${rangeText(r)}`;
}

/** A printable form of any value, short. */
export function shown(value: unknown): string {
  if (typeof value === 'string') return `'${value.length > 40 ? `${value.slice(0, 40)}...` : value}'`;
  if (typeof value === 'number' || typeof value === 'boolean' || value === null || value === undefined) return String(value);
  return Array.isArray(value) ? 'a list' : `a ${typeof value}`;
}

/**
 * Check one option value of a library entry point: returns it when accepted, else throws
 * E_VALUE naming the option (`path`), its range and an example.
 */
export function checkOption(name: OptionName, value: unknown, path: FieldPath = ['options', name]): number {
  const problem = optionProblem(name, value);
  if (problem === undefined) return value as number;
  const r: OptionRange = OPTION_RANGES[name];
  throw new RateloomError('E_VALUE', `${problem}, not ${shown(value)}`, {
    path,
    fix: `Give ${name} ${rangeText(r)}, for example ${r.example}.`,
    details: { option: name, min: r.min, max: r.max, integer: r.integer },
  });
}

/** Check the named options of an options object that are present (undefined = default). */
export function checkOptions(options: Record<string, unknown>, names: readonly OptionName[], prefix: FieldPath = ['options']): void {
  for (const n of names) if (options[n] !== undefined) checkOption(n, options[n], [...prefix, n]);
}
