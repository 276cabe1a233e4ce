/**
 * Study loader: JSON text -> structural check against schema/study.schema.json -> chemistry,
 * parameters, reactor and error models in SI -> CSV sources mapped and validated -> Study and
 * ValidationReport. Pure apart from the injected `readFile`.
 */
import { dirname } from 'node:path';
import { buildChemistry, type Chemistry } from '../chemistry/mechanism.js';
import type { SpeciesSpec } from '../chemistry/spec.js';
import type { ReactionSpec } from '../kinetics/spec.js';
import { RateloomError, isRateloomError } from '../core/errors.js';
import { parseJsonText } from '../core/json-text.js';
import type { RateLawSpec } from '../kinetics/spec.js';
import type { ReactorSpec } from '../reactors/types.js';
import { checkDisplayUnits, unitFor } from '../units/index.js';
import type { CsvTable } from '../data/csv.js';
import { mapLongSource, mapPerRunSource, type MappingContext, type MappedObservation, type MappedRun, type MappedSource, type RowLocation } from '../data/mapping.js';
import { DEFAULT_CHECKS, type CheckSettings, type PureError } from '../data/report.js';
import type { AnySourceSpec, LongSourceSpec, MeasureSpec, PerRunSourceSpec, RunFileSourceSpec, StackedSourceSpec } from '../data/spec.js';
import { mapStackedSource } from '../data/stacked.js';
import { mapRunFileSource } from '../data/run-file.js';
import { Ledger, type InletCheckContext, assertNoRejections, buildReport, checkAboveInlet, checkElementBalance, findReplicates, mergeDuplicateRuns, pureErrors, rejectZeroFeeds } from '../data/validation.js';
import schemaJson from '../../schema/study.schema.json' with { type: 'json' };
import { checkSchema, type JsonSchema } from './schema-check.js';
import { loadTransport } from './transport.js';
import { locatePath } from './locate.js';
import { readSources, type SourcePathOptions } from './sources.js';
import { checkHostileNames, checkOrderSpecies, checkPressureDrop } from './guards.js';
import type { StudyDisplaySpec } from './display.js';
import { buildParameters, parameterRoles, referencedNames, type ParameterSpec } from './parameters.js';
import { ratesOnlyRuns } from './rate-runs.js';
import { parameterStartFor, runParameterNames } from './run-parameters.js';
import { referenceTemperatureMatters } from './reference-temperature.js';
import { attachLabData, perRunIds } from './lab-attach.js';
import type { ActivitySpec, LabDataSpec } from './lab-types.js';
import { DEFAULT_ERROR_MODEL, sigmaFromModel, type CandidateSet, type ErrorModel, type LoadedStudy, type Observation, type Study, type StudyRun } from './types.js';

/** The study-file schema as an object (the same file editors use). */
export const STUDY_SCHEMA = schemaJson as unknown as JsonSchema;

interface RawStudy {
  title?: string;
  species: SpeciesSpec[];
  reactions: ReactionSpec[];
  keyReactant?: string;
  reactor: {
    kind: ReactorSpec['kind'];
    phase: ReactorSpec['phase'];
    bulkDensity?: MeasureSpec;
    pressureDrop?: { alpha?: MeasureSpec; ergun?: Record<string, MeasureSpec | number> };
    membrane?: { permeation: Record<string, MeasureSpec>; sweep?: Record<string, MeasureSpec> };
  };
  referenceTemperature?: number | MeasureSpec;
  displayUnits?: unknown;
  data: AnySourceSpec[];
  parameters: ParameterSpec[];
  errorModels?: Record<string, { absolute?: MeasureSpec; relative?: number; replicates?: true; size?: 'known' | 'weights' }>;
  candidates?: { name: string; description?: string; nests?: string; reactions: Record<string, RateLawSpec>; parameters?: ParameterSpec[] }[];
  checks?: Partial<CheckSettings> & { strict?: boolean };
  transport?: unknown;
  labData?: LabDataSpec;
  activity?: ActivitySpec;
}

export interface LoadOptions extends SourcePathOptions {
  /** Fail with a RateloomError listing every rejected row; default: the study's checks.strict, else false. */
  strict?: boolean;
}

function parseJson(text: string, file: string): unknown {
  return parseJsonText(text, file, 'study file');
}

/** Rethrow a problem in the study file with the file, line and column of its field path. */
function withFile<T>(file: string, text: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (isRateloomError(e) && !e.location) {
      const at = locatePath(text.replace(/^\uFEFF/, ''), e.path);
      throw new RateloomError(e.code, e.problem, { path: e.path, fix: e.fix, location: { file, ...(at ? { line: at.line, column: at.column } : {}) }, ...(e.details ? { details: e.details } : {}) });
    }
    throw e;
  }
}

