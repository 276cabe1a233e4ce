import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study/load';
import { applyParameterValues, simulateStudy } from '../../src/study/simulate';
import { RateloomError } from '../../src/core/errors';
import { baseStudy, load } from '../data/helpers';

/** An invented liquid plug-flow study, first order A -> B, k in 1/min, no temperature dependence. */
const pfr = {
  species: [{ name: 'A' }, { name: 'B' }],
  reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
  reactor: { kind: 'plug-flow', phase: 'liquid' },
  data: [
    {
      file: 'runs.csv',
      layout: 'per-run',
      columns: {
        run: 'run',
        temperature: { value: 300, unit: 'K' },
        volume: { column: 'V', unit: 'L' },
        volumetricFlow: { column: 'v0', unit: 'L/min' },
        inletConcentrations: { A: { column: 'CA0', unit: 'mol/L' } },
        measured: [{ response: 'outlet-concentration', species: 'A', column: 'CA', unit: 'mol/L' }],
      },
    },
  ],
  parameters: [{ name: 'k', value: 0.6, unit: '1/min' }],
};
const csv = 'run,V,v0,CA0,CA\np1,1,6,2,1.8\np2,2,6,2,1.6\n';

describe('simulateStudy', () => {
  it('first-order liquid plug flow matches X = 1 - exp(-k tau)', () => {
    const { study } = loadStudy(JSON.stringify(pfr), '/virtual/s.json', () => csv);
    const r = simulateStudy(study);
    expect(r.success).toBe(true);
    // Source: analytic solution of the first-order plug-flow mole balance, X = 1 - exp(-k V / v0).
    // k = 0.6/min = 0.01/s; tau = 1 L / (6 L/min) = 10 s and 20 s.
    expect(r.runs[0].conversion!).toBeCloseTo(1 - Math.exp(-0.1), 6);
    expect(r.runs[1].conversion!).toBeCloseTo(1 - Math.exp(-0.2), 6);
    expect(r.runs[0].measuredConversion!).toBeCloseTo(0.1, 12);
    expect(r.runs[0].pressureRatio).toBe(1);
  });
  it('parameter files: SI numbers, values with units, fit output; unknown names refused', () => {
    const { study } = loadStudy(JSON.stringify(pfr), '/virtual/s.json', () => csv);
    expect(applyParameterValues(study.parameters, { k: 0.02 }, 'p.json')[0].value).toBe(0.02);
    expect(applyParameterValues(study.parameters, { k: { value: 1.2, unit: '1/min' } }, 'p.json')[0].value).toBeCloseTo(0.02, 15);
    expect(applyParameterValues(study.parameters, { parameters: [{ name: 'k', value: 0.03 }] }, 'p.json')[0].value).toBe(0.03);
    expect(() => applyParameterValues(study.parameters, { kk: 1 }, 'p.json')).toThrow(RateloomError);
    expect(() => applyParameterValues(study.parameters, { k: { value: 1, unit: 'mol/s' } }, 'p.json')).toThrow(/is in 1\/s/);
    expect(study.parameters[0].value).toBeCloseTo(0.01, 15); // input not mutated
  });
  it('packed bed with groups and a candidate set', () => {
    const { study } = load(baseStudy());
    const r = simulateStudy(study);
    expect(r.runs).toHaveLength(7);
    expect(r.success).toBe(true);
    for (const run of r.runs) {
      // element balance on carbon: A and B carry 3 C each, so F_A + F_B = F_A0
      expect(run.outlet.A + run.outlet.B).toBeCloseTo(2e-3 / 60, 12);
      expect(run.pressureRatio).toBeLessThan(1);
    }
    const c = simulateStudy(study, study.candidates[0].parameters, { candidate: 'adsorptionLimited', profile: true });
    expect(c.runs[0].profile!.x.length).toBeGreaterThan(2);
  });
});
