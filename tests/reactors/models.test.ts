/**
 * Membrane, semibatch, gas batch and stirred-tank behaviour against closed forms; the stirred
 * tank's search for other steady states; compiled kinetics against the hand-written mass-action
 * implementation.
 */
import { describe, expect, it } from 'vitest';
import { solveReactor } from '../../src/reactors';
import { compile, pl, rpl } from './compiled';
import { massAction } from './mass-action';
import { GAS_CONSTANT } from '../../src/core/constants';

const tight = { rtol: 1e-11, atol: 1e-14 };
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('membrane reactor', () => {
  it('permeation of A beside an inert, no reaction: (F_A - F_A0) + F_I ln(F_A/F_A0) = -k C_T0 V', () => {
    const kin = compile(['A', 'B', { name: 'I', inert: true }], [{ equation: 'A -> B', rate: pl('k') }], ['k']);
    const T = 450;
    const P0 = 1.5e5;
    const kp = 0.4; // 1/s
    const V = 0.05; // m3
    const run = { id: 'm', temperature: T, pressure: P0, feed: Float64Array.from([0.6, 0, 0.4]), size: V };
    const s = solveReactor({ kind: 'membrane', phase: 'gas', membrane: { permeation: { A: kp } } }, run, kin, Float64Array.from([0]), tight);
    expect(s.status).toBe('success');
    const FA = s.outletAmounts[0];
    const cT0 = P0 / (GAS_CONSTANT * T);
    // Source: analytic solution of dF_A/dV = -k C_T0 F_A/(F_A + F_I) (separable; common practice)
    expect(Math.abs(FA - 0.6 + 0.4 * Math.log(FA / 0.6) + kp * cT0 * V)).toBeLessThan(1e-10);
    expect(s.outletAmounts[2]).toBe(0.4);
  });

  it('permeation with a sweep concentration drives towards C_sweep (liquid)', () => {
    const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k') }], ['k']);
    const v0 = 1e-3;
    const run = { id: 'm', temperature: 300, feed: Float64Array.from([0.1, 0]), volumetricFlow: v0, size: 0.2 };
    const s = solveReactor({ kind: 'membrane', phase: 'liquid', membrane: { permeation: { A: 0.05 }, sweep: { A: 20 } } }, run, kin, Float64Array.from([0]), tight);
    // Source: analytic dC_A/dtau = -k (C_A - C_s): C_A = C_s + (C_A0 - C_s) exp(-k tau)
    expect(rel(s.outletConcentrations[0], 20 + (100 - 20) * Math.exp(-0.05 * 200))).toBeLessThan(1e-9);
  });
});

describe('semibatch', () => {
  it('first order with a constant feed: N_A = F_A0/k (1 - e^-kt) + N_A0 e^-kt, V = V0 + v0 t', () => {
    const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k') }], ['k']);
    const k = 2e-3;
    const run = {
      id: 's', temperature: 310, feed: Float64Array.from([0.05, 0]), volumetricFlow: 1e-4, initialVolume: 0.5,
      initialConcentrations: Float64Array.from([200, 0]), size: 1500,
    };
    const s = solveReactor({ kind: 'semibatch', phase: 'liquid' }, run, kin, Float64Array.from([k]), { ...tight, profile: true });
    expect(s.status).toBe('success');
    const prof = s.profile!;
    for (let i = 0; i < prof.x.length; i++) {
      const t = prof.x[i];
      const NA = (0.05 / k) * (1 - Math.exp(-k * t)) + 100 * Math.exp(-k * t);
      // Source: analytic solution of dN_A/dt = F_A0 - k N_A (first order: independent of V)
      expect(rel(prof.amounts[i][0], NA)).toBeLessThan(1e-9);
      expect(rel(prof.concentrations[i][0], NA / (0.5 + 1e-4 * t))).toBeLessThan(1e-9);
      // total moles = initial + fed
      expect(rel(prof.amounts[i][0] + prof.amounts[i][1], 100 + 0.05 * t)).toBeLessThan(1e-11);
    }
  });

  it('refuses the gas phase', () => {
    const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k') }], ['k']);
    expect(() => solveReactor({ kind: 'semibatch', phase: 'gas' }, { id: 's', temperature: 300, size: 1 }, kin, Float64Array.from([1]))).toThrow(/liquid/);
  });
});

