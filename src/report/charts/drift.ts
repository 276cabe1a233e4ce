/**
 * Catalyst activity chart: the repeated reference conditions of a campaign, measured (points, with
 * +/- 1 sigma bars where known) and predicted at the fitted parameters (line), against time on
 * stream (h) or sequence number; one colour per reference group.
 */
import { axisTitle } from '../format.js';
import { OKABE_ITO } from '../theme.js';
import type { ChartSpec, LabReportData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** The drift chart of a fit report's lab section (none without reference groups). */
export function driftCharts(lab: LabReportData | null | undefined, size: ChartSize = {}): ChartSpec[] {
  const d = lab?.drift;
  if (!d || d.points.length === 0) return [];
  const rows = d.points.map((p) => ({ ...p, lo: p.sigma !== null ? p.measured - p.sigma : null, hi: p.sigma !== null ? p.measured + p.sigma : null }));
  const { rows: kept, dropped } = keepFinite(rows, ['time', 'measured']);
  const groups = [...new Set(kept.map((r) => r.group))];
  const colour = { field: 'group', type: 'nominal', title: 'Reference', scale: { domain: groups, range: OKABE_ITO.slice(0, Math.min(groups.length, OKABE_ITO.length)) } };
  const x = { field: 'time', type: 'quantitative', title: axisTitle(d.timeLabel, d.timeUnit) };
  const y = d.responseTitle;
  const layers: Record<string, unknown>[] = [
    { data: { values: kept.filter((r) => r.lo !== null) }, mark: { type: 'rule' }, encoding: { x, y: { field: 'lo', type: 'quantitative', title: y, scale: { zero: false } }, y2: { field: 'hi' }, color: colour } },
    { data: { values: kept }, mark: { type: 'point', filled: true }, encoding: { x, y: { field: 'measured', type: 'quantitative', title: y, scale: { zero: false } }, color: colour } },
  ];
  const pred = kept.filter((r) => r.predicted !== null && Number.isFinite(r.predicted));
  if (pred.length) layers.push({ data: { values: pred }, mark: { type: 'line' }, encoding: { x, y: { field: 'predicted', type: 'quantitative', title: y }, color: colour } });
  return [
    {
      id: 'activity-drift',
      title: `Reference conditions vs ${d.timeLabel}`,
      caption: caption(`Repeated reference conditions: measured (points, ±1 sigma) and predicted at the fitted parameters (line). ${d.verdict}`, droppedNote(dropped)),
      spec: topLevel({ layer: layers }, size),
    },
  ];
}