/**
 * Visit the observations grouped by source row (file and line), groups in order of first
 * appearance. The mapping emits a row's observations together, so with distinct per-run file names
 * a group is a run of neighbours with the same line (visited as one reused list, valid only during
 * the visit); otherwise rows are matched by file and line through a map.
 */
function forEachRowGroup(observations: readonly MappedObservation[], distinctFiles: boolean, visit: (list: readonly MappedObservation[]) => void): void {
  if (!distinctFiles) {
    const byRow = new Map<string, MappedObservation[]>();
    for (const o of observations) {
      const key = `${o.location.file}\u0000${o.location.line}`;
      const list = byRow.get(key) ?? [];
      list.push(o);
      byRow.set(key, list);
    }
    for (const list of byRow.values()) visit(list);
    return;
  }
  const list: MappedObservation[] = [];
  for (const o of observations) {
    const at = list.length ? list[0].location : undefined;
    if (at && (at.line !== o.location.line || at.file !== o.location.file)) {
      visit(list);
      list.length = 0;
    }
    list.push(o);
  }
  if (list.length) visit(list);
}

/**
 * A study observation with its keys in the documented order and optional keys only when defined:
 * one object literal per shape (no spreads, no keys added one by one), so every property stays
 * inside the object.
 */
function studyObservation(o: MappedObservation, index: number, runIndex: number, sigma: number | undefined, errorModel: string): Observation {
  const { runId, response, species, speciesIndex, position, value, unit, location } = o;
  if (species !== undefined) {
    if (position !== undefined) {
      return sigma !== undefined
        ? { index, runId, runIndex, response, species, speciesIndex, position, value, unit, sigma, errorModel, location }
        : { index, runId, runIndex, response, species, speciesIndex, position, value, unit, errorModel, location };
    }
    return sigma !== undefined
      ? { index, runId, runIndex, response, species, speciesIndex, value, unit, sigma, errorModel, location }
      : { index, runId, runIndex, response, species, speciesIndex, value, unit, errorModel, location };
  }
  if (position !== undefined) {
    return sigma !== undefined
      ? { index, runId, runIndex, response, position, value, unit, sigma, errorModel, location }
      : { index, runId, runIndex, response, position, value, unit, errorModel, location };
  }
  return sigma !== undefined ? { index, runId, runIndex, response, value, unit, sigma, errorModel, location } : { index, runId, runIndex, response, value, unit, errorModel, location };
}

function reactorSpec(raw: RawStudy['reactor'], speciesNames: readonly string[]): ReactorSpec {
  const spec: ReactorSpec = { kind: raw.kind, phase: raw.phase };
  const path = ['reactor'];
  if (raw.bulkDensity) spec.bulkDensity = unitFor('density', raw.bulkDensity.unit, { path: [...path, 'bulkDensity', 'unit'] }).toSI(raw.bulkDensity.value);
  const pd = raw.pressureDrop;
  if (pd) {
    if ((pd.alpha === undefined) === (pd.ergun === undefined)) {
      throw new RateloomError('E_SCHEMA', "give exactly one of 'alpha' and 'ergun' for the pressure drop", { path: [...path, 'pressureDrop'] });
    }
    if (pd.alpha) {
      const q = raw.kind === 'packed-bed' ? 'inverse-mass' : 'inverse-volume';
      spec.pressureDrop = { alpha: unitFor(q, pd.alpha.unit, { path: [...path, 'pressureDrop', 'alpha', 'unit'] }).toSI(pd.alpha.value) };
    } else if (pd.ergun) {
      const e = pd.ergun;
      const m = (k: string, q: Parameters<typeof unitFor>[0]) => {
        const v = e[k] as MeasureSpec;
        return unitFor(q, v.unit, { path: [...path, 'pressureDrop', 'ergun', k, 'unit'] }).toSI(v.value);
      };
      spec.pressureDrop = {
        ergun: {
          particleDiameter: m('particleDiameter', 'length'),
          voidFraction: e.voidFraction as number,
          superficialMassFlux: m('superficialMassFlux', 'mass-flux'),
          viscosity: m('viscosity', 'viscosity'),
          inletDensity: m('inletDensity', 'density'),
          crossSection: m('crossSection', 'area'),
          catalystDensity: m('catalystDensity', 'density'),
        },
      };
    }
  }
  if (raw.membrane) {
    const conv = (map: Record<string, MeasureSpec> | undefined, q: 'frequency' | 'concentration', key: string) => {
      const out: Record<string, number> = {};
      for (const [sp, v] of Object.entries(map ?? {})) {
        if (!speciesNames.includes(sp)) throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${sp}'`, { path: [...path, 'membrane', key, sp] });
        out[sp] = unitFor(q, v.unit, { path: [...path, 'membrane', key, sp, 'unit'] }).toSI(v.value);
      }
      return out;
    };
    spec.membrane = { permeation: conv(raw.membrane.permeation, 'frequency', 'permeation'), ...(raw.membrane.sweep ? { sweep: conv(raw.membrane.sweep, 'concentration', 'sweep') } : {}) };
  } else if (raw.kind === 'membrane') {
    throw new RateloomError('E_MISSING_FIELD', "a membrane reactor needs 'membrane' with permeation coefficients", { path: [...path, 'membrane'] });
  }
  checkPressureDrop(spec.pressureDrop, [...path, 'pressureDrop']);
  return spec;
}

