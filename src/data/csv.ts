/**
 * CSV reading with csv-parse (RFC 4180 quoting): strips a UTF-8 byte-order mark, skips blank lines
 * and comment lines starting with '#', trims cells, keeps the 1-based source line of each record.
 * Rows with the wrong number of cells are not thrown out here; the mapping step reports them.
 * A malformed file (an unclosed quote) is a RateloomError('E_CSV') with the line.
 * The delimiter (comma, semicolon or tab) is detected from the header line (dialect.ts); a NUL
 * character or a record longer than MAX_RECORD_CHARS is E_CSV at once.
 * Text without double quotes or carriage returns (the common lab export) takes a direct line
 * splitter that reproduces csv-parse's result for such text exactly (same cells, trimming, skipped
 * lines and line numbers); anything else goes through csv-parse.
 */
import { parse } from 'csv-parse/sync';
import { RateloomError, closestName } from '../core/errors.js';
import { MAX_RECORD_CHARS, detectDelimiter, type CsvDelimiter } from './dialect.js';
import { checkArgs, is } from '../core/args.js';

export interface CsvRow {
  /** 1-based line in the file where the record starts. */
  line: number;
  cells: string[];
}

export interface CsvTable {
  /** File name used in messages (as written in the study). */
  file: string;
  header: string[];
  /** Cell delimiter detected from the header line. */
  delimiter: CsvDelimiter;
  /** 1-based line of the header. */
  headerLine: number;
  /** The rows after the header (for plain text made on first use from rowAt). */
  rows: CsvRow[];
  /** Number of rows after the header (without making `rows`). */
  rowCount: number;
  /**
   * Row i after the header. For plain text a fresh row is split from the file text on each call
   * (nothing kept per row but offsets); otherwise rows[i].
   */
  rowAt(i: number): CsvRow;
}

type ParsedRecord = { record: string[]; info: { lines: number } };

/** Line breaks inside a cell: CRLF, a lone CR or a lone LF each count once. */
function breaksIn(cell: string): number {
  let n = 0;
  for (let k = 0; k < cell.length; k++) {
    const c = cell.charCodeAt(k);
    if (c === 10 || (c === 13 && cell.charCodeAt(k + 1) !== 10)) n++;
  }
  return n;
}

/** csv-parse reports the line where a record ends; step back over line breaks inside quoted cells. */
function startLine(r: ParsedRecord): number {
  let inner = 0;
  for (const c of r.record) inner += breaksIn(c);
  return r.info.lines - inner;
}

/**
 * csv-parse counts a CRLF inside a quoted cell as two lines (CR and LF apart); take one off per
 * such CRLF, for its own record and every record after it, so that line numbers match the file.
 */
function fixQuotedCrlf(records: ParsedRecord[]): ParsedRecord[] {
  let extra = 0;
  for (const r of records) {
    for (const c of r.record) for (let k = c.indexOf('\r\n'); k >= 0; k = c.indexOf('\r\n', k + 2)) extra++;
    if (extra) r.info = { ...r.info, lines: r.info.lines - extra };
  }
  return records;
}

/** True when no cell can be quoted and every line ends with '\n' (and no lone surrogate). */
function isPlain(text: string): boolean {
  // Anything but a string (a reader returning something else) keeps csv-parse's handling.
  if (typeof text !== 'string' || text.indexOf('"') >= 0 || text.indexOf('\r') >= 0) return false;
  const wf = (text as { isWellFormed?: () => boolean }).isWellFormed;
  return typeof wf === 'function' ? wf.call(text) : !/[\uD800-\uDFFF]/.test(text);
}

/** csv-parse trims these at the start of a cell (space, tab, form feed; CR/LF end the line here). */
function isLeftTrim(c: number): boolean {
  return c === 32 || c === 9 || c === 12;
}

/**
 * Where the records of plain text (see isPlain) are, as csv-parse finds them with the options of
 * readCsv: a leading BOM dropped; a line that is blank after left-trimming or whose first such
 * character is '#' skipped; a record whose cells are all white space skipped. Per record: the
 * offset of its first character after left-trimming, of its line end, and its 1-based line.
 * Offsets only: the cells are split by plainCells when a record is read.
 */
interface PlainIndex {
  starts: Int32Array;
  ends: Int32Array;
  lines: Int32Array;
  count: number;
}

