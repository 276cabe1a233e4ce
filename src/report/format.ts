/**
 * Number, unit and text formatting shared by the HTML, Markdown and chart writers. Numbers are
 * shown with a fixed count of significant digits; very large or very small magnitudes use a
 * ×10ⁿ form with superscript digits so the same string reads well in HTML, Markdown and SVG.
 * Nothing here returns 'NaN': missing values read "not computed", non-finite ones "n/a".
 */

/** Default significant digits for estimates and measured values. */
export const SIG_VALUE = 4;
/** Significant digits for standard errors and interval ends. */
export const SIG_ERROR = 3;

const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
  '-': '⁻', '+': '', '.': '·',
};

/** Text shown where a value was not computed. */
export const NOT_COMPUTED = 'not computed';

function superscript(s: string): string {
  return [...s].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

/** Trim trailing zeros of a fixed-point mantissa ('1.200' -> '1.2', '3.000' -> '3'). */
function trimZeros(s: string): string {
  return s.includes('.') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
}

/**
 * Format a number with `sig` significant digits (default 4). Magnitudes in [0.01, 1e5) print in
 * fixed point, others as mantissa×10ⁿ. null/undefined -> 'not computed'; NaN/±Infinity -> 'n/a'.
 */
export function formatNumber(x: number | null | undefined, sig = SIG_VALUE): string {
  if (x === null || x === undefined) return NOT_COMPUTED;
  if (!Number.isFinite(x)) return 'n/a';
  if (x === 0) return '0';
  // round to `sig` digits first so that 99999.9 and 9.99996 pick the right form after rounding
  const abs = Math.abs(Number(x.toPrecision(sig)));
  const minus = x < 0 ? '−' : '';
  if (abs >= 1e-2 && abs < 1e5) {
    const digits = Math.max(0, sig - 1 - Math.floor(Math.log10(abs)));
    return minus + trimZeros(abs.toFixed(Math.min(digits, 20)));
  }
  const [mant, exp] = abs.toExponential(sig - 1).split('e');
  return `${minus}${trimZeros(mant)}×10${superscript(String(Number(exp)))}`;
}

/** Text shown for a dimensionless unit: '1', the unit one (SI Brochure 9th ed. 2.3.3), never a dash that reads as 'missing'. */
export const DIMENSIONLESS = '1';

/**
 * Make a unit readable: '^2' -> '²', '^-1' -> '⁻¹', '^1.5' -> '¹·⁵', a lone '1', '-' or '' -> '1'
 * (dimensionless). Other text is kept as given.
 */
export function formatUnit(unit: string | null | undefined): string {
  const u = (unit ?? '').trim();
  if (u === '' || u === '1' || u === '-') return DIMENSIONLESS;
  return u.replace(/\^(-?\d+(?:\.\d+)?)/g, (_m, e: string) => superscript(e));
}

/** Axis title with its unit: 'T (K)', 'X_A (1)'. */
export function axisTitle(label: string, unit: string | null | undefined): string {
  return `${label} (${formatUnit(unit)})`;
}

/** A pressure in Pa as kPa (value only). */
export function paToKPa(pa: number): number {
  return pa / 1000;
}

/** An interval as 'lo … hi' (open sides read '—'). */
export function formatInterval(iv: readonly [number | null, number | null] | null | undefined, sig = SIG_ERROR): string {
  if (!iv) return NOT_COMPUTED;
  const side = (v: number | null) => (v === null ? 'open' : formatNumber(v, sig));
  return `${side(iv[0])} … ${side(iv[1])}`;
}

/** Escape text for HTML element content and double-quoted attributes. */
export function escapeHtml(s: unknown): string {
  return String(s ?? '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** Escape text for a Markdown table cell or paragraph (pipes, backslashes, markup characters, newlines). */
export function escapeMarkdown(s: unknown): string {
  return String(s ?? '')
    .replace(/\\/g, '\\\\')
    .replace(/([|*_`\[\]<>#])/g, '\\$1')
    .replace(/\r?\n/g, ' ');
}

/** A safe element id from any text (letters, digits, '-', '_'). */
export function slug(s: string): string {
  const t = s.normalize('NFKD').replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '');
  return t === '' ? 'x' : t;
}