describe('gas batch', () => {
  it('A -> 2 B at constant volume: X = 1 - e^-kt and P/P0 = N_T/N_T0 = 1 + y_A0 X', () => {
    const kin = compile(['A', 'B', { name: 'I', inert: true }], [{ equation: 'A -> 2 B', rate: pl('k') }], ['k']);
    const k = 0.01;
    const run = { id: 'b', temperature: 500, pressure: 2e5, initialConcentrations: Float64Array.from([30, 0, 18]), size: 120 };
    const s = solveReactor({ kind: 'batch', phase: 'gas' }, run, kin, Float64Array.from([k]), tight);
    const X = 1 - s.outletConcentrations[0] / 30;
    // Source: analytic first-order batch X = 1 - exp(-k t)
    expect(rel(X, 1 - Math.exp(-k * 120))).toBeLessThan(1e-9);
    // Source: ideal gas at constant V and T, P/P0 = N_T/N_T0 (y_A0 = 30/48)
    expect(rel(s.pressureRatio, 1 + (30 / 48) * X)).toBeLessThan(1e-10);
  });

  it('a mass-basis rate in a batch needs the catalyst mass', () => {
    const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k', 'mass') }], ['k']);
    const run = { id: 'b', temperature: 500, initialConcentrations: Float64Array.from([30, 0]), size: 120 };
    expect(() => solveReactor({ kind: 'batch', phase: 'liquid' }, run, kin, Float64Array.from([1e-3]))).toThrow(/catalystMass|catalyst mass/);
    const s = solveReactor({ kind: 'batch', phase: 'liquid' }, { ...run, catalystMass: 2, initialVolume: 0.5 }, kin, Float64Array.from([1e-3]), tight);
    // Source: analytic dC_A/dt = -(k W / V) C_A
    expect(rel(s.outletConcentrations[0], 30 * Math.exp((-1e-3 * 2 * 120) / 0.5))).toBeLessThan(1e-9);
  });
});

