/**
 * Bad input to the planner: limits outside the study's units or physics, conditions the study
 * cannot vary, a non-positive number of runs, a rate-law set without free parameters. Each is a
 * RateloomError with a stable code, a path and a fix.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/core/errors';
import { loadStudy } from '../../src/study/load';
import { fitStudy, type StudyFit } from '../../src/workflow/fit-study';
import { parseLimits } from '../../src/planning/limits';
import { planRuns } from '../../src/planning/plan';

const STUDY = resolve(import.meta.dirname, '../../datasets-demo/pbr/pbr.study.json');
const study = loadStudy(readFileSync(STUDY, 'utf8'), STUDY, (p) => readFileSync(p, 'utf8')).study;
const T = { min: 190, max: 260, unit: 'degC' };

function code(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    if (isRateloomError(e)) return `${e.code} ${e.path.join('.')}`;
    throw e;
  }
  return 'no error';
}

describe('planning input checks', () => {
  it('refuses limits in the wrong units, outside physics, or on conditions the study cannot vary', () => {
    expect(code(() => parseLimits({ factors: { temperature: { min: 190, max: 260, unit: 'bar' } } }, study))).toBe('E_UNIT factors.temperature.unit');
    expect(code(() => parseLimits({ factors: { temperature: { min: -300, max: 260, unit: 'degC' } } }, study))).toBe('E_VALUE factors.temperature.min');
    expect(code(() => parseLimits({ factors: { feed: { H2O: { min: -1, max: 4, unit: 'mmol/min' } } } }, study))).toBe('E_VALUE factors.feed.H2O.min');
    expect(code(() => parseLimits({ factors: { temperature: { min: 260, max: 190, unit: 'degC' } } }, study))).toBe('E_VALUE factors.temperature');
    expect(code(() => parseLimits({ factors: { volumetricFlow: { min: 1, max: 2, unit: 'mL/min' } } }, study))).toBe('E_VALUE factors.volumetricFlow');
    expect(code(() => parseLimits({ factors: { feed: { EtOH: { min: 0, max: 1, unit: 'mmol/min' } } } }, study))).toBe('E_VALUE factors.feed.EtOH');
    expect(code(() => parseLimits({ factors: { feed: { Xe: { min: 0, max: 1, unit: 'mmol/min' } } } }, study))).toBe('E_UNKNOWN_SPECIES factors.feed.Xe');
    expect(code(() => parseLimits({ factors: { temperatur: T } }, study))).toMatch(/^E_UNKNOWN_FIELD/);
    expect(code(() => parseLimits({ factors: { temperature: T }, maxConversion: 1.5 }, study))).toMatch(/^E_(VALUE|SCHEMA)/);
    expect(code(() => parseLimits({ factors: { temperature: T }, minOutletFlow: { value: 1, unit: 'kg' } }, study))).toBe('E_UNIT minOutletFlow.unit');
    expect(code(() => parseLimits({ factors: { temperature: { ...T, levels: 30 }, pressure: { min: 10, max: 30, unit: 'bar', levels: 30 }, catalystMass: { min: 5, max: 40, unit: 'g', levels: 30 } } }, study).factors)).toBe('no error');
  });

  it('refuses N <= 0, a fractional N and a rate-law set without free parameters', () => {
    const limits = parseLimits({ factors: { temperature: T } }, study);
    const fake = { variant: 'base', fit: { success: true, parameters: [] } } as unknown as StudyFit;
    expect(code(() => planRuns(study, limits, [fake], { runs: 0 }))).toBe('E_VALUE runs');
    expect(code(() => planRuns(study, limits, [fake], { runs: -3 }))).toBe('E_VALUE runs');
    expect(code(() => planRuns(study, limits, [fake], { runs: 2.5 }))).toBe('E_VALUE runs');
    const fixedStudy = { ...study, parameters: study.parameters.map((p) => ({ ...p, fixed: true })) };
    const sf = fitStudy(fixedStudy, { profile: false });
    expect(code(() => planRuns(fixedStudy, limits, [sf], { runs: 2 }))).toBe('E_VALUE parameters');
  });
});
