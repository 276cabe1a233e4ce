/**
 * Predicted amounts as shown: a reactor solve leaves tiny negative flows, concentrations or
 * fractions of a used-up species (solver round-off, of the order of the tolerances). In a fit's
 * observations, a negative prediction of an amount-like response (outlet flow, outlet
 * concentration, outlet fraction, fraction ratio) above -ROUND_OFF_TOLERANCE times the largest
 * value of the same response in the same run (measured or predicted) is shown as 0 and its
 * residual restated; more negative predictions are kept as computed. Common practice; the rule is
 * stated in the fit's `roundOff` note.
 */
import type { FitResult } from '../estimation/fit-types.js';
import { ROUND_OFF_TOLERANCE } from '../reactors/round-off.js';
import type { Study } from '../study/types.js';

const AMOUNT_LIKE = new Set(['outlet-flow', 'outlet-concentration', 'outlet-fraction', 'fraction-ratio']);

/** The sentence stating the rule for fit predictions. */
export const PREDICTION_ROUND_OFF_NOTE = `negative predicted flows, concentrations and fractions above -${ROUND_OFF_TOLERANCE} of the largest value of the same response in the run are solver round-off and shown as 0`;

/** The fit with round-off negative predictions shown as 0, and how many were (0: the fit unchanged). */
export function roundOffPredictions(fit: FitResult, study: Study): { fit: FitResult; clamped: number } {
  const scale = new Map<string, number>();
  const key = (i: number) => `${study.observations[i].runId}|${study.observations[i].response}`;
  for (const o of fit.observations) {
    if (!AMOUNT_LIKE.has(study.observations[o.index].response)) continue;
    const k = key(o.index);
    scale.set(k, Math.max(scale.get(k) ?? 0, Math.abs(o.measured), Math.abs(o.predicted)));
  }
  let clamped = 0;
  const observations = fit.observations.map((o) => {
    if (!(o.predicted < 0) || !AMOUNT_LIKE.has(study.observations[o.index].response)) return o;
    if (o.predicted < -ROUND_OFF_TOLERANCE * (scale.get(key(o.index)) ?? 0)) return o;
    clamped++;
    return { ...o, predicted: 0, residual: o.measured };
  });
  return clamped ? { fit: { ...fit, observations }, clamped } : { fit, clamped };
}
