/**
 * Column mapping: turn CSV rows into SI run conditions and observations, one row at a time.
 * Problems with a single row (empty required cell, unreadable number, negative flow, wrong number
 * of cells, unknown species) reject that row and are listed; problems with the mapping itself
 * (missing column, unknown unit, missing field for the reactor kind) are RateloomErrors, because
 * they are mistakes in the study file, not in the data.
 * Ideal gas for fractions with a volumetric flow: F_T0 = P0 v0 / (R T0), R from src/core/constants.ts.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import type { Phase, ReactorKind } from '../reactors/types.js';
import { unitFor, type Quantity, type UnitConversion } from '../units/index.js';
import { columnIndex, type CsvRow, type CsvTable } from './csv.js';
import { decimalCommaToPoint } from './dialect.js';
import { PHYSICAL_RANGES, outsideRange, type PhysicalRange } from './ranges.js';
import type { Rejection } from './report.js';
import type { SourceLayout } from './report.js';
import type { FieldSpec, LongSourceSpec, MeasureSpec, MeasuredSpec, PerRunColumns, PerRunSourceSpec, ResponseKind } from './spec.js';
import type { RunParameterRef } from './run-parameters.js';
import { prepareBalanceRates, prepareRateComposition, readBalanceRate, readRateComposition, type MappingTools, type PreparedBalanceRate, type PreparedComposition } from './rate-composition.js';
import { GAS_CONSTANT } from '../core/constants.js';
import { VectorPool } from './vector-pool.js';

export interface MappingContext {
  speciesNames: readonly string[];
  kind: ReactorKind;
  phase: Phase;
  /** Names of the study's error models, to check references. */
  errorModelNames: readonly string[];
  /** Path of this source in the study, for example ['data', 0]. */
  path: FieldPath;
  /**
   * SI start value of a parameter named by a field ({"parameter": ...}), checked against the
   * field's SI unit; absent: parameter fields are refused.
   */
  parameterStart?: (name: string, siUnit: string, path: FieldPath) => number;
}

export interface RowLocation {
  file: string;
  line: number;
  column?: string;
}

/** Conditions of a run as read from one row, SI. */
export interface MappedRun {
  id: string;
  group?: string;
  temperature: number;
  pressure?: number;
  /** Catalyst mass (packed bed), volume (plug flow, stirred tank, membrane) or time (batch, semibatch). */
  size?: number;
  catalystMass?: number;
  feed?: Float64Array;
  volumetricFlow?: number;
  initialConcentrations?: Float64Array;
  initialVolume?: number;
  /** Composition (mol/m3) at which this run's rates were measured, when the source gives it. */
  rateConcentrations?: Float64Array;
  /** Feed flows or initial concentrations held by fitted parameters (same array for all rows of a source). */
  runParameters?: readonly RunParameterRef[];
  location: RowLocation;
}

export interface MappedObservation {
  runId: string;
  response: ResponseKind;
  species?: string;
  speciesIndex?: number;
  /** Position along the reactor (kg or m3) or time (s) of a profile point; undefined = outlet. */
  position?: number;
  /** Value, SI. */
  value: number;
  /** Standard deviation from a sigma column, SI. */
  sigma?: number;
  errorModel?: string;
  /** SI unit of value and sigma. */
  unit: string;
  location: RowLocation;
}

export interface MappedSource {
  file: string;
  layout: SourceLayout;
  rowsIn: number;
  runs: MappedRun[];
  observations: MappedObservation[];
  rejections: Rejection[];
  /** Lines of rejected rows. */
  rejectedLines: Set<number>;
  /** Sentences for `check`: where this source's measured rates are evaluated, how rates were derived. */
  rateNotes?: string[];
}

/** The quantity (for units) of each response kind. */
export const RESPONSE_QUANTITY: Record<ResponseKind, Quantity> = {
  'outlet-flow': 'molar-flow',
  'outlet-concentration': 'concentration',
  conversion: 'dimensionless',
  rate: 'rate',
  'outlet-pressure': 'pressure',
};

/** The size field each reactor kind needs. */
export const SIZE_FIELD: Record<ReactorKind, 'catalystMass' | 'volume' | 'time'> = {
  'packed-bed': 'catalystMass',
  'plug-flow': 'volume',
  'stirred-tank': 'volume',
  membrane: 'volume',
  batch: 'time',
  semibatch: 'time',
};

const NUMBER_RE = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** A prepared field: its column index (or constant) and unit conversion. */
export interface Prepared {
  name: string;
  /** Name of the study parameter holding the value (constant = its start, SI). */
  parameter?: string;
  column?: number;
  header?: string;
  constant?: number;
  conv: UnitConversion;
}

