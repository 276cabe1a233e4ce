/**
 * Energy-balance charts of a sizing report: temperature and coolant profiles along one tube, the
 * hot-spot distribution over the Monte Carlo draws (rules at P50/P90/P95 and the limit), and the
 * hot spot against the coolant temperature with the critical coolant temperature of the runaway
 * criterion and the design value marked.
 */
import { axisTitle, formatNumber } from '../format.js';
import { INK, OKABE_ITO } from '../theme.js';
import type { ChartSpec, ThermalReportData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

function profileChart(t: ThermalReportData, size: ChartSize): ChartSpec {
  const all = t.profile.z.flatMap((z, i) => [
    { z, T: t.profile.T[i], series: 'reacting gas' },
    ...(t.profile.Ta[i] !== null ? [{ z, T: t.profile.Ta[i] as number, series: 'coolant' }] : []),
  ]);
  const { rows, dropped } = keepFinite(all, ['z', 'T']);
  const layer: Record<string, unknown>[] = [{
    data: { values: rows },
    mark: { type: 'line' },
    encoding: {
      x: { field: 'z', type: 'quantitative', title: axisTitle('Position along the tube', 'm') },
      y: { field: 'T', type: 'quantitative', title: axisTitle('Temperature', 'K'), scale: { zero: false } },
      color: { field: 'series', type: 'nominal', title: 'Stream', scale: { domain: ['reacting gas', 'coolant'], range: [OKABE_ITO[5], OKABE_ITO[4]] } },
    },
  }];
  if (t.hotSpot.limit !== null) layer.push({ data: { values: [{ v: t.hotSpot.limit }] }, mark: { type: 'rule', color: OKABE_ITO[5], strokeDash: [4, 3] }, encoding: { y: { field: 'v', type: 'quantitative' } } });
  return {
    id: 'thermal-profile',
    title: 'Temperature and coolant along one tube',
    caption: caption(`${t.mode} coolant; hot spot ${formatNumber(t.hotSpot.value)} K at ${formatNumber(t.hotSpot.position)} m${t.hotSpot.limit !== null ? `; dashed line: limit ${formatNumber(t.hotSpot.limit)} K` : ''}.`, droppedNote(dropped)),
    spec: topLevel({ layer }, size),
  };
}

function hotSpotChart(t: ThermalReportData, size: ChartSize): ChartSpec | null {
  const bins = (t.hotSpotHistogram ?? []).filter((b) => Number.isFinite(b.start) && Number.isFinite(b.end));
  if (bins.length === 0) return null;
  const rules = (t.hotSpotPercentiles ?? []).map((p) => ({ label: `P${Math.round(p.level * 100)}`, v: p.value })).filter((r) => Number.isFinite(r.v));
  if (t.hotSpot.limit !== null) rules.push({ label: 'limit', v: t.hotSpot.limit });
  const x = { field: 'start', type: 'quantitative', title: axisTitle('Hot-spot temperature', 'K'), scale: { zero: false } };
  return {
    id: 'thermal-hot-spot-distribution',
    title: 'Distribution of the hot spot over the kinetic uncertainty',
    caption: caption(rules.map((r) => `${r.label} ${formatNumber(r.v)} K`).join(', ') + '.'),
    spec: topLevel({
      layer: [
        { data: { values: bins }, mark: { type: 'rect', color: OKABE_ITO[5], stroke: '#ffffff', strokeWidth: 0.5 }, encoding: { x, x2: { field: 'end' }, y: { field: 'count', type: 'quantitative', title: axisTitle('Draws', '1') } } },
        { data: { values: rules }, mark: { type: 'rule', strokeWidth: 2 }, encoding: { x: { field: 'v', type: 'quantitative' }, color: { field: 'label', type: 'nominal', title: 'Mark', scale: { range: [INK.rule, OKABE_ITO[1], OKABE_ITO[3], OKABE_ITO[5]] } } } },
      ],
    }, size),
  };
}

function runawayChart(t: ThermalReportData, size: ChartSize): ChartSpec | null {
  const r = t.runaway;
  if (!r) return null;
  const { rows, dropped } = keepFinite(r.coolant.map((c, i) => ({ c, hot: r.hotSpot[i] })), ['c', 'hot']);
  const marks = [{ label: 'design', v: r.design }, ...(r.critical !== null ? [{ label: 'critical', v: r.critical }] : [])];
  return {
    id: 'thermal-runaway',
    title: 'Hot spot against coolant temperature',
    caption: caption(`${r.criterion}. Critical coolant temperature ${r.critical !== null ? `${formatNumber(r.critical)} K` : 'not located in the scan'}; design ${formatNumber(r.design)} K.`, droppedNote(dropped)),
    spec: topLevel({
      layer: [
        { data: { values: rows }, mark: { type: 'line', point: true, color: OKABE_ITO[5] }, encoding: { x: { field: 'c', type: 'quantitative', title: axisTitle('Coolant temperature', 'K'), scale: { zero: false } }, y: { field: 'hot', type: 'quantitative', title: axisTitle('Hot-spot temperature', 'K'), scale: { zero: false } } } },
        { data: { values: marks }, mark: { type: 'rule', strokeWidth: 2 }, encoding: { x: { field: 'v', type: 'quantitative' }, color: { field: 'label', type: 'nominal', title: 'Coolant', scale: { domain: ['design', 'critical'], range: [INK.rule, OKABE_ITO[1]] } } } },
      ],
    }, size),
  };
}

/** The energy-balance charts, or none without an energy balance. */
export function thermalCharts(t: ThermalReportData | null | undefined, size: ChartSize = {}): ChartSpec[] {
  if (!t) return [];
  return [profileChart(t, size), hotSpotChart(t, size), runawayChart(t, size)].filter((c): c is ChartSpec => c !== null);
}
