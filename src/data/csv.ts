/**
 * CSV reading with csv-parse (RFC 4180 quoting): strips a UTF-8 byte-order mark, skips blank lines
 * and comment lines starting with '#', trims cells, keeps the 1-based source line of each record.
 * Rows with the wrong number of cells are not thrown out here; the mapping step reports them.
 * A malformed file (an unclosed quote) is a RateloomError('E_CSV') with the line.
 */
import { parse } from 'csv-parse/sync';
import { RateloomError, closestName } from '../core/errors';

export interface CsvRow {
  /** 1-based line in the file where the record starts. */
  line: number;
  cells: string[];
}

export interface CsvTable {
  /** File name used in messages (as written in the study). */
  file: string;
  header: string[];
  /** 1-based line of the header. */
  headerLine: number;
  rows: CsvRow[];
}

/** csv-parse reports the line where a record ends; step back over newlines inside quoted cells. */
function startLine(r: { record: string[]; info: { lines: number } }): number {
  let inner = 0;
  for (const c of r.record) for (const ch of c) if (ch === '\n') inner++;
  return r.info.lines - inner;
}

/** Parse CSV text. `file` is only used in messages. */
export function readCsv(text: string, file: string): CsvTable {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      bom: true,
      comment: '#',
      comment_no_infix: true,
      skip_empty_lines: true,
      skip_records_with_empty_values: true,
      trim: true,
      relax_column_count: true,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (e) {
    const err = e as Error & { lines?: number; code?: string };
    throw new RateloomError('E_CSV', `cannot read CSV: ${err.message}`, {
      location: { file, ...(typeof err.lines === 'number' ? { line: err.lines } : {}) },
      fix: 'Check quoting on the line given: a quoted cell must end with a closing double quote.',
    });
  }
  if (records.length === 0) {
    throw new RateloomError('E_CSV', 'the CSV file has no header row', { location: { file }, fix: 'Add a header row naming the columns.' });
  }
  const [head, ...rest] = records;
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
    headerLine: startLine(head),
    rows: rest.map((r) => ({ line: startLine(r), cells: r.record })),
  };
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
