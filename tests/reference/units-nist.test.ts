/**
 * Unit factors checked against published values. Each row names its source.
 * NIST SP 811 (2008) Appendix B.8 prints factors to 7 significant digits; exact ones are compared
 * to full precision; printed 7-digit factors within half a unit in the last printed digit.
 */
import { describe, expect, it } from 'vitest';
import { toSI } from '../../src/units';

type Row = [quantity: Parameters<typeof toSI>[1], unit: string, si: number, relTol: number, source: string];

const rows: Row[] = [
  ['pressure', 'atm', 101325, 0, 'NIST SP 811 B.8: atmosphere, standard = 1.013 25 E+05 Pa (exact)'],
  ['pressure', 'bar', 1e5, 0, 'NIST SP 811 B.8: bar = 1.0 E+05 Pa (exact)'],
  ['pressure', 'mbar', 100, 0, 'NIST SP 811 B.8: millibar = 1.0 E+02 Pa (exact)'],
  ['pressure', 'psi', 6.894757e3, 1e-7, 'NIST SP 811 B.8: pound-force per square inch = 6.894 757 E+03 Pa'],
  ['pressure', 'torr', 1.333224e2, 4e-7, 'NIST SP 811 B.8: torr = 1.333 224 E+02 Pa'],
  ['pressure', 'mmHg', 1.333224e2, 4e-7, 'NIST SP 811 B.8: millimeter of mercury, conventional = 1.333 224 E+02 Pa'],
  ['pressure', 'kPa', 1e3, 0, 'SI Brochure 9th ed. Table 7: prefix kilo = 1e3 (exact)'],
  ['pressure', 'MPa', 1e6, 0, 'SI Brochure 9th ed. Table 7: prefix mega = 1e6 (exact)'],
  ['molar-energy', 'kcal/mol', 4184, 0, 'NIST SP 811 B.8: kilocalorie_th = 4.184 E+03 J (exact)'],
  ['molar-energy', 'kJ/mol', 1000, 0, 'SI Brochure 9th ed.: prefix kilo (exact)'],
  ['viscosity', 'cP', 1e-3, 0, 'NIST SP 811 B.8: centipoise = 1.0 E-03 Pa s (exact)'],
  ['viscosity', 'P', 0.1, 0, 'NIST SP 811 B.8: poise = 1.0 E-01 Pa s (exact)'],
  ['volume', 'L', 1e-3, 0, 'SI Brochure 9th ed. Table 8: litre = 1 dm3 = 1e-3 m3 (exact)'],
  ['volume', 'mL', 1e-6, 0, 'SI Brochure 9th ed. Table 8 (exact)'],
  ['volume', 'cm3', 1e-6, 1e-15, 'SI Brochure 9th ed.: (1e-2 m)^3 (exact)'],
  ['time', 'min', 60, 0, 'SI Brochure 9th ed. Table 8: minute = 60 s (exact)'],
  ['time', 'h', 3600, 0, 'SI Brochure 9th ed. Table 8: hour = 3600 s (exact)'],
  ['volumetric-flow', 'L/min', 1e-3 / 60, 1e-15, 'SI Brochure 9th ed. Table 8 (litre, minute; exact)'],
  ['volumetric-flow', 'm3/h', 1 / 3600, 1e-15, 'SI Brochure 9th ed. Table 8 (hour; exact)'],
  ['molar-flow', 'kmol/h', 1000 / 3600, 1e-15, 'SI Brochure 9th ed. (kilo, hour; exact)'],
  ['molar-flow', 'mmol/min', 1e-3 / 60, 1e-15, 'SI Brochure 9th ed. (milli, minute; exact)'],
  ['concentration', 'M', 1000, 0, 'SI Brochure 9th ed. Table 8: mol/L = 1e3 mol/m3 (exact)'],
  ['rate', 'mmol/(g min)', 1e-3 / (1e-3 * 60), 1e-15, 'SI Brochure 9th ed. (milli, gram, minute; exact)'],
  ['rate', 'mol/(L min)', 1 / (1e-3 * 60), 1e-15, 'SI Brochure 9th ed. (litre, minute; exact)'],
  ['density', 'g/cm3', 1000, 1e-15, 'NIST SP 811 B.9: gram per cubic centimeter = 1.0 E+03 kg/m3 (exact)'],
  ['mass-flux', 'g/(cm2 s)', 10, 1e-15, 'SI Brochure 9th ed. prefixes (exact)'],
  ['length', 'mm', 1e-3, 0, 'SI Brochure 9th ed. prefix milli (exact)'],
  ['dimensionless', '%', 0.01, 0, 'SI Brochure 9th ed. section 5.4.7: % = 0.01 (exact)'],
];

describe('unit factors against NIST SP 811 and the SI Brochure', () => {
  for (const [q, unit, si, tol, source] of rows) {
    it(`${unit} (${q}) — ${source}`, () => {
      const got = toSI(1, q, unit);
      if (tol === 0) expect(got).toBe(si);
      else expect(Math.abs(got - si) / si).toBeLessThanOrEqual(tol + 1e-15);
    });
  }
  it('temperature offsets: 0 degC = 273.15 K, 32 degF = 273.15 K, 212 degF = 373.15 K', () => {
    // Source: NIST SP 811 B.8 / section 4.2.1.1: T/K = t/degC + 273.15; T/K = (t/degF + 459.67)/1.8 (exact)
    expect(toSI(0, 'temperature', 'degC')).toBe(273.15);
    expect(toSI(32, 'temperature', 'degF')).toBeCloseTo(273.15, 12);
    expect(toSI(212, 'temperature', 'degF')).toBeCloseTo(373.15, 12);
  });
});
