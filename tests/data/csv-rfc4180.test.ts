/**
 * CSV quoting against the examples of RFC 4180 ("Common Format and MIME Type for Comma-Separated
 * Values (CSV) Files", IETF, October 2005), section 2 "Definition of the CSV Format", rules 1-7:
 * each example is read with readCsv and compared with the records the RFC's text defines. CRLF is
 * written out as "\r\n". The first line of a CSV is rateloom's header (rule 3's optional header is
 * always present in a lab file), so each example gets a header line 'a,b,c' where it has none.
 * One documented difference from rule 4 ("spaces are considered part of a field"): rateloom trims
 * unquoted cells (lab exports pad numbers with spaces); spaces inside quotes are kept.
 */
import { describe, expect, it } from 'vitest';
import { readCsv } from '../../src/data/csv';

const H = 'a,b,c\r\n';
const cells = (text: string) => readCsv(text, 'rfc.csv').rows.map((r) => r.cells);

describe('RFC 4180 section 2, rule by rule', () => {
  it('rule 1: each record on its own line, delimited by CRLF', () => {
    expect(cells(`${H}aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n`)).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });
  it('rule 2: the last record may have no line break', () => {
    expect(cells(`${H}aaa,bbb,ccc\r\nzzz,yyy,xxx`)).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });
  it('rule 3: the header line has the format of a record', () => {
    const t = readCsv('field_name,field_name2,field_name3\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n', 'rfc.csv');
    expect(t.header).toEqual(['field_name', 'field_name2', 'field_name3']);
    expect(t.rows.map((r) => r.line)).toEqual([2, 3]);
  });
  it('rule 4: fields separated by commas, the last not followed by one (unquoted spaces trimmed: documented difference)', () => {
    expect(cells(`${H}aaa,bbb,ccc`)).toEqual([['aaa', 'bbb', 'ccc']]);
    expect(cells(`${H} aaa , bbb,ccc `)).toEqual([['aaa', 'bbb', 'ccc']]);
  });
  it('rule 5: fields may be enclosed in double quotes', () => {
    expect(cells(`${H}"aaa","bbb","ccc"\r\nzzz,yyy,xxx`)).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });
  it('rule 6: quoted fields hold line breaks (CRLF), double quotes and commas; later lines keep their numbers', () => {
    const t = readCsv(`${H}"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx`, 'rfc.csv');
    expect(t.rows.map((r) => r.cells)).toEqual([['aaa', 'b\r\nbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    expect(t.rows.map((r) => r.line)).toEqual([2, 4]);
    expect(cells(`${H}"a,a","b ""q"" b"," c "`)).toEqual([['a,a', 'b "q" b', ' c ']]);
  });
  it('rule 7: a double quote inside a quoted field is written twice', () => {
    expect(cells(`${H}"aaa","b""bb","ccc"`)).toEqual([['aaa', 'b"bb', 'ccc']]);
  });
  it('a quoted field that never closes is E_CSV naming the file and line', () => {
    expect(() => readCsv(`${H}aaa,"bbb,ccc\r\nzzz,yyy,xxx\r\n`, 'rfc.csv')).toThrow(/rfc\.csv, line \d+: cannot read CSV.*Fix: .*RFC 4180/);
  });
  it('the same quoting holds with a semicolon or tab delimiter (European exports)', () => {
    expect(cells('a;b;c\r\n"aaa";"b\r\nb;b";"c""c"\r\n')).toEqual([['aaa', 'b\r\nb;b', 'c"c']]);
    expect(cells('a\tb\tc\n"aaa"\t"b\tb"\t"1,5"\n')).toEqual([['aaa', 'b\tb', '1,5']]);
  });
});
