/**
 * Correlation heat map of the parameter estimates: a diverging colour scale fixed to [-1, 1]
 * (Paul Tol's BuRd) with the coefficient printed in each cell.
 */
import { axisTitle } from '../format.js';
import { TOL_BURD } from '../theme.js';
import type { ChartSpec, CorrelationData } from '../types.js';
import { caption, topLevel, type ChartSize } from './common.js';

/** The heat map, or an empty list when there is no matrix. */
export function correlationCharts(corr: CorrelationData | null | undefined, size: ChartSize = {}): ChartSpec[] {
  if (!corr || corr.names.length === 0) return [];
  const values: { row: string; col: string; r: number | null; label: string }[] = [];
  let missing = 0;
  corr.names.forEach((row, i) =>
    corr.names.forEach((col, j) => {
      const r = corr.matrix[i]?.[j];
      const ok = typeof r === 'number' && Number.isFinite(r);
      if (!ok) missing++;
      values.push({ row, col, r: ok ? r : null, label: ok ? r.toFixed(2).replace('-', '−') : 'n/a' });
    }),
  );
  const cell = Math.max(34, Math.min(64, Math.floor(320 / corr.names.length)));
  const side = size.width ?? cell * corr.names.length;
  const axis = { title: null, labelFontSize: 12, labelAngle: 0, domain: false, ticks: false };
  return [
    {
      id: 'correlation',
      title: 'Parameter correlation',
      caption: caption(
        '|r| close to 1 means the data cannot separate the two parameters.',
        missing > 0 ? `${missing} cell${missing === 1 ? '' : 's'} not computed.` : undefined,
      ),
      spec: topLevel(
        {
          width: side,
          height: side,
          data: { values },
          encoding: {
            x: { field: 'col', type: 'nominal', sort: corr.names, axis: { ...axis, orient: 'top' } },
            y: { field: 'row', type: 'nominal', sort: corr.names, axis },
          },
          layer: [
            {
              mark: { type: 'rect', stroke: '#ffffff', strokeWidth: 1 },
              encoding: {
                color: {
                  field: 'r',
                  type: 'quantitative',
                  title: axisTitle('r', '1'),
                  scale: { domain: [-1, 1], range: [...TOL_BURD] },
                  legend: { gradientLength: Math.max(120, side - 20) },
                },
              },
            },
            {
              mark: { type: 'text', fontSize: 11 },
              encoding: {
                text: { field: 'label' },
                color: { condition: { test: 'datum.r !== null && abs(datum.r) > 0.7', value: '#ffffff' }, value: '#1f2328' },
              },
            },
          ],
        },
        size,
      ),
    },
  ];
}
