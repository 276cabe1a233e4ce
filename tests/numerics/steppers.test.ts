/**
 * The two one-step methods on their own: order of accuracy with fixed steps, the RODAS4
 * coefficients against the Rosenbrock order conditions (Hairer & Wanner, Solving ODEs II,
 * sec. IV.7, Table 7.1), L-stability, the dense output order, and the stiffness test.
 */
import { describe, expect, it } from 'vitest';
import { Dopri5 } from '../../src/numerics/dopri5';
import { RODAS4, Rosenbrock } from '../../src/numerics/rosenbrock';
import { newCounters, type StepperSettings } from '../../src/numerics/ode-common';
import type { OdeRhs } from '../../src/numerics/ode-types';

/** Settings that accept every step, so the steppers run with the fixed step hmax. */
function fixedStep(f: OdeRhs, n: number, h: number): StepperSettings {
  return { f, n, rtol: 1, atol: new Float64Array(n).fill(1e12), hmax: h, maxSteps: 1e6, maxEvaluations: 1e8, counters: newCounters() };
}

// y' = -2 t y^2, y(0) = 1: y = 1 / (1 + t^2) (nonlinear and non-autonomous)
const f: OdeRhs = (t, y, out) => {
  out[0] = -2 * t * y[0] * y[0];
};
const exact = (t: number) => 1 / (1 + t * t);

function globalError(kind: 'dopri5' | 'rodas4', h: number): number {
  const s = fixedStep(f, 1, h);
  const st =
    kind === 'dopri5'
      ? new Dopri5(s, { initialStep: h })
      : new Rosenbrock(s, { initialStep: h, jac: (t, y, J) => { J[0] = -4 * t * y[0]; } });
  expect(st.start(0, [1], 2)).toBe('ok');
  while (st.t !== 2) expect(st.step(2)).toBe('ok');
  return Math.abs(st.y[0] - exact(2));
}

describe('order of accuracy with fixed steps', () => {
  it('Dormand-Prince converges with order 5', () => {
    const e1 = globalError('dopri5', 0.1);
    const e2 = globalError('dopri5', 0.05);
    // Source: the method's classical order 5 (Dormand & Prince 1980)
    expect(Math.log2(e1 / e2)).toBeGreaterThan(4.6);
    expect(Math.log2(e1 / e2)).toBeLessThan(5.6);
  });

  it('RODAS4 converges with order 4', () => {
    const e1 = globalError('rodas4', 0.1);
    const e2 = globalError('rodas4', 0.05);
    // Source: RODAS4 has order 4 (Hairer & Wanner II, sec. IV.7)
    expect(Math.log2(e1 / e2)).toBeGreaterThan(3.6);
    expect(Math.log2(e1 / e2)).toBeLessThan(4.8);
  });
});