/** True for a character String.prototype.trim removes (WhiteSpace or LineTerminator). */
function isTrimmed(c: number): boolean {
  if (c < 128) return c === 32 || (c >= 9 && c <= 13);
  return /\s/.test(String.fromCharCode(c));
}

/** True when text[p, end) holds nothing but delimiters and white space (every cell blank). */
function allBlank(text: string, p: number, end: number): boolean {
  for (let k = p; k < end; k++) {
    const c = text.charCodeAt(k);
    if (c !== 44 && !isTrimmed(c)) return false;
  }
  return true;
}

/** Grow a record index to hold at least `n` records. */
function grown(a: Int32Array, n: number): Int32Array {
  if (n <= a.length) return a;
  const b = new Int32Array(Math.max(n, 2 * a.length));
  b.set(a);
  return b;
}

function indexPlain(text: string, file: string): PlainIndex {
  const n = text.length;
  const guess = 16 + (n >>> 5);
  const ix: PlainIndex = { starts: new Int32Array(guess), ends: new Int32Array(guess), lines: new Int32Array(guess), count: 0 };
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  while (start <= n) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = n;
    if (end - start > MAX_RECORD_CHARS) throw tooLong(file, line);
    let p = start;
    while (p < end && isLeftTrim(text.charCodeAt(p))) p++;
    if (p < end && text.charCodeAt(p) !== 35 && !allBlank(text, p, end)) {
      const k = ix.count++;
      if (k === ix.starts.length) {
        ix.starts = grown(ix.starts, k + 1);
        ix.ends = grown(ix.ends, k + 1);
        ix.lines = grown(ix.lines, k + 1);
      }
      ix.starts[k] = p;
      ix.ends[k] = end;
      ix.lines[k] = line;
    }
    line++;
    start = end + 1;
  }
  // Give back what the first guess of the record count over-allocated.
  return { starts: ix.starts.slice(0, ix.count), ends: ix.ends.slice(0, ix.count), lines: ix.lines.slice(0, ix.count), count: ix.count };
}

/**
 * The cells of the plain record text[p, end): split at ',', each left-trimmed of space, tab and
 * form feed and right-trimmed of white space (String.prototype.trimEnd), as csv-parse does.
 */
function plainCells(text: string, p: number, end: number): string[] {
  const record: string[] = [];
  let a = p;
  for (;;) {
    let b = text.indexOf(',', a);
    if (b < 0 || b > end) b = end;
    while (a < b && isLeftTrim(text.charCodeAt(a))) a++;
    record.push(text.slice(a, b).trimEnd());
    if (b === end) break;
    a = b + 1;
  }
  return record;
}

function tooLong(file: string, line: number): RateloomError {
  return new RateloomError('E_CSV', `record at line ${line} is longer than ${MAX_RECORD_CHARS} characters`, {
    location: { file, line },
    fix: 'Check the file: a lab CSV row is far shorter; an unclosed quote or a binary file can make one record swallow the rest.',
  });
}

/** Records through csv-parse (RFC 4180 quoting), with its errors as E_CSV naming the line. */
function parseQuoted(text: string, file: string, delimiter: CsvDelimiter): ParsedRecord[] {
  try {
    return fixQuotedCrlf(parse(text, {
      bom: true,
      delimiter,
      comment: '#',
      comment_no_infix: true,
      skip_empty_lines: true,
      skip_records_with_empty_values: true,
      trim: true,
      relax_column_count: true,
      max_record_size: MAX_RECORD_CHARS,
      info: true,
    }) as unknown as ParsedRecord[]);
  } catch (e) {
    const err = e as Error & { lines?: number; code?: string };
    if (err.code === 'CSV_MAX_RECORD_SIZE') throw tooLong(file, err.lines ?? 0);
    throw new RateloomError('E_CSV', `cannot read CSV: ${err.message}`, {
      location: { file, ...(typeof err.lines === 'number' ? { line: err.lines } : {}) },
      fix: 'Check quoting on the line given: a quoted cell must end with a closing double quote (RFC 4180: a quote inside a quoted cell is written twice).',
    });
  }
}

