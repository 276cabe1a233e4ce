/**
 * The study model's lab responses and activity: the exact Jacobian (flow sensitivities chained
 * through dg/dF, activity columns) against central differences of the predictions, and the
 * predicted fractions against the lab arithmetic applied to the predicted flows.
 */
import { describe, expect, it } from 'vitest';
import { fractionsFromFlows } from '../../src/data/lab-arithmetic';
import { StudyModel } from '../../src/workflow/study-model';
import { RUNS_HEADER, expectJacobianMatches, labStudy, loadLab } from './lab-fixture';

const RUNS = `${RUNS_HEADER},tos_h
R1,780,0.5,10,10,80,0.08,0.08,0.02,0.01,0.81,0
R2,800,1.0,10,10,80,0.07,0.07,0.03,0.01,0.82,5
R3,820,2.0,12,8,80,0.06,0.06,0.03,0.02,0.82,10
`;

function model(activity = true) {
  const lab = { fit: ['outlet-fraction', 'fraction-ratio', 'conversion', 'selectivity', 'yield'], timeOnStream: { column: 'tos_h', unit: 'h' } };
  const over = activity ? { activity: { model: 'exponential', start: { value: 0.01, unit: '1/h' } } } : {};
  const { study } = loadLab(labStudy(over, lab), { 'runs.csv': RUNS });
  return new StudyModel(study);
}

describe('lab responses in the study model', () => {
  it('exact Jacobian matches central differences (with the exponential activity model)', () => {
    const m = model();
    const theta = Float64Array.from(m.parameters, (p) => (p.transform === 'log' ? Math.log(p.value) : p.value));
    expectJacobianMatches(m, theta);
  });
  it('predicted dry fractions are those of the predicted flows, and activity slows the later runs', () => {
    const m = model();
    const ext = Float64Array.from(m.parameters, (p) => p.value);
    const sol = m.solveRun(2, ext);
    const y = fractionsFromFlows(sol.outletAmounts, m.study.lab!.removed.length ? m.study.chemistry.speciesNames.map((s) => s === 'H2O') : []);
    const pred = new Float64Array(m.nObservations);
    m.predict(Float64Array.from(m.parameters, (p) => (p.transform === 'log' ? Math.log(p.value) : p.value)), pred);
    const o = m.study.observations.find((q) => q.runIndex === 2 && q.response === 'outlet-fraction' && q.species === 'C2H4')!;
    expect(pred[o.index]).toBeCloseTo(y[2], 12);
    // Run 3 at 10 h on stream with kd = 0.01/h: a = exp(-0.1); conversion lower than fresh.
    const fresh = model(false);
    const predF = new Float64Array(fresh.nObservations);
    fresh.predict(Float64Array.from(fresh.parameters, (p) => (p.transform === 'log' ? Math.log(p.value) : p.value)), predF);
    const x = m.study.observations.find((q) => q.runIndex === 2 && q.response === 'conversion')!;
    expect(pred[x.index]).toBeLessThan(predF[x.index]);
    const x1 = m.study.observations.find((q) => q.runIndex === 0 && q.response === 'conversion')!;
    expect(pred[x1.index]).toBeCloseTo(predF[x1.index], 12); // t = 0: fresh catalyst
  });
});
