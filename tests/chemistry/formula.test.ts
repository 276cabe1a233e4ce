import { describe, expect, it } from 'vitest';
import { parseFormula } from '../../src/chemistry/formula';
import { err } from '../kinetics/helpers';

describe('parseFormula', () => {
  it('counts atoms in simple formulas', () => {
    expect(parseFormula('C2H6O').counts).toEqual({ C: 2, H: 6, O: 1 });
    expect(parseFormula('CO').counts).toEqual({ C: 1, O: 1 });
    expect(parseFormula('Co').counts).toEqual({ Co: 1 });
  });

  it('expands parentheses and brackets, merging repeated elements', () => {
    expect(parseFormula('Ca(OH)2').counts).toEqual({ Ca: 1, O: 2, H: 2 });
    expect(parseFormula('CH3COOH').counts).toEqual({ C: 2, H: 4, O: 2 });
    expect(parseFormula('K4[Fe(CN)6]').counts).toEqual({ K: 4, Fe: 1, C: 6, N: 6 });
    expect(parseFormula('(CH3)2CO').counts).toEqual({ C: 3, H: 6, O: 1 });
  });

  it('molar mass is the weighted sum of atomic weights (kg/mol)', () => {
    // Source: arithmetic from the table itself, 2*C + 6*H + O.
    expect(parseFormula('C2H6O').molarMass).toBeCloseTo((2 * 12.0107 + 6 * 1.00794 + 15.9994) / 1000, 12);
    expect(parseFormula('Ca(OH)2').molarMass).toBeCloseTo((40.078 + 2 * (15.9994 + 1.00794)) / 1000, 12);
  });

  it('rejects unknown element symbols with the column and a suggestion', () => {
    const e = err(() => parseFormula('C2Hx6', ['species', 0, 'formula']));
    expect(e.code).toBe('E_FORMULA');
    expect(e.message).toContain("'Hx'");
    expect(e.message).toContain('column 3');
    expect(e.location?.column).toBe(3);
    expect(e.path).toEqual(['species', 0, 'formula']);
  });

  it('rejects lowercase starts, unbalanced brackets, zero counts, empty and stray characters', () => {
    expect(err(() => parseFormula('h2o')).code).toBe('E_FORMULA');
    expect(err(() => parseFormula('Ca(OH2')).message).toContain('not closed');
    expect(err(() => parseFormula('CaOH)2')).message).toContain("unmatched ')'");
    expect(err(() => parseFormula('C0H4')).message).toContain('must be positive');
    expect(err(() => parseFormula('')).code).toBe('E_FORMULA');
    expect(err(() => parseFormula('()')).message).toContain('empty brackets');
    expect(err(() => parseFormula('C2 H6')).message).toContain('column 3');
    expect(err(() => parseFormula('C'.repeat(500))).code).toBe('E_FORMULA');
    expect(err(() => parseFormula('('.repeat(50) + 'C' + ')'.repeat(50))).message).toContain('nest deeper');
  });
});
