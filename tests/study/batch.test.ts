import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study/load';
import { simulateStudy } from '../../src/study/simulate';
import { summarizeStudy } from '../../src/study/summary';

/** An invented liquid batch study: 2 A -> B, conditions per run, concentrations vs time in a long file. */
const study = {
  species: [{ name: 'A' }, { name: 'B' }],
  reactions: [{ id: 'r1', equation: '2 A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' }, orders: { A: 1 } } }],
  reactor: { kind: 'batch', phase: 'liquid' },
  referenceTemperature: { value: 50, unit: 'degC' },
  data: [
    { file: 'conditions.csv', layout: 'per-run', columns: { run: 'run', temperature: { column: 'T', unit: 'degC' }, initialConcentrations: { A: { column: 'CA0', unit: 'mmol/L' } } } },
    { file: 'samples.csv', layout: 'long', response: 'outlet-concentration', unit: 'mmol/L', errorModel: 'gc', columns: { run: 'run', position: { column: 't', unit: 'min' }, species: 'sp', value: 'C' } },
  ],
  parameters: [{ name: 'k', value: 0.1, unit: '1/min' }],
  errorModels: { gc: { relative: 0.03 } },
};
const files: Record<string, string> = {
  'conditions.csv': 'run,T,CA0\nb1,50,100\nb2,50,200\n',
  'samples.csv': '# time series\nrun,t,sp,C\nb1,5,A,61\nb1,10,A,37\nb1,10,B,31\nb2,5,A,121\nb2,20,A,260\n',
};
const read = (abs: string) => files[abs.split('/').pop() as string];

describe('batch study with long layout', () => {
  const { study: s, report } = loadStudy(JSON.stringify(study), '/lab/batch.json', read);
  it('run time taken from the last sample; initial concentrations in SI', () => {
    expect(s.runs.map((r) => r.size)).toEqual([600, 300]);
    expect(s.runs[0].initialConcentrations![0]).toBeCloseTo(100, 12); // 100 mmol/L = 100 mol/m3
    expect(s.referenceTemperature).toBeCloseTo(323.15, 12);
    expect(s.observations.map((o) => o.position)).toEqual([300, 600, 600, 300]);
  });
  it('a concentration of reactant A above its initial value by more than 3 sigma is rejected', () => {
    // b2 at 20 min: 260 mmol/L against C0 = 200 mmol/L with sigma = 3% of 260 = 7.8: (260-200)/7.8 > 3
    expect(report.rejections.map((r) => `${r.file}:${r.line}:${r.reason}`)).toEqual(['samples.csv:7:above-inlet']);
    expect(report.rowsIn).toBe(report.rowsUsed + report.rowsRejected);
    expect(report.sources.map((x) => [x.rowsIn, x.rowsUsed, x.rowsRejected])).toEqual([[2, 2, 0], [5, 4, 1]]);
  });
  it('summary conversion from the end-of-run sample and simulation against the analytic solution', () => {
    const sum = summarizeStudy(s, report);
    expect(sum.ranges.size).toMatchObject({ min: 300, max: 600, unit: 's', quantity: 'time' });
    const sim = simulateStudy(s);
    // Source: analytic solution of dC_A/dt = -2 k C_A (reactant coefficient 2, rate first order in A):
    // C_A = C_A0 exp(-2 k t); k = 0.1/min, t = 10 min for b1.
    expect(sim.runs[0].concentrations.A).toBeCloseTo(100 * Math.exp(-2), 4);
    expect(sim.runs[0].conversion!).toBeCloseTo(1 - Math.exp(-2), 6);
  });
});
