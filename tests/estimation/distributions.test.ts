import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  chiSquareCdf,
  chiSquareQuantile,
  fCdf,
  fQuantile,
  fSurvival,
  normalCdf,
  normalQuantile,
  studentTCdf,
  studentTQuantile,
} from '../../src/estimation/distributions';

const here = path.dirname(fileURLToPath(import.meta.url));
// Source: SciPy scipy.stats, script tests/reference/scipy/distributions.py (output distributions.json).
const ref = JSON.parse(readFileSync(path.join(here, '..', 'reference', 'scipy', 'distributions.json'), 'utf8'));

const close = (a: number, b: number, rel: number, abs = 1e-300) => {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(Math.max(rel * Math.abs(b), abs));
};

describe('distribution functions against SciPy', () => {
  it('Student t quantiles and CDF', () => {
    for (const r of ref.t) {
      // Source: SciPy stats.t, tests/reference/scipy/distributions.py
      if ('ppf' in r) close(studentTQuantile(r.p, r.dof), r.ppf, 1e-8, 1e-12);
      else close(studentTCdf(r.x, r.dof), r.cdf, 1e-10, 1e-15);
    }
  });
  it('F quantiles, CDF and survival', () => {
    for (const r of ref.f) {
      // Source: SciPy stats.f, tests/reference/scipy/distributions.py
      if ('ppf' in r) close(fQuantile(r.p, r.d1, r.d2), r.ppf, 1e-9);
      else {
        close(fCdf(r.x, r.d1, r.d2), r.cdf, 1e-10, 1e-15);
        close(fSurvival(r.x, r.d1, r.d2), r.sf, 1e-9, 1e-300);
      }
    }
  });
  it('chi-square quantiles and CDF', () => {
    for (const r of ref.chi2) {
      // Source: SciPy stats.chi2, tests/reference/scipy/distributions.py
      if ('ppf' in r) close(chiSquareQuantile(r.p, r.k), r.ppf, 1e-9);
      else close(chiSquareCdf(r.x, r.k), r.cdf, 1e-10, 1e-15);
    }
  });
  it('normal quantiles and CDF', () => {
    for (const r of ref.norm) {
      // Source: SciPy stats.norm, tests/reference/scipy/distributions.py
      if ('ppf' in r) close(normalQuantile(r.p), r.ppf, 1e-9, 1e-12);
      else close(normalCdf(r.x), r.cdf, 1e-10, 1e-15);
    }
  });
  it('quantile and CDF are inverse to each other', () => {
    // Source: common practice, no source (identity check).
    for (const p of [1e-8, 0.1, 0.6, 0.9, 0.975]) {
      expect(studentTCdf(studentTQuantile(p, 10), 10) / p).toBeCloseTo(1, 10);
      expect(fCdf(fQuantile(p, 2, 9), 2, 9) / p).toBeCloseTo(1, 9);
    }
  });
  it('bad input throws', () => {
    expect(() => studentTQuantile(1.2, 3)).toThrow(/probability/);
    expect(() => fCdf(1, 0, 3)).toThrow(/degrees of freedom/);
  });
});
