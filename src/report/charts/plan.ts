/**
 * Charts of a run plan: the study's runs and the planned runs in the condition space of the limits
 * (the first two varied conditions in the study's own units, and every varied condition scaled to
 * its range side by side), and the interval widths now and after the planned runs.
 */
import { axisTitle } from '../format.js';
import { OKABE_ITO } from '../theme.js';
import type { ChartSpec, PlanResult } from '../types.js';
import { topLevel } from './common.js';

interface PointRow {
  run: string;
  kind: 'today' | 'planned';
  factor: string;
  scaled: number;
}

const KIND_SCALE = { domain: ['today', 'planned'], range: ['#9aa0a6', OKABE_ITO[5]] };

/** Value of factor k in the column unit from a scaled coordinate (column units are affine in SI). */
function shown(f: PlanResult['factors'][number], u: number): number {
  return f.shownMin + u * (f.shownMax - f.shownMin);
}

/** One varied condition: the runs along it, today's and planned in two rows. */
function stripChart(r: PlanResult): ChartSpec {
  const f = r.factors[0];
  const values = [...r.oldRuns.filter((o) => Number.isFinite(o.scaled[0])).map((o) => ({ run: o.id, kind: 'today', x: shown(f, o.scaled[0]) })), ...r.runs.map((p) => ({ run: p.id, kind: 'planned', x: shown(f, p.scaled[0]) }))];
  return {
    id: 'plan-conditions',
    title: `Runs today and planned: ${f.column}`,
    caption: `Grey: the study's runs; coloured: the ${r.runs.length} planned runs. The axis spans the limits.`,
    spec: topLevel({
      data: { values },
      mark: { type: 'tick', thickness: 2 },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: axisTitle(f.column, f.shownUnit), scale: { domain: [f.shownMin, f.shownMax], nice: false } },
        y: { field: 'kind', type: 'nominal', title: 'runs', sort: ['today', 'planned'] },
        color: { field: 'kind', type: 'nominal', legend: null, scale: KIND_SCALE },
      },
    }, { height: 120 }),
  };
}

function scatterChart(r: PlanResult): ChartSpec | null {
  if (r.factors.length === 1) return stripChart(r);
  if (r.factors.length < 2) return null;
  const [fx, fy] = r.factors;
  const row = (run: string, kind: string, s: readonly number[]) => ({ run, kind, x: shown(fx, s[0]), y: shown(fy, s[1]) });
  const values = [...r.oldRuns.filter((o) => o.scaled.every(Number.isFinite)).map((o) => row(o.id, 'today', o.scaled)), ...r.runs.map((p) => row(p.id, 'planned', p.scaled))];
  const enc = {
    x: { field: 'x', type: 'quantitative', title: axisTitle(fx.column, fx.shownUnit), scale: { domain: [fx.shownMin, fx.shownMax], nice: false } },
    y: { field: 'y', type: 'quantitative', title: axisTitle(fy.column, fy.shownUnit), scale: { domain: [fy.shownMin, fy.shownMax], nice: false } },
  };
  return {
    id: 'plan-conditions',
    title: `Runs today and planned: ${fx.column} and ${fy.column}`,
    caption: `Grey: the study's runs; coloured: the ${r.runs.length} planned runs (labelled). Axes span the limits.`,
    spec: topLevel({
      data: { values },
      layer: [
        { mark: { type: 'point', filled: true, size: 60 }, encoding: { ...enc, color: { field: 'kind', type: 'nominal', title: 'runs', scale: KIND_SCALE }, shape: { field: 'kind', type: 'nominal', legend: null } } },
        { transform: [{ filter: "datum.kind === 'planned'" }], mark: { type: 'text', dx: 9, align: 'left', fontSize: 10 }, encoding: { ...enc, text: { field: 'run' } } },
      ],
    }),
  };
}

function parallelChart(r: PlanResult): ChartSpec | null {
  if (r.factors.length < 3) return null;
  const values: PointRow[] = [];
  const add = (run: string, kind: PointRow['kind'], s: readonly number[]) => r.factors.forEach((f, k) => Number.isFinite(s[k]) && values.push({ run, kind, factor: `${f.column} (${f.shownUnit})`, scaled: s[k] }));
  r.oldRuns.forEach((o) => add(o.id, 'today', o.scaled));
  r.runs.forEach((p) => add(p.id, 'planned', p.scaled));
  return {
    id: 'plan-parallel',
    title: 'Every varied condition, scaled to its limits',
    caption: `0 = the lower limit, 1 = the upper limit of each condition (${r.factors.map((f) => `${f.column} ${f.shownMin}-${f.shownMax} ${f.shownUnit}`).join('; ')}). One line per run.`,
    spec: topLevel({
      data: { values },
      mark: { type: 'line', point: true, opacity: 0.7 },
      encoding: {
        x: { field: 'factor', type: 'nominal', sort: null, title: 'condition' },
        y: { field: 'scaled', type: 'quantitative', title: 'scaled value (1)' },
        detail: { field: 'run', type: 'nominal' },
        color: { field: 'kind', type: 'nominal', title: 'runs', scale: KIND_SCALE },
      },
    }),
  };
}

function widthChart(r: PlanResult): ChartSpec | null {
  const rows = r.precision.filter((p) => p.shrink !== null).map((p) => ({ parameter: p.name, shrink: 100 * (p.shrink as number) }));
  if (!rows.length) return null;
  return {
    id: 'plan-shrink',
    title: `Expected narrowing of the ${Math.round(100 * r.level)} % intervals of '${r.model}'`,
    caption: '1 - (width after the planned runs) / (width today), linear intervals at today\'s estimate.',
    spec: topLevel({
      data: { values: rows },
      mark: { type: 'bar', color: OKABE_ITO[1] },
      encoding: {
        x: { field: 'parameter', type: 'nominal', sort: null, title: 'parameter' },
        y: { field: 'shrink', type: 'quantitative', title: axisTitle('interval narrower by', '%') },
      },
    }),
  };
}

/** The plan's charts (none when nothing was varied). */
export function planCharts(r: PlanResult): ChartSpec[] {
  return [scatterChart(r), parallelChart(r), widthChart(r)].filter((c): c is ChartSpec => c !== null);
}
