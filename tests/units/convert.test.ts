import { describe, expect, it } from 'vitest';
import { acceptedUnits, compoundToSI, fromSI, QUANTITIES, toSI, unitFor, type Quantity } from '../../src/units';
import { RateloomError } from '../../src/core/errors';

describe('round trips for every listed unit', () => {
  for (const q of Object.keys(QUANTITIES) as Quantity[]) {
    for (const unit of acceptedUnits(q)) {
      it(`${q}: ${unit}`, () => {
        for (const x of [0.5, 3.25, 1234.5]) {
          const back = fromSI(toSI(x, q, unit), q, unit);
          expect(Math.abs(back - x) / x).toBeLessThan(1e-13);
        }
      });
    }
  }
  for (const unit of ['barg', 'psig', 'kPa(g)']) {
    it(`gauge ${unit} with ambient`, () => {
      const opts = { gauge: true, ambientPressure: 101325 };
      expect(fromSI(toSI(2.5, 'pressure', unit, opts), 'pressure', unit, opts)).toBeCloseTo(2.5, 12);
    });
  }
});

describe('unit parsing', () => {
  it('reads equivalent spellings the same', () => {
    const a = toSI(1, 'rate', 'mol/(kg s)');
    expect(toSI(1, 'rate', 'mol kg-1 s-1')).toBe(a);
    expect(toSI(1, 'rate', 'mol/kg/s')).toBe(a);
    expect(toSI(1, 'rate', 'mol/kg s')).toBe(a);
    expect(toSI(1, 'rate', 'mol/(kg*s)')).toBe(a);
  });
  it('knows the basis of rate data', () => {
    expect(unitFor('rate', 'mol/(g s)').basis).toBe('mass');
    expect(unitFor('rate', 'mol/(L s)').basis).toBe('volume');
  });
  it('gauge: barg is refused without gauge flag and ambient', () => {
    expect(() => toSI(1, 'pressure', 'barg')).toThrow(/ambient/);
    expect(() => toSI(1, 'pressure', 'barg', { gauge: true })).toThrow(RateloomError);
    expect(toSI(1, 'pressure', 'barg', { gauge: true, ambientPressure: 101325 })).toBe(201325);
    expect(toSI(14.5, 'pressure', 'psig', { gauge: true, ambientPressure: 1e5 })).toBeCloseTo(14.5 * 6894.757293168361 + 1e5, 6);
  });
  it('unknown unit: E_UNIT listing the accepted units and the closest', () => {
    try {
      toSI(1, 'pressure', 'barr');
      expect.unreachable();
    } catch (e) {
      const err = e as RateloomError;
      expect(err.code).toBe('E_UNIT');
      expect(err.details?.closest).toBe('bar');
      expect(err.fix).toContain('kPa');
      expect(err.message).toContain("closest: 'bar'");
    }
  });
  it('wrong dimensions are refused', () => {
    expect(() => toSI(1, 'mass', 'L')).toThrow(/not a mass unit/);
    expect(() => toSI(1, 'molar-flow', 'mol')).toThrow(RateloomError);
  });
  it('temperature aliases', () => {
    expect(toSI(25, 'temperature', '°C')).toBe(298.15);
    expect(() => toSI(1, 'temperature', 'degK')).toThrow(/closest: 'degC'|closest: 'K'/);
  });
  it('compound parameter units go to SI with an SI unit text', () => {
    const r = compoundToSI(2, 'L/(mol s)');
    expect(r.value).toBeCloseTo(2e-3, 15);
    expect(r.unit).toBe('m^3/(s mol)');
    // Pa^1.5 = kg^1.5 m^-1.5 s^-3, so mol/(kg s Pa^1.5) = m^1.5 s^2 mol / kg^2.5
    expect(compoundToSI(1, 'mol/(kg s Pa^1.5)').unit).toBe('m^1.5 s^2 mol/kg^2.5');
    expect(compoundToSI(1, 'mol/(g s bar)').value).toBeCloseTo(1e-2, 15);
    expect(compoundToSI(5, 'kJ/mol')).toEqual({ value: 5000, unit: 'J/mol' });
    expect(compoundToSI(1, 'mmol/(g min)').unit).toBe('mol/(kg s)');
    expect(() => compoundToSI(1, 'mol/(kg s')).toThrow(/\)/);
  });
});
