/**
 * The cooled packed bed (tube-balances.ts, thermal-tube.ts, counter-current.ts) against SciPy:
 * constant coolant and co-current coolant against solve_ivp (Radau, rtol 1e-12) to 1e-6 relative;
 * counter-current against solve_bvp (collocation, tol 1e-8) to 1e-5 relative. Script and output:
 * tests/reference/scipy/thermal_tube.py and thermal_tube.json.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ThermalTube } from '../../src/reactors/thermal/thermal-tube';
import { specOf, type RefCase } from '../reactors/thermal/fixture';

const ref = JSON.parse(readFileSync(new URL('./scipy/thermal_tube.json', import.meta.url), 'utf8')) as {
  W_points: number[];
  cases: Record<string, RefCase & { profile: number[][] }>;
};

function check(name: string, rel: number): void {
  const c = ref.cases[name];
  const { spec, theta, kin } = specOf(c);
  const tube = new ThermalTube(spec, kin, theta);
  const sol = tube.solve(c.W, { profile: ref.W_points, rtol: 1e-11, atolScale: 1e-13 });
  expect(sol.status).toBe('success');
  const prof = sol.profile!;
  expect(prof.x.length).toBe(ref.W_points.length);
  ref.W_points.forEach((_, i) => {
    const r = c.profile[i];
    const FT0 = c.feed.reduce((a, b) => a + b, 0);
    // flows relative to the total feed (A tends to zero), temperatures and p relative to themselves
    for (let j = 0; j < 3; j++) expect(Math.abs(prof.F[i][j] - r[j]) / FT0).toBeLessThan(rel);
    expect(Math.abs(prof.T[i] - r[3]) / r[3]).toBeLessThan(rel);
    if (c.mode !== 'constant-coolant') expect(Math.abs((prof.Ta[i] as number) - r[4]) / r[4]).toBeLessThan(rel);
    expect(Math.abs(prof.p[i] - r[5])).toBeLessThan(rel);
  });
}

describe('cooled packed bed against SciPy', () => {
  // SciPy solve_ivp Radau, rtol 1e-12 (thermal_tube.py, case "constant")
  it('constant coolant temperature matches solve_ivp to 1e-6 relative', () => check('constant', 1e-6));
  // SciPy solve_ivp Radau, rtol 1e-12 (thermal_tube.py, case "cocurrent", with pressure drop)
  it('co-current coolant matches solve_ivp to 1e-6 relative', () => check('cocurrent', 1e-6));
  // SciPy solve_bvp, tol 1e-8 (thermal_tube.py, case "counter"); shooting converges and reports it
  it('counter-current coolant matches solve_bvp to 1e-5 relative', () => {
    check('counter', 1e-5);
    const c = ref.cases.counter;
    const { spec, theta, kin } = specOf(c);
    const sol = new ThermalTube(spec, kin, theta).solve(c.W);
    expect(sol.bvp?.converged).toBe(true);
    expect(sol.bvp!.residual).toBeLessThan(1e-5);
    expect(Math.abs(sol.bvp!.coolantOutlet - c.profile[0][4])).toBeLessThan(1e-3);
  });
});
