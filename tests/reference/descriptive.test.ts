/**
 * Descriptive statistics of the Monte Carlo summaries (src/design/uncertainty.ts: quantileSorted,
 * the mean of the draws) and of the replicate pure error (src/data/validation.ts), which come from
 * simple-statistics, against NumPy: numpy.percentile (type 7) and math.fsum (exactly rounded) means.
 * Script and data: tests/reference/scipy/descriptive.py and descriptive.json.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { mean, sumNthPowerDeviations } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { quantileSorted } from '../../src/design/uncertainty';

interface Sample { name: string; values: number[]; percentiles: { p: number; value: number }[]; mean: number; sumSquaredDeviations: number }
const ref = JSON.parse(readFileSync(join(import.meta.dirname, 'scipy/descriptive.json'), 'utf8')) as { samples: Sample[] };
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('descriptive statistics against NumPy', () => {
  for (const s of ref.samples) {
    it(`${s.name}: type-7 percentiles, mean, sum of squared deviations`, () => {
      const sorted = Float64Array.from(s.values).sort();
      for (const q of s.percentiles) {
        // Source: numpy.percentile(x, 100 p, method='linear') (descriptive.py).
        expect(rel(quantileSorted(sorted, q.p), q.value)).toBeLessThan(1e-14);
      }
      // Source: math.fsum(x) / n (descriptive.py): exactly rounded.
      expect(rel(mean(s.values), s.mean)).toBeLessThan(2e-16);
      // Source: math.fsum((x - mean)^2) (descriptive.py).
      expect(rel(sumNthPowerDeviations(s.values, 2), s.sumSquaredDeviations)).toBeLessThan(1e-9);
    });
  }

  it('no draws: NaN, not an exception', () => {
    expect(quantileSorted(new Float64Array(0), 0.5)).toBeNaN();
  });
});
