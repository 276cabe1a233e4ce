/**
 * Loading the `labData` section: one row per run of analyser fractions (wet or dry basis) matched
 * to the runs of the per-run sources by id. Each row is checked (fractions summing above 1 beyond
 * the tolerance, the standard's fraction missing or zero, no standard in the feed: errors naming
 * the row), turned into the observations the study fits (src/study/lab-measures.ts) and into the
 * derived quantities `check` shows: flows from the internal standard, conversion, selectivity,
 * yield and the element balance closure (outside the tolerance: warned, the run is kept).
 */
import type { Chemistry } from '../chemistry/mechanism.js';
import { RateloomError, closestName } from '../core/errors.js';
import { columnIndex, type CsvRow, type CsvTable } from '../data/csv.js';
import { conversionFromStandard, elementClosure, flowFromStandard, selectivity, yieldOf } from '../data/lab-arithmetic.js';
import { unitFor } from '../units/index.js';
import type { LabConfig } from './lab-config.js';
import { labMeasures } from './lab-measures.js';
import type { LabData, LabRunDerived, LabSkipped } from './lab-types.js';
import type { Observation, StudyRun } from './types.js';

const NUMBER_RE = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** One row of the lab file, read. */
interface LabRow {
  runIndex: number;
  line: number;
  /** Fractions (mol/mol) by species index; NaN = not measured. */
  y: Float64Array;
  time?: number;
}

export interface LoadedLab {
  lab: LabData;
  /** Lab observations without their index (the loader numbers them after the others). */
  observations: Omit<Observation, 'index'>[];
  /** Run index -> time on stream (s) or sequence number. */
  times: Map<number, number>;
}

function rowError(table: CsvTable, line: number, problem: string, fix: string, column?: string): RateloomError {
  return new RateloomError('E_DATA', problem, { path: ['labData'], location: { file: table.file, line, ...(column ? { column } : {}) }, fix });
}

function cellNumber(table: CsvTable, row: CsvRow, col: number, what: string): number {
  const raw = (row.cells[col] ?? '').trim();
  if (raw === '') return NaN;
  if (!NUMBER_RE.test(raw)) throw rowError(table, row.line, `'${raw}' is not a number (${what}, column '${table.header[col]}')`, 'Write a plain number or leave the cell empty.', table.header[col]);
  return Number(raw);
}

function timeReader(table: CsvTable, cfg: LabConfig): ((row: CsvRow) => number) | undefined {
  const t = cfg.spec.timeOnStream;
  if (t?.column !== undefined) {
    const col = columnIndex(table, t.column, ['labData', 'timeOnStream', 'column']);
    const conv = unitFor('time', t.unit, { path: ['labData', 'timeOnStream', 'unit'] });
    return (row) => conv.toSI(cellNumber(table, row, col, 'time on stream'));
  }
  if (cfg.spec.sequence !== undefined) {
    const col = columnIndex(table, cfg.spec.sequence, ['labData', 'sequence']);
    return (row) => cellNumber(table, row, col, 'sequence number');
  }
  return undefined;
}

/** Check one row's fractions against the rules; throws naming the row. */
function checkRow(table: CsvTable, row: LabRow, cfg: LabConfig, run: StudyRun, chem: Chemistry): void {
  let sum = 0;
  for (const { j } of cfg.columns) if (Number.isFinite(row.y[j])) sum += row.y[j];
  if (sum > 1 + cfg.sumTolerance) {
    throw rowError(table, row.line, `the measured fractions of run '${run.id}' sum to ${sum.toPrecision(4)}, above 1 by more than the tolerance ${cfg.sumTolerance}`, "Check the fraction unit ('1', '%' or 'ppm') and the analyser calibration, or raise labData.sumTolerance.");
  }
  const s = cfg.standard;
  if (s === undefined) return;
  const name = chem.speciesNames[s];
  const column = cfg.spec.fractions[name];
  if (!Number.isFinite(row.y[s])) throw rowError(table, row.line, `the internal standard '${name}' has no fraction in run '${run.id}'`, 'Give the standard\'s fraction in every run: the outlet flows are scaled by it.', column);
  if (!(row.y[s] > 0)) throw rowError(table, row.line, `the internal standard '${name}' has fraction ${row.y[s]} in run '${run.id}'; the flows would divide by zero`, 'Check the analyser peak of the standard.', column);
  if (!((run.feed?.[s] ?? 0) > 0)) throw rowError(table, row.line, `run '${run.id}' feeds no '${name}', so it cannot serve as internal standard`, `Give the feed flow (or feed fraction) of ${name} in the per-run source.`);
}