export function ambientSI(spec: MeasureSpec | undefined, path: FieldPath): number | undefined {
  if (!spec) return undefined;
  return unitFor('pressure', spec.unit, { path: [...path, 'ambientPressure', 'unit'] }).toSI(spec.value);
}

export function prepare(table: CsvTable, name: string, f: FieldSpec, q: Quantity, path: FieldPath, ambient?: number, parameterStart?: MappingContext['parameterStart']): Prepared {
  const hasColumn = typeof f.column === 'string';
  const hasValue = typeof f.value === 'number';
  if (typeof f.parameter === 'string') return prepareParameterField(name, f, q, path, parameterStart, hasColumn || hasValue);
  if (hasColumn === hasValue) {
    throw new RateloomError('E_SCHEMA', `give exactly one of 'column' and 'value' for ${name}`, { path, fix: `Write {"column": "<header>", "unit": "..."} or {"value": <number>, "unit": "..."}.` });
  }
  if (f.gauge && q !== 'pressure') throw new RateloomError('E_SCHEMA', `'gauge' applies to pressures only, not ${name}`, { path: [...path, 'gauge'] });
  const conv = unitFor(q, f.unit, { path: [...path, 'unit'], gauge: f.gauge === true, ...(ambient !== undefined ? { ambientPressure: ambient } : {}) });
  if (hasColumn) return { name, column: columnIndex(table, f.column as string, [...path, 'column']), header: f.column as string, conv };
  return { name, constant: conv.toSI(f.value as number), conv };
}

export function speciesIdx(ctx: MappingContext, name: string, path: FieldPath): number {
  const j = ctx.speciesNames.indexOf(name);
  if (j >= 0) return j;
  const near = closestName(name, ctx.speciesNames);
  throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, {
    path,
    details: { species: name, ...(near ? { closest: near } : {}) },
  });
}

export function checkErrorModel(ctx: MappingContext, name: string | undefined, path: FieldPath): void {
  if (name === undefined || ctx.errorModelNames.includes(name)) return;
  const near = closestName(name, ctx.errorModelNames);
  throw new RateloomError('E_VALUE', `error model '${name}' is not defined in errorModels${near ? ` (did you mean '${near}'?)` : ''}`, {
    path,
    fix: `Define '${name}' under errorModels or use one of: ${ctx.errorModelNames.join(', ') || '(none defined)'}.`,
    ...(near ? { details: { closest: near } } : {}),
  });
}

/** A cell as shown in a message: at most 40 characters. */
function shortCell(cell: string): string {
  return cell.length > 40 ? `${cell.slice(0, 40)}...` : cell;
}

/** The message of a row whose cell count differs from the header's, with a hint on decimal commas. */
export function columnCountMessage(cells: number, header: number, delimiter: string): string {
  const hint = delimiter === ',' && cells > header ? " (decimal commas split cells in a comma-separated file: separate cells with ';' instead, or write decimal points)" : '';
  return `row has ${cells} cells, the header has ${header}${hint}`;
}


/** Reads cells of one row at a time (reset per row), collecting problems instead of throwing. */
export class RowReader {
  problems: Rejection[] = [];
  private row: CsvRow = { line: 0, cells: [] };
  constructor(private readonly table: CsvTable) {}

  /** Start on `row`; the previous row's problems are dropped (take them first). */
  reset(row: CsvRow): void {
    this.row = row;
    if (this.problems.length) this.problems = [];
  }

  reject(reason: Rejection['reason'], message: string, column?: string): void {
    const p = { file: this.table.file, line: this.row.line } as Rejection;
    if (column !== undefined) p.column = column;
    p.reason = reason;
    p.message = message;
    this.problems.push(p);
  }

  text(col: number): string {
    return (this.row.cells[col] ?? '').trim();
  }

  /**
   * The SI value of a prepared field; undefined when empty (and `required` adds a problem).
   * `min`: 'nonneg' rejects negatives as 'negative', 'positive' rejects <= 0 as 'out-of-range'.
   */
  num(p: Prepared, required: boolean, min: 'nonneg' | 'positive' | 'any', what = p.name, range?: PhysicalRange): number | undefined {
    if (p.constant !== undefined) return p.constant;
    const header = p.header as string;
    const cell = this.text(p.column as number);
    if (cell === '') {
      if (required) this.reject('missing', `${what} is required but the cell is empty`, header);
      return undefined;
    }
    const raw = NUMBER_RE.test(cell) ? cell : this.table.delimiter !== ',' ? decimalCommaToPoint(cell) : undefined;
    if (raw === undefined) {
      this.reject('non-numeric', `'${shortCell(cell)}' is not a number (${what})${this.table.delimiter === ',' && decimalCommaToPoint(cell) ? '; a decimal comma is read only in files whose cells are separated by semicolons or tabs' : ''}`, header);
      return undefined;
    }
    const x = Number(raw);
    const si = p.conv.toSI(x);
    if (!Number.isFinite(si)) {
      this.reject('out-of-range', `'${raw}' ${p.conv.unit} is too large to be a number here (${what})`, header);
      return undefined;
    }
    if (min === 'nonneg' && si < 0) {
      this.reject('negative', `${what} is negative (${raw} ${p.conv.unit})`, header);
      return undefined;
    }
    if (min === 'positive' && !(si > 0)) {
      this.reject('out-of-range', `${what} must be above zero (${raw} ${p.conv.unit} = ${si} ${p.conv.si})`, header);
      return undefined;
    }
    const outside = range ? outsideRange(si, range, what) : undefined;
    if (outside) {
      this.reject('out-of-range', `${outside} (cell '${raw}' ${p.conv.unit})`, header);
      return undefined;
    }
    return si;
  }
}

