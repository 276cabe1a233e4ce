import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { join } from 'node:path';
import { summarizeStudy } from '../../src/study/summary';
import { formatCheck } from '../../cli/check';
import { baseStudy, load, STUDY_PATH, withRunsFile } from '../data/helpers';

describe('check summary', () => {
  it('ranges, space time, conversion and degrees of freedom with units', () => {
    const { study, report } = load(baseStudy());
    const s = summarizeStudy(study, report);
    expect(s.runs).toBe(7);
    expect(s.observations).toBe(27);
    expect(s.ranges.temperature).toMatchObject({ min: 473.15, max: 513.15, unit: 'K' });
    // tau = W / F_A0 = 0.5 g / 2 mmol/min = 5e-4 kg / 3.333e-5 mol/s = 15 kg s/mol
    expect(s.ranges.spaceTime!.min).toBeCloseTo(15, 10);
    expect(s.ranges.spaceTime!.unit).toBe('kg s/mol');
    expect(s.ranges.conversion!.min).toBeCloseTo(0.12, 4);
    expect(s.ranges.conversion!.max).toBeCloseTo(0.66, 4);
    expect(s.freeParameters).toBe(2);
    expect(s.degreesOfFreedom).toBe(25);
    expect(s.rowsIn).toBe(s.rowsUsed + s.rowsRejected);
  });
  it('text lists rejections as file:line:column with the reason', () => {
    const { study, report } = load(withRunsFile('bad-non-numeric.csv'));
    const text = formatCheck(summarizeStudy(study, report), report);
    expect(text).toContain("bad-non-numeric.csv:5:T_C: non-numeric: '2x0' is not a number (temperature)");
    expect(text).toContain('4 rows in = 3 used + 1 rejected');
  });
});

describe('rateloom check (command)', () => {
  const main = join(import.meta.dirname, '../../cli/main.ts');
  const tsx = join(import.meta.dirname, '../../node_modules/.bin/tsx');
  it('--json prints one document with the report', () => {
    const out = execFileSync(tsx, [main, 'check', STUDY_PATH, '--json'], { encoding: 'utf8' });
    const doc = JSON.parse(out);
    expect(doc.status).toBe('ok');
    expect(doc.report.rowsIn).toBe(13);
    expect(doc.summary.degreesOfFreedom).toBe(25);
  });
});
