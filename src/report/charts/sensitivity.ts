/**
 * Sensitivity bar chart: the signed effect of each parameter on the required size, largest
 * magnitude on top; increases and decreases in two palette colours.
 */
import { axisTitle } from '../format.js';
import { OKABE_ITO } from '../theme.js';
import type { ChartSpec, SizingReportData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** The bar chart, or an empty list when there are no rows. */
export function sensitivityCharts(data: SizingReportData, size: ChartSize = {}): ChartSpec[] {
  if (!data.sensitivity || data.sensitivity.length === 0) return [];
  const { rows: kept, dropped } = keepFinite(data.sensitivity.map((r) => ({ ...r })), ['effect']);
  const rows = kept
    .map((r) => ({ parameter: r.parameter, effect: r.effect, direction: r.effect >= 0 ? 'increases size' : 'decreases size' }))
    .sort((a, b) => Math.abs(b.effect) - Math.abs(a.effect));
  const measure = data.sensitivityMeasure ?? 'Effect on size';
  const height = size.height ?? Math.max(90, 28 * rows.length);
  return [
    {
      id: 'sensitivity',
      title: 'Sensitivity of the size to each parameter',
      caption: caption(measure.endsWith('.') ? measure : `${measure}.`, droppedNote(dropped)),
      spec: topLevel(
        {
          height,
          data: { values: rows },
          layer: [
            {
              mark: { type: 'bar', height: { band: 0.7 } },
              encoding: {
                y: { field: 'parameter', type: 'nominal', sort: rows.map((r) => r.parameter), axis: { title: null } },
                x: { field: 'effect', type: 'quantitative', title: axisTitle('Effect on size', data.sensitivityUnit ?? '1') },
                color: {
                  field: 'direction',
                  type: 'nominal',
                  title: 'Direction',
                  scale: { domain: ['increases size', 'decreases size'], range: [OKABE_ITO[1], OKABE_ITO[0]] },
                },
              },
            },
            { data: { values: [{ z: 0 }] }, mark: { type: 'rule', color: '#444444' }, encoding: { x: { field: 'z', type: 'quantitative' } } },
          ],
        },
        { ...size, height },
      ),
    },
  ];
}
