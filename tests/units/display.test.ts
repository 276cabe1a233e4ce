/**
 * Display units: which unit each value is shown in, and the JSON shape of a fit with shown values
 * and SI beside. The expected factors are worked out here by hand from the definitions of the
 * units (litre = 1e-3 m3, gram = 1e-3 kg, minute = 60 s, kilojoule = 1e3 J, degC = K - 273.15;
 * SI Brochure 9th ed. Table 8 and NIST SP 811 App. B), not taken from the code under test.
 */
import { describe, expect, it } from 'vitest';
import { checkDisplayUnits, displayUnitFor, unitDims } from '../../src/units';
import { RateloomError } from '../../src/core/errors';
import { fitStudy } from '../../src/workflow/fit-study';
import { shownFitParts } from '../../src/workflow/shown-results';
import { baseStudy, load } from '../data/helpers';
import { fitReportData } from '../../src/workflow/fit-report-data';
import { formatFit } from '../../cli/fit';

const dims = (u: string) => unitDims(u)!;

describe('the unit a value is shown in', () => {
  const cases: [string, string | undefined, Record<string, string>, string][] = [
    // [SI unit, unit written by the user, displayUnits, shown unit]
    ['m^6/(mol kg s)', 'm^6/(mol kg s)', {}, 'm^6/(mol kg s)'],
    ['m^6/(mol kg s)', 'm^6/(mol kg s)', { volume: 'L', mass: 'g', time: 'min' }, 'L^2/(mol g min)'],
    ['m^3/(kg s)', 'm^3/(kg s)', { volume: 'L', mass: 'g', time: 'min' }, 'L/(g min)'],
    ['m^4.5/(kg s mol^0.5)', 'm^4.5/(kg s mol^0.5)', { volume: 'L' }, 'L^1.5/(kg s mol^0.5)'],
    ['m3/mol', 'm^3/mol', { volume: 'L', amount: 'mmol' }, 'L/mmol'],
    ['J/mol', 'kJ/mol', {}, 'kJ/mol'],
    ['J/mol', 'J/mol', { energy: 'kcal/mol' }, 'kcal/mol'],
    ['K', 'K', { temperature: 'degC' }, 'degC'],
    ['K', 'degF', {}, 'degF'],
    ['Pa', undefined, { pressure: 'bar' }, 'bar'],
    ['1/kg', undefined, { mass: 'g' }, '1/g'],
    ['mol/(kg s Pa^1.5)', 'mol/(kg s bar^1.5)', { pressure: 'kPa', time: 'h' }, 'mol/(kg h kPa^1.5)'],
    ['mol/s', 'mmol/min', {}, 'mmol/min'],
    ['mol/s', 'mmol/min', { molarFlow: 'kmol/h' }, 'kmol/h'],
    ['mol/s', undefined, {}, 'mol/s'],
    // a written unit of other dimensions is ignored (never shown with a wrong unit)
    ['J/mol', 'bar', {}, 'J/mol'],
  ];
  for (const [si, written, display, expected] of cases) {
    it(`${si} written '${written ?? '-'}' with ${JSON.stringify(display)} -> ${expected}`, () => {
      expect(displayUnitFor(dims(si), written, display)).toBe(expected);
    });
  }
});

describe('displayUnits is checked', () => {
  it('an unknown kind is E_UNKNOWN_FIELD naming the closest kind', () => {
    try {
      checkDisplayUnits({ energi: 'kJ/mol' }, ['displayUnits']);
      expect.unreachable();
    } catch (e) {
      expect((e as RateloomError).code).toBe('E_UNKNOWN_FIELD');
      expect((e as RateloomError).details?.closest).toBe('energy');
    }
  });
  it('a unit of another kind is E_UNIT with the path', () => {
    for (const [key, unit] of [['energy', 'bar'], ['pressure', 'kJ/mol'], ['amount', 'kg'], ['temperature', 'Pa'], ['time', 'furlong']]) {
      try {
        checkDisplayUnits({ [key]: unit }, ['displayUnits']);
        expect.unreachable();
      } catch (e) {
        expect((e as RateloomError).code).toBe('E_UNIT');
        expect((e as RateloomError).path).toEqual(['displayUnits', key]);
      }
    }
  });
  it('the study loader refuses both, with the field path', () => {
    const s = baseStudy();
    s.displayUnits = { pressure: 'bar', energi: 'kJ/mol' };
    expect(() => load(s)).toThrow(expect.objectContaining({ code: 'E_UNKNOWN_FIELD' }));
    s.displayUnits = { pressure: 'kJ/mol' };
    expect(() => load(s)).toThrow(expect.objectContaining({ code: 'E_UNIT', path: ['displayUnits', 'pressure'] }));
  });
});

