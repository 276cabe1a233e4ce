/**
 * Rival-model chart: Akaike weights (AICc-based) as horizontal bars on a fixed 0–1 axis, each
 * labelled with its weight and ΔAICc to the best model, coloured by verdict.
 */
import { criterionDeltaText } from '../../core/criterion.js';
import { axisTitle } from '../format.js';
import { OKABE_ITO } from '../theme.js';
import type { ChartSpec, RivalModelData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** The comparison chart, or an empty list with fewer than two models. */
export function rivalCharts(models: RivalModelData[] | undefined, size: ChartSize = {}): ChartSpec[] {
  if (!models || models.length < 2) return [];
  const { rows: kept, dropped } = keepFinite(models.map((m) => ({ ...m })), ['akaikeWeight', 'aicc']);
  const best = Math.min(...kept.map((m) => m.aicc));
  const rows = kept
    .map((m) => {
      return {
        name: m.name,
        weight: m.akaikeWeight,
        verdict: m.verdict,
        label: `${m.akaikeWeight.toFixed(3)}  (ΔAICc ${criterionDeltaText(m.aicc, best)})`,
      };
    })
    .sort((a, b) => b.weight - a.weight);
  const verdicts = [...new Set(rows.map((r) => r.verdict))];
  const height = size.height ?? Math.max(90, 34 * rows.length);
  return [
    {
      id: 'rival-models',
      title: 'Rival models: Akaike weights',
      caption: caption('Weight = relative support from AICc; ΔAICc > 10 means essentially no support.', droppedNote(dropped)),
      spec: topLevel(
        {
          height,
          data: { values: rows },
          encoding: {
            y: { field: 'name', type: 'nominal', sort: rows.map((r) => r.name), axis: { title: null, labelLimit: 200 } },
          },
          layer: [
            {
              mark: { type: 'bar', height: { band: 0.7 } },
              encoding: {
                x: { field: 'weight', type: 'quantitative', title: axisTitle('Akaike weight', '1'), scale: { domain: [0, 1] } },
                color: { field: 'verdict', type: 'nominal', title: 'Verdict', scale: { domain: verdicts, range: OKABE_ITO.slice(0, Math.min(verdicts.length, 8)) } },
              },
            },
            {
              transform: [{ filter: 'datum.weight <= 0.55' }],
              mark: { type: 'text', align: 'left', dx: 4, color: '#1f2328' },
              encoding: { x: { field: 'weight', type: 'quantitative' }, text: { field: 'label' } },
            },
            {
              transform: [{ filter: 'datum.weight > 0.55' }],
              mark: { type: 'text', align: 'right', dx: -4, color: '#ffffff', fontWeight: 600 },
              encoding: { x: { field: 'weight', type: 'quantitative' }, text: { field: 'label' } },
            },
          ],
        },
        { width: size.width ?? 300, height },
      ),
    },
  ];
}
