import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study';
import type { Study } from '../../src/study/types';
import { fitStudy } from '../../src/workflow/fit-study';
import { GAS_CONSTANT } from '../../src/core/constants';

const studyPath = resolve(__dirname, '../data/fixtures/study.json');
const load = (): Study =>
  loadStudy(readFileSync(studyPath, 'utf8'), studyPath, (p) => readFileSync(resolve(dirname(studyPath), p), 'utf8')).study;

describe('pre-exponential factor', () => {
  it('equals k_ref exp(E/(R T_ref)) and does not depend on the reference temperature chosen', () => {
    const base = load();
    const a = fitStudy(base, { profile: false });
    // Same data, same model, other reference temperature: only the parameterisation changes.
    const shifted: Study = { ...base, referenceTemperature: base.referenceTemperature + 60 };
    const b = fitStudy(shifted, { profile: false });
    const k = a.fit.parameters.find((p) => p.name === 'k1')!;
    const E = a.fit.parameters.find((p) => p.name === 'E1')!;
    const Aa = a.derived.find((d) => d.name === 'A(k1)')!;
    const Ab = b.derived.find((d) => d.name === 'A(k1)')!;
    // Definition (common practice, no source): A = k_ref exp(E / (R T_ref)).
    expect(Aa.value).toBeCloseTo(k.value * Math.exp(E.value / (GAS_CONSTANT * base.referenceTemperature)), 6);
    // Reparameterisation invariance: the fitted curve is the same, so A and its delta-method
    // standard error must agree between the two fits (to the fits' own tolerance).
    expect(Math.abs(Ab.value / Aa.value - 1)).toBeLessThan(1e-5);
    expect(Math.abs(Ab.stdError! / Aa.stdError! - 1)).toBeLessThan(1e-3);
    expect(Aa.ci.linear![0]).toBeLessThan(Aa.value);
    expect(Aa.ci.linear![1]).toBeGreaterThan(Aa.value);
  });
});
