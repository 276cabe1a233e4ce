import { describe, expect, it } from 'vitest';
import { RateloomError } from '../../src/core/errors';
import { baseStudy, load, withRunsFile } from './helpers';

function expectInvariant(report: { rowsIn: number; rowsUsed: number; rowsRejected: number; sources: { rowsIn: number; rowsUsed: number; rowsRejected: number }[] }) {
  expect(report.rowsIn).toBe(report.rowsUsed + report.rowsRejected);
  for (const s of report.sources) expect(s.rowsIn).toBe(s.rowsUsed + s.rowsRejected);
}

const cases: [file: string, reason: string, column: string | undefined, text: RegExp][] = [
  ['bad-non-numeric.csv', 'non-numeric', 'T_C', /'2x0' is not a number/],
  ['bad-negative-flow.csv', 'negative', 'FA0', /feed flow of A is negative/],
  ['bad-missing.csv', 'missing', 'T_C', /temperature is required/],
  ['bad-duplicate-run.csv', 'duplicate-run', undefined, /run id 'R1' was already used at bad-duplicate-run.csv:2/],
  ['bad-above-inlet.csv', 'above-inlet', 'FA', /more than 3 sigma .* above its inlet/],
  ['bad-element-balance.csv', 'element-balance', undefined, /element C is off by .*limit 2% of the inlet element flow/],
  ['bad-column-count.csv', 'column-count', undefined, /row has 7 cells, the header has 11/],
];

describe('each rejection reason, from a small CSV', () => {
  for (const [file, reason, column, text] of cases) {
    it(reason, () => {
      const { report, study } = load(withRunsFile(file));
      expectInvariant(report);
      expect(report.rowsIn).toBe(4);
      expect(report.rowsRejected).toBe(1);
      const r = report.rejections.find((x) => x.reason === reason);
      expect(r, JSON.stringify(report.rejections)).toBeDefined();
      expect(r!.file).toBe(file);
      expect(r!.line).toBe(5);
      if (column) expect(r!.column).toBe(column);
      expect(r!.message).toMatch(text);
      expect(study.runs.map((x) => x.id)).toEqual(['R1', 'R2', 'R3']);
      expect(study.observations.every((o) => o.location.line !== 5)).toBe(true);
    });
    it(`${reason}: strict mode fails listing the row`, () => {
      try {
        load(withRunsFile(file), {}, { strict: true });
        expect.unreachable();
      } catch (e) {
        expect((e as RateloomError).code).toBe('E_DATA');
        expect((e as RateloomError).message).toContain(`${file}:5`);
      }
    });
  }
});

describe('long layout rejections', () => {
  it('unknown run, unknown species, run rejected, non-numeric value', () => {
    const s = baseStudy();
    s.data[0].file = 'bad-above-inlet.csv';
    const profile = ['run,W_g,species,value,sd', 'R2,0.25,A,1.9,0.02', 'R8,0.25,A,1.9,0.02', 'R2,0.25,Q,1.9,0.02', 'R9,0.25,A,1.9,0.02', 'R2,0.5,B,abc,0.02'].join('\n');
    const { report } = load(s, { 'profile.csv': profile });
    expectInvariant(report);
    const reasons = report.rejections.filter((r) => r.file === 'profile.csv').map((r) => `${r.line}:${r.reason}`);
    expect(reasons).toEqual(['3:unknown-run', '4:unknown-species', '5:run-rejected', '6:non-numeric']);
    expect(report.sources[1]).toMatchObject({ rowsIn: 5, rowsUsed: 1, rowsRejected: 4 });
  });
  it('a reactant profile value above the inlet by more than 3 sigma is rejected', () => {
    const profile = ['run,W_g,species,value,sd', 'R2,0.25,A,2.05,0.01', 'R2,0.5,A,2.02,0.01'].join('\n');
    const { report } = load(baseStudy(), { 'profile.csv': profile });
    expectInvariant(report);
    // inlet 2.0 mmol/min, sigma 0.01: 2.05 is 5 sigma above (rejected), 2.02 is 2 sigma (kept)
    expect(report.rejections.map((r) => `${r.file}:${r.line}:${r.reason}`)).toEqual(['profile.csv:2:above-inlet']);
  });
});

describe('mapping mistakes are errors in the study', () => {
  it('missing column names the closest header', () => {
    const s = baseStudy();
    s.data[0].columns.temperature.column = 'T_c';
    expect(() => load(s)).toThrow(/column 'T_c' is not in the header of runs.csv \(closest: 'T_C'\)/);
  });
  it('gauge unit without the gauge flag is refused', () => {
    const s = baseStudy();
    delete s.data[0].columns.pressure.gauge;
    expect(() => load(s)).toThrow(/gauge pressure unit 'barg' needs the column marked gauge/);
  });
  it('gauge without ambient pressure is refused', () => {
    const s = baseStudy();
    delete s.data[0].ambientPressure;
    expect(() => load(s)).toThrow(/ambient pressure/);
  });
  it('unknown unit lists accepted units and the closest', () => {
    const s = baseStudy();
    s.data[0].columns.feed.A.unit = 'mmol/mn';
    try {
      load(s);
      expect.unreachable();
    } catch (e) {
      const err = e as RateloomError;
      expect(err.code).toBe('E_UNIT');
      expect(formatPathOf(err)).toBe('data[0].columns.feed.A.unit');
      expect(err.fix).toContain('mmol/min');
    }
  });
});

function formatPathOf(e: RateloomError): string {
  return e.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${p}`)).join('').replace(/^\./, '');
}
