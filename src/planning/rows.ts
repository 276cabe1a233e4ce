/**
 * Planned runs as rows and as reported runs: ids that do not clash with the study's, every
 * condition with its SI value and its value in the study's own column unit, and the study's old
 * runs placed in the same scaled condition space (for the chart).
 */
import type { PerRunSourceSpec } from '../data/spec.js';
import type { Study } from '../study/types.js';
import { siUnit } from '../units/index.js';
import { fieldValueSI, inputColumns, toColumnUnit, type PlannedRow } from './layout.js';
import { FIELD_QUANTITY, type LabLimits } from './limits.js';
import type { PlanResult, PlannedCondition } from '../report/types.js';

/** A run-id prefix not used by the study ('N', else 'N2', 'N3', ...). */
export function freshPrefix(study: Study, prefix: string, count: number): string {
  const ids = new Set(study.runs.map((r) => r.id));
  for (let k = 1; ; k++) {
    const pre = k === 1 ? prefix : `${prefix}${k}_`;
    let clash = false;
    for (let i = 1; i <= count; i++) if (ids.has(`${pre}${i}`)) clash = true;
    if (!clash) return pre;
  }
}

/** Conditions of a planned row, in the study's column order. */
export function conditionsOf(row: PlannedRow, src: PerRunSourceSpec, limits: LabLimits): PlannedCondition[] {
  const varied = new Set(limits.factors.map((f) => f.key));
  return inputColumns(src).map((c) => {
    const value = row.values.get(c.key) as number;
    return { key: c.key, column: c.header, value, unit: siUnit(FIELD_QUANTITY[c.field]), shown: toColumnUnit(c, value, src), shownUnit: c.spec.unit, varied: varied.has(c.key) };
  });
}

/** The factors for the report: key, column, SI range and the unit the limits used. */
export function factorSummary(src: PerRunSourceSpec, limits: LabLimits): PlanResult['factors'] {
  const cols = inputColumns(src);
  return limits.factors.map((f) => {
    const col = cols.find((c) => c.key === f.key);
    const shown = (v: number) => (col ? toColumnUnit(col, v, src) : v);
    return { key: f.key, column: col?.header ?? f.key, unit: siUnit(FIELD_QUANTITY[f.field]), min: f.min, max: f.max, shownUnit: col?.spec.unit ?? f.unit, shownMin: shown(f.min), shownMax: shown(f.max) };
  });
}

/** The study's runs in the scaled condition space of the limits (values SI; may fall outside 0..1). */
export function oldRunPoints(study: Study, src: PerRunSourceSpec, limits: LabLimits): PlanResult['oldRuns'] {
  const cols = inputColumns(src);
  return study.runs.map((r) => {
    const values = limits.factors.map((f) => {
      const col = cols.find((c) => c.key === f.key);
      return col ? fieldValueSI(r, col, study.chemistry.speciesNames) ?? NaN : NaN;
    });
    return { id: r.id, values, scaled: values.map((v, k) => (v - limits.factors[k].min) / (limits.factors[k].max - limits.factors[k].min)) };
  });
}

/** Planned rows for chosen candidates, with fresh ids. */
export function plannedRows(study: Study, chosen: readonly number[], candidateRows: readonly PlannedRow[], prefix: string): PlannedRow[] {
  const pre = freshPrefix(study, prefix, chosen.length);
  return chosen.map((c, k) => ({ ...candidateRows[c], id: `${pre}${k + 1}` }));
}