/**
 * A per-run observation with its keys in the documented order and optional keys only when
 * defined. One object literal per shape (instead of spreads or keys added one by one) keeps every
 * property inside the object: no extra property store per observation.
 */
function newObservation(runId: string, m: MeasuredSpec, j: number | undefined, value: number, sigma: number | undefined, unit: string, location: RowLocation): MappedObservation {
  const response = m.response;
  const species = m.species;
  const errorModel = m.errorModel;
  if (species !== undefined) {
    const speciesIndex = j;
    if (errorModel !== undefined) {
      return sigma !== undefined
        ? { runId, response, species, speciesIndex, value, sigma, errorModel, unit, location }
        : { runId, response, species, speciesIndex, value, errorModel, unit, location };
    }
    return sigma !== undefined ? { runId, response, species, speciesIndex, value, sigma, unit, location } : { runId, response, species, speciesIndex, value, unit, location };
  }
  if (errorModel !== undefined) {
    return sigma !== undefined ? { runId, response, value, sigma, errorModel, unit, location } : { runId, response, value, errorModel, unit, location };
  }
  return sigma !== undefined ? { runId, response, value, sigma, unit, location } : { runId, response, value, unit, location };
}

function prepareSpecies(table: CsvTable, ctx: MappingContext, map: Record<string, FieldSpec> | undefined, label: string, q: Quantity, path: FieldPath, allowParameters = false) {
  if (!map) return undefined;
  const start = allowParameters ? ctx.parameterStart : undefined;
  return Object.entries(map).map(([sp, f]) => ({ j: speciesIdx(ctx, sp, [...path, sp]), p: prepare(table, `${label} of ${sp}`, f, q, [...path, sp], undefined, start) }));
}

/** A field held by a fitted parameter: its start value stands in for the cell until the fit sets it. */
function prepareParameterField(name: string, f: FieldSpec, q: Quantity, path: FieldPath, parameterStart: MappingContext['parameterStart'], alsoOther: boolean): Prepared {
  if (alsoOther) throw new RateloomError('E_SCHEMA', `give exactly one of 'column', 'value' and 'parameter' for ${name}`, { path });
  if (!parameterStart) {
    throw new RateloomError('E_SCHEMA', `'parameter' is accepted only for feed flows and initial concentrations, not ${name}`, { path: [...path, 'parameter'], fix: "Give a 'column' or a 'value'." });
  }
  const conv = unitFor(q, f.unit, { path: [...path, 'unit'] });
  const parameter = f.parameter as string;
  return { name, parameter, constant: parameterStart(parameter, conv.si, [...path, 'parameter']), conv };
}

/** The fields of a plan held by parameters, as references for the model to fill in. */
function runParameterRefs(plan: Pick<PerRunPlan, 'feed' | 'c0'>): RunParameterRef[] {
  const refs: RunParameterRef[] = [];
  for (const { j, p } of plan.feed ?? []) if (p.parameter !== undefined) refs.push({ target: 'feed', speciesIndex: j, parameter: p.parameter });
  for (const { j, p } of plan.c0 ?? []) if (p.parameter !== undefined) refs.push({ target: 'initialConcentration', speciesIndex: j, parameter: p.parameter });
  return refs;
}

