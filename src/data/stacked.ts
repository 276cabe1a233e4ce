/**
 * The stacked layout: one row per run and species, the run's conditions repeated on each of its
 * rows. Rows are grouped by run id (in order of first appearance); the conditions are read from
 * the first row of a run and every other row must repeat them cell for cell. Each row gives one
 * species' inlet amount (feed molar flow, inlet concentration with the volumetric flow, or the
 * initial concentration of a batch run; its unit tells which) and its measured outlet amount
 * (outlet-flow or outlet-concentration). A problem in any row rejects the whole run, naming the row.
 * Element balances need a whole run on one row, so they are not checked for this layout.
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import { unitFor } from '../units/index.js';
import { columnIndex, type CsvRow, type CsvTable } from './csv.js';
import { RowReader, SIZE_FIELD, ambientSI, checkErrorModel, columnCountMessage, prepare, type MappedObservation, type MappedRun, type MappedSource, type MappingContext, type Prepared } from './mapping.js';
import { PHYSICAL_RANGES } from './ranges.js';
import type { StackedAmountSpec, StackedSourceSpec } from './spec.js';

/** An amount column prepared: which kind of quantity its unit names. */
interface Amount {
  kind: 'molar-flow' | 'concentration';
  p: Prepared;
}

interface StackedPlan {
  runCol: number;
  speciesCol: number;
  T: Prepared;
  P?: Prepared;
  size?: Prepared;
  v0?: Prepared;
  inlet?: Amount;
  outlet: Amount;
  /** Column indices whose cells must repeat on every row of a run. */
  conditionCols: number[];
}

/** Molar flow or concentration, from the unit; anything else is a mistake in the study file. */
function prepareAmount(table: CsvTable, name: string, spec: StackedAmountSpec, path: FieldPath): Amount {
  for (const kind of ['molar-flow', 'concentration'] as const) {
    try {
      unitFor(kind, spec.unit);
    } catch {
      continue;
    }
    return { kind, p: prepare(table, name, spec, kind, path) };
  }
  throw new RateloomError('E_UNIT', `unit '${spec.unit}' of ${name} is neither a molar flow nor a concentration`, {
    path: [...path, 'unit'],
    fix: 'Give a molar-flow unit (mol/s, mmol/min, ...) or a concentration unit (mol/L, mol/m3, ...).',
  });
}

/** Prepare every field once and check that the mapping gives what the reactor kind needs. */
function prepareStacked(table: CsvTable, spec: StackedSourceSpec, ctx: MappingContext): StackedPlan {
  const cols = spec.columns;
  const path = [...ctx.path, 'columns'];
  const ambient = ambientSI(spec.ambientPressure, ctx.path);
  const f = (name: string, key: 'pressure' | 'catalystMass' | 'volume' | 'volumetricFlow', q: Parameters<typeof prepare>[3]) =>
    cols[key] ? prepare(table, name, cols[key], q, [...path, key], key === 'pressure' ? ambient : undefined) : undefined;
  const sizeField = SIZE_FIELD[ctx.kind];
  if (ctx.kind === 'batch' || ctx.kind === 'semibatch') throw new RateloomError('E_VALUE', `the stacked layout holds steady flow runs; a ${ctx.kind} run's samples go in a 'run-file' or 'long' source`, { path: [...ctx.path, 'layout'] });
  const plan: StackedPlan = {
    runCol: columnIndex(table, cols.run, [...path, 'run']),
    speciesCol: columnIndex(table, cols.species, [...path, 'species']),
    T: prepare(table, 'temperature', cols.temperature, 'temperature', [...path, 'temperature']),
    P: f('pressure', 'pressure', 'pressure'),
    size: sizeField === 'catalystMass' ? f('catalyst mass', 'catalystMass', 'mass') : f('volume', 'volume', 'volume'),
    v0: f('volumetric flow', 'volumetricFlow', 'volumetric-flow'),
    ...(cols.inlet ? { inlet: prepareAmount(table, 'inlet amount', cols.inlet, [...path, 'inlet']) } : {}),
    outlet: prepareAmount(table, 'outlet amount', cols.outlet, [...path, 'outlet']),
    conditionCols: [],
  };
  checkErrorModel(ctx, spec.errorModel, [...ctx.path, 'errorModel']);
  if (!plan.size) throw new RateloomError('E_MISSING_FIELD', `a ${ctx.kind} reactor needs '${sizeField}' in the column mapping`, { path: [...path, sizeField] });
  if (ctx.phase === 'gas' && !plan.P) throw new RateloomError('E_MISSING_FIELD', "gas-phase data need 'pressure' in the column mapping", { path: [...path, 'pressure'] });
  if (!plan.inlet) throw new RateloomError('E_MISSING_FIELD', 'a flow reactor needs the inlet amount of each species', { path: [...path, 'inlet'] });
  if ((plan.inlet.kind === 'concentration' || ctx.phase === 'liquid') && !plan.v0) {
    throw new RateloomError('E_MISSING_FIELD', "inlet concentrations and liquid flow runs need 'volumetricFlow'", { path: [...path, 'volumetricFlow'] });
  }
  for (const p of [plan.T, plan.P, plan.size, plan.v0]) if (p?.column !== undefined) plan.conditionCols.push(p.column);
  return plan;
}

