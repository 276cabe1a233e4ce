/**
 * The README's "Input contract" states limits; each must be the constant the code enforces, so
 * that a change to one without the other fails here. Where the code can be run on the claim
 * (the size override, encodings, delimiters, path confinement) it is run, not only compared.
 * Encoding names: the WHATWG Encoding Standard (https://encoding.spec.whatwg.org/), whose label
 * table Node's TextDecoder implements ("latin1" and "iso-8859-1" are labels of windows-1252).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { maxInputBytes } from '../../src/api/files';
import { MAX_JSON_DEPTH } from '../../src/core/json-text';
import { OPTION_RANGES, type OptionName } from '../../src/core/option-ranges';
import { DEFAULT_MAX_INPUT_BYTES, decodeInput } from '../../src/data/decode';
import { MAX_RECORD_CHARS, detectDelimiter } from '../../src/data/dialect';
import { PHYSICAL_RANGES } from '../../src/data/ranges';
import { LOG_OVERFLOW, VALUE_OVERFLOW } from '../../src/estimation/verdict';
import { sourcePath } from '../../src/study/sources';
import { MAX_UNIT_LENGTH, MAX_UNIT_NESTING } from '../../src/units/parse';
import { caught } from '../robustness/caught';

const README = readFileSync(join(import.meta.dirname, '..', '..', 'README.md'), 'utf8');
const start = README.indexOf('## Input contract');
/** The contract section with line breaks and runs of spaces made single spaces. */
const contract = README.slice(start, README.indexOf('\n## ', start + 1)).replace(/\s+/g, ' ');

/** A number as the README writes it: 1e9 and 1e100 in exponent form, others plain. */
function written(x: number): string {
  return x >= 1e6 && Number.isInteger(Math.log10(x)) ? `1e${Math.log10(x)}` : String(x);
}

/** The flag (as the README names it) of each numeric option. */
const FLAGS: Record<OptionName, string> = {
  starts: '`--starts`',
  seed: '`--seed`',
  maxIterations: '`--max-iterations`',
  level: '`--level`',
  draws: '`size --draws`',
  planDraws: '`plan --draws`',
  posteriorDraws: '`plan --posterior-draws`',
  runs: '`--runs`',
  workers: '`--workers`',
};

describe("README 'Input contract' states the limits the code uses", () => {
  afterEach(() => {
    delete process.env.RATELOOM_MAX_INPUT_MB;
  });

  it('exists in the reference part of the README', () => {
    expect(start).toBeGreaterThan(0);
    expect(contract.length).toBeGreaterThan(2000);
  });

  it('size: the default input limit, its override and the longest record', () => {
    expect(contract).toContain(`may be at most ${DEFAULT_MAX_INPUT_BYTES / 2 ** 20} MiB`);
    expect(contract).toContain('`RATELOOM_MAX_INPUT_MB` (MiB)');
    expect(maxInputBytes()).toBe(DEFAULT_MAX_INPUT_BYTES);
    process.env.RATELOOM_MAX_INPUT_MB = '3';
    expect(maxInputBytes()).toBe(3 * 2 ** 20);
    expect(contract).toContain(`at most ${MAX_RECORD_CHARS.toLocaleString('en')} characters`);
  });

  it('encodings: the names detected are the WHATWG names the README lists', () => {
    const cases: [number[], string][] = [
      [[0xef, 0xbb, 0xbf, 0x41], 'UTF-8'],
      [[0xff, 0xfe, 0x41, 0x00], 'UTF-16LE'],
      [[0xfe, 0xff, 0x00, 0x41], 'UTF-16BE'],
      [[0x41], 'UTF-8'],
      [[0x54, 0xb0, 0x43], 'windows-1252'], // a lone degree sign byte: not UTF-8
    ];
    for (const [bytes, name] of cases) {
      expect(decodeInput(new Uint8Array(bytes), 'x.csv').encoding).toBe(name);
      expect(contract).toContain(`\`${name}\``);
      // WHATWG Encoding Standard: the name is a label of itself (TextDecoder gives it back, lower case).
      expect(new TextDecoder(name).encoding).toBe(name.toLowerCase());
    }
    // WHATWG Encoding Standard label table: "latin1" and "iso-8859-1" decode as windows-1252.
    for (const label of ['latin1', 'iso-8859-1']) {
      expect(new TextDecoder(label).encoding).toBe('windows-1252');
      expect(contract).toContain(`"${label}"`);
    }
  });

  it('delimiters: comma, semicolon and tab are detected', () => {
    expect(contract).toContain('comma, semicolon or tab');
    expect(detectDelimiter('a,b,c\n1,2,3\n')).toBe(',');
    expect(detectDelimiter('a;b;c\n1,5;2;3\n')).toBe(';');
    expect(detectDelimiter('a\tb\tc\n1\t2\t3\n')).toBe('\t');
  });

  it('JSON nesting and unit strings', () => {
    expect(contract).toContain(`at most ${MAX_JSON_DEPTH} levels of nesting`);
    expect(contract).toContain(`at most ${MAX_UNIT_LENGTH} characters and ${MAX_UNIT_NESTING} levels of parentheses`);
  });

  it('physical ranges per row', () => {
    const { temperature: T, pressure: P } = PHYSICAL_RANGES;
    expect(T.open && P.open).toBe(true);
    expect(contract).toContain(`temperature above ${T.min} ${T.unit} and at most ${written(T.max)} ${T.unit}`);
    expect(contract).toContain(`pressure above ${P.min} ${P.unit} and at most ${written(P.max)} ${P.unit}`);
  });

  it('every numeric option with its range', () => {
    expect(Object.keys(FLAGS).sort()).toEqual(Object.keys(OPTION_RANGES).sort());
    for (const [name, flag] of Object.entries(FLAGS) as [OptionName, string][]) {
      const r = OPTION_RANGES[name] as { min: number; max: number; minOpen?: boolean; maxOpen?: boolean };
      const range = r.minOpen && r.maxOpen ? `above ${r.min} and below ${r.max}` : `${r.min}-${r.max}`;
      expect(contract, name).toContain(`${flag} ${range}`);
    }
  });

  it('hand-off numbers: the overflow bounds', () => {
    expect(contract).toContain(`|value| < ${written(VALUE_OVERFLOW)}`);
    expect(contract).toContain(`|ln value| <= ${LOG_OVERFLOW}`);
  });

  it('paths: data files stay in the study folder unless --allow-data-outside', () => {
    expect(contract).toContain('`--allow-data-outside`');
    const study = join('/tmp', 'lab', 'a.study.json');
    expect(caught(() => sourcePath('../elsewhere.csv', 0, study, {})).code).toBe('E_VALUE');
    expect(sourcePath('../elsewhere.csv', 0, study, { allowDataOutside: true })).toBe(join('/tmp', 'elsewhere.csv'));
    expect(sourcePath('runs/a.csv', 0, study, {})).toBe(join('/tmp', 'lab', 'runs', 'a.csv'));
  });
});
