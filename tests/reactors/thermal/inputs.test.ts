/** Bad inputs of the non-isothermal tube: typed errors naming the field, never an isothermal fallback. */
import { describe, expect, it } from 'vitest';
import { err as refusal } from '../../kinetics/helpers';
import { checkThermalSpec } from '../../../src/reactors/thermal/thermal-inputs';
import { specOf, type RefCase } from './fixture';

const C: RefCase = {
  T0: 600, P0: 2e5, feed: [0.01, 0, 0.09], Tref: 600, k_ref: 1e-3, E: 1e5, dH_ref: -8e4, T_refH: 600,
  cp: [40, 50, 30], Ua: 15, W: 3, mode: 'co-current', Ta: 590, alpha: 0, mcp: 20,
};
const names = ['A', 'B', 'I'];

describe('checkThermalSpec', () => {
  it('accepts a complete spec', () => {
    expect(() => checkThermalSpec(specOf(C).spec, names)).not.toThrow();
  });
  it('refuses a flowing species without heat capacity', () => {
    const { spec } = specOf(C);
    const cp = [...spec.cp];
    cp[2] = undefined;
    const e = refusal(() => checkThermalSpec({ ...spec, cp }, names));
    expect(e.code).toBe('E_MISSING_FIELD');
    expect(e.path).toEqual(['heat', 'heatCapacities', 'I']);
  });
  it('allows a missing heat capacity for a species that does not flow in', () => {
    const { spec } = specOf(C);
    const cp = [...spec.cp];
    cp[1] = undefined;
    expect(() => checkThermalSpec({ ...spec, cp }, names)).not.toThrow();
  });
  it('refuses a non-positive U a, naming overallCoefficient', () => {
    const e = refusal(() => checkThermalSpec({ ...specOf(C).spec, Ua: 0 }, names));
    expect(e.path).toEqual(['heat', 'overallCoefficient']);
    expect(e.fix).toMatch(/adiabatic/);
  });
  it('refuses a co-current coolant without flow', () => {
    const e = refusal(() => checkThermalSpec({ ...specOf(C).spec, coolantFlowCapacity: 0 }, names));
    expect(e.path).toEqual(['heat', 'coolant', 'flow']);
  });
  it('adiabatic needs no coefficient', () => {
    expect(() => checkThermalSpec({ ...specOf(C).spec, mode: 'adiabatic', Ua: 0 }, names)).not.toThrow();
  });
});

describe('counter-current boundary-value problem that cannot converge', () => {
  it('is a status naming the coolant inputs, not a throw or an isothermal answer', async () => {
    const { ThermalTube } = await import('../../../src/reactors/thermal/thermal-tube');
    const { spec, theta, kin } = specOf({ ...C, mode: 'counter-current' });
    // every march passes the runaway cap 1 K above the inlet, so no coolant temperature fits
    const sol = new ThermalTube(spec, kin, theta).solve(C.W, { runawayTemperature: C.T0 + 1 });
    expect(sol.status).toBe('bvp-not-converged');
    expect(sol.success).toBe(false);
    expect(sol.message).toMatch(/heat\.coolant/);
    expect(sol.bvp?.converged).toBe(false);
  });
});