describe('stirred tank', () => {
  it('finds the three steady states of r = k C_A/(1 + K C_A)^2 and warns', () => {
    const kin = compile(['A', 'B'], [{
      equation: 'A -> B',
      rate: { form: 'lhhw', rateConstant: { k: 'k' }, adsorption: { A: { K: 'KA' } }, exponent: 2 },
    }], ['k', 'KA']);
    // u0 = K C_A0 = 20, Da = k tau = 80: three roots of u0 - u = Da u/(1 + u)^2
    const K = 0.05;
    const v0 = 1e-3;
    const V = 0.1;
    const k = 0.8;
    const run = { id: 'cstr', temperature: 350, feed: Float64Array.from([0.4, 0]), volumetricFlow: v0, size: V };
    const s = solveReactor({ kind: 'stirred-tank', phase: 'liquid' }, run, kin, Float64Array.from([k, K]));
    expect(s.status).toBe('success');
    const w = s.warnings.find((x) => x.code === 'multiple-steady-states');
    expect(w).toBeDefined();
    expect(w!.message).toMatch(/3 steady states/);
    const found = [...w!.message.matchAll(/A = ([0-9.e+-]+) mol\/s/g)].map((m) => Number(m[1])).sort((a, b) => a - b);
    // roots computed here independently by bisection on the scalar balance in u = K C_A
    const f = (u: number): number => 80 * u / (1 + u) ** 2 - (20 - u);
    const roots: number[] = [];
    const M = 20000;
    for (let i = 0; i < M; i++) {
      let a = (20 * i) / M;
      let b = (20 * (i + 1)) / M;
      if (f(a) * f(b) >= 0) continue;
      for (let it = 0; it < 100; it++) {
        const c = 0.5 * (a + b);
        if (f(a) * f(c) <= 0) b = c;
        else a = c;
      }
      roots.push(((0.5 * (a + b)) / K) * v0);
    }
    expect(roots.length).toBe(3);
    expect(found.length).toBe(3);
    // Source: the isothermal CSTR balance solved in this test by bisection (common practice)
    for (let i = 0; i < 3; i++) expect(rel(found[i], roots[i])).toBeLessThan(1e-5);
    // the reported steady state is one of them
    expect(Math.min(...roots.map((r) => rel(s.outletAmounts[0], r)))).toBeLessThan(1e-8);
    // A fit skips the search once Newton converged: same steady state, no search, no warning.
    const quick = solveReactor({ kind: 'stirred-tank', phase: 'liquid' }, run, kin, Float64Array.from([k, K]), { steadyStateSearch: 'on-failure' });
    expect(quick.status).toBe('success');
    expect(quick.outletAmounts[0]).toBe(s.outletAmounts[0]);
    expect(quick.warnings.find((x) => x.code === 'multiple-steady-states')).toBeUndefined();
  });

  it('mass-basis rate with a catalyst mass: X = k W C/F form (liquid)', () => {
    const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k', 'mass') }], ['k']);
    const run = { id: 'c', temperature: 350, feed: Float64Array.from([1, 0]), volumetricFlow: 2e-3, size: 0.5, catalystMass: 10 };
    const s = solveReactor({ kind: 'stirred-tank', phase: 'liquid' }, run, kin, Float64Array.from([4e-4]));
    const Da = (4e-4 * 10) / 2e-3;
    // Source: analytic F_A0 - F_A - k W F_A/v0 = 0
    expect(rel(1 - s.outletAmounts[0], Da / (1 + Da))).toBeLessThan(1e-10);
  });
});

describe('compiled kinetics against the hand-written mass-action kinetics', () => {
  it('same packed-bed outlet for two reactions with pressure drop', () => {
    const species = ['A', 'B', 'C', 'D', 'I'];
    const compiled = compile(species, [
      { equation: 'A + B <=> C', rate: rpl('k1', 'K1', 'mass') },
      { equation: 'C -> D', rate: pl('k2', 'mass') },
    ], ['k1', 'K1', 'k2']);
    const hand = massAction(species, [
      { nu: { A: -1, B: -1, C: 1 }, orders: { A: 1, B: 1 }, k: 'k1', reverse: { orders: { C: 1 }, K: 'K1' }, basis: 'mass' },
      { nu: { C: -1, D: 1 }, orders: { C: 1 }, k: 'k2', basis: 'mass' },
    ], ['k1', 'K1', 'k2']);
    const theta = Float64Array.from([1e-5, 0.05, 5e-4]);
    const run = { id: 'x', temperature: 500, pressure: 5e5, feed: Float64Array.from([1, 1.2, 0, 0, 0.8]), size: 50 };
    const spec = { kind: 'packed-bed' as const, phase: 'gas' as const, pressureDrop: { alpha: 0.012 } };
    const a = solveReactor(spec, run, compiled, theta, { ...tight, sensitivities: true });
    const b = solveReactor(spec, run, hand, theta, { ...tight, sensitivities: true });
    for (let j = 0; j < 5; j++) expect(Math.abs(a.outletAmounts[j] - b.outletAmounts[j])).toBeLessThan(1e-11);
    for (let i = 0; i < a.sensitivity!.amounts.length; i++) {
      expect(Math.abs(a.sensitivity!.amounts[i] - b.sensitivity!.amounts[i])).toBeLessThan(1e-8 * Math.abs(b.sensitivity!.amounts[i]) + 1e-12);
    }
  });
});
