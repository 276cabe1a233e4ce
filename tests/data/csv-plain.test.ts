/**
 * The direct line splitter readCsv uses for text without quotes or carriage returns must give
 * what csv-parse gives for the same text and options (cells, trimming, skipped blank and comment
 * lines, all-blank records, BOM, line numbers). Source: csv-parse 6 itself, run here with the
 * options readCsv passes it.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parse } from 'csv-parse/sync';
import { readCsv } from '../../src/data/csv';
import { detectDelimiter } from '../../src/data/dialect';

/** What readCsv returned before the direct path: csv-parse records with their lines (delimiter as detected). */
function viaCsvParse(text: string): { header: string[]; headerLine: number; rows: { line: number; cells: string[] }[] } | 'error' {
  const records = parse(text, {
    bom: true,
    delimiter: detectDelimiter(text),
    comment: '#',
    comment_no_infix: true,
    skip_empty_lines: true,
    skip_records_with_empty_values: true,
    trim: true,
    relax_column_count: true,
    info: true,
  }) as unknown as { record: string[]; info: { lines: number } }[];
  if (records.length === 0) return 'error';
  const header = records[0].record.map((h) => h.trim());
  if (header.some((h) => h === '') || new Set(header).size !== header.length) return 'error';
  return { header, headerLine: records[0].info.lines, rows: records.slice(1).map((r) => ({ line: r.info.lines, cells: r.record })) };
}

function viaReadCsv(text: string) {
  try {
    const t = readCsv(text, 'p.csv');
    return { header: t.header, headerLine: t.headerLine, rows: t.rows };
  } catch {
    return 'error';
  }
}

const plainChar = fc.constantFrom('a', 'R', '1', '.', ',', ',', '\n', '\n', '#', ' ', '\t', '\f', '\v', '\u00A0', '\uFEFF', '\u3000', 'x', '\u00e9');

describe('readCsv on plain text (no quotes, no CR)', () => {
  it('equals csv-parse on random text', () => {
    fc.assert(
      fc.property(fc.boolean(), fc.array(plainChar, { maxLength: 60 }), (bom, chars) => {
        const text = (bom ? '\uFEFF' : '') + chars.join('');
        expect(viaReadCsv(text)).toEqual(viaCsvParse(text));
      }),
      { numRuns: 3000 },
    );
  });
  it('a typical lab file: comments, blank lines, trailing spaces, a short row', () => {
    const text = '\uFEFF# exported\nrun, T ,F\n\nR1, 300 ,1.5 \n  # note\nR2,310\n,,\nR3,320,2\n';
    expect(viaReadCsv(text)).toEqual(viaCsvParse(text));
    expect(readCsv(text, 'x.csv').rows.map((r) => r.line)).toEqual([4, 6, 8]);
  });
});
