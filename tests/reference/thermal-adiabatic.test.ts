/**
 * Adiabatic packed bed against the adiabatic energy balance in closed form, and the isothermal
 * layout (energy term off) against the isothermal tube model.
 */
import { describe, expect, it } from 'vitest';
import { solveReactor } from '../../src/reactors';
import { cpIntegral, type HeatCapacity } from '../../src/reactors/thermal/heat-capacity';
import { ThermalTube } from '../../src/reactors/thermal/thermal-tube';
import { specOf, type RefCase } from '../reactors/thermal/fixture';
import { compile } from '../reactors/compiled';

const BASE: RefCase = {
  T0: 600, P0: 2e5, feed: [0.01, 0, 0.09], Tref: 600, k_ref: 1.2e-3, E: 1e5, dH_ref: -8e4, T_refH: 600,
  cp: [40, 50, 30], Ua: 0, W: 3, mode: 'adiabatic', Ta: 0, alpha: 0, mcp: null,
};
const W = Array.from({ length: 31 }, (_, i) => 0.1 * i);

describe('adiabatic packed bed', () => {
  it('T = T0 + (-dH) X / (sum Theta_i Cp_i + X dCp) along the bed (dH at T0)', () => {
    const { spec, theta, kin } = specOf(BASE);
    const sol = new ThermalTube(spec, kin, theta).solve(BASE.W, { profile: W, rtol: 1e-11, atolScale: 1e-14 });
    expect(sol.status).toBe('success');
    const sumThetaCp = (BASE.feed[0] * 40 + BASE.feed[2] * 30) / BASE.feed[0];
    const dCp = 50 - 40;
    let maxX = 0;
    sol.profile!.x.forEach((_, i) => {
      const X = 1 - sol.profile!.F[i][0] / BASE.feed[0];
      maxX = Math.max(maxX, X);
      // Source: adiabatic energy balance of a single reaction with constant heat capacities and
      // dH given at T0, T = T0 + (-dH(T0)) X / (sum Theta_i Cp_i + X dCp) (textbook relation, common practice)
      const T = BASE.T0 + (-BASE.dH_ref * X) / (sumThetaCp + X * dCp);
      expect(Math.abs(sol.profile!.T[i] - T) / T).toBeLessThan(1e-9);
    });
    expect(maxX).toBeGreaterThan(0.5);
    // the hottest point of an adiabatic exothermic bed is its outlet temperature (T never falls)
    expect(Math.abs(sol.hotSpot.temperature - sol.outletTemperature)).toBeLessThan(1e-8);
  });

  it('with dH at 298.15 K the Kirchhoff-corrected relation holds', () => {
    const c = { ...BASE, T_refH: 298.15 };
    const { spec, theta, kin } = specOf(c);
    const sol = new ThermalTube(spec, kin, theta).solve(c.W, { profile: W, rtol: 1e-11, atolScale: 1e-14 });
    const sumThetaCp = (c.feed[0] * 40 + c.feed[2] * 30) / c.feed[0];
    const dCp = 10;
    sol.profile!.x.forEach((_, i) => {
      const X = 1 - sol.profile!.F[i][0] / c.feed[0];
      // Source: adiabatic balance with dH(T) = dH(TR) + dCp (T - TR) solved for T (common practice):
      // T = [X (-dH(TR)) + sum Theta Cp T0 + X dCp TR] / (sum Theta Cp + X dCp)
      const T = (X * -c.dH_ref + sumThetaCp * c.T0 + X * dCp * 298.15) / (sumThetaCp + X * dCp);
      expect(Math.abs(sol.profile!.T[i] - T) / T).toBeLessThan(1e-9);
    });
  });

  it('Shomate heat capacities: the outlet enthalpy equals the inlet enthalpy', () => {
    // Shomate coefficients invented for the test (the form is NIST's; the values are not data)
    const sh = (A: number, B: number): HeatCapacity => ({ form: 'shomate', A, B, C: -5, D: 1, E: 0.2 });
    const cps = [sh(30, 20), sh(35, 25), sh(28, 4)];
    const { spec, theta, kin } = specOf(BASE, {}, cps);
    const sol = new ThermalTube(spec, kin, theta).solve(BASE.W, { profile: W, rtol: 1e-11, atolScale: 1e-14 });
    sol.profile!.x.forEach((_, i) => {
      const xi = BASE.feed[0] - sol.profile!.F[i][0];
      const T = sol.profile!.T[i];
      // Source: first law for an adiabatic steady flow, path feed at T0 -> feed at T -> react at T
      // (common practice): sum_j F_j0 int_T0^T Cp_j dT + xi dH(T) = 0, dH(T) = dH(T0) + int_T0^T dCp dT
      const heat = BASE.feed.reduce((s, F, j) => s + F * cpIntegral(cps[j], BASE.T0, T), 0);
      const dH = BASE.dH_ref + cpIntegral(cps[1], BASE.T0, T) - cpIntegral(cps[0], BASE.T0, T);
      expect(Math.abs(heat + xi * dH)).toBeLessThan(1e-9 * Math.abs(xi * BASE.dH_ref) + 1e-15);
    });
  });
});

