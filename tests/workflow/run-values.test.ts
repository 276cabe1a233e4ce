/**
 * A roughly known feed flow fitted as a run-level parameter: liquid stirred tank A -> B with
 * r = k C_A. Outlet flows F_A = F0/(1 + k tau) and F_B = F0 k tau/(1 + k tau) (the first-order
 * stirred-tank balance; Fogler, 5th ed., eq. 5-8) are generated here for F0 = 11 mmol/min while the
 * study's start says 10; the fit recovers both F0 and k.
 */
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study';
import { simulateStudy } from '../../src/study/simulate';
import { fitStudy } from '../../src/workflow/fit-study';

const k = 0.75; // 1/min
const F0 = 11; // mmol/min
const taus = [1, 2, 4]; // min (V in L with v0 = 1 L/min)
const rows = taus.map((t, i) => `R${i},${t},${F0 / (1 + k * t)},${(F0 * k * t) / (1 + k * t)}`);
const csv = `run,V,FA,FB\n${rows.join('\n')}\n`;
const study = {
  species: [{ name: 'A' }, { name: 'B' }],
  reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
  reactor: { kind: 'stirred-tank', phase: 'liquid' },
  data: [{
    file: 'f.csv', layout: 'per-run',
    columns: {
      run: 'run', temperature: { value: 300, unit: 'K' }, volume: { column: 'V', unit: 'L' }, volumetricFlow: { value: 1, unit: 'L/min' },
      feed: { A: { parameter: 'FA0', unit: 'mmol/min' }, B: { value: 0, unit: 'mmol/min' } },
      measured: [{ response: 'outlet-flow', species: 'A', column: 'FA', unit: 'mmol/min' }, { response: 'outlet-flow', species: 'B', column: 'FB', unit: 'mmol/min' }],
    },
  }],
  parameters: [{ name: 'k', value: 0.5, unit: '1/min' }, { name: 'FA0', value: 10, unit: 'mmol/min', lower: 5, upper: 20 }],
};

describe('a roughly known feed flow as a parameter', () => {
  it('is fitted with the kinetics and recovers the generating values', () => {
    const { study: s } = loadStudy(JSON.stringify(study), '/virtual/s.json', () => csv);
    const sf = fitStudy(s, { profile: false });
    expect(sf.fit.success).toBe(true);
    const get = (n: string) => sf.fit.parameters.find((p) => p.name === n)!.value;
    expect(get('FA0') * 60000).toBeCloseTo(F0, 6); // mol/s -> mmol/min
    expect(get('k') * 60).toBeCloseTo(k, 6); // 1/s -> 1/min
  });

  it('simulate uses the value given for the parameter', () => {
    const { study: s } = loadStudy(JSON.stringify(study), '/virtual/s.json', () => csv);
    const params = s.parameters.map((p) => (p.name === 'FA0' ? { ...p, value: F0 / 60000 } : p.name === 'k' ? { ...p, value: k / 60 } : p));
    const r = simulateStudy(s, params);
    taus.forEach((t, i) => expect(r.runs[i].outlet.A * 60000).toBeCloseTo(F0 / (1 + k * t), 8));
  });

  it('refuses a parameter field for a quantity that cannot hold one, and a unit of the wrong kind', () => {
    const bad1 = structuredClone(study) as any;
    bad1.data[0].columns.temperature = { parameter: 'k', unit: 'K' };
    expect(() => loadStudy(JSON.stringify(bad1), '/virtual/s.json', () => csv)).toThrow(/accepted only for feed flows and initial concentrations/);
    const bad2 = structuredClone(study) as any;
    bad2.parameters[1].unit = 'mol/m3';
    expect(() => loadStudy(JSON.stringify(bad2), '/virtual/s.json', () => csv)).toThrow(/needs mol\/s/);
  });
});