function errorModels(raw: RawStudy['errorModels']): Record<string, ErrorModel> {
  const out: Record<string, ErrorModel> = { [DEFAULT_ERROR_MODEL]: { name: DEFAULT_ERROR_MODEL, kind: 'unweighted', absolute: 0, relative: 0, sizeKnown: false } };
  for (const [name, m] of Object.entries(raw ?? {})) {
    const path = ['errorModels', name];
    if (name === DEFAULT_ERROR_MODEL) throw new RateloomError('E_VALUE', `'${DEFAULT_ERROR_MODEL}' is reserved for responses without an error model`, { path });
    if (m.replicates) {
      if (m.absolute || m.relative !== undefined || m.size !== undefined) throw new RateloomError('E_SCHEMA', "'replicates' cannot be combined with 'absolute', 'relative' or 'size'", { path });
      out[name] = { name, kind: 'replicates', absolute: 0, relative: 0, sizeKnown: true };
      continue;
    }
    if (!m.absolute && m.relative === undefined) throw new RateloomError('E_MISSING_FIELD', "an error model needs 'absolute', 'relative' (or both) or 'replicates': true", { path });
    let absolute = 0;
    let unit: string | undefined;
    if (m.absolute) {
      // The unit fixes the response dimension: try every response quantity.
      const qs = ['molar-flow', 'concentration', 'dimensionless', 'rate', 'pressure'] as const;
      const found = qs.map((q) => { try { return unitFor(q, m.absolute!.unit); } catch { return undefined; } }).find(Boolean);
      if (!found) throw new RateloomError('E_UNIT', `unit '${m.absolute.unit}' is not a unit of any response (flow, concentration, fraction, rate, pressure)`, { path: [...path, 'absolute', 'unit'] });
      absolute = m.absolute.value * found.factor;
      unit = found.si;
      if (!(absolute > 0)) throw new RateloomError('E_VALUE', 'absolute sigma must be above zero', { path: [...path, 'absolute', 'value'] });
    }
    const relative = m.relative ?? 0;
    out[name] = { name, kind: m.absolute && m.relative !== undefined ? 'combined' : m.absolute ? 'absolute' : 'relative', absolute, relative, sizeKnown: (m.size ?? 'known') === 'known', ...(unit ? { unit } : {}) };
  }
  return out;
}

/**
 * Load a study. `text` is the study file, `studyPath` its path (CSV paths are relative to its
 * folder), `readFile` reads a CSV by absolute path. Throws RateloomError for bad input (and, in
 * strict mode, for any rejected row); otherwise rejected rows are listed in the report.
 */
export function loadStudy(text: string, studyPath: string, readFile: (absPath: string) => string, options: LoadOptions = {}): LoadedStudy {
  const raw = parseJson(text, studyPath);
  withFile(studyPath, text, () => checkHostileNames(raw));
  withFile(studyPath, text, () => checkSchema(raw, STUDY_SCHEMA));
  return withFile(studyPath, text, () => resolveStudy(raw as RawStudy, studyPath, readFile, options));
}