/**
 * A lab row whose run id matches no surviving run: an error naming the row when no per-run source
 * defines the id at all (a typo), else the row of a rejected run, returned to be listed as skipped.
 */
function unmatchedRow(table: CsvTable, line: number, id: string, runCol: number, definedIds: ReadonlySet<string> | undefined, runIds: () => string[]): LabSkipped {
  if (definedIds && !definedIds.has(id)) {
    const near = closestName(id, runIds());
    throw rowError(table, line, `the lab row names run '${id}', which no per-run source defines${near ? ` (did you mean '${near}'?)` : ''}`, 'Use the run ids of the per-run source in the lab file, or add the run there.', table.header[runCol]);
  }
  return { runId: id, line };
}

function readRows(table: CsvTable, cfg: LabConfig, runIndex: ReadonlyMap<string, number>, runs: readonly StudyRun[], chem: Chemistry, definedIds?: ReadonlySet<string>): { rows: LabRow[]; skipped: LabSkipped[] } {
  const runCol = columnIndex(table, cfg.spec.run, ['labData', 'run']);
  const cols = cfg.columns.map(({ j, column }) => ({ j, col: columnIndex(table, column, ['labData', 'fractions', chem.speciesNames[j]]) }));
  const time = timeReader(table, cfg);
  const nS = chem.speciesNames.length;
  const out: LabRow[] = [];
  const skipped: LabSkipped[] = [];
  for (const row of table.rows) {
    const id = (row.cells[runCol] ?? '').trim();
    const r = runIndex.get(id);
    if (r === undefined) {
      skipped.push(unmatchedRow(table, row.line, id, runCol, definedIds, () => [...(definedIds ?? runIndex.keys())]));
      continue;
    }
    const y = new Float64Array(nS).fill(NaN);
    for (const { j, col } of cols) y[j] = cellNumber(table, row, col, `fraction of ${chem.speciesNames[j]}`) * cfg.unitFactor;
    for (const { j, col } of cols) if (y[j] < 0) throw rowError(table, row.line, `the fraction of ${chem.speciesNames[j]} is negative (${y[j]})`, 'Fractions are 0 or above.', table.header[col]);
    const t = time?.(row);
    const lr: LabRow = { runIndex: r, line: row.line, y, ...(t !== undefined && Number.isFinite(t) ? { time: t } : {}) };
    checkRow(table, lr, cfg, runs[r], chem);
    out.push(lr);
  }
  return { rows: out, skipped };
}

/** Flows, conversion, selectivity, yield and element closure of one row (needs the standard). */
function derive(row: LabRow, run: StudyRun, cfg: LabConfig, chem: Chemistry): LabRunDerived {
  const d: LabRunDerived = { runId: run.id, line: row.line, fractionSum: cfg.columns.reduce((a, { j }) => a + (Number.isFinite(row.y[j]) ? row.y[j] : 0), 0) };
  if (row.time !== undefined) d.time = row.time;
  const s = cfg.standard;
  const feed = run.feed;
  if (s === undefined || !feed) return d;
  const names = chem.speciesNames;
  const F = new Float64Array(names.length).fill(NaN);
  d.flows = {};
  for (const { j } of cfg.columns) if (Number.isFinite(row.y[j])) d.flows[names[j]] = F[j] = flowFromStandard(row.y[j], row.y[s], feed[s]);
  d.conversion = {};
  for (const a of cfg.conversion) if (Number.isFinite(row.y[a]) && feed[a] > 0) d.conversion[names[a]] = conversionFromStandard(row.y[a], row.y[s], feed[a], feed[s]);
  d.selectivity = {};
  d.yield = {};
  for (const p of cfg.pairs) {
    if (!Number.isFinite(F[p.product]) || !Number.isFinite(F[p.reactant])) continue;
    d.selectivity[p.label] = selectivity(F[p.product], feed[p.product], F[p.reactant], feed[p.reactant], p.factor);
    d.yield[p.label] = yieldOf(F[p.product], feed[p.product], feed[p.reactant], p.factor);
  }
  d.closure = closures(F, feed, cfg, chem);
  d.outside = Object.entries(d.closure).filter(([, c]) => Math.abs(c - 1) > cfg.balanceTolerance).map(([e]) => e);
  return d;
}

