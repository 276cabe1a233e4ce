import { describe, expect, it } from 'vitest';
import { buildChemistry, elementBalanceResidual, speciesIndex } from '../../src/chemistry/mechanism';
import { RateloomError } from '../../src/core/errors';
import { err } from '../kinetics/helpers';

const species = [
  { name: 'H2', formula: 'H2' },
  { name: 'O2', formula: 'O2' },
  { name: 'H2O', formula: 'H2O' },
  { name: 'N2', formula: 'N2', inert: true },
];

describe('buildChemistry', () => {
  it('builds the stoichiometric matrix (negative reactants) and coefficient matrices', () => {
    const chem = buildChemistry(species, [
      { id: 'r1', equation: 'H2 + 0.5 O2 -> H2O' },
      { id: 'r2', equation: '2 H2O <=> 2 H2 + O2' },
    ]);
    expect(chem.speciesNames).toEqual(['H2', 'O2', 'H2O', 'N2']);
    expect(chem.reactionIds).toEqual(['r1', 'r2']);
    expect(chem.reversible).toEqual([false, true]);
    expect([...chem.stoich]).toEqual([-1, -0.5, 1, 0, 2, 1, -2, 0]);
    expect([...chem.reactantCoefficients]).toEqual([1, 0.5, 0, 0, 0, 0, 2, 0]);
    expect([...chem.productCoefficients]).toEqual([0, 0, 1, 0, 2, 1, 0, 0]);
    expect(chem.elements).toEqual(['H', 'O', 'N']);
    expect([...chem.elementMatrix]).toEqual([2, 0, 2, 0, 0, 2, 1, 0, 0, 0, 0, 2]);
    expect(chem.inert).toEqual([false, false, false, true]);
    expect(chem.molarMass[2]).toBeCloseTo(0.01801528, 12);
    expect(chem.equations[0]).toBe('H2 + 0.5 O2 -> H2O');
  });

  it('reports an unbalanced reaction naming the element and the imbalance', () => {
    const e = err(() =>
      buildChemistry(species, [
        { id: 'r1', equation: 'H2 + 0.5 O2 -> H2O' },
        { id: 'r2', equation: 'H2 + O2 -> H2O' },
      ]),
    );
    expect(e.code).toBe('E_UNBALANCED');
    expect(e.message).toContain('reaction r2 is unbalanced in O: reactants 2, products 1');
    expect(e.message).toContain('1 fewer O atoms');
    expect(e.path).toEqual(['reactions', 1, 'equation']);
    expect(e.details).toMatchObject({ element: 'O', reactants: 2, products: 1 });
  });

  it('skips the balance check when a species lacks a formula', () => {
    const chem = buildChemistry([{ name: 'A' }, { name: 'B', formula: 'C2H4' }], [{ id: 'r1', equation: 'A -> B' }]);
    expect(chem.hasFormula).toEqual([false, true]);
    expect(chem.molarMass[0]).toBeUndefined();
  });

  it('rejects duplicate species, duplicate reaction ids, bad names and inert species in reactions', () => {
    expect(err(() => buildChemistry([{ name: 'A' }, { name: 'A' }], [])).message).toContain('declared twice');
    expect(
      err(() =>
        buildChemistry([{ name: 'A' }, { name: 'B' }], [
          { id: 'r1', equation: 'A -> B' },
          { id: 'r1', equation: 'B -> A' },
        ]),
      ).message,
    ).toContain("'r1' is used twice");
    expect(err(() => buildChemistry([{ name: '1A' }], [])).code).toBe('E_VALUE');
    expect(err(() => buildChemistry([{ name: 'A', inert: true }, { name: 'B' }], [{ id: 'r1', equation: 'A -> B' }])).message).toContain(
      'declared inert',
    );
    expect(err(() => buildChemistry([{ name: 'A', molarMass: -1 }], [])).code).toBe('E_VALUE');
    const e = err(() => buildChemistry([{ name: 'A' }, { name: 'B' }], [{ id: 'r1', equation: 'A -> Bb' }]));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.path).toEqual(['reactions', 0, 'equation']);
  });

  it('speciesIndex suggests the closest name', () => {
    const chem = buildChemistry(species, []);
    expect(speciesIndex(chem, 'H2O')).toBe(2);
    expect(err(() => speciesIndex(chem, 'H2Oo')).message).toContain("did you mean 'H2O'");
  });
});

describe('elementBalanceResidual', () => {
  it('is zero for a change made by balanced reactions and non-zero otherwise', () => {
    const chem = buildChemistry(species, [{ id: 'r1', equation: 'H2 + 0.5 O2 -> H2O' }]);
    const before = [2, 1, 0, 5];
    const extent = 0.7;
    const after = before.map((n, j) => n + extent * chem.stoich[j]);
    const res = elementBalanceResidual(chem, before, after);
    for (const v of res) expect(Math.abs(v)).toBeLessThan(1e-14);
    const leak = elementBalanceResidual(chem, before, [2, 0.9, 0, 5]);
    expect(leak[1]).toBeCloseTo(-0.2, 14); // O: 2 atoms * -0.1 mol
    expect(leak[0]).toBe(0);
    expect(() => elementBalanceResidual(chem, [1], [1])).toThrow(RateloomError);
  });
});