describe('fit results in the user units with SI beside', () => {
  const plain = load(baseStudy()).study;
  const sf = fitStudy(plain, { profile: false });
  it('parameters in the unit of their start value by default', () => {
    const shown = shownFitParts(plain, sf.fit, sf.derived);
    const E1 = shown.parameters.find((p) => p.name === 'E1')!;
    const fitted = sf.fit.parameters.find((p) => p.name === 'E1')!;
    expect(E1.unit).toBe('kJ/mol');
    expect(E1.unitSI).toBe('J/mol');
    expect(E1.valueSI).toBe(fitted.value);
    expect(E1.value).toBeCloseTo(fitted.value / 1000, 10);
    expect(E1.stdError!).toBeCloseTo(fitted.stdError! / 1000, 10);
    expect(E1.ci.linear![0]).toBeCloseTo(fitted.ci.linear![0] / 1000, 10);
    expect(E1.ciSI).toEqual(fitted.ci);
    const k1 = shown.parameters.find((p) => p.name === 'k1')!;
    expect(k1.unit).toBe('m^4.5/(kg s mol^0.5)');
    expect(k1.value).toBe(k1.valueSI);
  });
  it('measured and predicted values in the unit of their CSV column', () => {
    const shown = shownFitParts(plain, sf.fit, sf.derived);
    for (const o of shown.observations) {
      expect(o.unit).toBe('mmol/min');
      expect(o.unitSI).toBe('mol/s');
      // 1 mmol/min = 1e-3 mol / 60 s
      expect(o.measured).toBeCloseTo((o.measuredSI * 60) / 1e-3, 9);
      expect(o.predicted).toBeCloseTo((o.predictedSI * 60) / 1e-3, 9);
    }
  });
  it('displayUnits rebuilds composite units and converts every value', () => {
    const s = baseStudy();
    s.displayUnits = { volume: 'L', mass: 'g', time: 'min', temperature: 'degC', energy: 'kcal/mol', molarFlow: 'mol/h' };
    const study = load(s).study;
    const shown = shownFitParts(study, sf.fit, sf.derived);
    const k1 = shown.parameters.find((p) => p.name === 'k1')!;
    expect(k1.unit).toBe('L^1.5/(g min mol^0.5)');
    // m^4.5 = (1e3 L)^1.5, 1/kg = 1e-3 /g, 1/s = 60 /min
    expect(k1.value / (k1.valueSI * 1e3 ** 1.5 * 1e-3 * 60)).toBeCloseTo(1, 12);
    const E1 = shown.parameters.find((p) => p.name === 'E1')!;
    expect(E1.unit).toBe('kcal/mol');
    expect(E1.value * 4184).toBeCloseTo(E1.valueSI, 6); // thermochemical calorie 4.184 J (NIST SP 811 B.8)
    expect(shown.referenceTemperature.unit).toBe('degC');
    expect(shown.referenceTemperature.value! + 273.15).toBeCloseTo(study.referenceTemperature, 10);
    expect(shown.observations[0].unit).toBe('mol/h');
    expect(shown.observations[0].measured).toBeCloseTo(shown.observations[0].measuredSI * 3600, 9);
    const A = shown.derived.find((q) => q.name === 'A(k1)')!;
    expect(A.unit).toBe(k1.unit);
  });
});

describe('reports and command text in the user units', () => {
  const plain = load(baseStudy()).study;
  const sf = fitStudy(plain, { profile: false });
  it('the report view model: parameters, run conditions and responses in the units of the study', () => {
    const data = fitReportData(plain, sf);
    expect(data.parameters.find((p) => p.name === 'E1')!.unit).toBe('kJ/mol');
    const run = data.runs[0];
    // T_C is written in degC; the pressure column is gauge (barg), so kPa absolute is shown
    expect(run.conditions.temperatureUnit).toBe('degC');
    expect(run.conditions.temperature + 273.15).toBeCloseTo(plain.runs[0].temperature, 10);
    expect(run.conditions.pressureUnit).toBe('kPa');
    expect(run.conditions.pressure * 1000).toBeCloseTo(plain.runs[0].pressure!, 6);
    expect(run.responses[0].unit).toBe('mmol/min');
    const o = plain.observations.find((x) => x.runId === run.runId && x.position === undefined)!;
    expect(run.responses[0].measured).toBeCloseTo((o.value * 60) / 1e-3, 9);
  });
  it('displayUnits reach the report and the command text', () => {
    const s = baseStudy();
    s.displayUnits = { temperature: 'K', energy: 'kcal/mol', molarFlow: 'mol/h', pressure: 'bar' };
    const study = load(s).study;
    const data = fitReportData(study, sf);
    expect(data.runs[0].conditions.temperatureUnit).toBe('K');
    expect(data.runs[0].conditions.pressureUnit).toBe('bar');
    expect(data.runs[0].responses[0].unit).toBe('mol/h');
    const E1 = data.parameters.find((p) => p.name === 'E1')!;
    expect(E1.unit).toBe('kcal/mol');
    const text = formatFit(study, sf);
    const row = text.split('\n').find((l) => l.startsWith('E1 '))!;
    expect(row).toContain('kcal/mol');
    expect(Number(row.split(/\s+/)[1]) * 4184).toBeCloseTo(sf.fit.parameters.find((p) => p.name === 'E1')!.value, -2); // 4 significant digits printed
  });
});
