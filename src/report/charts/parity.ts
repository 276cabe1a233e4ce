/**
 * Parity plot: predicted against measured for one response, with the y = x line. Both axes share
 * one padded domain so distance from the line reads the same in both directions.
 */
import { axisTitle } from '../format.js';
import { INK } from '../theme.js';
import type { ChartSpec, RunObservationData } from '../types.js';
import { caption, droppedNote, keepFinite, paddedDomain, topLevel, type ChartSize } from './common.js';
import { observationRows, temperatureColour, temperatureShape } from './conditions.js';
import { slug } from '../format.js';

/** One parity chart per response label, in first-seen order. */
export function parityCharts(runs: RunObservationData[], size: ChartSize = {}): ChartSpec[] {
  const all = observationRows(runs);
  const responses = [...new Set(all.map((r) => r.response))];
  return responses.map((response) => {
    const { rows, dropped } = keepFinite(
      all.filter((r) => r.response === response),
      ['measured', 'predicted'],
    );
    const unit = rows[0]?.unit ?? all.find((r) => r.response === response)?.unit ?? '1';
    const domain = paddedDomain([...rows.map((r) => r.measured), ...rows.map((r) => r.predicted as number)]); // finite: kept above
    const scale = { domain, nice: false, zero: false };
    return {
      id: `parity-${slug(response)}`,
      title: `Parity: ${response}`,
      caption: caption('Each point is one run; points on the line are predicted exactly.', droppedNote(dropped)),
      spec: topLevel(
        {
          width: size.width ?? (size.height ?? 300),
          height: size.height ?? 300,
          layer: [
            {
              data: { values: [{ v: domain[0] }, { v: domain[1] }] },
              mark: { type: 'line', color: INK.rule, strokeDash: [5, 4], strokeWidth: 1.25, clip: true },
              encoding: {
                x: { field: 'v', type: 'quantitative', scale, title: axisTitle(`Measured ${response}`, unit) },
                y: { field: 'v', type: 'quantitative', scale, title: axisTitle(`Predicted ${response}`, unit) },
              },
            },
            {
              data: { values: rows },
              mark: { type: 'point', clip: true },
              encoding: {
                x: { field: 'measured', type: 'quantitative', scale },
                y: { field: 'predicted', type: 'quantitative', scale },
                color: temperatureColour(rows),
                ...(temperatureShape(rows) ? { shape: temperatureShape(rows) } : {}),
              },
            },
          ],
        },
        size,
      ),
    };
  });
}