/** Rows of each run id in order of first appearance; rows without an id or with the wrong cell count are rejected. */
function groupRows(table: CsvTable, plan: StackedPlan, r: RowReader, out: MappedSource, colRun: string): Map<string, CsvRow[]> {
  const groups = new Map<string, CsvRow[]>();
  for (const row of table.rows) {
    r.reset(row);
    if (row.cells.length !== table.header.length) r.reject('column-count', columnCountMessage(row.cells.length, table.header.length, table.delimiter));
    else if (r.text(plan.runCol) === '') r.reject('missing', 'run id is empty', colRun);
    else {
      const id = r.text(plan.runCol);
      const list = groups.get(id) ?? [];
      list.push(row);
      groups.set(id, list);
    }
    takeProblems(r, out, row.line);
  }
  return groups;
}

function takeProblems(r: RowReader, out: MappedSource, line: number): boolean {
  if (!r.problems.length) return false;
  for (const p of r.problems) out.rejections.push(p);
  out.rejectedLines.add(line);
  return true;
}

/** The conditions of a run from its first row (SI), or undefined when a cell is bad. */
function readConditions(plan: StackedPlan, r: RowReader, ctx: MappingContext): Pick<MappedRun, 'temperature' | 'pressure' | 'size' | 'volumetricFlow'> | undefined {
  const temperature = r.num(plan.T, true, 'positive', plan.T.name, PHYSICAL_RANGES.temperature);
  const pressure = plan.P ? r.num(plan.P, ctx.phase === 'gas', 'positive', plan.P.name, PHYSICAL_RANGES.pressure) : undefined;
  const size = plan.size ? r.num(plan.size, true, 'nonneg') : undefined;
  const volumetricFlow = plan.v0 ? r.num(plan.v0, true, 'positive') : undefined;
  if (r.problems.length || temperature === undefined) return undefined;
  return { temperature, ...(pressure !== undefined ? { pressure } : {}), ...(size !== undefined ? { size } : {}), ...(volumetricFlow !== undefined ? { volumetricFlow } : {}) };
}

/** Read one run's rows into `run.feed` and observations; false (problems recorded) when any row is bad. */
function readSpeciesRows(plan: StackedPlan, rows: CsvRow[], run: MappedRun, ctx: MappingContext, spec: StackedSourceSpec, table: CsvTable, r: RowReader, out: MappedSource, obs: MappedObservation[]): boolean {
  const feed = new Float64Array(ctx.speciesNames.length);
  const seen = new Set<string>();
  let ok = true;
  for (const row of rows) {
    r.reset(row);
    for (const c of plan.conditionCols) {
      if (r.text(c) !== (rows[0].cells[c] ?? '').trim()) r.reject('duplicate-run', `run '${run.id}' has '${rows[0].cells[c]?.trim()}' at ${table.file}:${rows[0].line} but '${r.text(c)}' here: a run's conditions must repeat on each of its rows`, table.header[c]);
    }
    const species = r.text(plan.speciesCol);
    const j = ctx.speciesNames.indexOf(species);
    if (j < 0) r.reject(species === '' ? 'missing' : 'unknown-species', species === '' ? 'species is empty' : `unknown species '${species}'`, spec.columns.species);
    else if (seen.has(species)) r.reject('duplicate-run', `species '${species}' appears twice in run '${run.id}'`, spec.columns.species);
    seen.add(species);
    const inlet = plan.inlet ? r.num(plan.inlet.p, false, 'nonneg') : undefined;
    const value = r.num(plan.outlet.p, false, 'nonneg');
    if (takeProblems(r, out, row.line)) {
      ok = false;
      continue;
    }
    if (inlet !== undefined) feed[j] = plan.inlet?.kind === 'concentration' ? inlet * (run.volumetricFlow as number) : inlet;
    if (value === undefined) continue;
    const response = plan.outlet.kind === 'molar-flow' ? 'outlet-flow' : 'outlet-concentration';
    const o: MappedObservation = { runId: run.id, response, species, speciesIndex: j, value, unit: plan.outlet.p.conv.si, location: { file: table.file, line: row.line, column: spec.columns.outlet.column } };
    if (spec.errorModel !== undefined) o.errorModel = spec.errorModel;
    obs.push(o);
  }
  run.feed = feed;
  return ok;
}

/** Reject every row of a run (its first problem was already recorded). */
function rejectRun(rows: CsvRow[], id: string, file: string, out: MappedSource): void {
  for (const row of rows) {
    if (out.rejectedLines.has(row.line)) continue;
    out.rejections.push({ file, line: row.line, reason: 'run-rejected', message: `run '${id}' was rejected (another of its rows has a problem)` });
    out.rejectedLines.add(row.line);
  }
}

/** Map a stacked source: one run per run id, one observation per row with a measured value. */
export function mapStackedSource(table: CsvTable, spec: StackedSourceSpec, ctx: MappingContext): MappedSource {
  const plan = prepareStacked(table, spec, ctx);
  const out: MappedSource = { file: table.file, layout: 'stacked', rowsIn: table.rows.length, runs: [], observations: [], rejections: [], rejectedLines: new Set() };
  const r = new RowReader(table);
  for (const [id, rows] of groupRows(table, plan, r, out, spec.columns.run)) {
    r.reset(rows[0]);
    const cond = readConditions(plan, r, ctx);
    if (!cond) {
      takeProblems(r, out, rows[0].line);
      rejectRun(rows, id, table.file, out);
      continue;
    }
    const run: MappedRun = { id, ...cond, location: { file: table.file, line: rows[0].line } };
    const obs: MappedObservation[] = [];
    if (!readSpeciesRows(plan, rows, run, ctx, spec, table, r, out, obs)) {
      rejectRun(rows, id, table.file, out);
      continue;
    }
    out.runs.push(run);
    for (const o of obs) out.observations.push(o);
  }
  return out;
}
