import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/core/errors';
import { loadStudy } from '../../src/study';
import { defaultStartValue } from '../../src/study/parameters';
import type { Study } from '../../src/study/types';
import { fitStudy, openStarts, type StudyFit } from '../../src/workflow/fit-study';
import { estimateStartValues } from '../../src/workflow/start-values';
import { StudyModel, baseVariant } from '../../src/workflow/study-model';

const FIX = resolve(__dirname, '../data/fixtures');
const read = (p: string) => readFileSync(p, 'utf8');
function loadObj(obj: unknown, path: string): Study {
  return loadStudy(JSON.stringify(obj), path, (p) => read(resolve(dirname(path), p))).study;
}
const json = (p: string) => JSON.parse(read(p));

const AUTO = join(FIX, 'auto/study.json');
const RATES = join(FIX, 'rates/study.json');
const BASE = join(FIX, 'study.json');
/** Generating values of the fixture data (tests/data/fixtures/auto/generate.ts, rates/generate.ts). */
const autoTruth = json(join(FIX, 'auto/truth.json')) as { k1: number; E1: number };
const rateTruth = json(join(FIX, 'rates/truth.json')) as { k1: number; E1: number; nA: number };

/** Same optimum: weighted SSR and every estimate within `tol` relative. */
function expectSameOptimum(a: StudyFit, b: StudyFit, tol = 1e-4): void {
  expect(a.fit.success).toBe(true);
  expect(b.fit.success).toBe(true);
  expect(Math.abs(a.fit.statistics.ssr - b.fit.statistics.ssr)).toBeLessThanOrEqual(tol * b.fit.statistics.ssr);
  for (const p of b.fit.parameters) {
    const q = a.fit.parameters.find((x) => x.name === p.name)!;
    expect(Math.abs(q.value - p.value)).toBeLessThanOrEqual(tol * Math.abs(p.value) + 1e-12);
  }
}