function resolveStudy(raw: RawStudy, studyPath: string, readFile: (absPath: string) => string, options: LoadOptions): LoadedStudy {
  const chemistry = buildChemistry(raw.species, raw.reactions);
  checkOrderSpecies(raw.reactions.map((r) => r.rate), chemistry, (i) => ['reactions', i, 'rate']);
  const speciesNames = chemistry.speciesNames;
  const settings = checkSettings(raw.checks);
  const reactor = reactorSpec(raw.reactor, speciesNames);
  const models = errorModels(raw.errorModels);
  const keyReactantIndex = keyReactantOf(raw.keyReactant, chemistry);
  const data = readData(raw, studyPath, readFile, options, { speciesNames, reactor, errorModelNames: Object.keys(models), settings });
  const inletCtx: InletCheckContext = { kind: reactor.kind, phase: reactor.phase, reactant: reactantFlags(chemistry), sigmaOf: sigmaFor(models), settings };
  const rows = checkPerRunRows(data, models, chemistry, inletCtx);
  addLongSources(raw.data, data, rows, inletCtx);
  const { runs, observations, runIndex } = settleRunSizes(rows.runs, rows.observations, data.ledger);
  rows.observations = []; // the settled list is the only one left (observationsWithSigma converts it in place)
  checkModelUnits(models, observations);
  const replicateGroups = findReplicates(runs, settings.replicateTolerance);
  const pure = pureErrors(observations, replicateGroups);
  const report = buildReport(data.ledger, replicateGroups, pure, settings);
  if (options.strict ?? raw.checks?.strict ?? false) assertNoRejections(report);
  const studyObs = observationsWithSigma(observations, models, pure, runIndex);
  const studyRuns = runs.map(studyRun);
  const reference = referenceTemperatureOf(raw.referenceTemperature, studyRuns);
  const { base, candidates } = studyParameters(raw, chemistry, studyRuns);
  checkRateBases(studyObs, raw.reactions, candidates, chemistry, keyReactantIndex);

  const study: Study = {
    ...(raw.title !== undefined ? { title: raw.title } : {}),
    studyPath,
    species: raw.species,
    reactions: raw.reactions,
    chemistry,
    keyReactant: speciesNames[keyReactantIndex],
    keyReactantIndex,
    reactor,
    referenceTemperature: reference.value,
    referenceTemperatureSource: reference.source,
    parameters: base.parameters,
    scopes: base.scopes,
    ...(base.autoStart.length ? { autoStart: base.autoStart } : {}),
    runs: studyRuns,
    observations: studyObs,
    errorModels: models,
    candidates,
    replicateGroups,
    ...(raw.transport !== undefined ? { transport: loadTransport(raw.transport, speciesNames, raw.reactions.map((r) => r.id)) } : {}),
    sources: raw.data,
    display: displaySpec(raw),
  };
  study.referenceTemperatureApplies = referenceTemperatureMatters(study);
  const notes = data.perRun.flatMap((m) => m.rateNotes ?? []);
  if (notes.length) study.rateNotes = notes;
  const labCtx = { baseDir: dirname(studyPath), readFile, ...(raw.labData ? { definedRunIds: perRunIds(data.tables, raw.data) } : {}) };
  return { study: attachLabData(study, raw.labData, raw.activity, labCtx), report };
}

/** The study's data checks: the defaults with the values the study gives. */
/** What the study wrote about units, for display: its displayUnits (checked) and each parameter's unit. */
function displaySpec(raw: RawStudy): StudyDisplaySpec {
  const parameterUnits: Record<string, string> = {};
  for (const p of [...raw.parameters, ...(raw.candidates ?? []).flatMap((c) => c.parameters ?? [])]) if (p.unit !== undefined && !(p.name in parameterUnits)) parameterUnits[p.name] = p.unit;
  const t = raw.referenceTemperature;
  return { units: checkDisplayUnits(raw.displayUnits, ['displayUnits']), parameterUnits, ...(typeof t === 'object' && t !== null ? { referenceTemperatureUnit: t.unit } : {}) };
}

function checkSettings(checks: RawStudy['checks']): CheckSettings {
  return {
    ...DEFAULT_CHECKS,
    ...(checks?.elementBalanceTolerance !== undefined ? { elementBalanceTolerance: checks.elementBalanceTolerance } : {}),
    ...(checks?.noiseSigmas !== undefined ? { noiseSigmas: checks.noiseSigmas } : {}),
    ...(checks?.replicateTolerance !== undefined ? { replicateTolerance: checks.replicateTolerance } : {}),
  };
}

/** Per species: a reactant (consumed by some reaction, produced by none, not inert). */
function reactantFlags(chemistry: Chemistry): boolean[] {
  const nS = chemistry.speciesNames.length;
  const nR = chemistry.reactionIds.length;
  return chemistry.speciesNames.map((_, j) => {
    let consumed = false;
    for (let i = 0; i < nR; i++) {
      const nu = chemistry.stoich[i * nS + j];
      if (nu > 0) return false;
      if (nu < 0) consumed = true;
    }
    return consumed && !chemistry.inert[j];
  });
}

/** Index of the key reactant: the one named, else the first species with a reactant coefficient, else 0. */
function keyReactantOf(name: string | undefined, chemistry: Chemistry): number {
  const speciesNames = chemistry.speciesNames;
  if (name !== undefined) {
    const j = speciesNames.indexOf(name);
    if (j < 0) {
      throw new RateloomError('E_UNKNOWN_SPECIES', `key reactant '${name}' is not a declared species`, { path: ['keyReactant'], fix: `Name one of: ${speciesNames.join(', ')}.` });
    }
    return j;
  }
  const j = speciesNames.findIndex((_, k) => chemistry.reactantCoefficients[k] > 0);
  return j < 0 ? 0 : j;
}

