/**
 * The ODE integrators against closed-form solutions, for every method (Dormand-Prince,
 * odex extrapolation, RODAS4 and the automatic choice), at rtol 1e-10.
 */
import { describe, expect, it } from 'vitest';
import { integrate } from '../../src/numerics/integrate';
import type { OdeOptions, OdeRhs } from '../../src/numerics/ode-types';

const methods: NonNullable<OdeOptions['method']>[] = ['nonstiff', 'odex', 'stiff', 'auto'];
const tight: OdeOptions = { rtol: 1e-10, atol: 1e-12 };

/** Largest |a_i - b_i| / scale. */
function maxRelErr(a: ArrayLike<number>, b: ArrayLike<number>, scale: number): number {
  let e = 0;
  for (let i = 0; i < a.length; i++) e = Math.max(e, Math.abs(a[i] - b[i]) / scale);
  return e;
}

describe.each(methods)('analytic solutions, method %s', (method) => {
  it('exponential decay y\' = -k y', () => {
    const k = 0.7;
    const f: OdeRhs = (_t, y, out) => {
      out[0] = -k * y[0];
    };
    const tEval = [0, 0.5, 1, 2.5, 5, 8];
    const r = integrate(f, 0, [3], 8, { ...tight, method, tEval });
    expect(r.status).toBe('success');
    expect(r.t).toBe(8);
    // Source: analytic solution y = y0 exp(-k t)
    const exact = 3 * Math.exp(-k * 8);
    expect(Math.abs(r.y[0] - exact) / exact).toBeLessThan(1e-8);
    // dense output at tEval points. Source: analytic solution y = y0 exp(-k t)
    expect(r.tOut).toEqual(tEval);
    for (let i = 0; i < tEval.length; i++) {
      const ex = 3 * Math.exp(-k * tEval[i]);
      expect(Math.abs(r.yOut[i][0] - ex) / ex).toBeLessThan(1e-8);
    }
  });

  it('harmonic oscillator y\'\' = -w^2 y', () => {
    const w = 2;
    const f: OdeRhs = (_t, y, out) => {
      out[0] = y[1];
      out[1] = -w * w * y[0];
    };
    const tEval = Array.from({ length: 21 }, (_, i) => i * 0.5);
    const r = integrate(f, 0, [1, 0], 10, { ...tight, method, tEval });
    expect(r.status).toBe('success');
    // Source: analytic solution y = cos(w t), y' = -w sin(w t); error relative to the amplitude w
    expect(maxRelErr(r.y, [Math.cos(w * 10), -w * Math.sin(w * 10)], w)).toBeLessThan(1e-8);
    for (let i = 0; i < tEval.length; i++) {
      const t = tEval[i];
      // Source: analytic solution (dense output at tEval)
      expect(maxRelErr(r.yOut[i], [Math.cos(w * t), -w * Math.sin(w * t)], w)).toBeLessThan(1e-8);
    }
  });

  it('logistic equation y\' = r y (1 - y/K)', () => {
    const rate = 0.8;
    const K = 2;
    const y0 = 0.1;
    const f: OdeRhs = (_t, y, out) => {
      out[0] = rate * y[0] * (1 - y[0] / K);
    };
    const exact = (t: number) => K / (1 + (K / y0 - 1) * Math.exp(-rate * t));
    const tEval = [1, 3, 4.5, 7, 15];
    const r = integrate(f, 0, [y0], 15, { ...tight, method, tEval });
    expect(r.status).toBe('success');
    // Source: analytic solution y = K / (1 + (K/y0 - 1) exp(-r t))
    expect(Math.abs(r.y[0] - exact(15)) / exact(15)).toBeLessThan(1e-8);
    for (let i = 0; i < tEval.length; i++) {
      // Source: analytic solution (dense output)
      expect(Math.abs(r.yOut[i][0] - exact(tEval[i])) / exact(tEval[i])).toBeLessThan(1e-8);
    }
  });

  it('non-autonomous y\' = y cos t, backwards in time', () => {
    const f: OdeRhs = (t, y, out) => {
      out[0] = y[0] * Math.cos(t);
    };
    const r = integrate(f, 4, [Math.exp(Math.sin(4))], -3, { ...tight, method, tEval: [4, 1, 0, -3] });
    expect(r.status).toBe('success');
    expect(r.t).toBe(-3);
    // Source: analytic solution y = exp(sin t)
    expect(Math.abs(r.y[0] - Math.exp(Math.sin(-3))) / Math.exp(Math.sin(-3))).toBeLessThan(1e-8);
    expect(r.tOut).toEqual([4, 1, 0, -3]);
    // Source: analytic solution y = exp(sin t) at t = 1 and 0
    expect(Math.abs(r.yOut[1][0] - Math.exp(Math.sin(1)))).toBeLessThan(1e-8 * Math.exp(1));
    expect(Math.abs(r.yOut[2][0] - 1)).toBeLessThan(1e-8);
  });

  it("event: y' = -y stops where y = 0.5, at t = ln 2", () => {
    const f: OdeRhs = (_t, y, out) => {
      out[0] = -y[0];
    };
    const r = integrate(f, 0, [1], 5, {
      ...tight,
      method,
      events: [{ name: 'half', g: (_t, y) => y[0] - 0.5 }],
    });
    expect(r.status).toBe('event');
    expect(r.success).toBe(true);
    // Source: analytic solution exp(-t) = 0.5  <=>  t = ln 2
    expect(Math.abs(r.t - Math.LN2)).toBeLessThan(1e-10);
    expect(Math.abs(r.y[0] - 0.5)).toBeLessThan(1e-10);
    expect(r.events).toHaveLength(1);
    expect(r.events[0].name).toBe('half');
    expect(r.events[0].t).toBe(r.t);
  });
});