describe('start values when the study gives none', () => {
  it('batch study without values: differential estimates, multistart by default, same optimum as from good values', () => {
    const auto = loadObj(json(AUTO), AUTO);
    expect(auto.autoStart).toEqual(['k1', 'E1']);
    const sf = fitStudy(auto, { profile: false });
    const est = sf.startValues!.estimated;
    expect(est.map((e) => [e.name, e.method, e.unit])).toEqual([
      ['k1', 'differential', 'm3/(mol s)'],
      ['E1', 'differential', 'J/mol'],
    ]);
    expect(est[0].detail).toMatch(/below 15%/);
    expect(sf.minima).toBeDefined();
    expect(sf.minima!.reduce((s, m) => s + m.count, 0)).toBeGreaterThan(1);
    // The fit's parameter table carries the unit the rate law gives k1 (the study gave none).
    expect(sf.fit.parameters.find((p) => p.name === 'k1')!.unit).toBe('m3/(mol s)');

    const given = json(AUTO);
    given.parameters = [
      { name: 'k1', value: autoTruth.k1, unit: 'm3/(mol s)' },
      { name: 'E1', value: autoTruth.E1 / 1000, unit: 'kJ/mol', lower: -50, upper: 300 },
    ];
    const good = fitStudy(loadObj(given, AUTO), { profile: false });
    expect(good.startValues).toBeUndefined();
    expect(good.minima).toBeUndefined();
    expectSameOptimum(sf, good);
  });

  it('on noise-free data the differential method lands within 20% of the true k_ref and E', () => {
    const study = loadObj(json(AUTO), AUTO);
    const model = new StudyModel(study);
    const theta = Float64Array.from(model.parameters, (p) => {
      const v = p.name === 'k1' ? autoTruth.k1 : autoTruth.E1;
      return p.transform === 'log' ? Math.log(v) : v;
    });
    const pred = new Float64Array(model.nObservations);
    expect(model.predict(theta, pred)).toBe(true);
    const exact: Study = { ...study, observations: study.observations.map((o) => ({ ...o, value: pred[o.index] })) };
    const sv = estimateStartValues(exact, baseVariant(exact), openStarts(exact, 'base'));
    const k = sv.estimated.find((e) => e.name === 'k1')!;
    const E = sv.estimated.find((e) => e.name === 'E1')!;
    expect(sv.points).toBe(15);
    // Source: the generating values of this test's data (auto/truth.json).
    expect(Math.abs(k.value / autoTruth.k1 - 1)).toBeLessThan(0.2);
    expect(Math.abs(E.value / autoTruth.E1 - 1)).toBeLessThan(0.2);
  });

  it('rate data without values: k_ref, E and the fitted order from the regression, same optimum', () => {
    const s = json(RATES);
    s.parameters = s.parameters.map((p: Record<string, unknown>) => ({ ...p, value: 'auto' }));
    const sf = fitStudy(loadObj(s, RATES), { profile: false });
    const est = sf.startValues!.estimated;
    expect(est.map((e) => e.method)).toEqual(['differential', 'differential', 'differential']);
    expect(est.find((e) => e.name === 'nA')!.unit).toBe('1');
    // Source: rates/truth.json; measured rates (3% noise) give the order directly.
    expect(Math.abs(est.find((e) => e.name === 'nA')!.value - rateTruth.nA)).toBeLessThan(0.1);
    const good = fitStudy(loadObj(json(RATES), RATES), { profile: false });
    expectSameOptimum(sf, good);
    expect(sf.model.counters.solves).toBe(0);
  });

  it('gas packed bed with pressure drop and profiles: same optimum without values; too few low-conversion runs noted', () => {
    const s = json(BASE);
    for (const p of s.parameters) if (p.name !== 'a') delete p.value;
    const sf = fitStudy(loadObj(s, BASE), { profile: false, starts: 8 });
    expect(sf.startValues!.notes.join(' ')).toMatch(/points up to 40% were used/);
    const good = fitStudy(loadObj(json(BASE), BASE), { profile: false });
    expectSameOptimum(sf, good);
  });

  it('parameters outside the power law keep the documented default, and the notes say why', () => {
    const s = json(BASE);
    delete s.candidates[0].parameters[0].value;
    const study = loadObj(s, BASE);
    const c = study.candidates[0];
    expect(c.autoStart).toEqual(['KA']);
    const sv = estimateStartValues(study, { name: c.name, reactions: c.reactions, parameters: c.parameters }, c.autoStart!);
    const ka = sv.estimated[0];
    expect([ka.name, ka.method, ka.unit]).toEqual(['KA', 'default', 'm s^2/kg']);
    // The fixture's LHHW term uses concentrations: K_A starts at 1 / mean inlet C_A.
    let sum = 0;
    for (const r of study.runs) {
      const F = r.feed!;
      sum += ((r.pressure! / (8.314462618 * r.temperature)) * F[0]) / F.reduce((x, y) => x + y, 0);
    }
    expect(ka.value).toBeCloseTo(study.runs.length / sum, 8);
    expect(ka.detail).toMatch(/1 \/ mean inlet concentration of A/);
    expect(sv.notes.join(' ')).toMatch(/lhhw rate law/);
  });

  it('reversible reaction: the forward term is regressed on low-conversion points; K_eq keeps its default', () => {
    const s = json(AUTO);
    s.reactions[0] = { id: 'r1', equation: 'A + B <=> C', rate: { form: 'reversible-power-law', rateConstant: { k: 'k1', activationEnergy: 'E1' }, equilibriumConstant: { K: 'K1' } } };
    s.parameters.push({ name: 'K1', value: 'auto', unit: 'L/mol', lower: 1e-3, upper: 1e5 });
    const study = loadObj(s, AUTO);
    const sv = estimateStartValues(study, baseVariant(study), openStarts(study, 'base'));
    expect(sv.estimated.map((e) => [e.name, e.method])).toEqual([
      ['k1', 'differential'],
      ['E1', 'differential'],
      ['K1', 'default'],
    ]);
    // Common practice, no source: geometric middle of [1e-3, 1e5] L/mol = 10 L/mol = 0.01 m3/mol.
    expect(sv.estimated[2].value).toBeCloseTo(0.01, 12);
    expect(sv.notes.join(' ')).toMatch(/reversible: only its forward term/);
    // Source: auto/truth.json (the data are irreversible, so the forward term is the whole rate).
    expect(Math.abs(sv.estimated[0].value / autoTruth.k1 - 1)).toBeLessThan(0.2);
  });

  it('per-run-group rate constants get one intercept per group', () => {
    const s = json(RATES);
    s.data[0].columns.group = 'charge';
    s.parameters = [
      { name: 'k1', scope: 'per-run-group', lower: 1e-12, upper: 1 },
      { name: 'E1', unit: 'kJ/mol', lower: 0, upper: 300 },
      { name: 'nA', lower: 0, upper: 3 },
    ];
    const csv = read(join(FIX, 'rates/rates.csv'))
      .split('\n')
      .map((l, i) => (i === 1 ? `${l},charge` : l.startsWith('D') ? `${l},${Number(l.slice(1, l.indexOf(','))) % 2 ? 'c1' : 'c2'}` : l))
      .join('\n');
    const study = loadStudy(JSON.stringify(s), RATES, (p) => (p.endsWith('rates.csv') ? csv : read(p))).study;
    expect(study.autoStart).toEqual(['k1@c1', 'k1@c2', 'E1', 'nA']);
    const sv = estimateStartValues(study, baseVariant(study), openStarts(study, 'base'));
    for (const n of ['k1@c1', 'k1@c2']) {
      const e = sv.estimated.find((x) => x.name === n)!;
      expect(e.method).toBe('differential');
      // Source: rates/truth.json (both groups were generated with one k).
      expect(Math.abs(e.value / rateTruth.k1 - 1)).toBeLessThan(0.1);
    }
  });

  it('default rules: geometric middle, 1 SI, 0 J/mol, stoichiometric coefficient', () => {
    // Common practice, no source: the documented defaults of study/parameters.ts.
    expect(defaultStartValue('constant', 1e-6, 1e2)).toBeCloseTo(1e-2, 12);
    expect(defaultStartValue('constant', 0, Infinity)).toBe(1);
    expect(defaultStartValue('constant', 0, 1e-3)).toBe(1e-4);
    expect(defaultStartValue('energy', -Infinity, Infinity)).toBe(0);
    expect(defaultStartValue('energy', 20e3, 200e3)).toBe(110e3);
    expect(defaultStartValue('order', 0, 3, 2)).toBe(2);
    expect(defaultStartValue('order', 0, 1, 2)).toBe(1);
    expect(defaultStartValue('other', -Infinity, Infinity)).toBe(1);
  });

  it('an explicit starts = 0 runs a single fit from the estimated start', () => {
    const sf = fitStudy(loadObj(json(AUTO), AUTO), { profile: false, starts: 0 });
    expect(sf.minima).toBeUndefined();
    expect(sf.startValues!.estimated).toHaveLength(2);
    expect(sf.fit.success).toBe(true);
  });

  it('a fixed parameter without a value is bad input', () => {
    const s = json(AUTO);
    s.parameters[1] = { name: 'E1', fixed: true };
    let err: unknown;
    try {
      loadObj(s, AUTO);
    } catch (e) {
      err = e;
    }
    expect(isRateloomError(err)).toBe(true);
    expect((err as { code: string }).code).toBe('E_MISSING_FIELD');
    expect((err as { path: unknown[] }).path).toEqual(['parameters', 1, 'value']);
  });
});
