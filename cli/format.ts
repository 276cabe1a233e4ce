/**
 * Number formatting for command output: d significant digits, exponent form below 1e-3 and from
 * 1e6, 'n/a' for values that could not be computed, and the unit always beside the number.
 */

/** A number to d significant digits. */
export function g(x: number | null | undefined, d = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return 'n/a';
  const a = Math.abs(x);
  return a !== 0 && (a < 1e-3 || a >= 1e6) ? x.toExponential(d - 1) : Number(x.toPrecision(d)).toString();
}

/** A number with its unit ('1' means dimensionless and shows no unit). */
export function withUnit(x: number | null | undefined, unit: string, d = 4): string {
  return unit === '1' || unit === '' ? g(x, d) : `${g(x, d)} ${unit}`;
}

/** Pad cells into aligned columns. */
export function table(rows: string[][]): string {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => (r[c] ?? '').length)));
  return rows.map((r) => r.map((cell, c) => (cell ?? '').padEnd(widths[c])).join('  ').trimEnd()).join('\n');
}
