/**
 * The run-file layout: one CSV file per batch run, as many lab loggers export it. Each row is a
 * sample: the time, the temperature (a column or one value) and one concentration column per
 * species. The row at time 0 gives the run's initial concentrations (species without a column
 * start at 0); every later row gives outlet-concentration observations at its time. The run id is
 * the source's `run`, else the file name without folders and extension.
 */
import { RateloomError } from '../core/errors.js';
import type { CsvRow, CsvTable } from './csv.js';
import { RowReader, columnCountMessage, checkErrorModel, prepare, speciesIdx, type MappedObservation, type MappedRun, type MappedSource, type MappingContext, type Prepared } from './mapping.js';
import { PHYSICAL_RANGES } from './ranges.js';
import type { RunFileSourceSpec } from './spec.js';

/** The run id of a run-file source: its `run`, else the file name without folders and extension. */
export function runFileId(spec: Pick<RunFileSourceSpec, 'file' | 'run'>): string {
  if (spec.run !== undefined) return spec.run;
  const base = spec.file.split(/[\\/]/).pop() ?? spec.file;
  return base.replace(/\.[^.]*$/, '');
}

interface RunFilePlan {
  t: Prepared;
  T: Prepared;
  P?: Prepared;
  species: { j: number; name: string; column: string; p: Prepared }[];
}

function prepareRunFile(table: CsvTable, spec: RunFileSourceSpec, ctx: MappingContext): RunFilePlan {
  const path = [...ctx.path, 'columns'];
  if (ctx.kind !== 'batch') throw new RateloomError('E_VALUE', `the run-file layout holds the samples of batch runs, not ${ctx.kind} runs`, { path: [...ctx.path, 'layout'] });
  checkErrorModel(ctx, spec.errorModel, [...ctx.path, 'errorModel']);
  const cols = spec.columns;
  if (cols.time.column === undefined) throw new RateloomError('E_MISSING_FIELD', "the run-file layout needs a 'time' column", { path: [...path, 'time', 'column'] });
  const species = Object.entries(cols.species).map(([name, column]) => ({
    j: speciesIdx(ctx, name, [...path, 'species', name]),
    name,
    column,
    p: prepare(table, `concentration of ${name}`, { column, unit: spec.unit }, 'concentration', [...path, 'species', name]),
  }));
  if (!species.length) throw new RateloomError('E_MISSING_FIELD', 'the run-file layout needs at least one species column', { path: [...path, 'species'] });
  return {
    t: prepare(table, 'time', cols.time, 'time', [...path, 'time']),
    T: prepare(table, 'temperature', cols.temperature, 'temperature', [...path, 'temperature']),
    ...(cols.pressure ? { P: prepare(table, 'pressure', cols.pressure, 'pressure', [...path, 'pressure']) } : {}),
    species,
  };
}

/** Read every row's time; rows with a bad time or cell count are rejected. */
function readTimes(table: CsvTable, plan: RunFilePlan, r: RowReader, out: MappedSource): { row: CsvRow; t: number }[] {
  const kept: { row: CsvRow; t: number }[] = [];
  for (const row of table.rows) {
    r.reset(row);
    if (row.cells.length !== table.header.length) r.reject('column-count', columnCountMessage(row.cells.length, table.header.length, table.delimiter));
    const t = r.problems.length ? undefined : r.num(plan.t, true, 'nonneg');
    if (r.problems.length || t === undefined) {
      for (const p of r.problems) out.rejections.push(p);
      out.rejectedLines.add(row.line);
    } else kept.push({ row, t });
  }
  return kept;
}

/** The run from the time-0 row, or undefined (and every row rejected) when it is missing or bad. */
function readInitialRow(first: { row: CsvRow; t: number } | undefined, plan: RunFilePlan, id: string, nS: number, r: RowReader, table: CsvTable): MappedRun | undefined {
  if (!first || first.t !== 0) return undefined;
  r.reset(first.row);
  const temperature = r.num(plan.T, true, 'positive', 'temperature', PHYSICAL_RANGES.temperature);
  const pressure = plan.P ? r.num(plan.P, false, 'positive', 'pressure', PHYSICAL_RANGES.pressure) : undefined;
  const c0 = new Float64Array(nS);
  for (const s of plan.species) c0[s.j] = r.num(s.p, true, 'nonneg') ?? 0;
  if (r.problems.length || temperature === undefined) return undefined;
  return { id, temperature, ...(pressure !== undefined ? { pressure } : {}), initialConcentrations: c0, location: { file: table.file, line: first.row.line } };
}

/** Map a run-file source: one batch run, its samples as outlet-concentration observations over time. */
export function mapRunFileSource(table: CsvTable, spec: RunFileSourceSpec, ctx: MappingContext): MappedSource {
  const plan = prepareRunFile(table, spec, ctx);
  const id = runFileId(spec);
  const out: MappedSource = { file: table.file, layout: 'run-file', rowsIn: table.rows.length, runs: [], observations: [], rejections: [], rejectedLines: new Set() };
  const r = new RowReader(table);
  const rows = readTimes(table, plan, r, out).sort((a, b) => a.t - b.t);
  const run = readInitialRow(rows[0], plan, id, ctx.speciesNames.length, r, table);
  if (!run) {
    const why = rows[0]?.t === 0 ? `its time-0 row (line ${rows[0].row.line}) has a problem: ${r.problems.map((p) => p.message).join('; ')}` : 'no row at time 0 gives the initial concentrations';
    for (const { row } of rows) {
      out.rejections.push({ file: table.file, line: row.line, reason: 'missing', message: `run '${id}' cannot be read: ${why}` });
      out.rejectedLines.add(row.line);
    }
    return out;
  }
  out.runs.push(run);
  for (const { row, t } of rows.slice(1)) {
    r.reset(row);
    const obs: MappedObservation[] = [];
    for (const s of plan.species) {
      const value = r.num(s.p, false, 'nonneg');
      if (value === undefined) continue;
      const o: MappedObservation = { runId: id, response: 'outlet-concentration', species: s.name, speciesIndex: s.j, position: t, value, unit: s.p.conv.si, location: { file: table.file, line: row.line, column: s.column } };
      if (spec.errorModel !== undefined) o.errorModel = spec.errorModel;
      obs.push(o);
    }
    if (r.problems.length) {
      for (const p of r.problems) out.rejections.push(p);
      out.rejectedLines.add(row.line);
    } else for (const o of obs) out.observations.push(o);
  }
  return out;
}
