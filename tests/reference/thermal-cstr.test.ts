/**
 * Steady states of a first-order exothermic liquid stirred tank against SciPy brentq roots of
 * heat generated = heat removed (tests/reference/scipy/cstr_heat.py, cstr_heat.json), and the
 * Semenov criterion against its closed form for an Arrhenius rate.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ReactionEnthalpy } from '../../src/reactors/thermal/enthalpy';
import type { HeatCapacity } from '../../src/reactors/thermal/heat-capacity';
import { semenovCriterion, semenovNumber, SEMENOV_CRITICAL } from '../../src/reactors/thermal/semenov';
import { stirredTankSteadyStates } from '../../src/reactors/thermal/stirred-tank-heat';
import { compile } from '../reactors/compiled';
import { GAS_CONSTANT } from '../../src/core/constants';

const ref = JSON.parse(readFileSync(new URL('./scipy/cstr_heat.json', import.meta.url), 'utf8')) as {
  params: Record<string, number> & { range: [number, number] };
  steady_states: { T: number; X: number; stable: boolean }[];
};
const P = ref.params;
const kin = compile(
  [{ name: 'A', formula: 'C4H8O' }, { name: 'B', formula: 'C4H8O' }, { name: 'S', formula: 'H2O', inert: true }],
  [{ equation: 'A -> B', rate: { form: 'power-law', basis: 'volume', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
  ['k', 'E'],
  P.T_ref,
);
const cp: HeatCapacity[] = [P.cpA, P.cpB, P.cpS].map((v) => ({ form: 'constant', cp: v }));
const theta = Float64Array.of(P.k_ref, P.E);

describe('stirred tank heat balance', () => {
  const res = stirredTankSteadyStates({
    gas: false, T0: P.T0, F0: Float64Array.of(P.FA0, 0, P.FS0), v0: P.v0, size: P.V, weights: Float64Array.of(1),
    enthalpy: new ReactionEnthalpy(kin.stoich, Float64Array.of(P.dH), P.T0, cp), cp, UA: P.UA, Ta: P.Ta,
  }, kin, theta, { range: [P.range[0], 700], intervals: 800 });

  it('finds the three steady states SciPy brentq finds, with their stability', () => {
    expect(res.status).toBe('ok');
    expect(res.steadyStates.length).toBe(ref.steady_states.length);
    expect(ref.steady_states.length).toBe(3);
    res.steadyStates.forEach((s, i) => {
      const r = ref.steady_states[i];
      // Source: SciPy brentq roots of G(T) - R(T) (cstr_heat.py), xtol 1e-12
      expect(Math.abs(s.temperature - r.T)).toBeLessThan(1e-6);
      expect(Math.abs((P.FA0 - s.outlet[0]) / P.FA0 - r.X)).toBeLessThan(1e-7);
      expect(s.stable).toBe(r.stable);
    });
  });

  it('gives the heat-generated and heat-removed curves that cross at the steady states', () => {
    expect(res.curve.T.length).toBeGreaterThan(100);
    const sgn = res.curve.T.map((_, i) => Math.sign(res.curve.generated[i] - res.curve.removed[i]));
    let changes = 0;
    for (let i = 1; i < sgn.length; i++) if (sgn[i] !== sgn[i - 1]) changes++;
    expect(changes).toBe(3);
  });
});

describe('Semenov criterion', () => {
  it('psi equals Qg E / (R Ta^2 UA) for an Arrhenius heat generation', () => {
    const E = 9e4;
    const qg = (T: number): number => 5e3 * Math.exp((-E / GAS_CONSTANT) * (1 / T - 1 / 350));
    const UA = 800;
    // Source: Semenov number for Arrhenius kinetics, psi = Qg(Ta) E / (R Ta^2 UA) (common practice)
    expect(semenovNumber(qg, 340, UA) / ((qg(340) * E) / (GAS_CONSTANT * 340 * 340 * UA)) - 1).toBeLessThan(1e-6);
    const c = semenovCriterion(qg, 300, UA);
    expect(c.safe).toBe(true);
    // at the critical coolant temperature psi = 1/e
    expect(Math.abs(semenovNumber(qg, c.criticalCoolantTemperature!, UA) - SEMENOV_CRITICAL)).toBeLessThan(1e-6);
    expect(c.margin).toBeGreaterThan(0);
  });
});
