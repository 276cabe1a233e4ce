/**
 * Column mapping: turn CSV rows into SI run conditions and observations, one row at a time.
 * Problems with a single row (empty required cell, unreadable number, negative flow, wrong number
 * of cells, unknown species) reject that row and are listed; problems with the mapping itself
 * (missing column, unknown unit, missing field for the reactor kind) are RateloomErrors, because
 * they are mistakes in the study file, not in the data.
 * Ideal gas for fractions with a volumetric flow: F_T0 = P0 v0 / (R T0), R = 8.314 462 618 J/(mol K)
 * (exact since the 2019 SI redefinition, SI Brochure 9th ed.).
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors';
import type { Phase, ReactorKind } from '../reactors/types';
import { unitFor, type Quantity, type UnitConversion } from '../units';
import { columnIndex, type CsvRow, type CsvTable } from './csv';
import type { Rejection } from './report';
import type { FieldSpec, LongSourceSpec, MeasureSpec, MeasuredSpec, PerRunSourceSpec, ResponseKind } from './spec';

/** Molar gas constant, J/(mol K): exact (SI Brochure 9th ed., k_B N_A). */
export const GAS_CONSTANT = 8.314462618;

export interface MappingContext {
  speciesNames: readonly string[];
  kind: ReactorKind;
  phase: Phase;
  /** Names of the study's error models, to check references. */
  errorModelNames: readonly string[];
  /** Path of this source in the study, for example ['data', 0]. */
  path: FieldPath;
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
  layout: 'per-run' | 'long';
  rowsIn: number;
  runs: MappedRun[];
  observations: MappedObservation[];
  rejections: Rejection[];
  /** Lines of rejected rows. */
  rejectedLines: Set<number>;
}