/** Closure of each checked element whose carriers are all measured (or absent from feed and outlet). */
function closures(F: Float64Array, feed: Float64Array, cfg: LabConfig, chem: Chemistry): Record<string, number> {
  const nS = chem.speciesNames.length;
  const out: Record<string, number> = {};
  for (const e of cfg.elements) {
    const atoms = chem.elementMatrix.subarray(e * nS, (e + 1) * nS);
    let complete = true;
    for (let k = 0; k < nS; k++) if (atoms[k] > 0 && !Number.isFinite(F[k])) complete = false;
    if (!complete) continue;
    const c = elementClosure(atoms, feed, F);
    if (c !== null) out[chem.elements[e]] = c;
  }
  return out;
}

/**
 * Load the lab file's rows for the surviving runs: observations, derived quantities, times.
 * `definedIds`: every run id the per-run sources define (rejected runs included); a lab row naming
 * another id is an error. Rows of rejected runs are listed in `lab.skipped`.
 */
export function loadLabRows(table: CsvTable, cfg: LabConfig, runs: readonly StudyRun[], runIndex: ReadonlyMap<string, number>, chem: Chemistry, definedIds?: ReadonlySet<string>): LoadedLab {
  const { rows, skipped } = readRows(table, cfg, runIndex, runs, chem, definedIds);
  const observations: Omit<Observation, 'index'>[] = [];
  const times = new Map<number, number>();
  const derived: LabRunDerived[] = [];
  const warnings: string[] = [];
  for (const row of rows) {
    const run = runs[row.runIndex];
    if (row.time !== undefined) times.set(row.runIndex, row.time);
    const d = derive(row, run, cfg, chem);
    derived.push(d);
    for (const e of d.outside ?? []) warnings.push(`${table.file}:${row.line}: run '${run.id}' closes the ${e} balance at ${(100 * (d.closure?.[e] ?? NaN)).toFixed(1)} %, outside 100 +/- ${(100 * cfg.balanceTolerance).toFixed(1)} % (kept in the fit)`);
    for (const m of labMeasures(cfg, row.y, run.feed ?? new Float64Array(chem.speciesNames.length))) {
      const o = { runId: run.id, runIndex: row.runIndex, response: m.kind, species: chem.speciesNames[m.species], speciesIndex: m.species, value: m.value, unit: '1', errorModel: cfg.errorModel.name, location: { file: table.file, line: row.line, column: m.column } } as Omit<Observation, 'index'>;
      if (m.sigma !== undefined) o.sigma = m.sigma;
      if (m.loadings) o.errorLoadings = m.loadings;
      if (m.terms) o.lab = m.terms;
      observations.push(o);
    }
  }
  const lab: LabData = {
    file: table.file,
    basis: cfg.spec.basis ?? 'wet',
    removed: chem.speciesNames.filter((_, j) => cfg.removed[j]),
    ...(cfg.standard !== undefined ? { standard: chem.speciesNames[cfg.standard] } : {}),
    fit: cfg.fit,
    species: cfg.columns.map(({ j }) => chem.speciesNames[j]),
    sumTolerance: cfg.sumTolerance,
    balanceTolerance: cfg.balanceTolerance,
    ...(cfg.spec.timeOnStream ? { timeUnit: 's' as const } : cfg.spec.sequence !== undefined ? { timeUnit: 'run' as const } : {}),
    derived,
    warnings,
    skipped,
  };
  return { lab, observations, times };
}