/** Parse CSV text. `file` is only used in messages. */
export function readCsv(text: string, file: string): CsvTable {
  checkArgs('readCsv', [text, file], [{ name: 'text', check: is.text }, { name: 'file', check: is.text }]);
  const nul = text.indexOf('\u0000');
  if (nul >= 0) {
    throw new RateloomError('E_CSV', `the file contains a NUL character (line ${text.slice(0, nul).split('\n').length}): it is binary, not CSV text`, {
      location: { file, line: text.slice(0, nul).split('\n').length },
      fix: 'Give a CSV text file (UTF-8, UTF-16 with byte-order mark, or windows-1252).',
    });
  }
  const delimiter = detectDelimiter(text);
  return delimiter === ',' && isPlain(text) ? plainTable(text, file) : quotedTable(text, file, delimiter);
}

function noHeader(file: string): RateloomError {
  return new RateloomError('E_CSV', 'the CSV file has no header row', { location: { file }, fix: 'Add a header row naming the columns.' });
}

/** The header cells trimmed; an empty or repeated name is E_CSV at `line`. */
function checkedHeader(cells: readonly string[], file: string, line: number): string[] {
  const header = cells.map((h) => h.trim());
  const seen = new Set<string>();
  header.forEach((h, i) => {
    if (h === '') {
      throw new RateloomError('E_CSV', `header cell ${i + 1} is empty`, { location: { file, line, column: i + 1 }, fix: 'Name every column in the header row.' });
    }
    if (seen.has(h)) {
      throw new RateloomError('E_CSV', `column '${h}' appears twice in the header`, { location: { file, line, column: h }, fix: 'Give each column a unique name.' });
    }
    seen.add(h);
  });
  return header;
}

/**
 * A table of plain text kept as the text and the offsets of its records: a row's cells are split
 * when it is read (rowAt), so a million-row file holds no string per cell; `rows` is made on first
 * use for the readers that want them all.
 */
function plainTable(text: string, file: string): CsvTable {
  const ix = indexPlain(text, file);
  if (ix.count === 0) throw noHeader(file);
  const header = checkedHeader(plainCells(text, ix.starts[0], ix.ends[0]), file, ix.lines[0]);
  const { starts, ends, lines } = ix;
  const rowCount = ix.count - 1;
  const rowAt = (i: number): CsvRow => ({ line: lines[i + 1], cells: plainCells(text, starts[i + 1], ends[i + 1]) });
  let rows: CsvRow[] | undefined;
  return {
    file,
    header,
    delimiter: ',',
    headerLine: lines[0],
    get rows(): CsvRow[] {
      if (!rows) {
        rows = new Array(rowCount);
        for (let i = 0; i < rowCount; i++) rows[i] = rowAt(i);
      }
      return rows;
    },
    rowCount,
    rowAt,
  };
}

/** A table read through csv-parse (quotes, carriage returns, other delimiters). */
function quotedTable(text: string, file: string, delimiter: CsvDelimiter): CsvTable {
  const records = parseQuoted(text, file, delimiter);
  if (records.length === 0) throw noHeader(file);
  const head = records[0];
  const header = checkedHeader(head.record, file, head.info.lines);
  const rows = rowsOf(records);
  return { file, header, delimiter, headerLine: startLine(head), rows, rowCount: rows.length, rowAt: (i) => rows[i] };
}

/** The records after the header as rows (a record's start line steps back over quoted newlines). */
function rowsOf(records: readonly ParsedRecord[]): CsvRow[] {
  const rows: CsvRow[] = new Array(records.length - 1);
  for (let i = 1; i < records.length; i++) rows[i - 1] = { line: startLine(records[i]), cells: records[i].record };
  return rows;
}

/** Index of a named column; a missing column is E_CSV naming the closest header. */
export function columnIndex(table: CsvTable, name: string, path: ReadonlyArray<string | number> = []): number {
  const i = table.header.indexOf(name);
  if (i >= 0) return i;
  const close = closestName(name, table.header);
  throw new RateloomError('E_CSV', `column '${name}' is not in the header of ${table.file}${close ? ` (closest: '${close}')` : ''}`, {
    path,
    location: { file: table.file, line: table.headerLine },
    fix: `Use one of the header names: ${table.header.join(', ')}.`,
    details: { column: name, header: table.header, ...(close ? { closest: close } : {}) },
  });
}