const RESPONSE_QUANTITY: Record<ResponseKind, Quantity> = {
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
interface Prepared {
  name: string;
  column?: number;
  header?: string;
  constant?: number;
  conv: UnitConversion;
}

function ambientSI(spec: MeasureSpec | undefined, path: FieldPath): number | undefined {
  if (!spec) return undefined;
  return unitFor('pressure', spec.unit, { path: [...path, 'ambientPressure', 'unit'] }).toSI(spec.value);
}

function prepare(table: CsvTable, name: string, f: FieldSpec, q: Quantity, path: FieldPath, ambient?: number): Prepared {
  const hasColumn = typeof f.column === 'string';
  const hasValue = typeof f.value === 'number';
  if (hasColumn === hasValue) {
    throw new RateloomError('E_SCHEMA', `give exactly one of 'column' and 'value' for ${name}`, { path, fix: `Write {"column": "<header>", "unit": "..."} or {"value": <number>, "unit": "..."}.` });
  }
  if (f.gauge && q !== 'pressure') throw new RateloomError('E_SCHEMA', `'gauge' applies to pressures only, not ${name}`, { path: [...path, 'gauge'] });
  const conv = unitFor(q, f.unit, { path: [...path, 'unit'], gauge: f.gauge === true, ...(ambient !== undefined ? { ambientPressure: ambient } : {}) });
  if (hasColumn) return { name, column: columnIndex(table, f.column as string, [...path, 'column']), header: f.column as string, conv };
  return { name, constant: conv.toSI(f.value as number), conv };
}

function speciesIdx(ctx: MappingContext, name: string, path: FieldPath): number {
  const j = ctx.speciesNames.indexOf(name);
  if (j >= 0) return j;
  const near = closestName(name, ctx.speciesNames);
  throw new RateloomError('E_UNKNOWN_SPECIES', `unknown species '${name}'${near ? ` (did you mean '${near}'?)` : ''}`, {
    path,
    details: { species: name, ...(near ? { closest: near } : {}) },
  });
}

function checkErrorModel(ctx: MappingContext, name: string | undefined, path: FieldPath): void {
  if (name === undefined || ctx.errorModelNames.includes(name)) return;
  const near = closestName(name, ctx.errorModelNames);
  throw new RateloomError('E_VALUE', `error model '${name}' is not defined in errorModels${near ? ` (did you mean '${near}'?)` : ''}`, {
    path,
    fix: `Define '${name}' under errorModels or use one of: ${ctx.errorModelNames.join(', ') || '(none defined)'}.`,
    ...(near ? { details: { closest: near } } : {}),
  });
}

/** Reads cells of one row at a time (reset per row), collecting problems instead of throwing. */
class RowReader {
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
  num(p: Prepared, required: boolean, min: 'nonneg' | 'positive' | 'any', what = p.name): number | undefined {
    if (p.constant !== undefined) return p.constant;
    const header = p.header as string;
    const raw = this.text(p.column as number);
    if (raw === '') {
      if (required) this.reject('missing', `${what} is required but the cell is empty`, header);
      return undefined;
    }
    if (!NUMBER_RE.test(raw)) {
      this.reject('non-numeric', `'${raw}' is not a number (${what})`, header);
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

function prepareSpecies(table: CsvTable, ctx: MappingContext, map: Record<string, FieldSpec> | undefined, label: string, q: Quantity, path: FieldPath) {
  if (!map) return undefined;
  return Object.entries(map).map(([sp, f]) => ({ j: speciesIdx(ctx, sp, [...path, sp]), p: prepare(table, `${label} of ${sp}`, f, q, [...path, sp]) }));
}

/** Map a per-run source: one run (and its measured outlet values) per row. */
export function mapPerRunSource(table: CsvTable, spec: PerRunSourceSpec, ctx: MappingContext): MappedSource {
  const cols = spec.columns;
  const path = [...ctx.path, 'columns'];
  const nS = ctx.speciesNames.length;
  const ambient = ambientSI(spec.ambientPressure, ctx.path);
  const runCol = columnIndex(table, cols.run, [...path, 'run']);
  const groupCol = cols.group !== undefined ? columnIndex(table, cols.group, [...path, 'group']) : undefined;
  const T = prepare(table, 'temperature', cols.temperature, 'temperature', [...path, 'temperature']);
  const P = cols.pressure ? prepare(table, 'pressure', cols.pressure, 'pressure', [...path, 'pressure'], ambient) : undefined;
  const sizeField = SIZE_FIELD[ctx.kind];
  const W = cols.catalystMass ? prepare(table, 'catalyst mass', cols.catalystMass, 'mass', [...path, 'catalystMass']) : undefined;
  const V = cols.volume ? prepare(table, 'volume', cols.volume, 'volume', [...path, 'volume']) : undefined;
  const t = cols.time ? prepare(table, 'time', cols.time, 'time', [...path, 'time']) : undefined;
  const size = sizeField === 'catalystMass' ? W : sizeField === 'volume' ? V : t;
  if (!size && sizeField !== 'time') {
    throw new RateloomError('E_MISSING_FIELD', `a ${ctx.kind} reactor needs '${sizeField}' in the column mapping`, { path: [...path, sizeField] });
  }
  if (ctx.phase === 'gas' && !P) {
    throw new RateloomError('E_MISSING_FIELD', "gas-phase data need 'pressure' in the column mapping", { path: [...path, 'pressure'] });
  }
  const feed = prepareSpecies(table, ctx, cols.feed, 'feed flow', 'molar-flow', [...path, 'feed']);
  const total = cols.totalFeed ? prepare(table, 'total feed', cols.totalFeed, 'molar-flow', [...path, 'totalFeed']) : undefined;
  const fractions = prepareSpecies(table, ctx, cols.feedFractions, 'feed fraction', 'dimensionless', [...path, 'feedFractions']);
  const v0 = cols.volumetricFlow ? prepare(table, 'volumetric flow', cols.volumetricFlow, 'volumetric-flow', [...path, 'volumetricFlow']) : undefined;
  const cin = prepareSpecies(table, ctx, cols.inletConcentrations, 'inlet concentration', 'concentration', [...path, 'inletConcentrations']);
  const c0 = prepareSpecies(table, ctx, cols.initialConcentrations, 'initial concentration', 'concentration', [...path, 'initialConcentrations']);
  const V0 = cols.initialVolume ? prepare(table, 'initial volume', cols.initialVolume, 'volume', [...path, 'initialVolume']) : undefined;

  const isBatch = ctx.kind === 'batch';
  const isSemi = ctx.kind === 'semibatch';
  const feedWays = [feed ? 1 : 0, total && fractions ? 1 : 0, v0 && cin ? 1 : 0, v0 && fractions && !total && ctx.phase === 'gas' ? 1 : 0].reduce((a, b) => a + b, 0);
  if (!isBatch && !isSemi && feedWays === 0) {
    throw new RateloomError('E_MISSING_FIELD', `a ${ctx.kind} reactor needs its feed: 'feed' flows, or 'totalFeed' with 'feedFractions', or 'volumetricFlow' with 'inletConcentrations' (or with 'feedFractions' for a gas)`, { path: [...path, 'feed'] });
  }
  if (total && !fractions) throw new RateloomError('E_MISSING_FIELD', "'totalFeed' needs 'feedFractions'", { path: [...path, 'feedFractions'] });
  if (ctx.phase === 'liquid' && !isBatch && !v0) {
    throw new RateloomError('E_MISSING_FIELD', `liquid-phase ${ctx.kind} data need 'volumetricFlow'`, { path: [...path, 'volumetricFlow'] });
  }
  if (isBatch && !c0 && !(fractions && ctx.phase === 'gas')) {
    throw new RateloomError('E_MISSING_FIELD', "batch data need 'initialConcentrations' (or 'feedFractions' with pressure for a gas)", { path: [...path, 'initialConcentrations'] });
  }
  if (isSemi && (!c0 || !V0)) {
    throw new RateloomError('E_MISSING_FIELD', "semibatch data need 'initialConcentrations' and 'initialVolume'", { path: [...path, c0 ? 'initialVolume' : 'initialConcentrations'] });
  }

  const measured = (cols.measured ?? []).map((m, i) => {
    const mp = [...path, 'measured', i];
    const needsSpecies = m.response !== 'outlet-pressure';
    if (needsSpecies && m.species === undefined) throw new RateloomError('E_MISSING_FIELD', `response '${m.response}' needs 'species'`, { path: [...mp, 'species'] });
    const j = m.species !== undefined ? speciesIdx(ctx, m.species, [...mp, 'species']) : undefined;
    checkErrorModel(ctx, m.errorModel, [...mp, 'errorModel']);
    const p = prepare(table, `${m.response}${m.species ? ` of ${m.species}` : ''}`, { column: m.column, unit: m.unit, ...(m.gauge ? { gauge: true } : {}) }, RESPONSE_QUANTITY[m.response], mp, ambient);
    const sigma = m.sigmaColumn !== undefined ? { ...p, name: `sigma of ${p.name}`, column: columnIndex(table, m.sigmaColumn, [...mp, 'sigmaColumn']), header: m.sigmaColumn, conv: { ...p.conv, toSI: (x: number) => x * p.conv.factor } } : undefined;
    return { m, j, p, sigma };
  });

  const out: MappedSource = { file: table.file, layout: 'per-run', rowsIn: table.rows.length, runs: [], observations: [], rejections: [], rejectedLines: new Set() };
  const r = new RowReader(table);
  const nCols = table.header.length;
  const needPressure = ctx.phase === 'gas';
  const needFlow = ctx.phase === 'liquid' && !isBatch;
  const measuredMin = measured.map(({ m }) => (m.response === 'outlet-flow' || m.response === 'outlet-concentration' || m.response === 'outlet-pressure' ? 'nonneg' : 'any'));
  const obs: MappedObservation[] = [];

  /** One row; its observations go to `obs`, its run (when the row has no problem) to out.runs. */
  function readPerRunRow(row: CsvRow): void {
    const id = r.text(runCol);
    if (id === '') r.reject('missing', 'run id is empty', cols.run);
    const group = groupCol !== undefined ? r.text(groupCol) : undefined;
    if (groupCol !== undefined && group === '') r.reject('missing', 'run group is empty', cols.group);
    const temperature = r.num(T, true, 'positive');
    const pressure = P ? r.num(P, needPressure, 'positive') : undefined;
    const sz = size ? r.num(size, true, 'nonneg') : undefined;
    const catalystMass = W && size !== W ? r.num(W, false, 'nonneg') : undefined;
    let feedVec: Float64Array | undefined;
    const volumetricFlow = v0 ? r.num(v0, needFlow, 'nonneg') : undefined;
    if (feed) {
      feedVec = new Float64Array(nS);
      for (let k = 0; k < feed.length; k++) feedVec[feed[k].j] = r.num(feed[k].p, true, 'nonneg') ?? 0;
    } else if (fractions && (total || (volumetricFlow !== undefined && ctx.phase === 'gas' && !isBatch))) {
      let FT: number | undefined;
      if (total) FT = r.num(total, true, 'nonneg');
      else if (volumetricFlow !== undefined && pressure !== undefined && temperature !== undefined) FT = (pressure * volumetricFlow) / (GAS_CONSTANT * temperature);
      feedVec = new Float64Array(nS);
      for (const { j, p } of fractions) {
        const y = r.num(p, true, 'nonneg');
        if (y !== undefined && y > 1 + 1e-9) r.reject('out-of-range', `feed fraction of ${ctx.speciesNames[j]} is above 1 (${y})`, p.header);
        feedVec[j] = (y ?? 0) * (FT ?? 0);
      }
    } else if (cin && volumetricFlow !== undefined) {
      feedVec = new Float64Array(nS);
      for (const { j, p } of cin) feedVec[j] = (r.num(p, true, 'nonneg') ?? 0) * volumetricFlow;
    }
    let initial: Float64Array | undefined;
    if (c0) {
      initial = new Float64Array(nS);
      for (const { j, p } of c0) initial[j] = r.num(p, true, 'nonneg') ?? 0;
    } else if (isBatch && fractions && pressure !== undefined && temperature !== undefined) {
      initial = new Float64Array(nS);
      const CT = pressure / (GAS_CONSTANT * temperature);
      for (const { j, p } of fractions) initial[j] = (r.num(p, true, 'nonneg') ?? 0) * CT;
    }
    const initialVolume = V0 ? r.num(V0, isSemi, 'nonneg') : undefined;
    const file = table.file;
    const line = row.line;
    obs.length = 0;
    for (let k = 0; k < measured.length; k++) {
      const { m, j, p, sigma } = measured[k];
      const value = r.num(p, false, measuredMin[k]);
      if (value === undefined) continue; // an empty measured cell is simply not measured
      const s = sigma ? r.num(sigma, false, 'positive') : undefined;
      obs.push(newObservation(id, m, j, value, s, p.conv.si, { file, line, column: m.column }));
    }
    if (r.problems.length) return;
    const run = { id } as MappedRun;
    if (group !== undefined) run.group = group;
    run.temperature = temperature as number;
    if (pressure !== undefined) run.pressure = pressure;
    if (sz !== undefined) run.size = sz;
    if (catalystMass !== undefined) run.catalystMass = catalystMass;
    if (feedVec) run.feed = feedVec;
    if (volumetricFlow !== undefined) run.volumetricFlow = volumetricFlow;
    if (initial) run.initialConcentrations = initial;
    if (initialVolume !== undefined) run.initialVolume = initialVolume;
    run.location = { file, line };
    out.runs.push(run);
    for (let k = 0; k < obs.length; k++) out.observations.push(obs[k]);
  }

  const rows = table.rows;
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i];
    r.reset(row);
    if (row.cells.length !== nCols) {
      r.reject('column-count', `row has ${row.cells.length} cells, the header has ${nCols}`);
    } else {
      readPerRunRow(row);
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
  const out: MappedSource = { file: table.file, layout: 'long', rowsIn: table.rows.length, runs: [], observations: [], rejections: [], rejectedLines: new Set() };
  const r = new RowReader(table);
  for (const row of table.rows) {
    r.reset(row);
    if (row.cells.length !== table.header.length) {
      r.reject('column-count', `row has ${row.cells.length} cells, the header has ${table.header.length}`);
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
