/**
 * Generated unit strings: tokens of real units, prefixes, exponents, operators, parentheses (also
 * unbalanced and deeply nested), gauge marks, unicode and junk, for every quantity and as a
 * parameter's compound unit. Property: a conversion with a finite positive factor, or one
 * RateloomError E_UNIT line naming the unit; never another exception or a stack overflow.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compoundToSI, isRateloomError, unitFor } from '../../src/index';

const QUANTITIES = ['molar-flow', 'mass', 'volume', 'volumetric-flow', 'pressure', 'temperature', 'time', 'concentration', 'rate', 'molar-energy', 'mass-flux', 'viscosity', 'density', 'length', 'area', 'dimensionless', 'inverse-mass', 'inverse-volume', 'frequency'] as const;
const TOKENS = ['mol', 'kmol', 'mmol', 'g', 'kg', 'm', 'cm', 'mm', 'L', 'mL', 's', 'min', 'h', 'Pa', 'kPa', 'bar', 'barg', 'atm', 'psi', 'K', 'degC', '°C', 'J', 'kJ', 'cal', 'µm', 'um', '%', '1', 'm3', 'm^3', 'm²', '^2', '^-1', '^0.5', '^1e308', '/', '*', ' ', '.', '(', ')', '((', '))', '(g)', 'e', '-', '+', '2', '1e3', '\u0000', '\uFEFF', 'NaN', 'Infinity', 'constructor', '__proto__'];

const unitText = fc.oneof(
  fc.array(fc.constantFrom(...TOKENS), { maxLength: 12 }).map((t) => t.join('')),
  fc.array(fc.constantFrom(...TOKENS), { maxLength: 8 }).map((t) => t.join(' ')),
  fc.integer({ min: 1, max: 30_000 }).map((n) => `${'('.repeat(n)}mol${')'.repeat(n)}`),
  fc.string({ maxLength: 40 }),
);

function check(f: () => { factor?: number; value?: number }): void {
  try {
    const r = f();
    const v = r.factor ?? r.value;
    expect(typeof v === 'number' && Number.isFinite(v)).toBe(true);
  } catch (e) {
    if (!isRateloomError(e)) throw e;
    expect(e.code).toMatch(/^E_(UNIT|TYPE|VALUE)$/);
    expect(e.message.split('\n')).toHaveLength(1);
    expect(e.message.length).toBeLessThan(1000); // long units are cut in messages
  }
}

describe('generated unit strings', () => {
  it('every quantity: a finite conversion or one E_UNIT line', () => {
    fc.assert(
      fc.property(fc.constantFrom(...QUANTITIES), unitText, (q, u) => check(() => unitFor(q, u, { gauge: true, ambientPressure: 101325 }))),
      { numRuns: 3000, seed: 10 },
    );
  });
  it("a parameter's compound unit: a finite SI value or one E_UNIT line", () => {
    fc.assert(
      fc.property(unitText, (u) => check(() => compoundToSI(1, u))),
      { numRuns: 2000, seed: 11 },
    );
  });
});
