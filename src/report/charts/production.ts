/**
 * Production profile along the production reactor with its uncertainty band: a shaded lo–hi band
 * and the median line for each series (species flow or conversion).
 */
import { axisTitle, formatNumber } from '../format.js';
import { OKABE_ITO } from '../theme.js';
import type { ChartSpec, SizingReportData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** The band chart, or an empty list when there is no profile. */
export function productionCharts(profile: SizingReportData['productionProfile'], size: ChartSize = {}): ChartSpec[] {
  if (!profile || profile.series.length === 0) return [];
  const names = profile.series.map((s) => s.name);
  const n = Math.min(names.length, OKABE_ITO.length);
  const { rows, dropped } = keepFinite(
    profile.series.flatMap((s) => s.points.map((p) => ({ series: s.name, x: p.x, median: p.median, lo: p.lo, hi: p.hi }))),
    ['x', 'median', 'lo', 'hi'],
  );
  // one legend for both layers, drawn as line strokes (the band shares the series colour)
  const colour = {
    field: 'series',
    type: 'nominal',
    title: 'Series',
    scale: { domain: names, range: OKABE_ITO.slice(0, n) },
    legend: { symbolType: 'stroke', symbolStrokeWidth: 3, symbolOpacity: 1 },
  };
  const x = { field: 'x', type: 'quantitative', title: axisTitle(profile.coordinate.label, profile.coordinate.unit) };
  const level = formatNumber(profile.bandLevel * 100, 3);
  return [
    {
      id: 'production-profile',
      title: 'Production profile with uncertainty band',
      caption: caption(`Line: median over parameter draws; band: central ${level} % of draws.`, droppedNote(dropped)),
      spec: topLevel(
        {
          data: { values: rows },
          layer: [
            {
              mark: { type: 'area', opacity: 0.22 },
              encoding: {
                x,
                y: { field: 'lo', type: 'quantitative', title: axisTitle(profile.quantity.label, profile.quantity.unit) },
                y2: { field: 'hi' },
                color: colour,
              },
            },
            {
              mark: { type: 'line' },
              encoding: { x, y: { field: 'median', type: 'quantitative' }, color: colour },
            },
          ],
        },
        size,
      ),
    },
  ];
}
