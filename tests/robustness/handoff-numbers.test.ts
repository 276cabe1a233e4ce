/**
 * Hand-off files edited by hand: numbers a fit cannot produce (a rate constant of 1e300, a covered
 * temperature of 1e308 K, a feed fraction above 1, swapped interval ends, a variance too wide to
 * draw from) are refused with E_VALUE naming the field, even with the content hash computed again
 * and even with acceptUntrustworthy; random edits of any number end in a result or a RateloomError.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isRateloomError, parseHandoff, sizeReactor, type FittedKinetics } from '../../src/index';
import { seal } from '../design/handoff-fixture';
import { caught } from './caught';

const KIN = 'tests/design/fixtures/bed.kinetics.json';
const CASE = JSON.parse(readFileSync('tests/design/fixtures/bed.case.json', 'utf8'));
const fresh = (): FittedKinetics => JSON.parse(readFileSync(KIN, 'utf8'));

/** The fixture hand-off changed by `edit`, with its hash sealed again (as a careful forger would). */
function edited(edit: (h: any) => void): FittedKinetics {
  const h = fresh();
  edit(h);
  return seal(h);
}

describe('numbers a fit cannot produce are refused, naming the field', () => {
  const cases: [string, (h: any) => void, string][] = [
    ['a rate constant of 1e300', (h) => { h.parameters[0].value = 1e300; h.parameters[0].internalValue = Math.log(1e300); }, 'parameters[0].value'],
    ['a covered temperature of 1e308 K', (h) => { h.coverage.temperature.max = 1e308; }, 'coverage.temperature.max'],
    ['a covered pressure below zero', (h) => { h.coverage.pressure.min = -5; }, 'coverage.pressure.min'],
    ['a feed mole fraction of 1.5', (h) => { h.coverage.feedMoleFraction.A.max = 1.5; }, 'coverage.feedMoleFraction.A.max'],
    ['a feed range of a species that does not exist', (h) => { h.coverage.feedMoleFraction.Zz = { min: 0, max: 0.1, unit: '1' }; }, 'coverage.feedMoleFraction.Zz'],
    ['a negative standard error', (h) => { h.parameters[0].stdError = -1; }, 'parameters[0].stdError'],
    ['swapped interval ends', (h) => { h.parameters[0].ci = { level: 0.95, linear: [2e-4, 1e-4] }; }, 'parameters[0].ci.linear'],
    ['a log variance too wide to draw from', (h) => { h.covariance.matrix[0][0] = 1e6; }, 'covariance.matrix[0][0]'],
    ['a reference temperature of 6000 K', (h) => { h.referenceTemperature = 6000; }, 'referenceTemperature'],
  ];
  it.each(cases)('%s', (_what, edit, path) => {
    const e = caught(() => parseHandoff(edited(edit)));
    expect(e.code).toBe('E_VALUE');
    expect(e.message).toContain(path);
    expect(e.fix).toMatch(/rateloom fit/);
  });
  it('sizing refuses it too, even when told to accept an untrustworthy hand-off', () => {
    const h = edited(cases[0][1]);
    const e = caught(() => sizeReactor(h, CASE, { draws: 0, acceptUntrustworthy: true }));
    expect(e.code).toBe('E_VALUE');
    expect(e.location?.file).toBe('fitted-kinetics file (in memory)');
  });
  it('the fixture itself passes (the checks refuse nothing a fit writes)', () => {
    expect(parseHandoff(fresh()).parameters.length).toBeGreaterThan(0);
  });
});

/** Paths of every number in a JSON document. */
function numberPaths(v: unknown, at: (string | number)[] = []): (string | number)[][] {
  if (typeof v === 'number') return [at];
  if (Array.isArray(v)) return v.flatMap((x, i) => numberPaths(x, [...at, i]));
  if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => numberPaths(x, [...at, k]));
  return [];
}

describe('property: any number of the hand-off replaced by any value', () => {
  const paths = numberPaths(fresh());
  it('ends in a sizing or a RateloomError, never a crash', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...paths),
        fc.oneof(fc.double(), fc.constantFrom(1e300, -1e300, 0, -1, 1e-320, null, '1', Number.NaN, [], {})),
        (path, value) => {
          const h: any = fresh();
          let o = h;
          for (const k of path.slice(0, -1)) o = o[k];
          o[path[path.length - 1]] = value;
          seal(h);
          try {
            const r = sizeReactor(JSON.parse(JSON.stringify(h)), CASE, { draws: 20, seed: 3, acceptUntrustworthy: true });
            expect(typeof r.status).toBe('string');
            expect(r.cautions.length).toBeGreaterThan(0);
          } catch (e) {
            if (!isRateloomError(e)) throw e;
          }
        },
      ),
      { numRuns: 60, seed: 17 },
    );
  });
});