/** The CSV sources read and their per-run sources mapped, with the ledger of rejected rows. */
interface SourceData {
  tables: CsvTable[];
  ledger: Ledger;
  /** Mapping context of source i. */
  ctxFor: (i: number) => MappingContext;
  perRun: MappedSource[];
  /** Every run row of the per-run sources, before merging repeats. */
  allRuns: MappedRun[];
  /** Runs with repeated rows of equal conditions merged. */
  runs: MappedRun[];
}

/** Read every source, map the per-run ones (run conditions), reject zero feeds and merge repeated runs. */
function readData(
  raw: RawStudy,
  studyPath: string,
  readFile: (absPath: string) => string,
  options: LoadOptions,
  setup: { speciesNames: readonly string[]; reactor: ReactorSpec; errorModelNames: readonly string[]; settings: CheckSettings },
): SourceData {
  const { speciesNames, reactor, errorModelNames, settings } = setup;
  const tables = readSources(raw.data, studyPath, readFile, options);
  const ledger = new Ledger();
  raw.data.forEach((s, i) => ledger.addSource(s.file, s.layout, tables[i].rowCount));
  const parameterStart = parameterStartFor(raw.parameters);
  const ctxFor = (i: number): MappingContext => ({ speciesNames, kind: reactor.kind, phase: reactor.phase, errorModelNames, path: ['data', i], parameterStart });

  const perRun: MappedSource[] = [];
  raw.data.forEach((s, i) => {
    if (s.layout === 'per-run') perRun.push(mapPerRunSource(tables[i], s as PerRunSourceSpec, ctxFor(i)));
    else if (s.layout === 'stacked') perRun.push(mapStackedSource(tables[i], s as StackedSourceSpec, ctxFor(i)));
    else if (s.layout === 'run-file') perRun.push(mapRunFileSource(tables[i], s as RunFileSourceSpec, ctxFor(i)));
  });
  for (const m of perRun) ledger.reject(...m.rejections);
  if (!perRun.length) {
    throw new RateloomError('E_MISSING_FIELD', 'the data need at least one per-run source (run conditions)', { path: ['data'], fix: 'Add a source with "layout": "per-run", "stacked" or "run-file" giving each run\'s conditions.' });
  }
  // Plain loops instead of flatMap and map-to-pairs: these run over every row and observation.
  const allRuns: MappedRun[] = [];
  for (const m of perRun) for (const r of m.runs) allRuns.push(r);
  rejectZeroFeeds(allRuns, reactor.kind, ledger);
  const runs = mergeDuplicateRuns(allRuns, ledger, settings.replicateTolerance);
  return { tables, ledger, ctxFor, perRun, allRuns, runs };
}

/** An absolute sigma must be in a unit of the responses that use it. */
function checkModelUnits(models: Record<string, ErrorModel>, list: readonly MappedObservation[]): void {
  for (const o of list) {
    const em = models[o.errorModel ?? DEFAULT_ERROR_MODEL];
    if (em.unit !== undefined && em.unit !== o.unit) {
      throw new RateloomError('E_UNIT', `error model '${em.name}' has an absolute sigma in ${em.unit}, but it is used for ${o.response} values in ${o.unit}`, {
        path: ['errorModels', em.name, 'absolute', 'unit'],
        fix: `Give the absolute sigma in a ${o.response} unit, or use a separate error model for each response.`,
      });
    }
  }
}

/** Sigma of an observation when known before the fit: its sigma column, else a fixed error model. */
function sigmaFor(models: Record<string, ErrorModel>): (o: MappedObservation) => number | undefined {
  return (o) => {
    if (o.sigma !== undefined) return o.sigma;
    const m = models[o.errorModel ?? DEFAULT_ERROR_MODEL];
    return m && m.kind !== 'replicates' ? sigmaFromModel(m, o.value) : undefined;
  };
}

/** Runs and observations that survive the row checks, and the runs rejected (with where). */
interface CheckedRows {
  runs: MappedRun[];
  runById: Map<string, MappedRun>;
  observations: MappedObservation[];
  rejectedRuns: Map<string, RowLocation>;
}

/**
 * Per-run observations: drop those of rejected rows, then physical checks row by row (outlet above
 * inlet, element balance); a rejected run takes its other rows and its observations with it.
 */
