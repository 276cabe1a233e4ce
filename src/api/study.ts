/**
 * Study entry points of the public API: load a study file from disk, fit it, simulate it, compare
 * its rival rate laws. Each accepts a path, a LoadedStudy or a Study, so a script can start from a
 * file or from a study it built or changed itself.
 */
import { loadStudy as parseStudy, type LoadOptions } from '../study/load.js';
import type { LoadedStudy, Study } from '../study/types.js';
import { fitStudy as fitLoaded, type StudyFit, type StudyFitOptions } from '../workflow/fit-study.js';
import { compareStudy, type StudyCompareOptions, type StudyComparison } from '../workflow/compare-study.js';
import { applyParameterValues, simulateStudy, type SimulateOptions, type SimulationResult } from '../study/simulate.js';
import { readJson, readText } from './files.js';
import { simulateWithHeat } from '../design/simulate-heat.js';
import { FIT_OPTIONS, checkArgs, is, options as optionsArg } from '../core/args.js';

/** A study given to an entry point: a study-file path, the result of loadStudy, or a Study. */
export type StudySource = string | LoadedStudy | Study;

/**
 * Load a study file and every CSV it names from disk, check each row, convert to SI.
 *
 * @param path - Study file (JSON, schema/study.schema.json); CSV paths inside it are taken
 *   relative to the study file's folder.
 * @param options - `strict`: fail with a RateloomError listing every rejected row (default: the
 *   study's checks.strict, else false).
 * @returns The study (SI units) and the validation report (rejected rows, replicates, pure error).
 * @throws RateloomError (code E_FILE, E_JSON, E_SCHEMA, ...) naming the file, row and field and the fix.
 */
export function loadStudy(path: string, options?: LoadOptions): LoadedStudy;
/**
 * Load a study from its JSON text, with CSV files read through `readFile` (no file I/O of its own).
 *
 * @param text - The study file's text.
 * @param studyPath - The study file's path (for messages and to resolve CSV paths).
 * @param readFile - Returns the text of a CSV file given its absolute path.
 * @param options - As for loadStudy(path).
 */
export function loadStudy(text: string, studyPath: string, readFile: (absPath: string) => string, options?: LoadOptions): LoadedStudy;
export function loadStudy(a: string, b?: string | LoadOptions, readFile?: (absPath: string) => string, options?: LoadOptions): LoadedStudy {
  if (typeof b === 'string') {
    checkArgs('loadStudy', [a, b, readFile, options], [{ name: 'text', check: is.text }, { name: 'studyPath', check: is.path }, { name: 'readFile', check: is.func }, optionsArg('options')]);
    return parseStudy(a, b, readFile!, options);
  }
  checkArgs('loadStudy', [a, b], [{ name: 'path', check: is.path }, optionsArg('options')]);
  return parseStudy(readText(a, 'study file'), a, (abs) => readText(abs, 'data file'), b ?? {});
}

/** The Study of a source (loads a path with loadStudy). */
export function studyOf(source: StudySource, fn = 'studyOf'): Study {
  checkArgs(fn, [source], [{ name: 'source', check: is.studySource }]);
  if (typeof source === 'string') return loadStudy(source).study;
  return 'study' in source && 'report' in source ? source.study : (source as Study);
}

/**
 * Fit a study's rate law (the base rate-law set, or `options.variant`) by weighted nonlinear least
 * squares over the reactor mole balances, with confidence intervals, on this thread.
 *
 * @param source - Study file path, LoadedStudy or Study.
 * @param options - Rate-law set (`variant`, default 'base'), multistart `starts` (default 0, or 20
 *   when the study leaves a start to rateloom), `seed` (default 1), solver tolerances and limits.
 * @returns The fit (status, estimates with intervals, statistics), the model and derived quantities.
 *   Numerical trouble is reported in `fit.status`/`fit.warnings`, never thrown.
 */
export function fitStudy(source: StudySource, options: StudyFitOptions = {}): StudyFit {
  checkArgs('fitStudy', [source, options], [{ name: 'source', check: is.studySource }, optionsArg('options', FIT_OPTIONS)]);
  return fitLoaded(studyOf(source), options);
}

/** Options of simulate(). */
export interface SimulateStudyOptions extends SimulateOptions {
  /**
   * Parameter values instead of the study's starting values: { "k1": 0.3 } (SI),
   * { "k1": { "value": 3, "unit": "L/(mol s)" } }, { "parameters": [...] } as a fit writes them, or a
   * path to a JSON file holding one of these; default none (the study's values).
   */
  parameters?: unknown;
  /**
   * Heat inputs: a path to a heat file or its parsed JSON, { "heat": {...case-file heat block...},
   * "tubes": { "innerDiameter": ... } }; every run is then solved with its energy balance
   * (design/simulate-heat.ts). Default none (isothermal runs at their temperatures).
   */
  heat?: unknown;
}

/**
 * Solve every run of a study with given parameter values and compare with the measurements.
 *
 * @param source - Study file path, LoadedStudy or Study.
 * @param options - `parameters` (see SimulateStudyOptions), `profile` (default false),
 *   `candidate` (a rival rate-law set; default the study's own), `heat` (heat inputs: a path to a
 *   heat file or its parsed JSON, `{ "heat": {...case-file heat block...}, "tubes": {...} }`; every
 *   run is then solved with its energy balance; default none).
 */
export function simulate(source: StudySource, options: SimulateStudyOptions = {}): SimulationResult {
  checkArgs('simulate', [source, options], [{ name: 'source', check: is.studySource }, optionsArg('options')]);
  const study = studyOf(source);
  const { parameters, ...rest } = options;
  let params = study.parameters;
  if (typeof parameters === 'string') params = applyParameterValues(params, readJson(parameters, 'parameter file'), parameters);
  else if (parameters !== undefined) params = applyParameterValues(params, parameters, 'parameters');
  const { heat, ...plain } = rest;
  if (typeof heat === 'string') return simulateWithHeat(study, params, readJson(heat, 'heat file'), { ...plain, heatFile: heat });
  if (heat !== undefined) return simulateWithHeat(study, params, heat, plain);
  return simulateStudy(study, params, plain);
}

/**
 * Fit every rate-law set of a study (its own and each candidate) to the same data and rank them
 * (SSR, AICc, BIC, Akaike weights, F tests for declared nested pairs).
 *
 * @param source - Study file path, LoadedStudy or Study.
 * @param options - As fitStudy (without `variant`), plus `progress(done, total)` per fitted set.
 */
export function compare(source: StudySource, options: StudyCompareOptions = {}): StudyComparison {
  checkArgs('compare', [source, options], [{ name: 'source', check: is.studySource }, optionsArg('options', FIT_OPTIONS)]);
  return compareStudy(studyOf(source), options);
}

