/**
 * Predictions of the lab responses (docs/lab-data.md) from a reactor's outlet molar flows F and
 * their gradients dg/dF, which the study model chains with the flow sensitivities dF/dtheta:
 *   outlet-fraction  g = F_i / sum_{k kept} F_k         dg/dF_k = (delta_ik - g [k kept]) / S
 *   fraction-ratio   g = F_i / F_s                      dg/dF_i = 1/F_s, dg/dF_s = -F_i/F_s^2
 *   selectivity      g = f (F_P - F_P0) / (F_A0 - F_A)  dg/dF_P = f/(F_A0 - F_A), dg/dF_A = g/(F_A0 - F_A)
 *   yield            g = f (F_P - F_P0) / F_A0          dg/dF_P = f/F_A0
 * Method: mole balance bookkeeping (common practice); see src/data/lab-arithmetic.ts.
 */
import { fractionsFromFlows, selectivity, yieldOf } from '../data/lab-arithmetic.js';
import type { Observation, StudyRun } from '../study/types.js';

/** True for the responses this file predicts. */
export function isLabResponse(o: Pick<Observation, 'response'>): boolean {
  return o.response === 'outlet-fraction' || o.response === 'fraction-ratio' || o.response === 'selectivity' || o.response === 'yield';
}

function keptTotal(F: ArrayLike<number>, removed: readonly boolean[] | undefined): number {
  let S = 0;
  for (let k = 0; k < F.length; k++) if (!removed?.[k]) S += F[k];
  return S;
}

/** Predicted value of a lab response from outlet flows F (mol/s); NaN for other responses. */
export function labValue(o: Observation, run: Pick<StudyRun, 'feed'>, F: ArrayLike<number>): number {
  const j = o.speciesIndex ?? -1;
  const lab = o.lab ?? {};
  const feed = run.feed;
  switch (o.response) {
    case 'outlet-fraction':
      return fractionsFromFlows(F, lab.removed ?? [])[j];
    case 'fraction-ratio':
      return F[j] / F[lab.standard ?? -1];
    case 'selectivity': {
      const a = lab.reactant ?? -1;
      return selectivity(F[j], feed?.[j] ?? 0, F[a], feed?.[a] ?? NaN, lab.factor ?? 1);
    }
    case 'yield': {
      const a = lab.reactant ?? -1;
      return yieldOf(F[j], feed?.[j] ?? 0, feed?.[a] ?? NaN, lab.factor ?? 1);
    }
    default:
      return NaN;
  }
}

/** dg/dF_k of a lab response into `out` (length nS). */
export function labGradient(o: Observation, run: Pick<StudyRun, 'feed'>, F: ArrayLike<number>, out: Float64Array): void {
  out.fill(0);
  const j = o.speciesIndex ?? -1;
  const lab = o.lab ?? {};
  const feed = run.feed;
  if (o.response === 'outlet-fraction') {
    const S = keptTotal(F, lab.removed);
    const g = F[j] / S;
    for (let k = 0; k < F.length; k++) out[k] = lab.removed?.[k] ? 0 : -g / S;
    out[j] += 1 / S;
  } else if (o.response === 'fraction-ratio') {
    const s = lab.standard ?? -1;
    out[j] = 1 / F[s];
    out[s] -= F[j] / (F[s] * F[s]);
  } else if (o.response === 'selectivity') {
    const a = lab.reactant ?? -1;
    const den = (feed?.[a] ?? NaN) - F[a];
    const f = lab.factor ?? 1;
    out[j] = f / den;
    out[a] = (f * (F[j] - (feed?.[j] ?? 0))) / (den * den);
  } else if (o.response === 'yield') {
    out[j] = (lab.factor ?? 1) / (feed?.[lab.reactant ?? -1] ?? NaN);
  }
}
