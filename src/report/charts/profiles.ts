/**
 * Measured against predicted profiles along the reactor coordinate (or time) for each run:
 * predicted curves as lines, measured points as symbols, one colour and shape per species.
 */
import { axisTitle, formatNumber, paToKPa, slug } from '../format.js';
import { OKABE_ITO, SHAPES } from '../theme.js';
import type { ChartSpec, RunObservationData, RunProfileData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** One chart per run profile; `runs` (optional) adds the run's T and P to the title. */
export function profileCharts(profiles: RunProfileData[], runs: RunObservationData[] = [], size: ChartSize = {}): ChartSpec[] {
  return profiles.map((p) => {
    const species = p.species.map((s) => s.species);
    const n = Math.min(species.length, OKABE_ITO.length);
    const pred = keepFinite(
      p.species.flatMap((s) => s.predicted.map((pt) => ({ species: s.species, x: pt.x, y: pt.y }))),
      ['x', 'y'],
    );
    const meas = keepFinite(
      p.species.flatMap((s) => s.measured.map((pt) => ({ species: s.species, x: pt.x, y: pt.y }))),
      ['x', 'y'],
    );
    const run = runs.find((r) => r.runId === p.runId);
    const where = run ? ` (${formatNumber(run.conditions.temperature, 4)} K, ${formatNumber(paToKPa(run.conditions.pressure), 4)} kPa)` : '';
    const colour = { field: 'species', type: 'nominal', title: 'Species', scale: { domain: species, range: OKABE_ITO.slice(0, n) } };
    const x = { field: 'x', type: 'quantitative', title: axisTitle(p.coordinate.label, p.coordinate.unit) };
    const y = { field: 'y', type: 'quantitative', title: axisTitle(p.quantity.label, p.quantity.unit) };
    return {
      id: `profile-${slug(p.runId)}`,
      title: `Profile of run ${p.runId}${where}`,
      caption: caption('Lines: model prediction; symbols: measurements.', droppedNote(pred.dropped + meas.dropped)),
      spec: topLevel(
        {
          layer: [
            { data: { values: pred.rows }, mark: { type: 'line' }, encoding: { x, y, color: colour, detail: { field: 'species' } } },
            {
              data: { values: meas.rows },
              mark: { type: 'point', size: 60, strokeWidth: 1.5 },
              encoding: {
                x,
                y,
                color: colour,
                shape: { field: 'species', type: 'nominal', title: 'Species', scale: { domain: species, range: SHAPES.slice(0, n) } },
              },
            },
          ],
        },
        size,
      ),
    };
  });
}
