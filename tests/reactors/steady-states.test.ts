/**
 * Every steady state of a stirred tank in the solution, with stability, and the branch chosen by a
 * start (the measured outlet).
 */
import { describe, expect, it } from 'vitest';
import { solveReactor } from '../../src/reactors';
import { compile } from './compiled';
import { GAS_CONSTANT } from '../../src/core/constants';
import gasRef from '../reference/scipy/gas_tank_states.json' with { type: 'json' };

// r = k C_A / (1 + K C_A)^2 in a liquid tank: u0 = K C_A0 = 20, Da = k tau = 80 gives three steady states.
const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: { form: 'lhhw', rateConstant: { k: 'k' }, adsorption: { A: { K: 'KA' } }, exponent: 2 } }], ['k', 'KA']);
const K = 0.05;
const k = 0.8;
const v0 = 1e-3;
const V = 0.1;
const run = { id: 'cstr', temperature: 350, feed: Float64Array.from([0.4, 0]), volumetricFlow: v0, size: V };
const theta = Float64Array.from([k, K]);

describe('stirred-tank steady states in the solution', () => {
  it('lists the three steady states with the stability of the slope condition', () => {
    const s = solveReactor({ kind: 'stirred-tank', phase: 'liquid' }, run, kin, theta);
    const states = s.steadyStates!;
    expect(states).toHaveLength(3);
    expect(states.filter((x) => x.reported)).toHaveLength(1);
    expect(s.steadyStateStart).toBe('feed');
    for (const st of states) {
      const C = st.outletConcentrations[0];
      expect(C).toBeCloseTo(st.outletAmounts[0] / v0, 9);
      // Source: stability of an isothermal stirred tank, d/dC [v0 (C0 - C) - V r(C)] < 0, i.e.
      // 1 + tau dr/dC > 0 with dr/dC = k (1 - K C)/(1 + K C)^3 (van Heerden 1953; common practice).
      const slope = 1 + (V / v0) * ((k * (1 - K * C)) / (1 + K * C) ** 3);
      expect(st.stability).toBe(slope > 0 ? 'stable' : 'unstable');
    }
    const sorted = [...states].sort((a, b) => a.outletAmounts[0] - b.outletAmounts[0]).map((x) => x.stability);
    expect(sorted).toEqual(['stable', 'unstable', 'stable']);
  });

  it('a start near the high-conversion branch reports that branch and says so', () => {
    const all = solveReactor({ kind: 'stirred-tank', phase: 'liquid' }, run, kin, theta).steadyStates!;
    const low = [...all].sort((a, b) => a.outletAmounts[0] - b.outletAmounts[0])[0];
    const start = Float64Array.from([low.outletAmounts[0] * 1.05, 0.4 - low.outletAmounts[0] * 1.05]);
    const s = solveReactor({ kind: 'stirred-tank', phase: 'liquid' }, run, kin, theta, { start, steadyStateSearch: 'on-failure' });
    expect(s.steadyStateStart).toBe('given');
    expect(Math.abs(s.outletAmounts[0] / low.outletAmounts[0] - 1)).toBeLessThan(1e-8);
  });
});

describe('gas stirred tank: stability assessed', () => {
  const gas = { kind: 'stirred-tank', phase: 'gas' } as const;
  it('A -> B (no change in moles) behaves as the liquid tank: slope condition of van Heerden', () => {
    // C_T = 400 mol/m3 at 350 K (P = C_T R T), pure A at 0.4 mol/s: v0 = 1e-3 m3/s, as the liquid case.
    const P = 400 * GAS_CONSTANT * 350;
    const s = solveReactor(gas, { ...run, volumetricFlow: undefined, pressure: P }, kin, theta);
    const states = s.steadyStates!;
    expect(states).toHaveLength(3);
    for (const st of states) {
      const C = st.outletConcentrations[0];
      const slope = 1 + (V / v0) * ((k * (1 - K * C)) / (1 + K * C) ** 3); // van Heerden 1953, common practice
      expect(st.stability).toBe(slope > 0 ? 'stable' : 'unstable');
    }
  });
  it('A -> 2 B (moles increase): states and stability match SciPy (brentq + solve_ivp of the holdup dynamics)', () => {
    const kin2 = compile(['A', 'B'], [{ equation: 'A -> 2 B', rate: { form: 'lhhw', rateConstant: { k: 'k' }, adsorption: { A: { K: 'KA' } }, exponent: 2 } }], ['k', 'KA']);
    const P = gasRef.CT * GAS_CONSTANT * 350;
    const s = solveReactor(gas, { id: 'g', temperature: 350, feed: Float64Array.from([gasRef.FA0, 0]), size: gasRef.V, pressure: P }, kin2, Float64Array.from([gasRef.k, gasRef.K]));
    const ours = [...s.steadyStates!].sort((a, b) => a.outletAmounts[0] - b.outletAmounts[0]);
    expect(ours).toHaveLength(gasRef.states.length);
    ours.forEach((st, i) => {
      // tests/reference/scipy/gas_tank_states.json
      expect(st.outletAmounts[0] / gasRef.states[i].FA).toBeCloseTo(1, 7);
      expect(st.outletConcentrations[0] / gasRef.states[i].CA).toBeCloseTo(1, 7);
      expect(st.stability).toBe(gasRef.states[i].stability);
    });
    expect(ours.map((x) => x.stability)).toEqual(['stable', 'unstable', 'stable']);
  });
});
