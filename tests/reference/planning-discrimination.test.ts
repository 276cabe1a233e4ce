/**
 * Discrimination planning against SciPy (tests/reference/scipy/discrimination.py and its JSON):
 * one next sample of a batch decay to tell first order from second order. The whole path runs:
 * study with a rival rate-law set -> both fits -> Akaike weights -> candidates on [0, 10000] s ->
 * exact sensitivities -> Box-Hill / Hunter-Reiner -> expected posterior probabilities.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitStudy, studyVariants } from '../../src/workflow/fit-study';
import { parseLimits } from '../../src/planning/limits';
import { planRuns } from '../../src/planning/plan';
import { batchDecayStudy, studyFromText } from '../planning/helpers';

const ref = JSON.parse(readFileSync(join(__dirname, 'scipy/discrimination.json'), 'utf8'));

const doc = {
  ...batchDecayStudy({ c0: ref.C0_mol_m3, unit: 'mol/m^3', k: 1e-3, sigma: ref.sigma_mol_m3 }),
  candidates: [{
    name: 'second',
    reactions: { r: { form: 'power-law', basis: 'volume', rateConstant: { k: 'k2' }, orders: { A: 2 } } },
    parameters: [{ name: 'k2', value: 1e-6, unit: 'm^3/(mol s)', lower: 1e-12, upper: 1 }],
  }],
};

function setup() {
  const csv = ['run,t_s,CA', ...ref.times_s.map((t: number, i: number) => `S${i + 1},${t},${ref.data_mol_m3[i]}`)].join('\n') + '\n';
  const study = studyFromText(doc, csv);
  const fits = studyVariants(study).map((v) => fitStudy(study, { variant: v.name, profile: false }));
  const limits = parseLimits({ factors: { time: { min: 0, max: ref.tMax_s, unit: 's', levels: 2001 } }, minSpacing: 0 }, study);
  return { study, fits, limits };
}

describe('discrimination planning against SciPy', () => {
  const { study, fits, limits } = setup();

  it('Box-Hill: the fits and Akaike weights, the sample time and criterion value match SciPy; expected posteriors match quad to 0.01', () => {
    expect(fits[0].fit.parameters[0].value / ref.rivals[0].k).toBeCloseTo(1, 6);
    expect(fits[1].fit.parameters[0].value / ref.rivals[1].k).toBeCloseTo(1, 6);
    const plan = planRuns(study, limits, fits, { runs: 1, mode: 'discrimination', discrimination: 'box-hill', posteriorDraws: 20000 });
    // Today's probabilities: Akaike weights with known sigma, as the script computes them.
    const now = plan.discrimination!.models.map((m) => m.now);
    expect(now[0]).toBeCloseTo(ref.prior[0], 6);
    expect(now[1]).toBeCloseTo(ref.prior[1], 6);
    expect(plan.status).toBe('planned');
    const t = plan.runs[0].conditions.find((c) => c.key === 'time')!.value;
    // Box & Hill 1967 criterion maximised by SciPy minimize_scalar over [0, 10000] s.
    expect(Math.abs(t - ref.boxHill.t_s) / ref.boxHill.t_s).toBeLessThan(0.01);
    // One run: the run's contribution is the criterion itself (an empty plan scores 0).
    expect(plan.runs[0].contribution / ref.boxHill.value).toBeCloseTo(1, 3);
    // Expected posterior probabilities at SciPy's optimum time, by quadrature in the script.
    const E = plan.discrimination!.expected;
    for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) expect(Math.abs(E[i][j] - ref.expectedPosteriorAtBoxHill[i][j])).toBeLessThan(0.01);
  });

  it('Hunter-Reiner: the sample time where the predictions differ most matches SciPy', () => {
    const plan = planRuns(study, limits, fits, { runs: 1, mode: 'discrimination', discrimination: 'hunter-reiner', posteriorDraws: 10 });
    const t = plan.runs[0].conditions.find((c) => c.key === 'time')!.value;
    // Hunter & Reiner 1965: argmax (y1 - y2)^2, SciPy minimize_scalar.
    expect(Math.abs(t - ref.hunterReiner.t_s) / ref.hunterReiner.t_s).toBeLessThan(0.01);
    expect(plan.runs[0].contribution / ref.hunterReiner.value).toBeCloseTo(1, 3);
  });
});
