/**
 * An invented ethane oxidative dehydrogenation study for the lab-data tests: packed bed, dry-basis
 * analyser fractions (water condensed), N2 as internal standard.
 *   C2H6 + 0.5 O2 -> C2H4 + H2O     r1 = k1 C_C2H6
 *   C2H4 + 3 O2 -> 2 CO2 + 2 H2O    r2 = k2 C_C2H4
 */
import { expect } from 'vitest';
import { loadStudy } from '../../src/study/load';
import type { StudyModel } from '../../src/workflow/study-model';

export const LAB_DIR = '/virtual/lab';

export function labStudy(over: Record<string, unknown> = {}, lab: Record<string, unknown> = {}): any {
  return {
    title: 'invented ODH bench',
    species: [
      { name: 'C2H6', formula: 'C2H6' },
      { name: 'O2', formula: 'O2' },
      { name: 'C2H4', formula: 'C2H4' },
      { name: 'CO2', formula: 'CO2' },
      { name: 'H2O', formula: 'H2O' },
      { name: 'N2', formula: 'N2', inert: true },
    ],
    reactions: [
      { id: 'odh', equation: 'C2H6 + 0.5 O2 -> C2H4 + H2O', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k1', activationEnergy: 'E1' }, orders: { C2H6: 1 } } },
      { id: 'comb', equation: 'C2H4 + 3 O2 -> 2 CO2 + 2 H2O', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k2', activationEnergy: 'E2' }, orders: { C2H4: 1 } } },
    ],
    keyReactant: 'C2H6',
    reactor: { kind: 'packed-bed', phase: 'gas' },
    referenceTemperature: { value: 800, unit: 'K' },
    data: [
      {
        file: 'runs.csv',
        layout: 'per-run',
        columns: {
          run: 'run',
          temperature: { column: 'T_K', unit: 'K' },
          pressure: { value: 1.2, unit: 'bar' },
          catalystMass: { column: 'W_g', unit: 'g' },
          feed: { C2H6: { column: 'F_C2H6', unit: 'mmol/min' }, O2: { column: 'F_O2', unit: 'mmol/min' }, N2: { column: 'F_N2', unit: 'mmol/min' } },
        },
      },
    ],
    parameters: [
      { name: 'k1', value: 2e-4, unit: 'm^3/(kg s)', lower: 1e-9, upper: 1 },
      { name: 'E1', value: 90, unit: 'kJ/mol', lower: 10, upper: 250 },
      { name: 'k2', value: 5e-4, unit: 'm^3/(kg s)', lower: 1e-9, upper: 1 },
      { name: 'E2', value: 70, unit: 'kJ/mol', lower: 10, upper: 250 },
    ],
    errorModels: { gc: { absolute: { value: 0.0002, unit: '1' }, relative: 0.01 } },
    labData: {
      file: 'runs.csv',
      run: 'run',
      fractions: { C2H6: 'y_C2H6', O2: 'y_O2', C2H4: 'y_C2H4', CO2: 'y_CO2', N2: 'y_N2' },
      basis: 'dry',
      removed: ['H2O'],
      standard: 'N2',
      selectivity: [{ product: 'C2H4', reactant: 'C2H6' }, { product: 'CO2', reactant: 'C2H6', factor: 0.5 }],
      errorModel: 'gc',
      balance: { elements: ['C'] },
      ...lab,
    },
    ...over,
  };
}

export const RUNS_HEADER = 'run,T_K,W_g,F_C2H6,F_O2,F_N2,y_C2H6,y_O2,y_C2H4,y_CO2,y_N2';

/** Load a lab study from in-memory files (names relative to LAB_DIR). */
export function loadLab(study: unknown, files: Record<string, string>) {
  return loadStudy(JSON.stringify(study), `${LAB_DIR}/study.json`, (abs) => {
    const f = files[abs.slice(LAB_DIR.length + 1)];
    if (f === undefined) throw new Error(`no such file ${abs}`);
    return f;
  });
}

/**
 * The model's exact Jacobian against central differences of its predictions (relative step 1e-5;
 * the decay rate is ~3e-6 1/s, so an absolute step would be far too large), for the given columns
 * (default all).
 */
export function expectJacobianMatches(m: StudyModel, theta: Float64Array, columns: number[] = [...theta.keys()]): void {
  const n = m.nObservations;
  const nP = theta.length;
  const J = new Float64Array(n * nP);
  expect(m.jacobian!(theta, new Float64Array(n), J)).toBe(true);
  const up = new Float64Array(n);
  const dn = new Float64Array(n);
  for (const k of columns) {
    const h = 1e-5 * (Math.abs(theta[k]) || 1);
    const t = Float64Array.from(theta);
    t[k] = theta[k] + h;
    m.predict(t, up);
    t[k] = theta[k] - h;
    m.predict(t, dn);
    for (let i = 0; i < n; i++) {
      const fd = (up[i] - dn[i]) / (2 * h);
      expect(Math.abs(J[i * nP + k] - fd)).toBeLessThan(1e-5 * Math.max(1e-3, Math.abs(fd)) + 1e-9);
    }
  }
}