describe('isothermal layout', () => {
  it('is the cooled model with the energy term off and equals the isothermal tube solve', () => {
    const c = { ...BASE, mode: 'isothermal' as const, alpha: 0.05 };
    const { spec, theta, kin } = specOf(c);
    const tube = new ThermalTube(spec, kin, theta);
    expect(tube.balances.layout.T).toBe(-1);
    const sol = tube.solve(c.W, { rtol: 1e-11, atolScale: 1e-14 });
    const iso = solveReactor({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: 0.05 } },
      { id: 'r', temperature: c.T0, pressure: c.P0, feed: Float64Array.from(c.feed), size: c.W }, kin, theta, { rtol: 1e-11, atol: 1e-14 });
    for (let j = 0; j < 3; j++) expect(Math.abs(sol.outlet[j] - iso.outletAmounts[j])).toBeLessThan(1e-10 * 0.1);
    expect(Math.abs(sol.outletPressureRatio - iso.pressureRatio)).toBeLessThan(1e-9);
    expect(sol.outletTemperature).toBe(c.T0);
  });
});

describe('stiff integrator with the difference Jacobian', () => {
  it('gives the same cooled profile as the explicit method', () => {
    const c: RefCase = { ...BASE, mode: 'constant-coolant', Ua: 15, Ta: 590 };
    const { spec, theta, kin } = specOf(c);
    const a = new ThermalTube(spec, kin, theta).solve(c.W, { rtol: 1e-10, method: 'nonstiff' });
    const b = new ThermalTube(spec, kin, theta).solve(c.W, { rtol: 1e-10, method: 'stiff' });
    // Source: two integrators of the same equations (RODAS4 uses the Jacobian, Dormand-Prince does not)
    expect(Math.abs(a.outletTemperature - b.outletTemperature) / a.outletTemperature).toBeLessThan(1e-7);
    expect(Math.abs(a.hotSpot.temperature - b.hotSpot.temperature) / a.hotSpot.temperature).toBeLessThan(1e-7);
  });
});

describe('plug flow in volume (the same balances, coordinate V)', () => {
  // A -> B per m3 of reactor, r = k C_A with Arrhenius; the tube spec of the packed-bed case with kind
  // 'plug-flow': the same layout and terms, only the coordinate changes.
  const kin = compile(
    [{ name: 'A', formula: 'C4H10' }, { name: 'B', formula: 'C4H10' }, { name: 'I', formula: 'N2', inert: true }],
    [{ equation: 'A -> B', rate: { form: 'power-law', basis: 'volume', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
    ['k', 'E'], 600,
  );
  const theta = Float64Array.of(0.8, 1e5); // 1/s at 600 K
  const V = 0.05;
  it('isothermal: equals the isothermal plug-flow model of src/reactors', () => {
    const { spec } = specOf({ ...BASE, mode: 'isothermal' }, { kind: 'plug-flow' });
    const v = V / 10; // conversion about 0.8
    const sol = new ThermalTube(spec, kin, theta).solve(v, { rtol: 1e-11, atolScale: 1e-14 });
    const iso = solveReactor({ kind: 'plug-flow', phase: 'gas' }, { id: 'r', temperature: BASE.T0, pressure: BASE.P0, feed: Float64Array.from(BASE.feed), size: v }, kin, theta, { rtol: 1e-11, atol: 1e-14 });
    // Source: plug flow, first order, no mole change: F_A = F_A0 exp(-k C_T0 V / F_T0) (closed form, common practice)
    const CT0 = BASE.P0 / (8.314462618 * BASE.T0);
    const FA = BASE.feed[0] * Math.exp((-0.8 * CT0 * v) / 0.1);
    expect(Math.abs(sol.outlet[0] - FA) / FA).toBeLessThan(1e-8);
    expect(Math.abs(sol.outlet[0] - iso.outletAmounts[0]) / FA).toBeLessThan(1e-8);
  });
  it('adiabatic: T = T0 + (-dH) X / (sum Theta_i Cp_i + X dCp) along the tube', () => {
    const { spec } = specOf(BASE, { kind: 'plug-flow' });
    const xs = Array.from({ length: 11 }, (_, i) => (V * i) / 10);
    const sol = new ThermalTube(spec, kin, theta).solve(V, { profile: xs, rtol: 1e-11, atolScale: 1e-14 });
    const sumThetaCp = (BASE.feed[0] * 40 + BASE.feed[2] * 30) / BASE.feed[0];
    let maxX = 0;
    sol.profile!.x.forEach((_, i) => {
      const X = 1 - sol.profile!.F[i][0] / BASE.feed[0];
      maxX = Math.max(maxX, X);
      // Source: adiabatic energy balance, textbook relation (common practice)
      const T = BASE.T0 + (-BASE.dH_ref * X) / (sumThetaCp + X * 10);
      expect(Math.abs(sol.profile!.T[i] - T) / T).toBeLessThan(1e-9);
    });
    expect(maxX).toBeGreaterThan(0.3);
  });
});