describe('RODAS4 coefficients', () => {
  const s = RODAS4.stages;
  const g = RODAS4.gamma;
  // transformed form -> original: Gamma^{-1} = diag(1/gamma) - C, alpha = A Gamma, b^T = m^T Gamma
  const Ginv: number[][] = [];
  for (let i = 0; i < s; i++) {
    Ginv.push(new Array(s).fill(0));
    Ginv[i][i] = 1 / g;
    for (let j = 0; j < i; j++) Ginv[i][j] = -RODAS4.c[i][j];
  }
  // invert the lower-triangular Ginv by forward substitution
  const G: number[][] = Array.from({ length: s }, () => new Array(s).fill(0));
  for (let col = 0; col < s; col++) {
    for (let i = 0; i < s; i++) {
      let v = i === col ? 1 : 0;
      for (let k = 0; k < i; k++) v -= Ginv[i][k] * G[k][col];
      G[i][col] = v / Ginv[i][i];
    }
  }
  const A: number[][] = Array.from({ length: s }, (_, i) => Array.from({ length: s }, (_, j) => (j < i ? RODAS4.a[i][j] : 0)));
  const alpha = A.map((row) => Array.from({ length: s }, (_, j) => row.reduce((acc, v, k) => acc + v * G[k][j], 0)));
  const weights = (m: readonly number[]) => Array.from({ length: s }, (_, j) => m.reduce((acc, v, k) => acc + v * G[k][j], 0));
  const beta = alpha.map((row, i) => row.map((v, j) => (j < i ? v + G[i][j] : 0)));
  const ai = alpha.map((row) => row.reduce((x, y) => x + y, 0));
  const bp = beta.map((row) => row.reduce((x, y) => x + y, 0));
  const sum = (fn: (i: number) => number) => Array.from({ length: s }, (_, i) => fn(i)).reduce((x, y) => x + y, 0);

  function conditions(b: number[]): number[] {
    // residuals of the order conditions up to order 4 (Hairer & Wanner II, Table 7.1)
    return [
      sum((i) => b[i]) - 1,
      sum((i) => b[i] * bp[i]) - (0.5 - g),
      sum((i) => b[i] * ai[i] ** 2) - 1 / 3,
      sum((i) => b[i] * sum((k) => beta[i][k] * bp[k])) - (1 / 6 - g + g * g),
      sum((i) => b[i] * ai[i] ** 3) - 1 / 4,
      sum((i) => b[i] * ai[i] * sum((k) => alpha[i][k] * bp[k])) - (1 / 8 - g / 3),
      sum((i) => b[i] * sum((k) => beta[i][k] * ai[k] ** 2)) - (1 / 12 - g / 3),
      sum((i) => b[i] * sum((k) => beta[i][k] * sum((l) => beta[k][l] * bp[l]))) - (1 / 24 - g / 2 + 1.5 * g * g - g ** 3),
    ];
  }

  it('stage abscissae and gamma sums match the listed alpha_i and gamma_i', () => {
    for (let i = 0; i < s; i++) {
      expect(ai[i]).toBeCloseTo(RODAS4.alpha[i], 10);
      expect(G[i].reduce((x, y) => x + y, 0)).toBeCloseTo(RODAS4.gammaSum[i], 10);
    }
  });

  it('the main method satisfies the order-4 conditions', () => {
    for (const r of conditions(weights(RODAS4.m))) expect(Math.abs(r)).toBeLessThan(1e-10);
  });

  it('the embedded method satisfies the order-3 conditions but not all order-4 ones', () => {
    const res = conditions(weights(RODAS4.m.map((v, i) => v - RODAS4.e[i])));
    for (const r of res.slice(0, 4)) expect(Math.abs(r)).toBeLessThan(1e-10);
    expect(Math.max(...res.slice(4).map(Math.abs))).toBeGreaterThan(1e-6);
  });

  it('is L-stable: one huge step on y\' = lambda y damps to ~0', () => {
    const lambda = -1e12;
    const st = new Rosenbrock(fixedStep((_t, y, out) => { out[0] = lambda * y[0]; }, 1, 1), { initialStep: 1, autonomous: true });
    st.start(0, [1], 1);
    expect(st.step(1)).toBe('ok');
    // Source: R(infinity) = 0 for a stiffly accurate L-stable method; R(z) = O(1/z)
    expect(Math.abs(st.y[0])).toBeLessThan(1e-10);
  });
});

describe('dense output and stiffness test', () => {
  it('Dormand-Prince dense output has local error O(h^5) (order 4)', () => {
    const errAt = (h: number) => {
      const st = new Dopri5(fixedStep(f, 1, h), { initialStep: h });
      st.start(0.5, [exact(0.5)], 10);
      st.step(10);
      const out = new Float64Array(1);
      let e = 0;
      for (const th of [0.2, 0.5, 0.7]) {
        st.dense(0.5 + th * h, out);
        e = Math.max(e, Math.abs(out[0] - exact(0.5 + th * h)));
      }
      return e;
    };
    const ratio = Math.log2(errAt(0.025) / errAt(0.0125));
    // Source: Hairer, Norsett & Wanner I, sec. II.6: continuous extension of order 4
    expect(ratio).toBeGreaterThan(4.6); // a cubic Hermite interpolant would give about 4
  });

  it('the stiffness test fires on a stiff linear system and not on a non-stiff one', () => {
    const run = (k: number) => {
      const s: StepperSettings = { f: (_t, y, out) => { out[0] = -k * (y[0] - 1); }, n: 1, rtol: 1e-6, atol: Float64Array.from([1e-8]), hmax: 100, maxSteps: 1e5, maxEvaluations: 1e7, counters: newCounters() };
      const st = new Dopri5(s);
      st.start(0, [0], 100);
      while (st.t !== 100 && !st.stiff) if (st.step(100) !== 'ok') break;
      return st;
    };
    const stiff = run(1e4);
    expect(stiff.stiff).toBe(true);
    expect(stiff.t).toBeLessThan(0.1);
    // Source: Hairer & Wanner II, sec. IV.2, h lambda near the stability boundary 3.3 of DOPRI5
    expect(stiff.hLambda).toBeGreaterThan(2);
    expect(run(0.1).stiff).toBe(false);
  });
});
