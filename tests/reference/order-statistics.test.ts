/**
 * Distribution-free quantile intervals from order statistics (design/order-statistics.ts): the
 * binomial coverage against SciPy (tests/reference/scipy/order_stat_ci.py, order_stat_ci.json),
 * and the rank search reaching the asked level.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { binomialCoverage, quantileInterval } from '../../src/design/order-statistics';

const ref = JSON.parse(readFileSync(new URL('./scipy/order_stat_ci.json', import.meta.url), 'utf8')) as {
  cases: { n: number; q: number; l: number; u: number; coverage: number }[];
};

describe('order-statistic intervals of quantiles', () => {
  it('binomial coverage agrees with scipy.stats.binom to 1e-10', () => {
    // Source: scipy.stats.binom.cdf (order_stat_ci.py)
    for (const c of ref.cases) expect(Math.abs(binomialCoverage(c.n, c.q, c.l, c.u) - c.coverage), `${c.n} ${c.q}`).toBeLessThan(1e-10);
  });
  it('the chosen ranks cover at least 95 % and bracket the sample quantile', () => {
    const sorted = Float64Array.from({ length: 400 }, (_, i) => i / 399);
    for (const q of [0.5, 0.9, 0.95]) {
      const iv = quantileInterval(sorted, q)!;
      expect(iv.coverage).toBeGreaterThanOrEqual(0.95);
      expect(Math.abs(iv.coverage - binomialCoverage(400, q, iv.ranks[0], iv.ranks[1]))).toBeLessThan(1e-12);
      expect(iv.lower).toBeLessThanOrEqual(q);
      expect(iv.upper).toBeGreaterThanOrEqual(q);
    }
    // 20 draws cannot bound P95 from above at 95 %: the coverage achieved says so
    expect(quantileInterval(Float64Array.from({ length: 20 }, (_, i) => i), 0.95)!.coverage).toBeLessThan(0.95);
  });
});
