/**
 * The 'stacked' (one row per run and species) and 'run-file' (one file per batch run) layouts:
 * rows grouped into runs, conditions that must repeat, the time-0 row as the charge, and the
 * rejections that name the file, line and column.
 */
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/index';

const stackedStudy = {
  species: [{ name: 'A' }, { name: 'B' }],
  reactions: [{ id: 'r', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
  reactor: { kind: 'stirred-tank', phase: 'liquid' },
  data: [{ file: 'runs.csv', layout: 'stacked', columns: { run: 'run', species: 'sp', temperature: { column: 'T', unit: 'degC' }, volume: { value: 1, unit: 'L' }, volumetricFlow: { column: 'Q', unit: 'mL/min' }, inlet: { column: 'Cin', unit: 'mol/L' }, outlet: { column: 'Cout', unit: 'mol/L' } } }],
  parameters: [{ name: 'k', value: 1e-4, unit: '1/s' }],
};
const load = (study: object, files: Record<string, string>) => loadStudy(JSON.stringify(study), '/x/s.study.json', (abs) => files[abs.replace('/x/', '')]);

describe('stacked layout', () => {
  it('gathers the rows of a run: feed = C_in * Q, one observation per outlet cell', () => {
    const csv = 'run,T,Q,sp,Cin,Cout\nS1,40,10,A,1.0,0.6\nS1,40,10,B,0,0.4\nS2,50,10,A,2.0,0.9\nS2,50,10,B,0,\n';
    const { study, report } = load(stackedStudy, { 'runs.csv': csv });
    expect(study.runs.map((r) => r.id)).toEqual(['S1', 'S2']);
    // feed of A in S1: 1.0 mol/L * 10 mL/min = 1000 mol/m3 * 1.6667e-7 m3/s (exact arithmetic of the units)
    expect(study.runs[0].feed?.[0]).toBeCloseTo((1000 * 10e-6) / 60, 12);
    expect(study.observations).toHaveLength(3);
    expect(report.rowsRejected).toBe(0);
  });

  it('rejects a whole run whose rows disagree on a condition, naming the row', () => {
    const csv = 'run,T,Q,sp,Cin,Cout\nS1,40,10,A,1.0,0.6\nS1,45,10,B,0,0.4\nS2,50,10,A,2.0,0.9\nS2,50,10,B,0,1.0\n';
    const { study, report } = load(stackedStudy, { 'runs.csv': csv });
    expect(study.runs.map((r) => r.id)).toEqual(['S2']);
    expect(report.rowsRejected).toBe(2);
    const bad = report.rejections.find((r) => r.line === 3);
    expect(bad?.column).toBe('T');
    expect(bad?.message).toMatch(/must repeat/);
  });
});

describe('run-file layout', () => {
  const study = {
    species: [{ name: 'A' }, { name: 'B' }],
    reactions: [{ id: 'r', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
    reactor: { kind: 'batch', phase: 'liquid' },
    data: ['B1.csv', 'B2.csv'].map((file) => ({ file, layout: 'run-file', unit: 'mol/L', columns: { time: { column: 't', unit: 'min' }, temperature: { column: 'T', unit: 'degC' }, species: { A: 'CA', B: 'CB' } } })),
    parameters: [{ name: 'k', value: 1e-4, unit: '1/s' }],
  };
  it('takes the time-0 row as the charge and later rows as samples; the run id is the file name', () => {
    const { study: s } = load(study, { 'B1.csv': 't,T,CA,CB\n0,50,1.0,0\n10,50,0.8,0.2\n20,50,0.6,0.4\n', 'B2.csv': 't,T,CA,CB\n0,60,2.0,0\n10,60,1.5,\n' });
    expect(s.runs.map((r) => r.id)).toEqual(['B1', 'B2']);
    expect(s.runs[0].initialConcentrations?.[0]).toBe(1000);
    expect(s.runs[0].size).toBe(1200); // last sample, 20 min in s
    expect(s.observations).toHaveLength(5);
  });
  it('rejects every row of a file without a time-0 row', () => {
    const { study: s, report } = load(study, { 'B1.csv': 't,T,CA,CB\n0,50,1.0,0\n10,50,0.8,0.2\n', 'B2.csv': 't,T,CA,CB\n5,60,2.0,0\n10,60,1.5,0.5\n' });
    expect(s.runs.map((r) => r.id)).toEqual(['B1']);
    expect(report.rejections.filter((r) => r.file === 'B2.csv')).toHaveLength(2);
    expect(report.rejections[0].message).toMatch(/no row at time 0/);
  });
});
