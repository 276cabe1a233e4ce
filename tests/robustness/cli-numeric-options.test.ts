/**
 * Numeric command-line options (counts, seeds, levels, workers): one table of ranges
 * (src/core/option-ranges.ts) checked in one place (cli/options.ts) before any file is read.
 * A value outside its range, or not a plain decimal number, ends in exit 2 with E_USAGE naming the
 * flag, the range and an example; never a RangeError, an out-of-memory crash or a hang.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { OPTION_RANGES, RateloomError, optionProblem, type OptionName } from '../../src/index';
import { numericOptionOf, parseNumericFlag } from '../../cli/options';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { oneJson, runMany, type CliRun } from './cli-helpers';

const NAMES = Object.keys(OPTION_RANGES) as OptionName[];

/** Texts a user (or a script gone wrong) might pass as a number. */
const numberText = fc.oneof(
  fc.constantFrom('1e12', '1e9', '1e308', '-1', '0', '1', '1.5', '0.95', '1.0', 'Infinity', '-Infinity', 'NaN', '0x10', '1_000', '', ' ', '2 ', '+3', '.5', '1e-400', 'auto', '10000000', '10000001', '4294967296'),
  fc.integer({ min: -1e6, max: 1e10 }).map(String),
  fc.double({ noNaN: false }).map(String),
  fc.string({ maxLength: 12 }),
);

describe('parseNumericFlag: every value is accepted inside its range or refused with the range', () => {
  it('property over random texts and every option', () => {
    fc.assert(
      fc.property(fc.constantFrom(...NAMES), numberText, (name, raw) => {
        let v: number | 'auto' | undefined;
        let err: unknown;
        try {
          v = parseNumericFlag(`--${name}`, name, raw);
        } catch (e) {
          err = e;
        }
        if (err === undefined) {
          if (v === 'auto') return name === 'workers' && raw === 'auto';
          return optionProblem(name, v) === undefined && v === Number(raw) && raw.trim() !== '';
        }
        const e = err as RateloomError;
        expect(e).toBeInstanceOf(RateloomError);
        expect(e.code).toBe('E_USAGE');
        expect(e.path).toEqual([`--${name}`]);
        expect(e.details).toMatchObject({ option: `--${name}`, min: OPTION_RANGES[name].min, max: OPTION_RANGES[name].max });
        expect(e.fix).toMatch(/for example/);
        expect(e.message.split('\n')).toHaveLength(1);
        return true;
      }),
      { numRuns: 2000, seed: 20 },
    );
  });
  it('the cases seen: --draws 1e12 and --starts 1e9 are refused with their ranges', () => {
    expect(() => parseNumericFlag('--draws', 'draws', '1e12')).toThrow(/Monte Carlo draws must be a whole number from 0 to 10000000/);
    expect(() => parseNumericFlag('--starts', 'starts', '1e9')).toThrow(/multistart starts must be a whole number from 0 to 1000/);
    expect(() => parseNumericFlag('--workers', 'workers', '100000')).toThrow(/from 1 to 64 or 'auto'/);
    expect(parseNumericFlag('--draws', 'draws', '1e4')).toBe(10000);
  });
  it("plan's --draws has its own range; options that are not numeric are left alone", () => {
    expect(numericOptionOf('plan', 'draws')).toBe('planDraws');
    expect(numericOptionOf('size', 'draws')).toBe('draws');
    expect(numericOptionOf('fit', 'out')).toBeUndefined();
    expect(numericOptionOf('fit', 'constructor')).toBeUndefined();
  });
});

/** Command lines with a bad numeric value (the property above covers every option in process). */
const BAD: string[][] = [
  ['size', 'kinetics.json', 'plant.case.json', '--draws', '1e12'],
  ['size', 'kinetics.json', 'plant.case.json', '--workers', '100000'],
  ['fit', 'study.json', '--starts', '1e9'],
  ['fit', 'study.json', '--level', '1'],
  ['plan', 'study.json', '--limits', 'x.json', '--runs', '3', '--draws', '1e9'],
  ['demo', '--workers', 'Infinity'],
];

describe('the real command line', () => {
  // An empty folder: the options are checked before any file is read, so none is needed.
  let dir: string;
  let runs: CliRun[];
  let good: CliRun;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'rateloom-options-'));
    // The last line has good values but a missing study: the options pass and the file is named.
    runs = await runMany([...BAD.map((a) => [...a, '--json']), ['fit', 'none.json', '--starts', '3', '--level', '0.9', '--json']], dir, 3);
    good = runs.pop()!;
  }, 120_000);
  afterAll(() => dir && rmSync(dir, { recursive: true, force: true }));

  it.each(BAD.map((a, i) => [a.join(' '), i] as const))('%s: exit 2, E_USAGE naming the flag and its range', (_line, i) => {
    const r = runs[i];
    expect(r.code, r.stderr).toBe(2);
    const doc = oneJson(r);
    const flag = BAD[i][BAD[i].length - 2];
    expect(doc.error.code).toBe('E_USAGE');
    expect(doc.error.path).toBe(flag);
    expect(doc.error.details.option).toBe(flag);
    expect(doc.error.fix).toMatch(/whole number|a number/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
  it('values inside their ranges pass on to the command (which then names the missing file)', () => {
    expect(good.code).toBe(2);
    expect(oneJson(good).error.code).toBe('E_FILE');
    expect(readdirSync(dir)).toEqual([]);
  });
});