/** Everything prepared once for a per-run source: fields, conversions and what each row needs. */
interface PerRunPlan {
  cols: PerRunColumns;
  nS: number;
  runCol: number;
  groupCol?: number;
  T: Prepared;
  P?: Prepared;
  W?: Prepared;
  size?: Prepared;
  feed?: { j: number; p: Prepared }[];
  total?: Prepared;
  fractions?: { j: number; p: Prepared }[];
  v0?: Prepared;
  cin?: { j: number; p: Prepared }[];
  c0?: { j: number; p: Prepared }[];
  V0?: Prepared;
  measured: { m: MeasuredSpec; j: number | undefined; p: Prepared; sigma?: Prepared; min: 'nonneg' | 'any' }[];
  composition?: PreparedComposition<Prepared>;
  balance: PreparedBalanceRate<Prepared>[];
  /** Fields held by fitted parameters; undefined when none. */
  runParameters?: RunParameterRef[];
  /** Measured rates only, at a measured composition: no reactor size, feed or pressure needed. */
  atComposition: boolean;
  isBatch: boolean;
  isSemi: boolean;
  needPressure: boolean;
  needFlow: boolean;
  /** Feed and initial-concentration vectors of the rows (views of shared blocks). */
  vectors: VectorPool;
}

/** True when a source measures only rates and gives the composition they were measured at. */
function ratesAtComposition(cols: PerRunColumns): boolean {
  const measured = cols.measured ?? [];
  return cols.rateComposition !== undefined && !cols.balanceRates?.length && measured.length > 0 && measured.every((m) => m.response === 'rate');
}

/** Tools the rate-composition reader uses: field preparation, species lookup and the row reader. */
function mappingTools(table: CsvTable, ctx: MappingContext, r: RowReader, ambient?: number): MappingTools<Prepared> {
  return {
    prepare: (name, f, q, path) => prepare(table, name, f, q, path, ambient),
    speciesIndex: (name, path) => speciesIdx(ctx, name, path),
    num: (p, required, min) => r.num(p, required, min),
    reject: (message, column) => r.reject('missing', message, column),
  };
}

/** Refuse a per-run mapping that lacks what the reactor kind and phase need. */
function checkPerRunMapping(plan: PerRunPlan, ctx: MappingContext, path: FieldPath): void {
  const { cols, isBatch, isSemi, atComposition, feed, total, fractions, v0, cin, c0, V0 } = plan;
  if (cols.rateComposition && (cols.measured ?? []).every((m) => m.response !== 'rate') && !cols.balanceRates?.length) {
    throw new RateloomError('E_VALUE', "'rateComposition' is given but this source measures no rate", { path: [...path, 'rateComposition'], fix: "Add a measured 'rate' response or 'balanceRates', or remove 'rateComposition'." });
  }
  const sizeField = SIZE_FIELD[ctx.kind];
  if (!plan.size && sizeField !== 'time' && !atComposition) {
    throw new RateloomError('E_MISSING_FIELD', `a ${ctx.kind} reactor needs '${sizeField}' in the column mapping (only rates given with their measured composition need no size)`, { path: [...path, sizeField] });
  }
  if (ctx.phase === 'gas' && !plan.P && !atComposition) {
    throw new RateloomError('E_MISSING_FIELD', "gas-phase data need 'pressure' in the column mapping", { path: [...path, 'pressure'] });
  }
  const feedWays = [feed ? 1 : 0, total && fractions ? 1 : 0, v0 && cin ? 1 : 0, v0 && fractions && !total && ctx.phase === 'gas' ? 1 : 0].reduce((a, b) => a + b, 0);
  if (!isBatch && !isSemi && feedWays === 0 && !atComposition) {
    throw new RateloomError('E_MISSING_FIELD', `a ${ctx.kind} reactor needs its feed: 'feed' flows, or 'totalFeed' with 'feedFractions', or 'volumetricFlow' with 'inletConcentrations' (or with 'feedFractions' for a gas)`, { path: [...path, 'feed'] });
  }
  if (total && !fractions) throw new RateloomError('E_MISSING_FIELD', "'totalFeed' needs 'feedFractions'", { path: [...path, 'feedFractions'] });
  if (ctx.phase === 'liquid' && !isBatch && !v0 && !atComposition) {
    throw new RateloomError('E_MISSING_FIELD', `liquid-phase ${ctx.kind} data need 'volumetricFlow'`, { path: [...path, 'volumetricFlow'] });
  }
  if (isBatch && !c0 && !(fractions && ctx.phase === 'gas')) {
    throw new RateloomError('E_MISSING_FIELD', "batch data need 'initialConcentrations' (or 'feedFractions' with pressure for a gas)", { path: [...path, 'initialConcentrations'] });
  }
  if (isSemi && (!c0 || !V0)) {
    throw new RateloomError('E_MISSING_FIELD', "semibatch data need 'initialConcentrations' and 'initialVolume'", { path: [...path, c0 ? 'initialVolume' : 'initialConcentrations'] });
  }
  const comp = plan.composition;
  const needsP = comp && (comp.basis === 'outlet-flow' ? ctx.phase === 'gas' : comp.basis === 'mole-fraction' && !comp.totalPressure);
  if (needsP && !plan.P) {
    throw new RateloomError('E_MISSING_FIELD', `a rate composition from ${comp.basis}s needs 'pressure' in the column mapping`, { path: [...path, 'pressure'] });
  }
  if (comp?.basis === 'outlet-flow' && ctx.phase === 'liquid' && !v0) {
    throw new RateloomError('E_MISSING_FIELD', "a liquid rate composition from outlet flows needs 'volumetricFlow'", { path: [...path, 'volumetricFlow'] });
  }
}

