import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study';
import type { Study } from '../../src/study/types';
import { StudyModel } from '../../src/workflow/study-model';
import { fitStudy, buildHandoff } from '../../src/workflow/fit-study';
import { cosineNormals as normals } from '../../src/numerics/random';
import { checkJacobian } from '../../src/estimation/jacobian-check';

const studyPath = resolve(__dirname, '../data/fixtures/study.json');
const load = (): Study =>
  loadStudy(readFileSync(studyPath, 'utf8'), studyPath, (p) => readFileSync(resolve(dirname(studyPath), p), 'utf8')).study;

describe('StudyModel', () => {
  it('predicts every observation and its exact Jacobian matches central differences', () => {
    const study = load();
    const model = new StudyModel(study);
    const theta = Float64Array.from(model.parameters, (p) => (p.transform === 'log' ? Math.log(p.value) : p.value));
    const c = checkJacobian(model, theta);
    expect(c.ok).toBe(true);
    for (let i = 0; i < c.exact.length; i++) {
      // Common practice, no source: central differences agree with exact derivatives to ~1e-6.
      expect(Math.abs(c.exact[i] - c.central[i])).toBeLessThanOrEqual(1e-6 * Math.max(Math.abs(c.central[i]), 1e-9) + 1e-12);
    }
  });

  it('recovers known parameters from data it generated, within the 95% intervals', () => {
    const base = load();
    const truth = { k1: 2e-4, E1: 55e3 };
    const model = new StudyModel(base);
    const theta = Float64Array.from(model.parameters, (p) => {
      const v = (truth as Record<string, number>)[p.name] ?? p.value;
      return p.transform === 'log' ? Math.log(v) : v;
    });
    const pred = new Float64Array(model.nObservations);
    expect(model.predict(theta, pred)).toBe(true);
    const z = normals(7);
    const sd = 0.01;
    const study: Study = {
      ...base,
      observations: base.observations.map((o) => ({ ...o, value: pred[o.index] * (1 + sd * z()), sigma: Math.abs(pred[o.index]) * sd + 1e-12 })),
    };
    const sf = fitStudy(study, { profile: false });
    expect(sf.fit.success).toBe(true);
    for (const p of sf.fit.parameters.filter((q) => !q.fixed)) {
      const t = (truth as Record<string, number>)[p.name];
      expect(p.ci.linear![0]).toBeLessThan(t);
      expect(p.ci.linear![1]).toBeGreaterThan(t);
    }
    const h = buildHandoff(study, sf);
    expect(h.covariance.names).toEqual(sf.fit.covariance.names);
    expect(h.coverage.temperature.unit).toBe('K');
    expect(h.coverage.temperature.min).toBeLessThanOrEqual(h.coverage.temperature.max);
  });
});
