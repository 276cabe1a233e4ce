/**
 * The generated tube right-hand side (src/reactors/tube-rhs.ts) against the plain dense loops it
 * replaces: identical to the last bit for gas and liquid, with and without permeation, on random
 * states; and a packed-bed solve through solveReactor keeps its pinned step counts.
 */
import { describe, expect, it } from 'vitest';
import { makeTubeRhs, tubeRhsSource, type TubeRhsState } from '../../src/reactors/tube-rhs';
import { solveReactor } from '../../src/reactors';
import type { CompiledKinetics } from '../../src/kinetics/compiled';
import { compile, pl, rpl } from './compiled';
import { mulberry32 } from '../../src/numerics/random';

/** The generic tube balances written as dense loops (the form the generator must reproduce). */
function denseRhs(kin: CompiledKinetics, gas: boolean, membrane: boolean, s: TubeRhsState, y: Float64Array, out: Float64Array): void {
  const nS = kin.speciesNames.length;
  const nR = kin.reactionIds.length;
  const C = new Float64Array(nS);
  const r = new Float64Array(nR);
  let FT = 0;
  if (gas) {
    for (let j = 0; j < nS; j++) FT += y[j];
    const f = FT > 0 ? (s.cT0 * y[nS]) / FT : 0;
    for (let j = 0; j < nS; j++) C[j] = f * y[j];
  } else for (let j = 0; j < nS; j++) C[j] = y[j] * s.invV0;
  kin.rates(C, s.T, s.theta, r);
  for (let j = 0; j < nS; j++) out[j] = 0;
  for (let i = 0; i < nR; i++) {
    const wr = s.weights[i] * r[i];
    if (wr === 0) continue;
    for (let j = 0; j < nS; j++) out[j] += kin.stoich[i * nS + j] * wr;
  }
  if (membrane) for (let j = 0; j < nS; j++) out[j] -= s.perm[j] * (C[j] - s.sweep[j]);
  if (gas) {
    const p = y[nS] > 1e-12 ? y[nS] : 1e-12;
    out[nS] = s.alpha === 0 ? 0 : (-s.alpha / (2 * p)) * (FT / s.FT0);
  }
}

describe('generated tube right-hand side', () => {
  const kin = compile(['A', 'B', 'C', 'D', 'I'], [
    { equation: '2 A + B <=> C', rate: rpl('k1', 'K1', 'mass') },
    { equation: 'C -> D', rate: pl('k2') },
    { equation: 'A -> 0.5 D', rate: pl('k3', 'mass') },
  ], ['k1', 'K1', 'k2', 'k3'], 500);
  const nS = 5;

  for (const gas of [true, false]) {
    for (const membrane of [false, true]) {
      it(`${gas ? 'gas' : 'liquid'}${membrane ? ' with permeation' : ''}: bit-identical to the dense loops`, () => {
        const rng = mulberry32(gas ? 7 : 11);
        const rnd = (): number => rng.next();
        const state: TubeRhsState = {
          cT0: 120.3, FT0: 3.1, alpha: 0.011, T: 510, invV0: 1 / 2.5e-3,
          weights: Float64Array.from([1, 1 / 800, 1]),
          perm: Float64Array.from([0, 0.4, 0, 0, 0.05]),
          sweep: Float64Array.from([0, 2, 0, 0, 0]),
          theta: Float64Array.from([2e-5, 0.07, 3e-4, 1e-5]),
        };
        const n = gas ? nS + 1 : nS;
        const rhs = makeTubeRhs(kin, gas, membrane, state, new Float64Array(nS), new Float64Array(3));
        const y = new Float64Array(n);
        const a = new Float64Array(n);
        const b = new Float64Array(n);
        for (let trial = 0; trial < 200; trial++) {
          for (let j = 0; j < nS; j++) y[j] = trial % 17 === 3 && j === 1 ? 0 : 2 * rnd();
          if (gas) y[nS] = trial % 23 === 5 ? 0 : rnd();
          if (trial % 50 === 7) state.alpha = 0;
          else state.alpha = 0.011;
          rhs(0, y, a);
          denseRhs(kin, gas, membrane, state, y, b);
          for (let j = 0; j < n; j++) expect(Object.is(a[j] + 0, b[j] + 0), `component ${j} trial ${trial}: ${a[j]} vs ${b[j]}`).toBe(true);
        }
      });
    }
  }

  it('writes the stoichiometry out sparsely (zero coefficients never appear)', () => {
    const src = tubeRhsSource(kin, true, false);
    expect(src).toContain('out[4] = 0;'); // the inert takes part in no reaction
    expect(src).toContain('(-2) * a0');
    expect(src).toContain('(0.5) * a2');
    expect(src).not.toMatch(/\(0\) \*/);
  });

  it('a gas packed bed with pressure drop solves with the step counts of the reference case', () => {
    const k2 = compile(['A', 'B', 'C', 'D', 'I'], [
      { equation: 'A + B <=> C', rate: rpl('k1', 'K1', 'mass') },
      { equation: 'C -> D', rate: pl('k2', 'mass') },
    ], ['k1', 'K1', 'k2'], 500);
    const sol = solveReactor({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: 0.012 } },
      { id: 'b', temperature: 500, pressure: 5e5, feed: Float64Array.from([1, 1.2, 0, 0, 0.8]), size: 50 },
      k2, Float64Array.from([1e-5, 0.05, 5e-4]), { method: 'nonstiff' });
    // Source: bench/c/dopri5_pbr.c (the same Dormand-Prince control in C, gcc -O2): 26 steps,
    // 158 RHS evaluations, outlet F_A = 0.578652114522, p = 0.674288627487.
    expect(sol.stats.steps).toBe(26);
    expect(sol.stats.rhsEvaluations).toBe(158);
    expect(sol.outletAmounts[0]).toBeCloseTo(0.578652114522, 11);
    expect(sol.pressureRatio).toBeCloseTo(0.674288627487, 11);
  });
});
