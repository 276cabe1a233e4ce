/**
 * Profile-likelihood curves: the objective re-optimised over the other parameters against one
 * parameter's value, with the threshold that bounds the profile interval (dashed) and the
 * estimate (dotted). Where the curve crosses the threshold are the interval ends.
 */
import { axisTitle, slug } from '../format.js';
import { INK, OKABE_ITO } from '../theme.js';
import type { ChartSpec, LikelihoodProfileData } from '../types.js';
import { caption, droppedNote, keepFinite, topLevel, type ChartSize } from './common.js';

/** One chart per parameter profile. */
export function likelihoodCharts(profiles: LikelihoodProfileData[] | undefined, size: ChartSize = {}): ChartSpec[] {
  return (profiles ?? []).map((p) => {
    const { rows, dropped } = keepFinite(p.points.map((pt) => ({ value: pt.value, objective: pt.objective })), ['value', 'objective']);
    rows.sort((a, b) => a.value - b.value);
    const objLabel = p.objectiveLabel ?? 'objective';
    const x = { field: 'value', type: 'quantitative', title: axisTitle(p.parameter, p.unit), scale: { zero: false } };
    const y = { field: 'objective', type: 'quantitative', title: axisTitle(objLabel, p.objectiveUnit ?? '1'), scale: { zero: false } };
    const layer: Record<string, unknown>[] = [
      { data: { values: rows }, mark: { type: 'line', color: OKABE_ITO[0], point: { filled: true, size: 28 } }, encoding: { x, y } },
    ];
    if (Number.isFinite(p.threshold)) {
      layer.push({
        data: { values: [{ t: p.threshold }] },
        mark: { type: 'rule', color: OKABE_ITO[1], strokeDash: [6, 4], strokeWidth: 1.5 },
        encoding: { y: { field: 't', type: 'quantitative' } },
      });
    }
    if (Number.isFinite(p.estimate)) {
      layer.push({
        data: { values: [{ e: p.estimate }] },
        mark: { type: 'rule', color: INK.rule, strokeDash: [2, 3], strokeWidth: 1.25 },
        encoding: { x: { field: 'e', type: 'quantitative' } },
      });
    }
    return {
      id: `likelihood-${slug(p.parameter)}`,
      title: `Profile likelihood: ${p.parameter}`,
      caption: caption(
        'Dashed line: threshold of the profile interval; dotted line: estimate.',
        droppedNote(dropped),
        !Number.isFinite(p.threshold) ? 'Threshold not computed.' : undefined,
      ),
      spec: topLevel({ layer }, size),
    };
  });
}