/** Prepare the measured responses of a per-run source. */
function prepareMeasured(table: CsvTable, cols: PerRunColumns, ctx: MappingContext, path: FieldPath, ambient?: number): PerRunPlan['measured'] {
  return (cols.measured ?? []).map((m, i) => {
    const mp = [...path, 'measured', i];
    const needsSpecies = m.response !== 'outlet-pressure';
    if (needsSpecies && m.species === undefined) throw new RateloomError('E_MISSING_FIELD', `response '${m.response}' needs 'species'`, { path: [...mp, 'species'] });
    const j = m.species !== undefined ? speciesIdx(ctx, m.species, [...mp, 'species']) : undefined;
    checkErrorModel(ctx, m.errorModel, [...mp, 'errorModel']);
    const p = prepare(table, `${m.response}${m.species ? ` of ${m.species}` : ''}`, { column: m.column, unit: m.unit, ...(m.gauge ? { gauge: true } : {}) }, RESPONSE_QUANTITY[m.response], mp, ambient);
    const sigma = m.sigmaColumn !== undefined ? { ...p, name: `sigma of ${p.name}`, column: columnIndex(table, m.sigmaColumn, [...mp, 'sigmaColumn']), header: m.sigmaColumn, conv: { ...p.conv, toSI: (x: number) => x * p.conv.factor } } : undefined;
    const min: 'nonneg' | 'any' = m.response === 'outlet-flow' || m.response === 'outlet-concentration' || m.response === 'outlet-pressure' ? 'nonneg' : 'any';
    return sigma ? { m, j, p, sigma, min } : { m, j, p, min };
  });
}

/** Prepare every field of a per-run source once, and check the mapping. */
function preparePerRun(table: CsvTable, spec: PerRunSourceSpec, ctx: MappingContext, r: RowReader): PerRunPlan {
  const cols = spec.columns;
  const path = [...ctx.path, 'columns'];
  const ambient = ambientSI(spec.ambientPressure, ctx.path);
  const f = (name: string, field: FieldSpec | undefined, q: Quantity, key: string, amb?: number) => (field ? prepare(table, name, field, q, [...path, key], amb) : undefined);
  const sizeField = SIZE_FIELD[ctx.kind];
  const W = f('catalyst mass', cols.catalystMass, 'mass', 'catalystMass');
  const V = f('volume', cols.volume, 'volume', 'volume');
  const t = f('time', cols.time, 'time', 'time');
  const isBatch = ctx.kind === 'batch';
  const atComposition = ratesAtComposition(cols);
  const tools = mappingTools(table, ctx, r, ambient);
  const plan: PerRunPlan = {
    cols,
    nS: ctx.speciesNames.length,
    runCol: columnIndex(table, cols.run, [...path, 'run']),
    ...(cols.group !== undefined ? { groupCol: columnIndex(table, cols.group, [...path, 'group']) } : {}),
    T: prepare(table, 'temperature', cols.temperature, 'temperature', [...path, 'temperature']),
    P: f('pressure', cols.pressure, 'pressure', 'pressure', ambient),
    W,
    size: sizeField === 'catalystMass' ? W : sizeField === 'volume' ? V : t,
    feed: prepareSpecies(table, ctx, cols.feed, 'feed flow', 'molar-flow', [...path, 'feed'], true),
    total: f('total feed', cols.totalFeed, 'molar-flow', 'totalFeed'),
    fractions: prepareSpecies(table, ctx, cols.feedFractions, 'feed fraction', 'dimensionless', [...path, 'feedFractions']),
    v0: f('volumetric flow', cols.volumetricFlow, 'volumetric-flow', 'volumetricFlow'),
    cin: prepareSpecies(table, ctx, cols.inletConcentrations, 'inlet concentration', 'concentration', [...path, 'inletConcentrations']),
    c0: prepareSpecies(table, ctx, cols.initialConcentrations, 'initial concentration', 'concentration', [...path, 'initialConcentrations'], true),
    V0: f('initial volume', cols.initialVolume, 'volume', 'initialVolume'),
    measured: prepareMeasured(table, cols, ctx, path, ambient),
    ...(cols.rateComposition ? { composition: prepareRateComposition(cols.rateComposition, ctx.phase, tools, [...path, 'rateComposition']) } : {}),
    balance: prepareBalanceRates(cols.balanceRates ?? [], ctx.kind, tools, [...path, 'balanceRates']),
    atComposition,
    isBatch,
    isSemi: ctx.kind === 'semibatch',
    needPressure: ctx.phase === 'gas' && !atComposition,
    needFlow: ctx.phase === 'liquid' && !isBatch && !atComposition,
    vectors: new VectorPool(ctx.speciesNames.length),
  };
  for (const b of plan.balance) checkErrorModel(ctx, b.spec.errorModel, [...path, 'balanceRates', plan.balance.indexOf(b), 'errorModel']);
  checkPerRunMapping(plan, ctx, path);
  const refs = runParameterRefs(plan);
  if (refs.length) plan.runParameters = refs;
  return plan;
}