function checkPerRunRows(data: SourceData, models: Record<string, ErrorModel>, chemistry: Chemistry, inletCtx: InletCheckContext): CheckedRows {
  const { ledger, perRun } = data;
  for (const m of perRun) checkModelUnits(models, m.observations);
  const runById = new Map<string, MappedRun>();
  for (const r of data.runs) runById.set(r.id, r);
  let observations: MappedObservation[] = [];
  for (const m of perRun) for (const o of m.observations) if (!ledger.isRejected(o.location)) observations.push(o);
  // The sources' own lists are let go: this list (and its successors) holds the observations now.
  for (const m of perRun) m.observations = [];
  forEachRowGroup(observations, new Set(perRun.map((m) => m.file)).size === perRun.length, (list) => {
    const run = runById.get(list[0].runId) as MappedRun;
    const rowRun = run.location.line === list[0].location.line && run.location.file === list[0].location.file ? run : { ...run, location: { file: list[0].location.file, line: list[0].location.line } };
    for (const o of list) {
      const bad = checkAboveInlet(o, run, inletCtx);
      if (bad) ledger.reject(bad);
    }
    const eb = checkElementBalance(rowRun, list, chemistry, inletCtx);
    if (eb) ledger.reject(eb);
  });
  const rejectedRuns = new Map<string, RowLocation>();
  const runs = data.runs.filter((r) => {
    if (!ledger.isRejected(r.location)) return true;
    rejectedRuns.set(r.id, r.location);
    return false;
  });
  // Other rows of a rejected run (repeated rows with equal conditions) go with it.
  for (const r of data.allRuns) {
    const at = rejectedRuns.get(r.id);
    if (at && !ledger.isRejected(r.location)) ledger.reject({ file: r.location.file, line: r.location.line, reason: 'run-rejected', message: `run '${r.id}' was rejected (${at.file}:${at.line})` });
  }
  observations = observations.filter((o) => !ledger.isRejected(o.location) && !rejectedRuns.has(o.runId));
  return { runs, runById, observations, rejectedRuns };
}

/** Long sources, mapped against the surviving runs; their observations checked and added to `rows`. */
function addLongSources(sources: readonly AnySourceSpec[], data: SourceData, rows: CheckedRows, inletCtx: InletCheckContext): void {
  const known = new Set<string>();
  if (sources.some((s) => s.layout === 'long')) for (const r of rows.runs) known.add(r.id);
  sources.forEach((s, i) => {
    if (s.layout !== 'long') return;
    const m = mapLongSource(data.tables[i], s as LongSourceSpec, data.ctxFor(i), known, rows.rejectedRuns);
    data.ledger.reject(...m.rejections);
    for (const o of m.observations) {
      const bad = checkAboveInlet(o, rows.runById.get(o.runId) as MappedRun, inletCtx);
      if (bad) data.ledger.reject(bad);
      else rows.observations.push(o);
    }
  });
}

/**
 * Batch and semibatch runs take their size (time) from the last profile point when not given; a run
 * with neither (and not rates only) is rejected with its observations. Returns what is left, indexed.
 */
function settleRunSizes(checked: readonly MappedRun[], observed: readonly MappedObservation[], ledger: Ledger): { runs: MappedRun[]; observations: MappedObservation[]; runIndex: Map<string, number> } {
  const maxPos = new Map<string, number>();
  for (const o of observed) if (o.position !== undefined) maxPos.set(o.runId, Math.max(maxPos.get(o.runId) ?? 0, o.position));
  const sized = checked.map((r) => (r.size !== undefined ? r : maxPos.has(r.id) ? { ...r, size: maxPos.get(r.id) as number } : r));
  const rateOnly = ratesOnlyRuns(observed);
  for (const r of sized) {
    if (r.size !== undefined || rateOnly.has(r.id)) continue;
    ledger.reject({ file: r.location.file, line: r.location.line, reason: 'missing', message: `run '${r.id}' has no reaction time and no profile points to take it from` });
    for (const o of observed) if (o.runId === r.id) ledger.reject({ file: o.location.file, line: o.location.line, reason: 'run-rejected', message: `run '${r.id}' was rejected (${r.location.file}:${r.location.line})` });
  }
  const runs = sized.filter((r) => r.size !== undefined || rateOnly.has(r.id));
  const runIndex = new Map<string, number>();
  for (let i = 0; i < runs.length; i++) runIndex.set(runs[i].id, i);
  const observations = observed.filter((o) => runIndex.has(o.runId) && !ledger.isRejected(o.location));
  return { runs, observations, runIndex };
}

/**
 * Observations with their error models; a replicates model takes sigma (and its dof) from the
 * pooled pure error of the response. The list is turned into the study's observations in place:
 * each mapped observation can be collected as soon as its study observation exists, so the two
 * (three per row of a typical file) are never all in memory at once. The caller hands the list
 * over and uses only the returned one.
 */
