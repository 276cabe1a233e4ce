/**
 * How information criteria (AICc, AIC, BIC) and their differences are printed, everywhere: the
 * command text, the Markdown and HTML reports, the chart labels and the comparison's verdict
 * sentence. One decimal (a difference of 0.1 in AICc is far below anything that matters; the
 * usual marks are 2 and 10). A difference is computed from the two printed values, so that it
 * always equals the difference of the numbers printed beside it.
 */

/** Decimals of a printed criterion value or difference. */
export const CRITERION_DECIMALS = 1;

/** The value as printed, as a number (so that differences of printed values are exact). */
function printedValue(x: number): number {
  return Number(x.toFixed(CRITERION_DECIMALS));
}

/** A criterion value as printed: '33648.8'; 'n/a' when it could not be computed. */
export function criterionText(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? 'n/a' : printedValue(x).toFixed(CRITERION_DECIMALS);
}

/** The difference `x - best` as printed: the difference of the two printed values; 'n/a' when either is missing. */
export function criterionDeltaText(x: number | null | undefined, best: number | null | undefined): string {
  if (x === null || x === undefined || best === null || best === undefined || !Number.isFinite(x) || !Number.isFinite(best)) return 'n/a';
  return Math.abs(printedValue(x) - printedValue(best)).toFixed(CRITERION_DECIMALS);
}
