/**
 * Study-level semantics: all steady states of a stirred tank in `simulate` and the branch used by a
 * fit; semibatch conversion on the amount that entered; blank runs (zero catalyst mass or volume);
 * no reference-temperature note when nothing depends on temperature. Hand calculations beside
 * each check.
 */
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study/load';
import { simulateStudy } from '../../src/study/simulate';
import { summarizeStudy } from '../../src/study/summary';
import { formatCheck } from '../../cli/check';
import { formatSimulation } from '../../cli/simulate';
import { fitStudy } from '../../src/workflow/fit-study';
import { roundOffPredictions } from '../../src/workflow/round-off-predictions';

const load = (s: unknown, csv: string) => loadStudy(JSON.stringify(s), '/virtual/s.json', () => csv);

/** Liquid tank, r = k C_A/(1 + K C_A)^2: K C_A0 = 20 and k tau = 80 give three steady states. */
function tank(measured: unknown[] = []) {
  return {
    species: [{ name: 'A' }, { name: 'B' }],
    reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'lhhw', rateConstant: { k: 'k' }, adsorption: { A: { K: 'KA' } }, exponent: 2 } }],
    reactor: { kind: 'stirred-tank', phase: 'liquid' },
    data: [{ file: 't.csv', layout: 'per-run', columns: { run: 'run', temperature: { value: 350, unit: 'K' }, volume: { value: 100, unit: 'L' }, volumetricFlow: { value: 1, unit: 'L/s' }, inletConcentrations: { A: { value: 400, unit: 'mol/m3' }, B: { value: 0, unit: 'mol/m3' } }, measured } }],
    parameters: [{ name: 'k', value: 0.8, unit: '1/s' }, { name: 'KA', value: 0.05, unit: 'm3/mol' }],
  };
}

describe('stirred-tank steady states', () => {
  it('simulate lists every steady state with its stability, in JSON and text', () => {
    const { study } = load(tank(), 'run\nT1\n');
    expect(study.referenceTemperatureApplies).toBe(false);
    const r = simulateStudy(study);
    const states = r.runs[0].steadyStates!;
    expect(states).toHaveLength(3);
    expect(states.filter((s) => s.reported)).toHaveLength(1);
    const byA = [...states].sort((a, b) => a.outlet.A - b.outlet.A);
    expect(byA.map((s) => s.stability)).toEqual(['stable', 'unstable', 'stable']);
    // Each is a root of the balance u0 - u = Da u/(1 + u)^2 with u = K C_A (u0 = 20, Da = 80).
    for (const s of states) {
      const u = 0.05 * s.concentrations.A;
      expect(Math.abs(20 - u - (80 * u) / (1 + u) ** 2)).toBeLessThan(1e-6);
    }
    const text = formatSimulation(r, false);
    expect(text).toMatch(/steady state 1 of 3.*(stable|unstable): A .* mol\/s/);
    expect(text).not.toMatch(/Reference temperature/);
    expect(text).toContain('shown as 0');
  });

  it('a fit uses the branch of the measured outlet and says which', () => {
    // Measured outlet on the high-conversion branch: C_A near the lowest root.
    const { study } = load(tank([{ response: 'outlet-concentration', species: 'A', column: 'CA', unit: 'mol/m3' }]), 'run,CA\nT1,7.0\nT2,7.1\n');
    const sf = fitStudy({ ...study, parameters: study.parameters.map((p) => (p.name === 'KA' ? { ...p, fixed: true } : p)) }, { profile: false });
    const w = sf.fit.warnings.filter((x) => x.code === 'tank-branch');
    expect(w).toHaveLength(2);
    expect(w[0].message).toMatch(/run T1: the tank has 3 steady states .* the fit used the one nearest the measured outlet: A [0-9.e-]+ mol\/s, stable/);
    // The fitted prediction sits on the low-C_A branch (about 7 mol/m3), not at ~300 mol/m3.
    expect(sf.fit.observations[0].predicted).toBeLessThan(20);
    // The same as data (the fit's JSON carries `steadyStates`): every state, its stability, the one used.
    const t1 = sf.steadyStates!.find((r) => r.runId === 'T1')!;
    expect(t1.start).toBe('measured-outlet');
    expect(t1.states).toHaveLength(3);
    const used = t1.states.filter((x) => x.used);
    expect(used).toHaveLength(1);
    expect(used[0].concentrations.A).toBeCloseTo(sf.fit.observations[0].predicted, 6);
    expect(used[0].stability).toBe('stable');
    expect([...t1.states].sort((a, b) => a.concentrations.A - b.concentrations.A).map((x) => x.stability)).toEqual(['stable', 'unstable', 'stable']);
    for (const st of t1.states) {
      // Each is a root of u0 - u = Da u/(1 + u)^2 at the fitted k (Da = k tau, tau = 100 s; u = K C_A).
      const k = sf.fit.parameters.find((p) => p.name === 'k')!.value;
      const u = 0.05 * st.concentrations.A;
      expect(Math.abs(20 - u - (k * 100 * u) / (1 + u) ** 2)).toBeLessThan(1e-6);
      expect(Math.min(...Object.values(st.outletFlows))).toBeGreaterThanOrEqual(0);
    }
  });
});

