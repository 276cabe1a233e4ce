/**
 * Generated CSV files, as bytes on disk, read the way the commands read them (cli/study-input.ts:
 * encoding detection, NUL and size limits, dialect detection, row checks): encodings (UTF-8 with
 * and without BOM, UTF-16LE/BE with BOM, windows-1252), delimiters (comma, semicolon, tab, with
 * decimal commas), RFC 4180 quoting (quoted cells, doubled quotes, line breaks inside quotes, an
 * unbalanced quote), CRLF line ends, NUL bytes, huge fields, truncation and flipped bytes.
 * Property: the study loads (every row used or rejected with its line), or loading ends in one
 * RateloomError line naming the file, and the input file is left untouched.
 */
import { createHash } from 'node:crypto';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/index';
import { readStudy } from '../../cli/study-input';
import { FIXTURES } from '../data/helpers';

const dir = mkdtempSync(join(tmpdir(), 'rateloom-csvfuzz-'));
for (const f of ['study.json', 'profile.csv']) copyFileSync(join(FIXTURES, f), join(dir, f));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const RUNS = readFileSync(join(FIXTURES, 'runs.csv'), 'utf8');

type Mutation = (text: string) => string | Uint8Array;

/** Text changes: dialect, quoting, line ends, odd cells. */
const textMutations: Record<string, (rnd: number) => (t: string) => string> = {
  semicolons: () => (t) => t.replace(/,/g, ';'),
  tabsAndDecimalCommas: () => (t) => t.replace(/,/g, '\t').replace(/(\d)\.(\d)/g, '$1,$2'),
  decimalCommasInCommaFile: () => (t) => t.replace(/(\d)\.(\d)/, '$1,$2'),
  crlf: () => (t) => t.replace(/\n/g, '\r\n'),
  quoteEveryCell: () => (t) => t.split('\n').map((l) => (l.startsWith('#') || !l ? l : l.split(',').map((c) => `"${c.replace(/"/g, '""')}"`).join(','))).join('\n'),
  quotedLineBreak: (r) => (t) => { const l = t.split('\n'); const i = 3 + (r % Math.max(1, l.length - 4)); l[i] = l[i].replace(/^([^,]*),/, '"$1\nmore",'); return l.join('\n'); },
  doubledQuotes: () => (t) => t.replace(/^(R\d+),/m, '"$1 ""x""",'),
  unbalancedQuote: (r) => (t) => { const at = r % t.length; return `${t.slice(0, at)}"${t.slice(at)}`; },
  hugeField: () => (t) => t.replace(/^(R\d+),/m, `$1${'9'.repeat(1_100_000)},`),
  manyColumns: () => (t) => t.replace(/\n(R\d+,[^\n]*)/, `\n$1${',1'.repeat(5000)}`),
  truncate: (r) => (t) => t.slice(0, r % t.length),
  degreeSign: () => (t) => t.replace('# ', '# 25 \u00b0C, 5 \u00b5m pellets; '),
};

/** Byte changes: encodings, BOMs, NULs, flipped bytes. */
const byteMutations: Record<string, (rnd: number) => (t: string) => Uint8Array> = {
  utf8Bom: () => (t) => Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(t)]),
  utf16le: () => (t) => Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(t, 'utf16le')]),
  utf16be: () => (t) => Buffer.concat([Buffer.from([0xfe, 0xff]), Buffer.from(t, 'utf16le').swap16()]),
  utf16NoBom: () => (t) => Buffer.from(t, 'utf16le'),
  windows1252: () => (t) => Buffer.from(t, 'latin1'),
  nulByte: (r) => (t) => { const b = Buffer.from(t); b[r % b.length] = 0; return b; },
  flippedByte: (r) => (t) => { const b = Buffer.from(t); b[r % b.length] ^= 0x80; return b; },
};

const mutation: fc.Arbitrary<{ names: string[]; apply: Mutation }> = fc
  .tuple(
    fc.array(fc.tuple(fc.constantFrom(...Object.keys(textMutations)), fc.nat()), { maxLength: 3 }),
    fc.option(fc.tuple(fc.constantFrom(...Object.keys(byteMutations)), fc.nat())),
  )
  .map(([texts, bytes]) => ({
    names: [...texts.map(([n]) => n), ...(bytes ? [bytes[0]] : [])],
    apply: (t: string) => {
      let s = t;
      for (const [n, r] of texts) s = textMutations[n](r)(s);
      return bytes ? byteMutations[bytes[0]](bytes[1])(s) : s;
    },
  }));

const digest = (p: string) => createHash('sha256').update(readFileSync(p)).digest('hex');

describe('generated CSV bytes', () => {
  it('every file loads or ends in one typed error line naming it; the file is untouched', () => {
    const seen: Record<string, number> = { loaded: 0, refused: 0 };
    fc.assert(
      fc.property(mutation, ({ apply }) => {
        const file = join(dir, 'runs.csv');
        writeFileSync(file, apply(RUNS));
        const before = digest(file);
        try {
          const { report } = readStudy(join(dir, 'study.json'));
          expect(report.rowsIn).toBe(report.rowsUsed + report.rowsRejected);
          for (const r of report.rejections) expect(r.line).toBeGreaterThan(0);
          seen.loaded++;
        } catch (e) {
          if (!isRateloomError(e)) throw e;
          expect(e.message.split('\n')).toHaveLength(1);
          expect(e.message).toMatch(/runs\.csv|study\.json/);
          expect(e.message).toContain('Fix:');
          seen.refused++;
        }
        expect(digest(file)).toBe(before);
      }),
      { numRuns: 150, seed: 4180 },
    );
    console.log(`generated CSV files: ${seen.loaded} loaded, ${seen.refused} refused with a typed error`);
    expect(seen.loaded).toBeGreaterThan(0);
    expect(seen.refused).toBeGreaterThan(0);
  });

  it('re-encoding alone (UTF-16 with BOM, windows-1252, CRLF, semicolons with decimal commas) changes nothing that is read', () => {
    writeFileSync(join(dir, 'runs.csv'), RUNS);
    const plain = readStudy(join(dir, 'study.json')).study.observations.map((o) => o.value);
    const same: Mutation[] = [byteMutations.utf16le(0), byteMutations.utf16be(0), byteMutations.windows1252(0), byteMutations.utf8Bom(0), textMutations.crlf(0), textMutations.tabsAndDecimalCommas(0), textMutations.quoteEveryCell(0)];
    for (const m of same) {
      writeFileSync(join(dir, 'runs.csv'), m(RUNS));
      expect(readStudy(join(dir, 'study.json')).study.observations.map((o) => o.value)).toEqual(plain);
    }
  });
});