/** Feed molar flows of the current row (mol/s), from whichever feed description the source uses. */
function readFeed(plan: PerRunPlan, r: RowReader, ctx: MappingContext, temperature?: number, pressure?: number, volumetricFlow?: number): Float64Array | undefined {
  const { feed, fractions, total, cin } = plan;
  if (feed) {
    const out = plan.vectors.take();
    for (let k = 0; k < feed.length; k++) out[feed[k].j] = r.num(feed[k].p, true, 'nonneg') ?? 0;
    return out;
  }
  if (fractions && (total || (volumetricFlow !== undefined && ctx.phase === 'gas' && !plan.isBatch))) {
    let FT: number | undefined;
    if (total) FT = r.num(total, true, 'nonneg');
    else if (volumetricFlow !== undefined && pressure !== undefined && temperature !== undefined) FT = (pressure * volumetricFlow) / (GAS_CONSTANT * temperature);
    const out = plan.vectors.take();
    for (const { j, p } of fractions) {
      const y = r.num(p, true, 'nonneg');
      if (y !== undefined && y > 1 + 1e-9) r.reject('out-of-range', `feed fraction of ${ctx.speciesNames[j]} is above 1 (${y})`, p.header);
      out[j] = (y ?? 0) * (FT ?? 0);
    }
    return out;
  }
  if (cin && volumetricFlow !== undefined) {
    const out = plan.vectors.take();
    for (const { j, p } of cin) out[j] = (r.num(p, true, 'nonneg') ?? 0) * volumetricFlow;
    return out;
  }
  return undefined;
}

/** Initial concentrations of the current row (batch, semibatch), mol/m3. */
function readInitial(plan: PerRunPlan, r: RowReader, temperature?: number, pressure?: number): Float64Array | undefined {
  const { c0, fractions } = plan;
  if (c0) {
    const out = plan.vectors.take();
    for (const { j, p } of c0) out[j] = r.num(p, true, 'nonneg') ?? 0;
    return out;
  }
  if (plan.isBatch && fractions && pressure !== undefined && temperature !== undefined) {
    const out = plan.vectors.take();
    const CT = pressure / (GAS_CONSTANT * temperature);
    for (const { j, p } of fractions) out[j] = (r.num(p, true, 'nonneg') ?? 0) * CT;
    return out;
  }
  return undefined;
}

/** Observations of the current row: measured columns, then rates from the mole balance. */
function readObservations(plan: PerRunPlan, r: RowReader, id: string, run: Pick<MappedRun, 'feed' | 'size' | 'catalystMass'>, location: { file: string; line: number }, obs: MappedObservation[], tools: MappingTools<Prepared>, ctx: MappingContext): void {
  const { measured } = plan;
  for (let k = 0; k < measured.length; k++) {
    const { m, j, p, sigma, min } = measured[k];
    const value = r.num(p, false, min);
    if (value === undefined) continue; // an empty measured cell is simply not measured
    const s = sigma ? r.num(sigma, false, 'positive') : undefined;
    obs.push(newObservation(id, m, j, value, s, p.conv.si, { file: location.file, line: location.line, column: m.column }));
  }
  if (!plan.balance.length) return;
  // Per kg of catalyst when the run has a catalyst mass, else per m3 of reactor volume.
  const perMass = ctx.kind === 'packed-bed' || run.catalystMass !== undefined;
  const divisor = ctx.kind === 'packed-bed' ? run.size : (run.catalystMass ?? run.size);
  if (divisor === 0) return; // a blank run has no rate to derive
  for (const b of plan.balance) {
    const v = readBalanceRate(b, run.feed, divisor, tools);
    if (!v) continue;
    const m: MeasuredSpec = { response: 'rate', species: b.spec.species, column: b.spec.outletColumn, unit: b.spec.unit, ...(b.spec.errorModel !== undefined ? { errorModel: b.spec.errorModel } : {}) };
    obs.push(newObservation(id, m, b.j, v.value, v.sigma, perMass ? 'mol/(kg s)' : 'mol/(m3 s)', { file: location.file, line: location.line, column: b.spec.outletColumn }));
  }
}

