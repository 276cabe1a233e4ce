/**
 * The candidate set of the planner: a full grid over the factors the limits vary (evenly spaced
 * levels, ends included), every other run condition held at the value most of the study's runs
 * used. Candidates are written as rows in the study's own CSV layout and read back through the
 * study's column mapping (data/mapping.ts), so the runs planned on are exactly the runs the CSV
 * handed to the lab describes.
 */
import { RateloomError } from '../core/errors.js';
import { readCsv } from '../data/csv.js';
import { RESPONSE_QUANTITY, mapPerRunSource } from '../data/mapping.js';
import type { PerRunSourceSpec } from '../data/spec.js';
import { DEFAULT_ERROR_MODEL, type Observation, type Study, type StudyRun } from '../study/types.js';
import { unitFor } from '../units/index.js';
import { fieldValueSI, inputColumns, rowsCsv, type PlannedRow } from './layout.js';
import type { Factor, LabLimits } from './limits.js';

/** Candidate grids above this size are refused (lower the levels). */
export const MAX_CANDIDATES = 20000;

export interface CandidateSet {
  /** Rows in the study's layout (SI values by column key). */
  rows: PlannedRow[];
  /** Per candidate: each factor scaled to 0..1 over its range. */
  points: Float64Array[];
  /** The candidate runs as the study's mapping reads them. */
  runs: StudyRun[];
  /** Held conditions: column key -> SI value. */
  held: Map<string, number>;
}

/** The most common value of a column over the study's runs (ties: the smaller). */
function heldValue(values: number[]): number {
  const counts = new Map<number, number>();
  for (const v of values) {
    const key = Number(v.toPrecision(9));
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  let best = NaN;
  let n = -1;
  for (const [v, c] of [...counts.entries()].sort((a, b) => a[0] - b[0])) {
    if (c > n) {
      best = v;
      n = c;
    }
  }
  return best;
}

/** SI values of the conditions the plan does not vary. */
export function heldConditions(study: Study, src: PerRunSourceSpec, factors: readonly Factor[]): Map<string, number> {
  const varied = new Set(factors.map((f) => f.key));
  const held = new Map<string, number>();
  for (const col of inputColumns(src)) {
    if (varied.has(col.key)) continue;
    const vals = study.runs.map((r) => fieldValueSI(r, col, study.chemistry.speciesNames)).filter((v): v is number => v !== undefined && Number.isFinite(v));
    if (!vals.length) throw new RateloomError('E_DATA', `no run of the study gives '${col.key}', so the plan cannot hold it`, { path: ['factors', col.key], fix: `Add '${col.key}' to the limits.` });
    held.set(col.key, heldValue(vals));
  }
  return held;
}

function gridSize(factors: readonly Factor[]): number {
  return factors.reduce((n, f) => n * f.levels, 1);
}

/** Every grid point: scaled coordinates and SI values per factor. */
function gridPoints(factors: readonly Factor[]): Float64Array[] {
  const total = gridSize(factors);
  const out: Float64Array[] = [];
  for (let i = 0; i < total; i++) {
    const u = new Float64Array(factors.length);
    let rest = i;
    for (let k = factors.length - 1; k >= 0; k--) {
      const L = factors[k].levels;
      u[k] = (rest % L) / (L - 1);
      rest = Math.floor(rest / L);
    }
    out.push(u);
  }
  return out;
}

/** SI value of a factor at scaled coordinate u. */
export function factorValue(f: Factor, u: number): number {
  return f.min + u * (f.max - f.min);
}

/** Rows for scaled points (ids 'id1', 'id2', ...). */
export function rowsFor(points: readonly Float64Array[], factors: readonly Factor[], held: ReadonlyMap<string, number>, prefix: string, group?: string): PlannedRow[] {
  return points.map((u, i) => {
    const values = new Map(held);
    factors.forEach((f, k) => values.set(f.key, factorValue(f, u[k])));
    return { id: `${prefix}${i + 1}`, ...(group !== undefined ? { group } : {}), values };
  });
}

/** Read planned rows back through the study's column mapping: the runs they describe. */
export function mapRows(study: Study, src: PerRunSourceSpec, rows: readonly PlannedRow[]): StudyRun[] {
  const table = readCsv(rowsCsv(src, rows), 'planned runs');
  const mapped = mapPerRunSource(table, src, {
    speciesNames: study.chemistry.speciesNames,
    kind: study.reactor.kind,
    phase: study.reactor.phase,
    errorModelNames: Object.keys(study.errorModels),
    path: ['data', 0],
  });
  if (mapped.rejections.length) {
    const r = mapped.rejections[0];
    throw new RateloomError('E_VALUE', `a planned run is not a valid run of the study: ${r.message}`, { path: ['factors'], fix: 'Keep the limits inside what the study accepts (positive sizes and flows, fractions at most 1).' });
  }
  return mapped.runs.map((r) => ({ ...r, size: r.size ?? 0 }) as StudyRun);
}

/** The candidate grid of the limits for a study. */
export function buildCandidates(study: Study, src: PerRunSourceSpec, limits: LabLimits): CandidateSet {
  const total = gridSize(limits.factors);
  if (total > MAX_CANDIDATES) {
    throw new RateloomError('E_VALUE', `the candidate grid has ${total} runs (limit ${MAX_CANDIDATES})`, { path: ['levels'], fix: 'Lower "levels" (or per-factor levels) in the limits file.' });
  }
  const held = heldConditions(study, src, limits.factors);
  const points = gridPoints(limits.factors);
  const group = commonGroup(study);
  const rows = rowsFor(points, limits.factors, held, 'cand', group);
  return { rows, points, runs: mapRows(study, src, rows), held };
}

/** The group most runs belong to (per-run-group parameters), or undefined. */
export function commonGroup(study: Study): string | undefined {
  const groups = study.runs.map((r) => r.group).filter((g): g is string => g !== undefined);
  if (!groups.length) return undefined;
  const counts = new Map<string, number>();
  for (const g of groups) counts.set(g, (counts.get(g) ?? 0) + 1);
  return [...counts.entries()].sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))[0][0];
}

/**
 * A study whose runs are the given runs, each with one observation per measured column of the
 * per-run source (value 0: only the model's predictions and sensitivities are used).
 */
export function studyOfRuns(study: Study, src: PerRunSourceSpec, runs: readonly StudyRun[]): Study {
  const observations: Observation[] = [];
  const measured = src.columns.measured ?? [];
  if (!measured.length) throw new RateloomError('E_DATA', "the study's per-run source measures nothing, so planned runs would add no information", { path: ['data', 0, 'columns', 'measured'] });
  runs.forEach((run, runIndex) => {
    for (const m of measured) {
      const unit = unitFor(RESPONSE_QUANTITY[m.response], m.unit).si;
      const j = m.species !== undefined ? study.chemistry.speciesNames.indexOf(m.species) : undefined;
      observations.push({
        index: observations.length,
        runId: run.id,
        runIndex,
        response: m.response,
        ...(m.species !== undefined ? { species: m.species, speciesIndex: j } : {}),
        value: 0,
        unit,
        errorModel: m.errorModel ?? DEFAULT_ERROR_MODEL,
        location: run.location,
      });
    }
  });
  return { ...study, runs: [...runs], observations, replicateGroups: [] };
}
