/**
 * Test fixture: first-order exothermic A -> B over a catalyst with inert I (the case written out
 * independently in tests/reference/scipy/thermal_tube.py), compiled through the real pipeline.
 */
import { ReactionEnthalpy } from '../../../src/reactors/thermal/enthalpy';
import type { HeatCapacity } from '../../../src/reactors/thermal/heat-capacity';
import type { CoolingMode } from '../../../src/reactors/thermal/layout';
import type { ThermalTubeSpec } from '../../../src/reactors/thermal/tube-balances';
import { compile } from '../compiled';

export interface RefCase {
  T0: number; P0: number; feed: number[]; Tref: number; k_ref: number; E: number; dH_ref: number; T_refH: number;
  cp: number[]; Ua: number; W: number; mode: CoolingMode; Ta: number; alpha: number; mcp: number | null;
}

export function firstOrderKinetics(Tref: number) {
  return compile(
    [{ name: 'A', formula: 'C4H10' }, { name: 'B', formula: 'C4H10' }, { name: 'I', formula: 'N2', inert: true }],
    [{ equation: 'A -> B', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
    ['k', 'E'],
    Tref,
  );
}

/** The thermal spec of a reference case, with optional heat capacities and mode overrides. */
export function specOf(c: RefCase, over: Partial<ThermalTubeSpec> = {}, cp?: HeatCapacity[]): { spec: ThermalTubeSpec; theta: Float64Array; kin: ReturnType<typeof firstOrderKinetics> } {
  const kin = firstOrderKinetics(c.Tref);
  const cps: HeatCapacity[] = cp ?? c.cp.map((v) => ({ form: 'constant', cp: v }));
  const spec: ThermalTubeSpec = {
    kind: 'packed-bed', gas: true, mode: c.mode, T0: c.T0, P0: c.P0, F0: Float64Array.from(c.feed), alpha: c.alpha,
    weights: Float64Array.of(1), enthalpy: new ReactionEnthalpy(kin.stoich, Float64Array.of(c.dH_ref), c.T_refH, cps), cp: cps,
    Ua: c.Ua, coolantTemperature: c.Ta, coolantFlowCapacity: c.mcp ?? 1, ...over,
  };
  return { spec, theta: Float64Array.of(c.k_ref, c.E), kin };
}