function observationsWithSigma(observations: MappedObservation[], models: Record<string, ErrorModel>, pure: readonly PureError[], runIndex: ReadonlyMap<string, number>): Observation[] {
  const out = observations as unknown as (MappedObservation | Observation)[];
  for (let index = 0; index < observations.length; index++) {
    const o = observations[index];
    const modelName = o.errorModel ?? DEFAULT_ERROR_MODEL;
    let sigma = o.sigma;
    if (sigma === undefined && models[modelName].kind === 'replicates') {
      const pe = pure.find((p) => p.response === o.response && p.species === o.species && p.sigma > 0);
      if (!pe) {
        throw new RateloomError('E_DATA', `error model '${modelName}' estimates sigma from replicates, but no replicate runs measure ${o.response}${o.species ? ` of ${o.species}` : ''}`, {
          path: ['errorModels', modelName],
          fix: 'Add replicate runs (equal conditions) or give an absolute or relative sigma.',
        });
      }
      sigma = pe.sigma;
      models[modelName] = { ...models[modelName], dof: pe.dof };
    }
    out[index] = studyObservation(o, index, runIndex.get(o.runId) as number, sigma, modelName);
  }
  return out as Observation[];
}

/** A study run from a mapped run, optional fields only when given. */
function studyRun(r: MappedRun): StudyRun {
  // A run with measured rates only needs no size: NaN marks it (no reactor is solved for it).
  const sr = { id: r.id, temperature: r.temperature, size: r.size ?? NaN } as StudyRun;
  if (r.pressure !== undefined) sr.pressure = r.pressure;
  if (r.feed) sr.feed = r.feed;
  if (r.volumetricFlow !== undefined) sr.volumetricFlow = r.volumetricFlow;
  if (r.initialConcentrations) sr.initialConcentrations = r.initialConcentrations;
  if (r.initialVolume !== undefined) sr.initialVolume = r.initialVolume;
  if (r.catalystMass !== undefined) sr.catalystMass = r.catalystMass;
  if (r.rateConcentrations) sr.rateConcentrations = r.rateConcentrations;
  if (r.runParameters) sr.runParameters = r.runParameters;
  if (r.group !== undefined) sr.group = r.group;
  sr.location = r.location;
  return sr;
}

/** Reference temperature, K: given, or the round number nearest the inverse-mean of the data range (298 K without runs). */
function referenceTemperatureOf(given: RawStudy['referenceTemperature'], runs: readonly StudyRun[]): { value: number; source: Study['referenceTemperatureSource'] } {
  if (given !== undefined) {
    const value = typeof given === 'number' ? given : unitFor('temperature', given.unit, { path: ['referenceTemperature', 'unit'] }).toSI(given.value);
    if (!(value > 0)) {
      throw new RateloomError('E_VALUE', `reference temperature must be above 0 K (got ${value} K)`, { path: ['referenceTemperature'], fix: 'Give an absolute temperature, for example { "value": 350, "unit": "K" }, or leave it out to take it from the data.' });
    }
    return { value, source: 'study' };
  }
  const Ts = runs.map((r) => r.temperature);
  // Reduced rather than spread into Math.min/max: a spread of many runs can overflow the stack.
  const value = Ts.length ? Math.round(2 / (1 / Ts.reduce((a, b) => Math.min(a, b), Infinity) + 1 / Ts.reduce((a, b) => Math.max(a, b), -Infinity))) : 298;
  return { value, source: 'data' };
}

/** What the parameter sets of the study and its candidates share: groups, per-run values, default orders. */
interface ParameterContext {
  groups: string[];
  hasGroupColumn: boolean;
  runValues: Set<string>;
  /** Default start of an order: the species' coefficient on that side of reaction i. */
  coefficient: (i: number, sp: string, side: 'forward' | 'reverse') => number;
}

/** The study's parameters and its candidate rate-law sets (names checked). */
function studyParameters(raw: RawStudy, chemistry: Chemistry, runs: readonly StudyRun[]): { base: ReturnType<typeof buildParameters>; candidates: CandidateSet[] } {
  const nS = chemistry.speciesNames.length;
  const ctx: ParameterContext = {
    runValues: runParameterNames(runs),
    groups: [...new Set(runs.map((r) => r.group).filter((g): g is string => g !== undefined))],
    hasGroupColumn: runs.some((r) => r.group !== undefined),
    coefficient: (i, sp, side) => {
      const j = chemistry.speciesNames.indexOf(sp);
      const nu = j < 0 ? 0 : chemistry.stoich[i * nS + j];
      return side === 'forward' ? Math.max(0, -nu) : Math.max(0, nu);
    },
  };
  const rates = raw.reactions.map((r) => r.rate);
  const base = buildParameters(raw.parameters, rates, ctx.groups, ctx.hasGroupColumn, ['parameters'], parameterRoles(rates, ctx.coefficient));
  const candidates = (raw.candidates ?? []).map((c, ci) => candidateSet(c, ci, raw, chemistry, ctx));
  checkCandidateNames(candidates);
  return { base, candidates };
}

