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
  rows: CsvRow[];
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
 * The records csv-parse returns for plain text (see isPlain) with the options of readCsv: a
 * leading BOM dropped; a line that is blank after left-trimming or whose first such character is
 * '#' skipped; cells split at ',', left-trimmed of space/tab/form feed and right-trimmed of white
 * space (String.prototype.trimEnd); a record whose cells are all white space skipped; `lines` is
 * the 1-based line of the record.
 */
function parsePlain(text: string, file: string): ParsedRecord[] {
  const out: ParsedRecord[] = [];
  const n = text.length;
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  while (start <= n) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = n;
    if (end - start > MAX_RECORD_CHARS) throw tooLong(file, line);
    let p = start;
    while (p < end && isLeftTrim(text.charCodeAt(p))) p++;
    if (p < end && text.charCodeAt(p) !== 35) {
      const record: string[] = [];
      let empty = true;
      let a = p;
      for (;;) {
        let b = text.indexOf(',', a);
        if (b < 0 || b > end) b = end;
        while (a < b && isLeftTrim(text.charCodeAt(a))) a++;
        const cell = text.slice(a, b).trimEnd();
        if (empty && cell.trim() !== '') empty = false;
        record.push(cell);
        if (b === end) break;
        a = b + 1;
      }
      if (!empty) out.push({ record, info: { lines: line } });
    }
    line++;
    start = end + 1;
  }
  return out;
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
  const records = delimiter === ',' && isPlain(text) ? parsePlain(text, file) : parseQuoted(text, file, delimiter);
  if (records.length === 0) {
    throw new RateloomError('E_CSV', 'the CSV file has no header row', { location: { file }, fix: 'Add a header row naming the columns.' });
  }
  const head = records[0];
  const header = head.record.map((h) => h.trim());
  const seen = new Set<string>();
  header.forEach((h, i) => {
    if (h === '') {
      throw new RateloomError('E_CSV', `header cell ${i + 1} is empty`, { location: { file, line: head.info.lines, column: i + 1 }, fix: 'Name every column in the header row.' });
    }
    if (seen.has(h)) {
      throw new RateloomError('E_CSV', `column '${h}' appears twice in the header`, { location: { file, line: head.info.lines, column: h }, fix: 'Give each column a unique name.' });
    }
    seen.add(h);
  });
  return {
    file,
    header,
    delimiter,
    headerLine: startLine(head),
    rows: rowsOf(records),
  };
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