/** One row of a per-run source: its run (when the row has no problem) and its observations. */
function readPerRunRow(plan: PerRunPlan, r: RowReader, row: CsvRow, ctx: MappingContext, tools: MappingTools<Prepared>, file: string, out: MappedSource, obs: MappedObservation[]): void {
  const { cols } = plan;
  const id = r.text(plan.runCol);
  if (id === '') r.reject('missing', 'run id is empty', cols.run);
  const group = plan.groupCol !== undefined ? r.text(plan.groupCol) : undefined;
  if (plan.groupCol !== undefined && group === '') r.reject('missing', 'run group is empty', cols.group);
  const temperature = r.num(plan.T, true, 'positive', plan.T.name, PHYSICAL_RANGES.temperature);
  const pressure = plan.P ? r.num(plan.P, plan.needPressure, 'positive', plan.P.name, PHYSICAL_RANGES.pressure) : undefined;
  const sz = plan.size ? r.num(plan.size, true, 'nonneg') : undefined;
  const catalystMass = plan.W && plan.size !== plan.W ? r.num(plan.W, false, 'nonneg') : undefined;
  const volumetricFlow = plan.v0 ? r.num(plan.v0, plan.needFlow, plan.isBatch || plan.isSemi ? 'nonneg' : 'positive') : undefined;
  const feed = readFeed(plan, r, ctx, temperature, pressure, volumetricFlow);
  const initial = readInitial(plan, r, temperature, pressure);
  const initialVolume = plan.V0 ? r.num(plan.V0, plan.isSemi, 'nonneg') : undefined;
  const rateC = plan.composition ? readRateComposition(plan.composition, plan.nS, { temperature, pressure, volumetricFlow }, tools, ctx.phase === 'gas') : undefined;
  const line = row.line;
  obs.length = 0;
  readObservations(plan, r, id, { feed, size: sz, catalystMass }, { file, line }, obs, tools, ctx);
  if (r.problems.length) return;
  const run = { id } as MappedRun;
  if (group !== undefined) run.group = group;
  run.temperature = temperature as number;
  if (pressure !== undefined) run.pressure = pressure;
  if (sz !== undefined) run.size = sz;
  if (catalystMass !== undefined) run.catalystMass = catalystMass;
  if (feed) run.feed = feed;
  if (volumetricFlow !== undefined) run.volumetricFlow = volumetricFlow;
  if (initial) run.initialConcentrations = initial;
  if (initialVolume !== undefined) run.initialVolume = initialVolume;
  if (rateC) run.rateConcentrations = rateC;
  if (plan.runParameters) run.runParameters = plan.runParameters;
  run.location = { file, line };
  out.runs.push(run);
  for (let k = 0; k < obs.length; k++) out.observations.push(obs[k]);
}

/** Sentences for `check` on where this source's rates are evaluated and how derived rates were formed. */
function rateNotes(plan: PerRunPlan, file: string): string[] {
  const notes: string[] = [];
  const hasRates = plan.measured.some(({ m }) => m.response === 'rate') || plan.balance.length > 0;
  if (!hasRates) return notes;
  if (plan.composition) notes.push(`${file}: ${plan.composition.description}`);
  else notes.push(`${file}: measured rates evaluated at the ${plan.isBatch || plan.isSemi ? 'initial' : 'feed'} composition (no 'rateComposition' columns given)`);
  for (const b of plan.balance) {
    const sig = [b.spec.outletSigmaColumn, b.spec.feedSigmaColumn].filter((c) => c !== undefined);
    notes.push(`${file}: rate of ${b.spec.species} from the mole balance r = (F0 - F)/W (or /V), F from column ${b.spec.outletColumn}${sig.length ? `, sigma propagated from ${sig.join(' and ')}` : ''}`);
  }
  return notes;
}

/** Map a per-run source: one run (and its measured outlet values) per row. */
export function mapPerRunSource(table: CsvTable, spec: PerRunSourceSpec, ctx: MappingContext): MappedSource {
  const r = new RowReader(table);
  const plan = preparePerRun(table, spec, ctx, r);
  const tools = mappingTools(table, ctx, r, ambientSI(spec.ambientPressure, ctx.path));
  const out: MappedSource = { file: table.file, layout: 'per-run', rowsIn: table.rowCount, runs: [], observations: [], rejections: [], rejectedLines: new Set() };
  const notes = rateNotes(plan, table.file);
  if (notes.length) out.rateNotes = notes;
  const nCols = table.header.length;
  const obs: MappedObservation[] = [];
  // Rows one at a time (rowAt): a plain-text table makes each row's cells only here, for this row.
  for (let i = 0; i < table.rowCount; i++) {
    const row = table.rowAt(i);
    r.reset(row);
    if (row.cells.length !== nCols) {
      r.reject('column-count', columnCountMessage(row.cells.length, nCols, table.delimiter));
    } else {
      readPerRunRow(plan, r, row, ctx, tools, table.file, out, obs);
    }
    if (r.problems.length) {
      for (const p of r.problems) out.rejections.push(p);
      out.rejectedLines.add(row.line);
    }
  }
  return out;
}

