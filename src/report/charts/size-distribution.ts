/**
 * Monte Carlo size distribution: histogram of the required size over parameter draws with rules
 * at the median (P50), P90 and P95. Takes raw samples (binned here) or a ready histogram.
 */
import { axisTitle, formatNumber } from '../format.js';
import { INK, OKABE_ITO } from '../theme.js';
import type { ChartSpec, SizingReportData } from '../types.js';
import { caption, droppedNote, topLevel, type ChartSize } from './common.js';

/** Bin samples into about sqrt(n) (10..40) equal bins. */
export function binSamples(samples: number[]): { start: number; end: number; count: number }[] {
  const v = samples.filter(Number.isFinite);
  if (v.length === 0) return [];
  const lo = Math.min(...v);
  const hi = Math.max(...v);
  if (lo === hi) return [{ start: lo - Math.abs(lo) * 0.01 - 1e-12, end: hi + Math.abs(hi) * 0.01 + 1e-12, count: v.length }];
  const k = Math.max(10, Math.min(40, Math.round(Math.sqrt(v.length))));
  const w = (hi - lo) / k;
  const bins = Array.from({ length: k }, (_, i) => ({ start: lo + i * w, end: lo + (i + 1) * w, count: 0 }));
  for (const x of v) bins[Math.min(k - 1, Math.floor((x - lo) / w))].count++;
  return bins;
}

/** The histogram chart, or an empty list when there is no distribution. */
export function sizeDistributionCharts(data: SizingReportData, size: ChartSize = {}): ChartSpec[] {
  const dist = data.sizeDistribution;
  if (!dist) return [];
  let dropped = 0;
  let bins: { start: number; end: number; count: number }[];
  if (dist.samples && dist.samples.length > 0) {
    bins = binSamples(dist.samples);
    dropped = dist.samples.length - dist.samples.filter(Number.isFinite).length;
  } else {
    bins = (dist.histogram ?? []).filter((b) => Number.isFinite(b.start) && Number.isFinite(b.end) && Number.isFinite(b.count));
    dropped = (dist.histogram ?? []).length - bins.length;
  }
  if (bins.length === 0) return [];
  const s = data.size;
  const rules = [
    { label: 'P50', v: s.median },
    { label: 'P90', v: s.p90 },
    { label: 'P95', v: s.p95 },
  ].filter((r) => Number.isFinite(r.v));
  const ruleColour = { field: 'label', type: 'nominal', title: 'Percentile', scale: { domain: ['P50', 'P90', 'P95'], range: [INK.rule, OKABE_ITO[1], OKABE_ITO[3]] } };
  const x = { field: 'start', type: 'quantitative', title: axisTitle(s.label, s.unit), scale: { zero: false } };
  return [
    {
      id: 'size-distribution',
      title: `Distribution of required ${s.label}`,
      caption: caption(
        `P50 ${formatNumber(s.median)}, P90 ${formatNumber(s.p90)}, P95 ${formatNumber(s.p95)} ${s.unit}.`,
        droppedNote(dropped),
      ),
      spec: topLevel(
        {
          layer: [
            {
              data: { values: bins },
              mark: { type: 'rect', color: OKABE_ITO[5], stroke: '#ffffff', strokeWidth: 0.5 },
              encoding: {
                x,
                x2: { field: 'end' },
                y: { field: 'count', type: 'quantitative', title: axisTitle('Draws', 'count'), scale: { zero: true } },
                y2: { datum: 0 },
              },
            },
            {
              data: { values: rules },
              mark: { type: 'rule', strokeWidth: 2, strokeDash: [6, 3] },
              encoding: { x: { field: 'v', type: 'quantitative' }, color: ruleColour },
            },
            {
              data: { values: rules },
              mark: { type: 'text', angle: 270, align: 'right', baseline: 'bottom', dx: -4, dy: -3, fontSize: 10, fontWeight: 600 },
              encoding: { x: { field: 'v', type: 'quantitative' }, y: { value: 0 }, text: { field: 'label' }, color: ruleColour },
            },
          ],
        },
        size,
      ),
    },
  ];
}