/** One candidate: the study's reactions with its rate laws in place, and its parameter set. */
function candidateSet(c: NonNullable<RawStudy['candidates']>[number], ci: number, raw: RawStudy, chemistry: Chemistry, ctx: ParameterContext): CandidateSet {
  const path = ['candidates', ci];
  const replaced = Object.keys(c.reactions);
  for (const id of replaced) {
    if (!chemistry.reactionIds.includes(id)) {
      throw new RateloomError('E_VALUE', `candidate '${c.name}' replaces unknown reaction '${id}'`, { path: [...path, 'reactions', id], fix: `Use one of the study's reaction ids: ${chemistry.reactionIds.join(', ')}.` });
    }
  }
  const reactions = raw.reactions.map((r) => (c.reactions[r.id] ? { ...r, rate: c.reactions[r.id] } : r));
  const rates = reactions.map((r) => r.rate);
  checkOrderSpecies(rates, chemistry, (i) => (replaced.includes(reactions[i].id) ? [...path, 'reactions', reactions[i].id] : ['reactions', i, 'rate']));
  // A candidate keeps only the study parameters its own rate laws use (an unused one would be an
  // unidentifiable direction of the fit), plus every parameter it declares itself.
  const used = new Set<string>();
  for (const r of reactions) {
    if (r.rate.form === 'expression') {
      for (const m of r.rate.expression.matchAll(/[A-Za-z_][A-Za-z0-9_]*/g)) used.add(m[0]);
    } else {
      const { constants, others } = referencedNames(r.rate);
      for (const n of [...constants, ...others]) used.add(n);
    }
  }
  const kept = raw.parameters.filter((p) => used.has(p.name) || p.scope === 'per-run-group' || ctx.runValues.has(p.name));
  const own = buildParameters([...kept, ...(c.parameters ?? [])], rates, ctx.groups, ctx.hasGroupColumn, [...path, 'parameters'], parameterRoles(rates, ctx.coefficient));
  return { name: c.name, ...(c.description !== undefined ? { description: c.description } : {}), ...(c.nests !== undefined ? { nests: c.nests } : {}), reactions, replaced, parameters: own.parameters, scopes: own.scopes, ...(own.autoStart.length ? { autoStart: own.autoStart } : {}) };
}

/** Candidate names are unique and each `nests` names 'base' or another candidate. */
function checkCandidateNames(candidates: readonly CandidateSet[]): void {
  const names = new Set<string>();
  for (const c of candidates) {
    if (c.nests !== undefined && c.nests !== 'base' && !candidates.some((o) => o.name === c.nests)) {
      throw new RateloomError('E_VALUE', `candidate '${c.name}' nests '${c.nests}', which is neither 'base' nor another candidate`, {
        path: ['candidates', candidates.indexOf(c), 'nests'],
        fix: `Name 'base' or one of: ${candidates.map((o) => o.name).join(', ')}.`,
      });
    }
    if (names.has(c.name)) throw new RateloomError('E_VALUE', `candidate name '${c.name}' is used twice`, { path: ['candidates'], fix: 'Give each candidate its own name.' });
    names.add(c.name);
  }
}

/**
 * Measured rates are predicted from the rate laws as written (no basis conversion): a rate in
 * mol/(kg s) needs mass-basis rate laws for its species, a rate in mol/(m3 s) volume-basis ones.
 */
function checkRateBases(studyObs: readonly Observation[], reactions: readonly ReactionSpec[], candidates: readonly CandidateSet[], chemistry: Chemistry, keyReactantIndex: number): void {
  const nS = chemistry.speciesNames.length;
  const rateSets = [
    { name: 'the study', reactions, at: (i: number) => ['reactions', i, 'rate', 'basis'] },
    ...candidates.map((c, ci) => ({ name: `candidate '${c.name}'`, reactions: c.reactions, at: (i: number) => (c.replaced.includes(c.reactions[i].id) ? ['candidates', ci, 'reactions', c.reactions[i].id, 'basis'] : ['reactions', i, 'rate', 'basis']) })),
  ];
  for (const o of studyObs) {
    if (o.response !== 'rate') continue;
    const basis = o.unit === 'mol/(kg s)' ? 'mass' : 'volume';
    const j = o.speciesIndex ?? keyReactantIndex;
    for (const set of rateSets) {
      set.reactions.forEach((r, i) => {
        const lawBasis = r.rate.basis ?? 'volume';
        if (chemistry.stoich[i * nS + j] === 0 || lawBasis === basis) return;
        throw new RateloomError('E_UNIT', `measured rates of ${chemistry.speciesNames[j]} are per ${basis === 'mass' ? 'kg of catalyst' : 'm3 of fluid'} (${o.location.file}:${o.location.line}), but reaction '${r.id}' of ${set.name} has a ${lawBasis}-basis rate law`, {
          path: set.at(i),
          fix: `Give the rate column in a ${lawBasis === 'mass' ? 'per-mass unit such as mmol/(g min)' : 'per-volume unit such as mol/(L s)'}, or set the rate law's basis to '${basis}'.`,
        });
      });
    }
  }
}
