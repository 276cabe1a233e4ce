/**
 * Argument checks of the public entry points (src/index.ts): a caller who passes null, a number
 * where a path or a study belongs, NaN as a count or an options object of the wrong shape gets a
 * RateloomError (E_TYPE, or E_VALUE for a numeric option out of range) naming the function, the
 * argument and what it must be, instead of a TypeError from deep inside. Each entry point states
 * its arguments once with checkArgs at its top; the checks are shallow (the shape a value must
 * have to be handed on), the loaders below check content field by field.
 */
import { RateloomError } from './errors.js';
import { checkOptions, shown, type OptionName } from './option-ranges.js';
import { isObj } from './record.js';

/** Why a value does not fit: the expected kind in words ("a string"), or undefined when it fits. */
export type Check = (v: unknown) => string | undefined;

/** One argument: its name and its check. */
export interface ArgSpec {
  name: string;
  check: Check;
  /** Numeric options of an options object to check against OPTION_RANGES. */
  options?: readonly OptionName[];
}

const arrays = (v: Record<string, unknown>, keys: readonly string[]) => keys.every((k) => Array.isArray(v[k]));

/** The checks, by kind. */
export const is = {
  text: ((v) => (typeof v === 'string' ? undefined : 'a string')) as Check,
  path: ((v) => (typeof v === 'string' && v.trim() !== '' && !v.includes('\0') ? undefined : 'a file path (a non-empty string)')) as Check,
  number: ((v) => (typeof v === 'number' && Number.isFinite(v) ? undefined : 'a finite number')) as Check,
  /** A number above 0 (Infinity allowed: no limit). */
  positive: ((v) => (typeof v === 'number' && v > 0 ? undefined : 'a number above 0 (Infinity for no limit)')) as Check,
  object: ((v) => (isObj(v) ? undefined : 'an object')) as Check,
  bytes: ((v) => (v instanceof Uint8Array ? undefined : 'bytes (a Uint8Array or Buffer)')) as Check,
  func: ((v) => (typeof v === 'function' ? undefined : 'a function')) as Check,
  /** A parsed JSON document or a path to one. */
  pathOrObject: ((v) => (is.path(v) === undefined || isObj(v) ? undefined : 'a file path or a parsed JSON object')) as Check,
  /** Anything JSON.parse can return (the loader checks the content). */
  json: ((v) => (v !== undefined && typeof v !== 'function' && typeof v !== 'symbol' && typeof v !== 'bigint' ? undefined : 'a parsed JSON value')) as Check,
  stringList: ((v) => (Array.isArray(v) && v.every((s) => typeof s === 'string') ? undefined : 'a list of strings')) as Check,
  /** A Study as loadStudy returns it in `.study`. */
  study: ((v) => (isObj(v) && arrays(v, ['species', 'reactions', 'parameters', 'runs', 'observations']) && isObj(v.reactor) && isObj(v.chemistry) ? undefined : 'a Study (the .study of loadStudy)')) as Check,
  /** A StudyFit as fitStudy returns it. */
  studyFit: ((v) => (isObj(v) && isObj(v.fit) && Array.isArray(v.fit.parameters) && typeof v.variant === 'string' ? undefined : 'a StudyFit (the result of fitStudy)')) as Check,
  /** A SizingResult as sizeReactor returns it. */
  sizingResult: ((v) => (isObj(v) && typeof v.status === 'string' && Array.isArray(v.cautions) && isObj(v.reactor) ? undefined : 'a SizingResult (the result of sizeReactor)')) as Check,
  /** A SizingInput as sizingInput(prepareSizing(...)) returns it. */
  sizingInput: ((v) => (isObj(v) && isObj(v.handoff) && isObj(v.kinetics) && isObj(v.kase) ? undefined : 'a SizingInput (see sizingInput)')) as Check,
  /** Report data as fitReportData / sizingReportData return it (with the given name field). */
  reportData: (nameField: string): Check => (v) => (isObj(v) && typeof v.title === 'string' && typeof v[nameField] === 'string' && Array.isArray(v.warnings) ? undefined : `report data (the result of ${nameField === 'caseName' ? 'sizingReportData' : 'fitReportData'})`),
  /** A SizingSetup as prepareSizing returns it. */
  sizingSetup: ((v) => (isObj(v) && isObj(v.handoff) && isObj(v.kinetics) && isObj(v.kinetics.kinetics) && isObj(v.kase) ? undefined : 'a SizingSetup (the result of prepareSizing)')) as Check,
  /** A field-path segment: a name or an index. */
  key: ((v) => (typeof v === 'string' || (typeof v === 'number' && Number.isInteger(v)) ? undefined : 'a field name or index')) as Check,
  /** A study-file path, a LoadedStudy or a Study. */
  studySource: ((v) => {
    if (is.path(v) === undefined || is.study(v) === undefined) return undefined;
    return isObj(v) && is.study(v.study) === undefined && isObj(v.report) ? undefined : 'a study-file path, the result of loadStudy, or a Study';
  }) as Check,
  /** A list whose every item passes `c`. */
  list: (c: Check): Check => (v) => (Array.isArray(v) && v.every((x) => c(x) === undefined) ? undefined : `a list of ${c(undefined)?.replace(/^an? /, '') ?? 'items'}`),
  /** `c`, or undefined. */
  optional: (c: Check): Check => (v) => (v === undefined ? undefined : c(v) && `${c(v)} or undefined`),
  /** One of the given strings. */
  oneOf: (values: readonly string[]): Check => (v) => (typeof v === 'string' && values.includes(v) ? undefined : `one of ${values.map((s) => `'${s}'`).join(', ')}`),
};

/** The numeric options of a study fit (fitStudy, compare and their parallel forms). */
export const FIT_OPTIONS: readonly OptionName[] = ['starts', 'seed', 'maxIterations', 'level'];

/** An options object (or undefined) whose numeric options `names` are checked against their ranges. */
export function options(name: string, names: readonly OptionName[] = []): ArgSpec {
  return { name, check: is.optional(is.object), options: names };
}

/**
 * Check the arguments of entry point `fn` (in call order); throws E_TYPE naming the first argument
 * that does not fit, or E_VALUE for a numeric option outside its range.
 */
export function checkArgs(fn: string, args: ArrayLike<unknown>, specs: readonly ArgSpec[]): void {
  specs.forEach((s, i) => {
    const v = args[i];
    const expected = s.check(v);
    if (expected !== undefined) {
      throw new RateloomError('E_TYPE', `${fn}(): argument '${s.name}' must be ${expected}, not ${shown(v)}`, {
        path: ['arguments', s.name],
        fix: `Pass ${expected} as '${s.name}' (see the documentation of ${fn} in the README's 'Use from TypeScript').`,
      });
    }
    if (s.options?.length && isObj(v)) checkOptions(v, s.options.filter((n) => !(n === 'workers' && v.workers === 'auto')), ['arguments', s.name]);
  });
}
