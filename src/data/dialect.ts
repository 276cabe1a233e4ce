/**
 * The CSV dialect of a lab file: its delimiter, detected from the header line, and the decimal
 * comma that goes with a semicolon or tab delimiter (European spreadsheet exports write
 * "1,5;200" for 1.5 and 200). Quoting follows RFC 4180 whatever the delimiter.
 */

/** Delimiters rateloom detects: comma (RFC 4180), semicolon and tab. */
export type CsvDelimiter = ',' | ';' | '\t';

/** Longest accepted record (one row with all its cells), in characters. */
export const MAX_RECORD_CHARS = 1 << 20;

/** The header line: the first line that is neither blank nor a '#' comment (BOM skipped). */
function headerLine(text: string): string {
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const line = text.slice(start, Math.min(end, start + MAX_RECORD_CHARS));
    const t = line.trim();
    if (t !== '' && !t.startsWith('#')) return line;
    start = end + 1;
  }
  return '';
}

/** Occurrences of `c` outside double-quoted parts of `line`. */
function countOutsideQuotes(line: string, c: string): number {
  let n = 0;
  let quoted = false;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && ch === c) n++;
  }
  return n;
}

/**
 * The delimiter of a CSV text: the one of ',', ';', tab found most often (outside quotes) in the
 * header line (trimmed); comma when none is found or on a tie with comma.
 */
export function detectDelimiter(text: string): CsvDelimiter {
  const line = headerLine(text).trim();
  let best: CsvDelimiter = ',';
  let most = countOutsideQuotes(line, ',');
  for (const d of [';', '\t'] as const) {
    const n = countOutsideQuotes(line, d);
    if (n > most) {
      best = d;
      most = n;
    }
  }
  return best;
}

const DECIMAL_COMMA_RE = /^[-+]?(\d+,\d*|,\d+)([eE][-+]?\d+)?$/;

/**
 * A cell with a decimal comma ('1,5', '-0,25e-3') as the same text with a decimal point, or
 * undefined when the cell is not such a number. Applied only in files whose delimiter is not the
 * comma; no thousands separators are accepted.
 */
export function decimalCommaToPoint(cell: string): string | undefined {
  return DECIMAL_COMMA_RE.test(cell) ? cell.replace(',', '.') : undefined;
}
