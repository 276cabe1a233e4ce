/**
 * Non-linear rate laws in an isothermal spherical pellet: rateloom's collocation solver against
 * SciPy's solve_bvp (tests/reference/scipy/pellet_eta.py -> pellet_eta.json).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { compile, pl } from '../reactors/compiled';
import { PelletSolver } from '../../src/pellets/pellet-bvp';
import type { RateLawSpec } from '../../src/kinetics/spec';

interface Case { rate: 'second-order' | 'lhhw'; k: number; K: number; eta: number; centre: number }
const ref = JSON.parse(readFileSync(new URL('./scipy/pellet_eta.json', import.meta.url), 'utf8')) as {
  R: number; De: number; Cs: number; cases: Case[];
};

function rateOf(c: Case): RateLawSpec {
  if (c.rate === 'second-order') return pl('k', 'volume', { A: 2 });
  return { form: 'lhhw', basis: 'volume', rateConstant: { k: 'k' }, orders: { A: 1 }, adsorption: { A: { K: 'K' } }, exponent: 2 };
}

describe('pellet eta vs SciPy solve_bvp (sphere)', () => {
  for (const c of ref.cases) {
    it(`${c.rate}, k = ${c.k}`, () => {
      const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: rateOf(c) }], c.rate === 'lhhw' ? ['k', 'K'] : ['k']);
      const theta = c.rate === 'lhhw' ? Float64Array.of(c.k, c.K) : Float64Array.of(c.k);
      const solver = new PelletSolver({ kinetics: kin, a: 3, R: ref.R, De: Float64Array.of(ref.De, ref.De), rateToPellet: Float64Array.of(1) }, theta);
      const sol = solver.solve(Float64Array.of(ref.Cs, 0), 500);
      expect(sol.status).toBe('converged');
      // SciPy solve_bvp, tol 1e-10 (pellet_eta.json)
      expect(Math.abs(sol.eta[0] - c.eta)).toBeLessThan(1e-5);
      expect(Math.abs(sol.centreConcentrations[0] - c.centre)).toBeLessThan(1e-5 * ref.Cs);
    });
  }
});
