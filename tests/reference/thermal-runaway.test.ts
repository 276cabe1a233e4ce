/**
 * Critical coolant temperature by the generalized parametric-sensitivity criterion (runaway.ts)
 * against an independent SciPy scan on a 0.05 K grid (tests/reference/scipy/runaway_scan.py,
 * runaway_scan.json): rateloom scans on a 0.5 K grid with a parabola through the largest
 * sensitivity, so agreement within 0.5 K (the coarser grid's step) is what can be justified.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { criticalNear, hotSpotAt, runawayMargin } from '../../src/design/runaway';
import { specOf, type RefCase } from '../reactors/thermal/fixture';

const ref = JSON.parse(readFileSync(new URL('./scipy/runaway_scan.json', import.meta.url), 'utf8')) as {
  case: Omit<RefCase, 'mode' | 'Ta' | 'alpha' | 'mcp'>;
  critical_coolant_temperature: number;
  sample: { Ta: number[]; hot_spot: number[] };
};

describe('runaway margin', () => {
  const Ta = 600;
  const { spec, theta, kin } = specOf({ ...ref.case, mode: 'constant-coolant', Ta, alpha: 0, mcp: null });

  it('hot spots along the scan agree with SciPy solve_ivp', () => {
    ref.sample.Ta.forEach((t, i) => {
      // Source: SciPy solve_ivp Radau hot spot (runaway_scan.py sample)
      expect(Math.abs(hotSpotAt(spec, kin, theta, ref.case.W, t) - ref.sample.hot_spot[i]) / ref.sample.hot_spot[i]).toBeLessThan(1e-5);
    });
  });

  it('the critical coolant temperature agrees with the SciPy scan within 0.5 K', () => {
    const m = runawayMargin(spec, kin, theta, ref.case.W, { below: 30, above: 30, step: 0.5 });
    // Source: SciPy scan of S = (Ta/T*) dT*/dTa on a 0.05 K grid (runaway_scan.py)
    expect(Math.abs(m.criticalCoolantTemperature! - ref.critical_coolant_temperature)).toBeLessThan(0.5);
    expect(m.margin).toBeCloseTo(m.criticalCoolantTemperature! - Ta, 12);
    expect(m.sensitivityCoolant).toBeGreaterThan(0);
  });

  it('the local scan used for Monte Carlo draws finds it too, from a guess off by 8 K or by 20 K', () => {
    // Source: the same SciPy scan; a 2 K grid with a parabola: agreement within 1 K is what can be justified
    for (const off of [-8, 8, 20]) {
      const c = criticalNear(spec, kin, theta, ref.case.W, ref.critical_coolant_temperature + off);
      expect(Math.abs(c! - ref.critical_coolant_temperature), `guess off by ${off} K`).toBeLessThan(1);
    }
  });
});
