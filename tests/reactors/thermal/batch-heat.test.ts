/** Jacketed batch and semibatch vessels (batch-heat.ts). */
import { describe, expect, it } from 'vitest';
import { solveBatchHeat } from '../../../src/reactors/thermal/batch-heat';
import { ReactionEnthalpy } from '../../../src/reactors/thermal/enthalpy';
import type { HeatCapacity } from '../../../src/reactors/thermal/heat-capacity';
import { compile } from '../compiled';

const kin = compile(
  [{ name: 'A', formula: 'C4H8O' }, { name: 'B', formula: 'C4H8O' }, { name: 'S', formula: 'H2O', inert: true }],
  [{ equation: 'A -> B', rate: { form: 'power-law', basis: 'volume', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
  ['k', 'E'],
  320,
);
const cp: HeatCapacity[] = [{ form: 'constant', cp: 150 }, { form: 'constant', cp: 150 }, { form: 'constant', cp: 75 }];
const base = {
  T0: 320, V0: 1, N0: Float64Array.of(1000, 0, 50000), weights: Float64Array.of(1),
  enthalpy: new ReactionEnthalpy(kin.stoich, Float64Array.of(-6e4), 320, cp), cp, UA: 0, Ta: 300,
};
const theta = Float64Array.of(1e-4, 8e4);

describe('jacketed batch', () => {
  it('adiabatic: T - T0 = (-dH) (N_A0 - N_A) / sum N_j Cp_j along the run (dCp = 0)', () => {
    const t = Array.from({ length: 21 }, (_, i) => 500 * i);
    const r = solveBatchHeat(base, kin, theta, 10000, { profile: t, rtol: 1e-10 });
    expect(r.status).toBe('success');
    const sumNCp = 1000 * 150 + 50000 * 75;
    r.profile!.t.forEach((_, i) => {
      // Source: adiabatic energy balance of a closed vessel with constant heat capacities (common practice)
      const T = 320 + (6e4 * (1000 - r.profile!.N[i][0])) / sumNCp;
      expect(Math.abs(r.profile!.T[i] - T)).toBeLessThan(1e-6);
    });
  });

  it('a colder jacket keeps the run cooler, and its hot spot lies inside the run', () => {
    const hot = solveBatchHeat(base, kin, theta, 10000);
    const cooled = solveBatchHeat({ ...base, UA: 1000, Ta: 318 }, kin, theta, 10000);
    expect(cooled.hotSpot.temperature).toBeLessThan(hot.hotSpot.temperature);
    expect(cooled.hotSpot.position).toBeGreaterThan(0);
    expect(cooled.hotSpot.position).toBeLessThan(10000);
    expect(cooled.temperature).toBeLessThan(cooled.hotSpot.temperature);
  });

  it('semibatch: a cold feed lowers the temperature and adds its moles', () => {
    const feed = { flows: Float64Array.of(0, 0, 5), volumetricFlow: 1e-4, temperature: 290 };
    const r = solveBatchHeat({ ...base, feed }, kin, theta, 2000);
    expect(r.status).toBe('success');
    // S is inert: its moles grow by the fed amount exactly
    expect(r.moles[2]).toBeCloseTo(50000 + 5 * 2000, 6);
    expect(r.temperature).toBeLessThan(solveBatchHeat(base, kin, theta, 2000).temperature);
  });
});
