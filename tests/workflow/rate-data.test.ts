import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/core/errors';
import { loadStudy } from '../../src/study';
import type { Study } from '../../src/study/types';
import { StudyModel } from '../../src/workflow/study-model';
import { fitStudy } from '../../src/workflow/fit-study';
import { checkJacobian } from '../../src/estimation/jacobian-check';

const DIR = resolve(__dirname, '../data/fixtures/rates');
const STUDY = join(DIR, 'study.json');
const read = (p: string) => readFileSync(p, 'utf8');
const loadText = (text: string): Study => loadStudy(text, STUDY, (p) => read(resolve(dirname(STUDY), p))).study;
/** Generating values of the fixture (tests/data/fixtures/rates/generate.ts). */
const truth = JSON.parse(read(join(DIR, 'truth.json'))) as { k1: number; E1: number; nA: number; referenceTemperature: number };

describe('rate data (differential packed bed)', () => {
  it('predicts measured rates from the rate law at the inlet, consumption of A counted positive, without integration', () => {
    const study = loadText(read(STUDY));
    const model = new StudyModel(study);
    const theta = Float64Array.from(model.parameters, (p) => {
      const v = (truth as unknown as Record<string, number>)[p.name];
      return p.transform === 'log' ? Math.log(v) : v;
    });
    const pred = new Float64Array(model.nObservations);
    expect(model.predict(theta, pred)).toBe(true);
    const R = 8.314462618;
    for (const o of study.observations) {
      const run = study.runs[o.runIndex];
      const F = run.feed!;
      const FT = F.reduce((s, f) => s + f, 0);
      const CT = run.pressure! / (R * run.temperature);
      const CA = (CT * F[0]) / FT;
      const CB = (CT * F[1]) / FT;
      // Source: analytic power law at inlet conditions (ideal gas), as in generate.ts without noise.
      const r = truth.k1 * Math.exp((-truth.E1 / R) * (1 / run.temperature - 1 / truth.referenceTemperature)) * CA ** truth.nA * CB;
      expect(o.unit).toBe('mol/(kg s)');
      expect(pred[o.index]).toBeGreaterThan(0);
      expect(Math.abs(pred[o.index] - r)).toBeLessThanOrEqual(1e-9 * r);
    }
    expect(model.counters.solves).toBe(0);
  });

  it('the exact Jacobian matches central differences', () => {
    const study = loadText(read(STUDY));
    const model = new StudyModel(study);
    const theta = Float64Array.from(model.parameters, (p) => (p.transform === 'log' ? Math.log(p.value) : p.value));
    const c = checkJacobian(model, theta);
    expect(c.ok).toBe(true);
    for (let i = 0; i < c.exact.length; i++) {
      // Common practice, no source: central differences with h = 1e-5 agree to ~1e-7 relative.
      expect(Math.abs(c.exact[i] - c.central[i])).toBeLessThanOrEqual(1e-6 * Math.abs(c.central[i]) + 1e-14);
    }
    expect(model.counters.solves).toBe(0);
  });

  it('a direct fit recovers the generating values within the 95% intervals, with no reactor solve', () => {
    const study = loadText(read(STUDY));
    const sf = fitStudy(study, { profile: false });
    expect(sf.fit.success).toBe(true);
    expect(sf.fit.statistics.covarianceBasis).toBe('known-sigma');
    for (const name of ['k1', 'E1', 'nA'] as const) {
      const p = sf.fit.parameters.find((q) => q.name === name)!;
      // Source: the generating values of the fixture data (truth.json, written by generate.ts).
      expect(p.ci.linear![0]).toBeLessThan(truth[name]);
      expect(p.ci.linear![1]).toBeGreaterThan(truth[name]);
    }
    expect(sf.model.counters.solves).toBe(0);
    expect(sf.model.counters.rateEvaluations).toBeGreaterThan(0);
    expect(sf.startValues).toBeUndefined();
  });

  it('rejects rates per volume when the rate law is per catalyst mass', () => {
    const s = JSON.parse(read(STUDY));
    s.data[0].columns.measured[0].unit = 'mmol/(L min)';
    let err: unknown;
    try {
      loadText(JSON.stringify(s));
    } catch (e) {
      err = e;
    }
    expect(isRateloomError(err)).toBe(true);
    expect((err as { code: string }).code).toBe('E_UNIT');
    expect((err as { path: unknown[] }).path).toEqual(['reactions', 0, 'rate', 'basis']);
  });
});
