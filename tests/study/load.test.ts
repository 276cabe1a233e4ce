import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { RateloomError, formatPath } from '../../src/core/errors';
import { checkSchema, STUDY_SCHEMA } from '../../src/study';
import { baseStudy, load } from '../data/helpers';

function errorOf(f: () => unknown): RateloomError {
  try {
    f();
  } catch (e) {
    if (e instanceof RateloomError) return e;
    throw e;
  }
  throw new Error('expected a RateloomError');
}

describe('misspelt and invalid fields', () => {
  it("'reactons' names the field and 'reactions'", () => {
    const s = baseStudy();
    s.reactons = s.reactions;
    delete s.reactions;
    const e = errorOf(() => load(s));
    expect(e.code).toBe('E_UNKNOWN_FIELD');
    expect(formatPath(e.path)).toBe('reactons');
    expect(e.details?.closest).toBe('reactions');
    expect(e.message).toContain("did you mean 'reactions'");
    expect(e.location?.file).toMatch(/study\.json$/);
  });
  it('nested misspelling inside a rate law (oneOf picked by form)', () => {
    const s = baseStudy();
    s.reactions[0].rate.rateConstnt = s.reactions[0].rate.rateConstant;
    delete s.reactions[0].rate.rateConstant;
    const e = errorOf(() => load(s));
    expect(e.code).toBe('E_UNKNOWN_FIELD');
    expect(formatPath(e.path)).toBe('reactions[0].rate.rateConstnt');
    expect(e.details?.closest).toBe('rateConstant');
  });
  it('misspelt column key in a per-run source', () => {
    const s = baseStudy();
    s.data[0].columns.temprature = s.data[0].columns.temperature;
    const e = errorOf(() => load(s));
    expect(formatPath(e.path)).toBe('data[0].columns.temprature');
    expect(e.details?.closest).toBe('temperature');
  });
  it('bad enum value names the closest', () => {
    const s = baseStudy();
    s.reactor.kind = 'packed-bd';
    const e = errorOf(() => load(s));
    expect(e.code).toBe('E_VALUE');
    expect(e.message).toContain("closest: 'packed-bed'");
  });
  it('bad layout discriminator', () => {
    const s = baseStudy();
    s.data[1].layout = 'longg';
    expect(errorOf(() => load(s)).message).toContain("closest: 'long'");
  });
  it('wrong type and missing required field', () => {
    const s = baseStudy();
    s.parameters[0].value = '0.5';
    expect(errorOf(() => load(s)).code).toBe('E_TYPE');
    const t = baseStudy();
    delete t.reactor;
    const e = errorOf(() => load(t));
    expect(e.code).toBe('E_MISSING_FIELD');
    expect(formatPath(e.path)).toBe('reactor');
  });
  it('invalid JSON gives line and column', () => {
    const e = errorOf(() => checkSchema(JSON.parse('{}'), STUDY_SCHEMA));
    expect(e.code).toBe('E_MISSING_FIELD');
  });
  it('undeclared parameter in a rate law names the closest', () => {
    const s = baseStudy();
    s.reactions[0].rate.rateConstant.k = 'k_1';
    const e = errorOf(() => load(s));
    expect(e.code).toBe('E_UNKNOWN_PARAMETER');
    expect(e.details?.closest).toBe('k1');
  });
});

describe('resolved study', () => {
  const { study, report } = load(baseStudy());
  it('runs in SI with gauge pressure and group', () => {
    const r1 = study.runs[0];
    expect(r1.temperature).toBeCloseTo(473.15, 12);
    expect(r1.pressure).toBeCloseTo(1e5 + 101325, 6); // 1 barg + 101.325 kPa ambient
    expect(r1.size).toBeCloseTo(5e-4, 15); // 0.5 g
    expect(r1.feed![0]).toBeCloseTo(2e-3 / 60, 15); // 2 mmol/min
    expect(r1.group).toBe('c1');
  });
  it('parameters in SI with default transforms and per-group copies', () => {
    const byName = Object.fromEntries(study.parameters.map((p) => [p.name, p]));
    expect(byName.E1.value).toBe(60000);
    expect(byName.E1.unit).toBe('J/mol');
    expect(byName.E1.transform).toBe('none');
    expect(byName.k1.transform).toBe('log');
    expect(Object.keys(byName)).toEqual(['k1', 'E1', 'a@c1', 'a@c2']);
    expect(study.scopes.find((s) => s.base === 'a')?.members).toEqual({ c1: 'a@c1', c2: 'a@c2' });
  });
  it('observations carry SI values, error model and location', () => {
    const o = study.observations[0];
    expect(o).toMatchObject({ runId: 'R1', response: 'outlet-flow', species: 'A', errorModel: 'flows', unit: 'mol/s' });
    expect(o.location).toEqual({ file: 'runs.csv', line: 4, column: 'FA' });
    const prof = study.observations.filter((x) => x.position !== undefined);
    expect(prof).toHaveLength(6);
    expect(prof[0].position).toBeCloseTo(2.5e-4, 15);
    expect(prof[0].sigma).toBeCloseTo(0.02e-3 / 60, 15);
    expect(prof[0].errorModel).toBe('unweighted');
  });
  it('reference temperature picked from the data when absent', () => {
    expect(study.referenceTemperatureSource).toBe('data');
    expect(study.referenceTemperature).toBeGreaterThan(473);
    expect(study.referenceTemperature).toBeLessThan(514);
  });
  it('replicates and pure error', () => {
    expect(report.replicateGroups).toEqual([{ id: 'rep1', runIds: ['R6', 'R7'] }]);
    const pe = report.pureError.find((p) => p.species === 'A')!;
    expect(pe.dof).toBe(1);
    // FA of R6 and R7: 2*(1-0.66) and 2*(1-0.64) mmol/min; s = |d| / sqrt(2)
    expect(pe.sigma).toBeCloseTo((0.04e-3 / 60) / Math.SQRT2, 12);
  });
  it('candidates replace rate laws and add parameters', () => {
    const c = study.candidates[0];
    expect(c.replaced).toEqual(['r1']);
    expect(c.reactions[0].rate.form).toBe('lhhw');
    expect(c.parameters.map((p) => p.name)).toContain('KA');
    expect(c.parameters.find((p) => p.name === 'KA')!.transform).toBe('log');
  });
  it("'replicates' error model takes sigma from the pure error", () => {
    const s = baseStudy();
    s.errorModels.flows = { replicates: true };
    const { study: st } = load(s);
    const o = st.observations.find((x) => x.species === 'B' && x.errorModel === 'flows')!;
    expect(o.sigma).toBeCloseTo((0.04e-3 / 60) / Math.SQRT2, 12);
  });
  it("'replicates' without replicate runs is an error", () => {
    const s = baseStudy();
    s.errorModels.flows = { replicates: true };
    s.data[0].file = 'bad-missing.csv';
    s.data = [s.data[0]];
    expect(() => load(s)).toThrow(/no replicate runs measure/);
  });
});

describe('the shipped schema file', () => {
  it('is draft 2020-12 and the study fixture refers to it', () => {
    const schema = JSON.parse(readFileSync(join(import.meta.dirname, '../../schema/study.schema.json'), 'utf8'));
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(baseStudy().$schema).toBe('../../../schema/study.schema.json');
  });
});

describe('error model units', () => {
  it('an absolute sigma in another dimension than its responses is refused', () => {
    const s = baseStudy();
    s.errorModels.flows.absolute.unit = 'mol/L';
    expect(() => load(s)).toThrow(/absolute sigma in mol\/m3, but it is used for outlet-flow values in mol\/s/);
  });
});
