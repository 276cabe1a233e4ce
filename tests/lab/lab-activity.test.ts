/**
 * The linear and piecewise activity models and the sequence-number time axis: the model's
 * activity against its closed form a = 1 - b t (linear) and a = a_g (piecewise), applied as the
 * equivalent contact size (a first-order isothermal bed depends on W only through k W, so the
 * outlet at activity a equals the fresh outlet at a W: common practice); exact Jacobian columns
 * of the activity parameters against central differences; refusals with a pressure drop.
 */
import { describe, expect, it } from 'vitest';
import { activityOf } from '../../src/study/activity-params';
import { StudyModel } from '../../src/workflow/study-model';
import { RUNS_HEADER, expectJacobianMatches, labStudy, loadLab } from './lab-fixture';

const RUNS = `${RUNS_HEADER},seq,charge
R1,780,0.5,10,10,80,0.08,0.08,0.02,0.01,0.81,1,c1
R2,800,1.0,10,10,80,0.07,0.07,0.03,0.01,0.82,2,c1
R3,820,2.0,12,8,80,0.06,0.06,0.03,0.02,0.82,3,c2
R4,800,1.0,10,10,80,0.07,0.07,0.03,0.01,0.82,4,c2
`;

function study(activity: Record<string, unknown>) {
  const s = labStudy({ activity }, { sequence: 'seq', fit: ['outlet-fraction', 'conversion'] });
  s.data[0].columns.group = 'charge';
  return loadLab(s, { 'runs.csv': RUNS }).study;
}

const internal = (m: StudyModel, values: Record<string, number> = {}) => Float64Array.from(m.parameters, (p) => {
  const v = values[p.name] ?? p.value;
  return p.transform === 'log' ? Math.log(v) : v;
});

const activityColumns = (m: StudyModel) => m.study.activity!.parameters.map((n) => m.parameterNames.indexOf(n));

describe('activity models', () => {
  it('linear on the sequence number: a = 1 - b n, the outlet equals the fresh outlet at a W', () => {
    const s = study({ model: 'linear', start: { value: 0.05, unit: '1' } });
    expect(s.activity).toEqual({ model: 'linear', parameters: ['activity_b'], timeUnit: 'run' });
    expect(activityOf(s.activity!, s.runs[2], [0.05])).toBeCloseTo(1 - 0.05 * 3, 15);
    const m = new StudyModel(s);
    const ext = Float64Array.from(m.parameters, (p) => p.value);
    const aged = m.solveRun(2, ext);
    const fresh = new StudyModel(study({ model: 'none' }));
    const scaled = fresh.solveRun(2, Float64Array.from(fresh.parameters, (p) => p.value), {});
    const freshAtAW = new StudyModel({ ...fresh.study, runs: fresh.study.runs.map((r, i) => (i === 2 ? { ...r, size: 0.85 * r.size } : r)) });
    const ref = freshAtAW.solveRun(2, Float64Array.from(fresh.parameters, (p) => p.value));
    expect(aged.outletAmounts[0]).toBeCloseTo(ref.outletAmounts[0], 12);
    expect(aged.outletAmounts[0]).toBeGreaterThan(scaled.outletAmounts[0]); // less ethane converted
    expectJacobianMatches(m, internal(m), activityColumns(m));
  });
  it('piecewise per catalyst charge: the second charge has its own activity', () => {
    const s = study({ model: 'piecewise' });
    expect(s.activity!.parameters).toEqual(['activity@c2']);
    expect(activityOf(s.activity!, s.runs[0], [0.7])).toBe(1);
    expect(activityOf(s.activity!, s.runs[3], [0.7])).toBe(0.7);
    const m = new StudyModel(s);
    expectJacobianMatches(m, internal(m, { 'activity@c2': 0.7 }), activityColumns(m));
  });
  it('refuses an activity model with a pressure drop, naming why', () => {
    const s = labStudy({ activity: { model: 'exponential' }, reactor: { kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: { value: 1, unit: '1/kg' } } } }, { sequence: 'seq' });
    expect(() => loadLab(s, { 'runs.csv': RUNS })).toThrow(/equivalent contact size/);
  });
});
