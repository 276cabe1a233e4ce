import { describe, expect, it } from 'vitest';
import { readCsv } from '../../src/data/csv';

describe('readCsv', () => {
  it('BOM, comments, blank lines, quoted fields with commas and newlines, empty cells', () => {
    const t = readCsv('\uFEFF# note\nrun,T,"remark"\n\n1,300,"a,b"\n# c\n2,310,"two\nlines"\n3,,\n', 'x.csv');
    expect(t.header).toEqual(['run', 'T', 'remark']);
    expect(t.headerLine).toBe(2);
    expect(t.rows).toEqual([
      { line: 4, cells: ['1', '300', 'a,b'] },
      { line: 6, cells: ['2', '310', 'two\nlines'] },
      { line: 8, cells: ['3', '', ''] },
    ]);
  });
  it('an unclosed quote is E_CSV with a line', () => {
    expect(() => readCsv('a,b\n1,"2\n', 'g.csv')).toThrow(/g.csv, line 2/);
  });
  it('duplicate and empty header cells are refused', () => {
    expect(() => readCsv('a,a\n1,2', 'd.csv')).toThrow(/appears twice/);
    expect(() => readCsv('a,,b\n1,2,3', 'd.csv')).toThrow(/header cell 2 is empty/);
    expect(() => readCsv('# only a comment\n', 'e.csv')).toThrow(/no header/);
  });
});
