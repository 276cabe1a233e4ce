import { describe, expect, it } from 'vitest';
import { parseFormula } from '../../src/chemistry/formula';

describe('molar masses against published values', () => {
  it('water', () => {
    // Source: IUPAC standard atomic weights (2007 table: H 1.00794, O 15.9994) -> 18.01528 g/mol; value from memory.
    expect(parseFormula('H2O').molarMass).toBeCloseTo(0.01801528, 12);
  });
  it('ethanol', () => {
    // Source: IUPAC 2007 atomic weights, C2H6O = 46.06844 g/mol; value from memory.
    expect(parseFormula('C2H6O').molarMass).toBeCloseTo(0.04606844, 12);
  });
  it('carbon dioxide and calcium hydroxide', () => {
    // Source: IUPAC 2007 atomic weights, CO2 = 44.0095 g/mol, Ca(OH)2 = 74.09268 g/mol; values from memory.
    expect(parseFormula('CO2').molarMass).toBeCloseTo(0.0440095, 12);
    expect(parseFormula('Ca(OH)2').molarMass).toBeCloseTo(0.07409268, 12);
  });
});
