/**
 * Residual charts: residuals against each run condition (T, P, space time, feed ratio) and
 * against the prediction. With studentized residuals for every observation, all responses share
 * one dimensionless axis (colour = response) with guide lines at 0 and ±2; otherwise each
 * response gets its own chart of raw residuals in its own unit.
 */
import { axisTitle, slug } from '../format.js';
import { INK, OKABE_ITO, SHAPES } from '../theme.js';
import type { ChartSpec, RunObservationData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';
import { conditionAxes, observationRows, type ObservationRow } from './conditions.js';

function zeroRules(studentized: boolean): Record<string, unknown>[] {
  const values = studentized ? [{ y: 0, kind: 'zero' }, { y: -2, kind: 'band' }, { y: 2, kind: 'band' }] : [{ y: 0, kind: 'zero' }];
  return [
    {
      data: { values },
      mark: { type: 'rule', color: INK.rule, strokeWidth: 1 },
      encoding: {
        y: { field: 'y', type: 'quantitative' },
        strokeDash: { field: 'kind', type: 'nominal', scale: { domain: ['zero', 'band'], range: [[1, 0], [4, 4]] }, legend: null },
      },
    },
  ];
}

function responseEncoding(responses: string[]): Record<string, unknown> {
  return {
    color: { field: 'response', type: 'nominal', title: 'Response', scale: { domain: responses, range: OKABE_ITO.slice(0, Math.min(responses.length, OKABE_ITO.length)) } },
    shape: { field: 'response', type: 'nominal', title: 'Response', scale: { domain: responses, range: SHAPES.slice(0, Math.min(responses.length, SHAPES.length)) } },
  };
}

function chart(
  id: string,
  title: string,
  rows: ObservationRow[],
  xField: string,
  xTitle: string,
  yField: 'studentized' | 'residual',
  yTitle: string,
  responses: string[],
  dropped: number,
  size: ChartSize,
): ChartSpec {
  const studentized = yField === 'studentized';
  return {
    id,
    title,
    caption: caption(
      studentized ? 'Studentized residuals; about 95 % should lie between the dashed lines at ±2.' : 'Residual = measured − predicted.',
      droppedNote(dropped),
    ),
    spec: topLevel(
      {
        layer: [
          ...zeroRules(studentized),
          {
            data: { values: rows },
            mark: { type: 'point' },
            encoding: {
              x: { field: xField, type: 'quantitative', title: xTitle, scale: { zero: false, padding: 12 } },
              y: { field: yField, type: 'quantitative', title: yTitle },
              ...responseEncoding(responses),
            },
          },
        ],
      },
      size,
    ),
  };
}

/** Residual charts against every condition present in all runs and against the prediction. */
export function residualCharts(runs: RunObservationData[], size: ChartSize = {}): ChartSpec[] {
  const all = observationRows(runs);
  if (all.length === 0) return [];
  const responses = [...new Set(all.map((r) => r.response))];
  const axes = conditionAxes(runs);
  const useStudentized = all.every((r) => r.studentized !== null && Number.isFinite(r.studentized));
  const charts: ChartSpec[] = [];
  if (useStudentized) {
    const yTitle = axisTitle('Studentized residual', '1');
    for (const ax of axes) {
      const { rows, dropped } = keepFinite(all, [ax.field, 'studentized']);
      charts.push(chart(`residuals-${ax.key}`, `Residuals vs ${ax.title}`, rows, ax.field, ax.title, 'studentized', yTitle, responses, dropped, size));
    }
    for (const response of responses) {
      const { rows, dropped } = keepFinite(all.filter((r) => r.response === response), ['predicted', 'studentized']);
      const unit = rows[0]?.unit ?? '1';
      const xTitle = axisTitle(`Predicted ${response}`, unit);
      charts.push(chart(`residuals-pred-${slug(response)}`, `Residuals vs predicted ${response}`, rows, 'predicted', xTitle, 'studentized', yTitle, [response], dropped, size));
    }
    return charts;
  }
  for (const response of responses) {
    const sub = all.filter((r) => r.response === response);
    const unit = sub[0].unit;
    const yTitle = axisTitle(`Residual ${response}`, unit);
    for (const ax of axes) {
      const { rows, dropped } = keepFinite(sub, [ax.field, 'residual']);
      charts.push(chart(`residuals-${ax.key}-${slug(response)}`, `Residuals of ${response} vs ${ax.title}`, rows, ax.field, ax.title, 'residual', yTitle, [response], dropped, size));
    }
    const { rows, dropped } = keepFinite(sub, ['predicted', 'residual']);
    charts.push(chart(`residuals-pred-${slug(response)}`, `Residuals vs predicted ${response}`, rows, 'predicted', axisTitle(`Predicted ${response}`, unit), 'residual', yTitle, [response], dropped, size));
  }
  return charts;
}
