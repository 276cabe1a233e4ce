/**
 * Pellet charts of a sizing report: the effectiveness factor along the bed (one line per reaction)
 * and the pellet trade-off (catalyst mass and pressure drop against pellet diameter, two panels
 * side by side sharing the diameter axis).
 */
import { axisTitle } from '../format.js';
import { OKABE_ITO } from '../theme.js';
import type { ChartSpec, PelletReportData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** eta along the bed. */
function etaChart(p: PelletReportData, size: ChartSize): ChartSpec {
  const names = p.profile.series.map((s) => s.reaction);
  const { rows, dropped } = keepFinite(
    p.profile.series.flatMap((s) => s.points.map((q) => ({ reaction: s.reaction, x: q.size, eta: q.eta }))),
    ['x', 'eta'],
  );
  return {
    id: 'pellet-eta',
    title: 'Effectiveness factor along the bed',
    caption: caption(`Plant pellet (${p.shape}); ${p.method === 'numerical' ? 'pellet solved numerically at each point' : "Bischoff's generalized modulus"}.`, droppedNote(dropped)),
    spec: topLevel(
      {
        data: { values: rows },
        mark: { type: 'line', point: true },
        encoding: {
          x: { field: 'x', type: 'quantitative', title: axisTitle('Catalyst mass', 'kg') },
          y: { field: 'eta', type: 'quantitative', title: axisTitle('Effectiveness factor', '1') },
          color: { field: 'reaction', type: 'nominal', title: 'Reaction', scale: { domain: names, range: OKABE_ITO.slice(0, Math.min(names.length, OKABE_ITO.length)) } },
        },
      },
      size,
    ),
  };
}

/** Catalyst mass (left axis) and pressure drop (right axis) against pellet diameter. */
function tradeOffChart(p: PelletReportData, size: ChartSize): ChartSpec {
  const all = p.tradeOff.rows.map((r) => ({ diameter: r.diameterMm, mass: r.catalystMass ?? NaN, drop: r.pressureDropKPa ?? NaN }));
  const mass = keepFinite(all, ['diameter', 'mass']);
  const drop = keepFinite(all, ['diameter', 'drop']);
  const x = { field: 'diameter', type: 'quantitative', title: axisTitle('Pellet diameter', 'mm') };
  const layer: Record<string, unknown>[] = [
    {
      data: { values: mass.rows },
      mark: { type: 'line', point: true, color: OKABE_ITO[0] },
      encoding: { x, y: { field: 'mass', type: 'quantitative', title: axisTitle('Catalyst mass', 'kg'), axis: { titleColor: OKABE_ITO[0] } } },
    },
  ];
  if (drop.rows.length > 0) {
    layer.push({
      data: { values: drop.rows },
      mark: { type: 'line', point: true, strokeDash: [6, 3], color: OKABE_ITO[1] },
      encoding: { x, y: { field: 'drop', type: 'quantitative', title: axisTitle('Pressure drop', 'kPa'), axis: { orient: 'right', titleColor: OKABE_ITO[1] } } },
    });
  }
  const dropped = all.length - mass.rows.length + (drop.rows.length > 0 ? all.length - drop.rows.length : 0);
  return {
    id: 'pellet-trade-off',
    title: 'Pellet diameter: catalyst mass and pressure drop',
    caption: caption(
      `Solid line, left axis: catalyst mass for the target; dashed line, right axis: pressure drop${p.tradeOff.tubeCount ? ` with the ${p.tradeOff.tubeCount} tubes of the design` : ''}. Bigger pellets lower the pressure drop and the effectiveness factor.`,
      droppedNote(dropped),
    ),
    spec: topLevel({ layer, resolve: { scale: { y: 'independent' } } }, size),
  };
}

/** The pellet charts, or none without a pellet. */
export function pelletCharts(p: PelletReportData | null | undefined, size: ChartSize = {}): ChartSpec[] {
  if (!p) return [];
  const out = [etaChart(p, size)];
  if (p.tradeOff.rows.length > 1) out.push(tradeOffChart(p, size));
  return out;
}