/**
 * Map a long source: one measured value per row. `knownRuns` are the run ids defined by the
 * per-run sources; `rejectedRuns` maps ids whose rows were rejected to where.
 */
export function mapLongSource(
  table: CsvTable,
  spec: LongSourceSpec,
  ctx: MappingContext,
  knownRuns: ReadonlySet<string>,
  rejectedRuns: ReadonlyMap<string, RowLocation>,
): MappedSource {
  const cols = spec.columns;
  const path = [...ctx.path, 'columns'];
  const runCol = columnIndex(table, cols.run, [...path, 'run']);
  const needsSpecies = spec.response !== 'outlet-pressure';
  if (needsSpecies && cols.species === undefined) {
    throw new RateloomError('E_MISSING_FIELD', `response '${spec.response}' needs a 'species' column`, { path: [...path, 'species'] });
  }
  checkErrorModel(ctx, spec.errorModel, [...ctx.path, 'errorModel']);
  const spCol = cols.species !== undefined ? columnIndex(table, cols.species, [...path, 'species']) : undefined;
  const sizeQuantity: Quantity = SIZE_FIELD[ctx.kind] === 'catalystMass' ? 'mass' : SIZE_FIELD[ctx.kind] === 'volume' ? 'volume' : 'time';
  const pos = cols.position ? prepare(table, 'position', cols.position, sizeQuantity, [...path, 'position']) : undefined;
  const val = prepare(table, spec.response, { column: cols.value, unit: spec.unit }, RESPONSE_QUANTITY[spec.response], [...path, 'value']);
  const sig = cols.sigma !== undefined ? { ...val, name: 'sigma', column: columnIndex(table, cols.sigma, [...path, 'sigma']), header: cols.sigma, conv: { ...val.conv, toSI: (x: number) => x * val.conv.factor } } : undefined;
  const out: MappedSource = { file: table.file, layout: 'long', rowsIn: table.rowCount, runs: [], observations: [], rejections: [], rejectedLines: new Set() };
  const r = new RowReader(table);
  for (let i = 0; i < table.rowCount; i++) {
    const row = table.rowAt(i);
    r.reset(row);
    if (row.cells.length !== table.header.length) {
      r.reject('column-count', columnCountMessage(row.cells.length, table.header.length, table.delimiter));
    } else {
      const id = r.text(runCol);
      if (id === '') r.reject('missing', 'run id is empty', cols.run);
      else if (rejectedRuns.has(id)) {
        const at = rejectedRuns.get(id) as RowLocation;
        r.reject('run-rejected', `run '${id}' was rejected (${at.file}:${at.line})`, cols.run);
      } else if (!knownRuns.has(id)) {
        const near = closestName(id, knownRuns);
        r.reject('unknown-run', `run '${id}' is not defined by any per-run source${near ? ` (closest: '${near}')` : ''}`, cols.run);
      }
      let species: string | undefined;
      let j: number | undefined;
      if (spCol !== undefined) {
        species = r.text(spCol);
        j = ctx.speciesNames.indexOf(species);
        if (species === '') r.reject('missing', 'species is empty', cols.species);
        else if (j < 0) {
          const near = closestName(species, ctx.speciesNames);
          r.reject('unknown-species', `unknown species '${species}'${near ? ` (closest: '${near}')` : ''}`, cols.species);
        }
      }
      const position = pos ? r.num(pos, false, 'nonneg', 'position') : undefined;
      const min = spec.response === 'conversion' || spec.response === 'rate' ? 'any' : 'nonneg';
      const value = r.num(val, true, min, spec.response);
      const sigma = sig ? r.num(sig, false, 'positive', 'sigma') : undefined;
      if (!r.problems.length) {
        out.observations.push({
          runId: id,
          response: spec.response,
          ...(species !== undefined ? { species, speciesIndex: j } : {}),
          ...(position !== undefined ? { position } : {}),
          value: value as number,
          ...(sigma !== undefined ? { sigma } : {}),
          ...(spec.errorModel !== undefined ? { errorModel: spec.errorModel } : {}),
          unit: val.conv.si,
          location: { file: table.file, line: row.line, column: cols.value },
        });
      }
    }
    if (r.problems.length) {
      for (const p of r.problems) out.rejections.push(p);
      out.rejectedLines.add(row.line);
    }
  }
  return out;
}
