import { describe, expect, it } from 'vitest';
import { formatEquation, parseEquation } from '../../src/chemistry/equation';
import { err } from '../kinetics/helpers';

describe('parseEquation', () => {
  it('parses reversible and irreversible equations with coefficients', () => {
    const eq = parseEquation('A + 2 B <=> C');
    expect(eq.reversible).toBe(true);
    expect(eq.reactants).toEqual([
      { species: 'A', coefficient: 1 },
      { species: 'B', coefficient: 2 },
    ]);
    expect(eq.products).toEqual([{ species: 'C', coefficient: 1 }]);
    const irr = parseEquation('A->B');
    expect(irr.reversible).toBe(false);
    expect(irr.products).toEqual([{ species: 'B', coefficient: 1 }]);
  });

  it('accepts decimal coefficients and coefficients written against the name', () => {
    const eq = parseEquation('H2 + 0.5 O2 -> H2O');
    expect(eq.reactants[1]).toEqual({ species: 'O2', coefficient: 0.5 });
    expect(parseEquation('2H2 + O2 -> 2H2O').reactants[0]).toEqual({ species: 'H2', coefficient: 2 });
  });

  it('sums a species repeated on one side', () => {
    const eq = parseEquation('A + A + 0.5 A -> B');
    expect(eq.reactants).toEqual([{ species: 'A', coefficient: 2.5 }]);
    expect(formatEquation(eq)).toBe('2.5 A -> B');
  });

  it('names the closest species and the column of an unknown species', () => {
    const e = err(() => parseEquation('A + Bx -> C', ['A', 'B', 'C'], ['reactions', 0, 'equation']));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.message).toContain("'Bx'");
    expect(e.message).toContain("did you mean 'B'");
    expect(e.message).toContain('column 5');
    expect(e.details?.closest).toBe('B');
  });

  it('rejects malformed equations with the column', () => {
    expect(err(() => parseEquation('A + B')).message).toContain('no reaction arrow');
    expect(err(() => parseEquation('A = B')).message).toContain('column 3');
    expect(err(() => parseEquation('A => B')).code).toBe('E_EQUATION');
    expect(err(() => parseEquation('A -> B -> C')).message).toContain('column 8');
    expect(err(() => parseEquation('A + -> B')).message).toContain('missing reactant');
    expect(err(() => parseEquation('A -> ')).message).toContain('missing product');
    expect(err(() => parseEquation('0 A -> B')).message).toContain('positive');
    expect(err(() => parseEquation('A B -> C')).message).toContain('column 3');
    expect(err(() => parseEquation('A -> B; C')).message).toContain("unexpected character ';'");
    expect(err(() => parseEquation('2 -> B')).message).toContain('species name must follow');
  });
});
