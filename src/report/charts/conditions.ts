/**
 * Flattening of runs into chart rows and the run-condition axes (T, P, space time, feed ratio)
 * that residual charts are drawn against. Pressure is shown in kPa.
 */
import { axisTitle, paToKPa } from '../format.js';
import { OKABE_ITO, SHAPES } from '../theme.js';
import type { RunObservationData } from '../types.js';

/** One observation as a flat chart row. */
export interface ObservationRow {
  run: string;
  response: string;
  unit: string;
  measured: number;
  /** Null for a run the model could not evaluate (dropped from charts like a non-finite value). */
  predicted: number | null;
  residual: number | null;
  studentized: number | null;
  T: number;
  P_kPa: number;
  spaceTime: number | null;
  feedRatio: number | null;
}

/** Flatten runs into one row per response observation. */
export function observationRows(runs: RunObservationData[]): ObservationRow[] {
  const rows: ObservationRow[] = [];
  for (const run of runs) {
    for (const r of run.responses) {
      rows.push({
        run: run.runId,
        response: r.response,
        unit: r.unit,
        measured: r.measured,
        predicted: r.predicted,
        residual: r.residual,
        studentized: r.studentized ?? null,
        T: Math.round(run.conditions.temperature * 10) / 10,
        P_kPa: paToKPa(run.conditions.pressure),
        spaceTime: run.conditions.spaceTime?.value ?? null,
        feedRatio: run.conditions.feedRatio?.value ?? null,
      });
    }
  }
  return rows;
}

/** A condition to plot residuals against. */
export interface ConditionAxis {
  /** Field of ObservationRow. */
  field: 'T' | 'P_kPa' | 'spaceTime' | 'feedRatio';
  /** Axis title with unit. */
  title: string;
  /** Short id for chart ids. */
  key: string;
}

/** The condition axes present in every run (a condition missing in some run is left out). */
export function conditionAxes(runs: RunObservationData[]): ConditionAxis[] {
  if (runs.length === 0) return [];
  const axes: ConditionAxis[] = [
    { field: 'T', title: axisTitle('T', 'K'), key: 'T' },
    { field: 'P_kPa', title: axisTitle('P', 'kPa'), key: 'P' },
  ];
  const st = runs[0].conditions.spaceTime;
  if (st && runs.every((r) => r.conditions.spaceTime && r.conditions.spaceTime.label === st.label && r.conditions.spaceTime.unit === st.unit)) {
    axes.push({ field: 'spaceTime', title: axisTitle(st.label, st.unit), key: 'spacetime' });
  }
  const fr = runs[0].conditions.feedRatio;
  if (fr && runs.every((r) => r.conditions.feedRatio && r.conditions.feedRatio.label === fr.label)) {
    axes.push({ field: 'feedRatio', title: axisTitle(fr.label, fr.unit), key: 'feedratio' });
  }
  return axes;
}

/**
 * Colour encoding by run temperature: one Okabe-Ito colour per temperature when there are at most
 * eight, otherwise a continuous viridis scale (also colour-blind safe).
 */
export function temperatureColour(rows: { T: number }[]): Record<string, unknown> {
  const temps = [...new Set(rows.map((r) => r.T))].sort((a, b) => a - b);
  if (temps.length <= OKABE_ITO.length) {
    return {
      field: 'T',
      type: 'nominal',
      title: axisTitle('T', 'K'),
      sort: temps,
      scale: { domain: temps, range: OKABE_ITO.slice(0, temps.length) },
    };
  }
  return { field: 'T', type: 'quantitative', title: axisTitle('T', 'K'), scale: { scheme: 'viridis' } };
}

/** Shape encoding paired with temperatureColour (same legend); none for more than eight temperatures. */
export function temperatureShape(rows: { T: number }[]): Record<string, unknown> | undefined {
  const temps = [...new Set(rows.map((r) => r.T))].sort((a, b) => a - b);
  if (temps.length > SHAPES.length) return undefined;
  return {
    field: 'T',
    type: 'nominal',
    title: axisTitle('T', 'K'),
    sort: temps,
    scale: { domain: temps, range: SHAPES.slice(0, temps.length) },
  };
}
