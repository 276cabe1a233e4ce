/**
 * The unit conversions rateloom shows, against the factors of NIST Special Publication 811 (2008),
 * "Guide for the Use of the International System of Units (SI)", Appendix B.8 (factors for units
 * listed alphabetically) and B.9 (by kind of quantity). Each row gives the factor as SP 811 prints
 * it (six or seven significant digits, or exact); the code's factor must agree to half a unit in
 * the last printed digit, and exactly (to round-off) where SP 811 marks the factor exact.
 * The factors below were typed from memory of SP 811 B.8/B.9 (the document was not at hand when
 * this table was written); derived rows (L/min, mmol/min, ...) are the quotient of two B.8 rows.
 * Each conversion is checked both ways: reading (toSI) and showing (displayConversion, the path
 * reports and JSON results use).
 */
import { describe, expect, it } from 'vitest';
import { displayConversion, shownValue, toSI, type Quantity } from '../../src/units';

interface Row {
  unit: string;
  quantity: Quantity;
  /** SP 811 factor to the SI unit, as printed. */
  factor: string;
  exact: boolean;
  source: string;
}

const ROWS: Row[] = [
  { unit: 'kJ/mol', quantity: 'molar-energy', factor: '1.0 E+03', exact: true, source: 'SI prefix kilo (SP 811 Table 5); from memory' },
  { unit: 'kcal/mol', quantity: 'molar-energy', factor: '4.184 E+03', exact: true, source: 'B.9 kilocalorie_th per mole; from memory' },
  { unit: 'bar', quantity: 'pressure', factor: '1.0 E+05', exact: true, source: 'B.8 bar; from memory' },
  { unit: 'mbar', quantity: 'pressure', factor: '1.0 E+02', exact: true, source: 'B.8 millibar; from memory' },
  { unit: 'kPa', quantity: 'pressure', factor: '1.0 E+03', exact: true, source: 'SI prefix kilo; from memory' },
  { unit: 'atm', quantity: 'pressure', factor: '1.013 25 E+05', exact: true, source: 'B.8 atmosphere, standard; from memory' },
  { unit: 'psi', quantity: 'pressure', factor: '6.894 757 E+03', exact: false, source: 'B.8 pound-force per square inch (psi); from memory' },
  { unit: 'psia', quantity: 'pressure', factor: '6.894 757 E+03', exact: false, source: 'B.8 psi (absolute reading); from memory' },
  { unit: 'torr', quantity: 'pressure', factor: '1.333 224 E+02', exact: false, source: 'B.8 torr (Torr); from memory' },
  { unit: 'mmHg', quantity: 'pressure', factor: '1.333 224 E+02', exact: false, source: 'B.8 millimeter of mercury, conventional; from memory' },
  { unit: 'L', quantity: 'volume', factor: '1.0 E-03', exact: true, source: 'B.8 liter (L); from memory' },
  { unit: 'mL', quantity: 'volume', factor: '1.0 E-06', exact: true, source: 'B.8 liter with prefix milli; from memory' },
  { unit: 'L/min', quantity: 'volumetric-flow', factor: '1.666 667 E-05', exact: false, source: 'B.8 liter / B.8 minute (derived); from memory' },
  { unit: 'm3/h', quantity: 'volumetric-flow', factor: '2.777 778 E-04', exact: false, source: 'B.8 hour (derived); from memory' },
  { unit: 'lb', quantity: 'mass', factor: '4.535 924 E-01', exact: false, source: 'B.8 pound (avoirdupois) (lb); from memory' },
  { unit: 'g', quantity: 'mass', factor: '1.0 E-03', exact: true, source: 'SI prefix; from memory' },
  { unit: 't', quantity: 'mass', factor: '1.0 E+03', exact: true, source: 'B.8 ton, metric (t); from memory' },
  { unit: 'min', quantity: 'time', factor: '6.0 E+01', exact: true, source: 'B.8 minute (min); from memory' },
  { unit: 'h', quantity: 'time', factor: '3.6 E+03', exact: true, source: 'B.8 hour (h); from memory' },
  { unit: 'd', quantity: 'time', factor: '8.64 E+04', exact: true, source: 'B.8 day (d); from memory' },
  { unit: 'mmol/min', quantity: 'molar-flow', factor: '1.666 667 E-05', exact: false, source: 'SI prefix milli / B.8 minute (derived); from memory' },
  { unit: 'kmol/h', quantity: 'molar-flow', factor: '2.777 778 E-01', exact: false, source: 'SI prefix kilo / B.8 hour (derived); from memory' },
  { unit: 'mol/L', quantity: 'concentration', factor: '1.0 E+03', exact: true, source: 'B.8 liter (derived); from memory' },
  { unit: 'cP', quantity: 'viscosity', factor: '1.0 E-03', exact: true, source: 'B.8 centipoise (cP); from memory' },
  { unit: 'mm', quantity: 'length', factor: '1.0 E-03', exact: true, source: 'SI prefix milli; from memory' },
];

/** '6.894 757 E+03' -> value and count of significant digits printed. */
function printed(text: string): { value: number; digits: number } {
  const [mant, exp] = text.replace(/ /g, '').split('E');
  return { value: Number(mant) * 10 ** Number(exp), digits: mant.replace(/[^0-9]/g, '').length };
}

describe('unit factors against NIST SP 811 Appendix B', () => {
  for (const r of ROWS) {
    it(`${r.unit} (${r.source})`, () => {
      const { value, digits } = printed(r.factor);
      const code = toSI(1, r.quantity, r.unit);
      const tolerance = r.exact ? 1e-14 : 0.5 * 10 ** -(digits - 1);
      expect(Math.abs(code - value) / value).toBeLessThanOrEqual(tolerance);
      // the display path shows the same factor: one SI value of `code` reads as 1 unit
      expect(shownValue(displayConversion(r.unit), code)).toBeCloseTo(1, 12);
    });
  }

  it('degC and degF are affine: T/K = t/degC + 273.15 and T/K = (t/degF + 459.67)/1.8 (B.8, exact; from memory)', () => {
    for (const t of [-40, 0, 25, 250]) {
      expect(toSI(t, 'temperature', 'degC')).toBeCloseTo(t + 273.15, 12);
      expect(toSI(t, 'temperature', 'degF')).toBeCloseTo((t + 459.67) / 1.8, 12);
      expect(shownValue(displayConversion('degC'), t + 273.15)).toBeCloseTo(t, 12);
      expect(shownValue(displayConversion('degF'), (t + 459.67) / 1.8)).toBeCloseTo(t, 12);
    }
    // -40 degC and -40 degF are the same temperature
    expect(toSI(-40, 'temperature', 'degC')).toBeCloseTo(toSI(-40, 'temperature', 'degF'), 12);
  });
});