describe('round-off in fit predictions', () => {
  it('a tiny negative predicted amount is shown as 0 (rule stated); a real negative is kept', () => {
    const { study } = load(tank([{ response: 'outlet-concentration', species: 'A', column: 'CA', unit: 'mol/m3' }]), 'run,CA\nT1,7.0\nT2,7.1\n');
    const sf = fitStudy({ ...study, parameters: study.parameters.map((p) => (p.name === 'KA' ? { ...p, fixed: true } : p)) }, { profile: false });
    expect(sf.roundOff).toBeUndefined(); // nothing negative in this fit
    const obs = sf.fit.observations.map((o, i) => ({ ...o, predicted: i === 0 ? -1e-15 : -0.01 }));
    const { fit, clamped } = roundOffPredictions({ ...sf.fit, observations: obs }, study);
    // Scale of run T1's outlet-concentration = max(|measured|, |predicted|) = 7 mol/m3; -1e-15 > -7e-9.
    expect(clamped).toBe(1);
    expect(fit.observations[0].predicted).toBe(0);
    expect(fit.observations[0].residual).toBe(7.0);
    // -0.01 mol/m3 is below -1e-9 x 7.1: kept as computed.
    expect(fit.observations[1].predicted).toBe(-0.01);
  });
});

describe('semibatch conversion and blank runs', () => {
  it('semibatch conversion is on the charge plus the amount fed', () => {
    const s = {
      species: [{ name: 'A' }, { name: 'B' }],
      reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
      reactor: { kind: 'semibatch', phase: 'liquid' },
      data: [{ file: 's.csv', layout: 'per-run', columns: { run: 'run', temperature: { value: 300, unit: 'K' }, time: { value: 100, unit: 's' }, initialVolume: { value: 1, unit: 'L' }, initialConcentrations: { A: { value: 1000, unit: 'mol/m3' }, B: { value: 0, unit: 'mol/m3' } }, volumetricFlow: { value: 0.01, unit: 'L/s' }, inletConcentrations: { A: { value: 1000, unit: 'mol/m3' }, B: { value: 0, unit: 'mol/m3' } }, measured: [] } }],
      parameters: [{ name: 'k', value: 0.01, unit: '1/s' }],
    };
    const r = simulateStudy(load(s, 'run\nS1\n').study);
    // N_A = F_A0/k (1 - e^-kt) + N_A0 e^-kt: F_A0 = 1e-5 m3/s * 1000 = 0.01 mol/s, N_A0 = 1 mol,
    // k t = 1: N_A = 1 (1 - e^-1) + e^-1 = 1 mol; entered 1 + 0.01 * 100 = 2 mol; X = 0.5.
    expect(r.runs[0].outlet.A).toBeCloseTo(1, 6);
    expect(r.runs[0].conversion!).toBeCloseTo(0.5, 6);
  });

  it('a blank run (zero catalyst mass) of a mass-basis stirred tank gives outlet = feed', () => {
    const s = {
      species: [{ name: 'A' }, { name: 'B' }],
      reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k' } } }],
      reactor: { kind: 'stirred-tank', phase: 'liquid' },
      referenceTemperature: 300,
      data: [{ file: 'b.csv', layout: 'per-run', columns: { run: 'run', temperature: { value: 300, unit: 'K' }, volume: { value: 1, unit: 'L' }, catalystMass: { column: 'W', unit: 'g' }, volumetricFlow: { value: 1, unit: 'L/min' }, feed: { A: { value: 10, unit: 'mmol/min' }, B: { value: 0, unit: 'mmol/min' } }, measured: [{ response: 'outlet-flow', species: 'A', column: 'FA', unit: 'mmol/min' }] } }],
      parameters: [{ name: 'k', value: 1e-3, unit: 'm3/(kg s)' }],
    };
    const { study, report } = load(s, 'run,W,FA\nB0,0,10\nW1,5,6\n');
    expect(report.rowsRejected).toBe(0);
    const r = simulateStudy(study);
    expect(r.runs[0].success).toBe(true);
    expect(r.runs[0].outlet.A).toBeCloseTo(10 / 60000, 15); // 10 mmol/min in mol/s: no catalyst, no reaction
    const check = formatCheck(summarizeStudy(study, report), report);
    // k has no activation energy: the reference temperature is not mentioned.
    expect(check).not.toMatch(/reference temperature/);
    expect(summarizeStudy(study, report).referenceTemperature.applies).toBe(false);
  });
});
