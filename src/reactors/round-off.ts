/**
 * Amounts as shown: a solver leaves tiny negative flows or amounts (round-off of the order of the
 * tolerances, for example -1e-17 mol/s of a species used up). Values between -tol * scale and 0,
 * where scale is the total feed (or initial) amount of the run, are shown as 0; more negative
 * values are kept and counted so that the caller can warn. Common practice; the tolerance is
 * stated with every result that applies it.
 */

/** Relative tolerance: negatives above -ROUND_OFF_TOLERANCE x (total feed or initial amount) show as 0. */
export const ROUND_OFF_TOLERANCE = 1e-9;

/** The sentence stating the rule, for results and reports. */
export const ROUND_OFF_NOTE = `negative flows, amounts and concentrations above -${ROUND_OFF_TOLERANCE} of the run's total feed (or initial amount) are solver round-off and shown as 0`;

/**
 * Copy of `amounts` (and of `concentrations`, index for index) with round-off negatives set to 0.
 * `negative` counts values below the tolerance (kept as they are).
 */
export function shownAmounts(amounts: ArrayLike<number>, concentrations: ArrayLike<number>, scale: number): { amounts: number[]; concentrations: number[]; clamped: number; negative: number } {
  const lim = -ROUND_OFF_TOLERANCE * Math.abs(scale);
  const a = Array.from(amounts);
  const c = Array.from(concentrations);
  let clamped = 0;
  let negative = 0;
  for (let j = 0; j < a.length; j++) {
    if (!(a[j] < 0)) continue;
    if (a[j] >= lim) {
      a[j] = 0;
      c[j] = 0;
      clamped++;
    } else negative++;
  }
  for (let j = 0; j < c.length; j++) if (c[j] < 0 && a[j] === 0) c[j] = 0;
  return { amounts: a, concentrations: c, clamped, negative };
}
