/**
 * The planner against designs known from outside the project: the locally D-optimal two-point
 * Michaelis-Menten design and the one-parameter first-order decay. Both go through the whole
 * planning path: study file -> fit -> limits file -> candidates in the study's CSV layout -> exact
 * sensitivities -> exchange -> planned CSV.
 */
import { describe, expect, it } from 'vitest';
import { fitStudy } from '../../src/workflow/fit-study';
import { parseLimits } from '../../src/planning/limits';
import { planRuns } from '../../src/planning/plan';
import { batchDecayStudy, studyFromText } from './helpers';


// Saturating rate r = k C / (1 + KA C) = V C / (K + C) with V = k / KA and K = 1 / KA, measured in a
// liquid stirred tank as rate data (predicted at the inlet). Constant (absolute) error on new runs;
// the old runs carry a sigma 1e4 times larger, so the plan is (almost) the design on its own.
const MM_K = 1e-3; // 1/s: r = k C in mol/(m3 s) at low C
const MM_KA = 1 / 800; // m3/mol: K = 800 mol/m3 = 0.8 mol/L
const X_MAX = 5000; // mol/m3 = 5 mol/L
const mmStudy = {
  species: [{ name: 'A' }, { name: 'B' }],
  reactions: [{ id: 'r', equation: 'A -> B', rate: { form: 'lhhw', basis: 'volume', rateConstant: { k: 'k' }, orders: { A: 1 }, adsorption: { A: { K: 'KA' } } } }],
  reactor: { kind: 'stirred-tank', phase: 'liquid' },
  referenceTemperature: 300,
  data: [{
    file: 'runs.csv', layout: 'per-run',
    columns: {
      run: 'run', temperature: { value: 300, unit: 'K' }, volume: { value: 1, unit: 'L' }, volumetricFlow: { value: 10, unit: 'mL/min' },
      inletConcentrations: { A: { column: 'CA_in', unit: 'mol/L' }, B: { value: 0, unit: 'mol/L' } },
      measured: [{ response: 'rate', species: 'A', column: 'rA', unit: 'mol/(L s)', sigmaColumn: 'sd', errorModel: 'lab' }],
    },
  }],
  parameters: [
    { name: 'k', value: 1.2e-3, unit: '1/s', lower: 1e-9, upper: 1 },
    { name: 'KA', value: 1e-3, unit: 'm^3/mol', lower: 1e-9, upper: 1 },
  ],
  errorModels: { lab: { absolute: { value: 1e-5, unit: 'mol/(L s)' } } },
};
function mmCsv(): string {
  const lines = ['run,CA_in,rA,sd'];
  [0.2, 0.5, 1, 2, 4].forEach((c, i) => {
    const C = c * 1000;
    const r = (MM_K * C) / (1 + MM_KA * C) / 1000; // mol/(L s)
    lines.push(`R${i + 1},${c},${r.toPrecision(15)},0.1`);
  });
  return lines.join('\n') + '\n';
}

describe('planning against known optimal designs', () => {
  it('Michaelis-Menten with constant error: the two planned runs are x_max and K x_max / (2K + x_max), to 1 %', () => {
    const study = studyFromText(mmStudy, mmCsv());
    const sf = fitStudy(study, { profile: false });
    // The old runs carry a huge sigma on purpose, so the fit itself is flagged as not identifiable;
    // its point estimate (exact data) is what the local design needs.
    expect(sf.fit.parameters[1].value).toBeCloseTo(MM_KA, 8);
    const limits = parseLimits({ factors: { inletConcentrations: { A: { min: 0, max: X_MAX / 1000, unit: 'mol/L', levels: 2001 } } }, minSpacing: 0 }, study);
    const plan = planRuns(study, limits, [sf], { runs: 2 });
    expect(plan.runs).toHaveLength(2);
    const xs = plan.runs.map((r) => r.conditions.find((c) => c.key === 'inletConcentrations.A')!.value).sort((a, b) => a - b);
    // Duggleby 1979 (J. theor. Biol. 81, 671-684), from memory: locally D-optimal two-point design
    // {K x_max / (2K + x_max), x_max}; confirmed by brute force over det F in exchange.test.ts.
    const K = 1 / MM_KA;
    const expected = (K * X_MAX) / (2 * K + X_MAX);
    expect(Math.abs(xs[0] - expected) / expected).toBeLessThan(0.01);
    expect(Math.abs(xs[1] - X_MAX) / X_MAX).toBeLessThan(0.01);
    // The CSV is in the study's layout: run id, the input column, the measured and sigma columns empty.
    expect(plan.csv.split('\n').find((l) => l.startsWith('run'))).toBe('run,CA_in,rA,sd');
    expect(plan.csv).toMatch(/^N1,[0-9.]+,,$/m);
  });

  it('first-order decay C = C0 exp(-k t): the one planned sample is at t = 1/k', () => {
    const k = 1e-3;
    const doc = batchDecayStudy({ c0: 1, unit: 'mol/L', k: 2e-3, sigma: 0.01 });
    const csv = ['run,t_s,CA', ...[100, 300, 600].map((t, i) => `S${i + 1},${t},${Math.exp(-k * t).toPrecision(15)}`)].join('\n') + '\n';
    const study = studyFromText(doc, csv);
    const sf = fitStudy(study, { profile: false });
    expect(sf.fit.parameters[0].value).toBeCloseTo(k, 8);
    const limits = parseLimits({ factors: { time: { min: 0, max: 3000, unit: 's', levels: 3001 } } }, study);
    const plan = planRuns(study, limits, [sf], { runs: 1 });
    // Analytic: |dC/dk| = C0 t exp(-k t) is largest at t = 1/k (one parameter: D-optimal = most sensitive).
    const t = plan.runs[0].conditions.find((c) => c.key === 'time')!.value;
    expect(Math.abs(t - 1 / k) / (1 / k)).toBeLessThan(0.01);
  });
});
