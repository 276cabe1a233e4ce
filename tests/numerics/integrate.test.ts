import { describe, expect, it } from 'vitest';
import { integrate } from '../../src/numerics/integrate';
import type { OdeOptions, OdeRhs } from '../../src/numerics/ode-types';

const methods: NonNullable<OdeOptions['method']>[] = ['nonstiff', 'stiff', 'odex', 'auto'];
const decay: OdeRhs = (_t, y, out) => {
  out[0] = -y[0];
};
const oscillator: OdeRhs = (_t, y, out) => {
  out[0] = y[1];
  out[1] = -y[0];
};

describe('integrate: input checks (status, never a throw)', () => {
  it.each([
    ['t1 equals t0', () => integrate(decay, 1, [1], 1)],
    ['non-finite y0', () => integrate(decay, 0, [NaN], 1)],
    ['empty y0', () => integrate(decay, 0, [], 1)],
    ['rtol <= 0', () => integrate(decay, 0, [1], 1, { rtol: 0 })],
    ['atol length', () => integrate(decay, 0, [1], 1, { atol: Float64Array.from([1, 2]) })],
    ['atol negative', () => integrate(decay, 0, [1], 1, { atol: -1 })],
    ['tEval outside', () => integrate(decay, 0, [1], 1, { tEval: [0.5, 2] })],
    ['tEval unsorted', () => integrate(decay, 0, [1], 1, { tEval: [0.5, 0.2] })],
    ['maxSteps', () => integrate(decay, 0, [1], 1, { maxSteps: 0 })],
    ['method', () => integrate(decay, 0, [1], 1, { method: 'rk4' as never })],
  ])('%s', (_name, run) => {
    const r = run();
    expect(r.status).toBe('bad-input');
    expect(r.success).toBe(false);
    expect(r.message.length).toBeGreaterThan(30);
    for (const v of r.y) expect(Number.isFinite(v)).toBe(true);
  });

  it('keeps y0 in the result when y0 is valid, drops it when it is not', () => {
    expect(Array.from(integrate(decay, 0, [2], 0).y)).toEqual([2]);
    expect(integrate(decay, 0, [Infinity], 1).y.length).toBe(0);
  });

  it('does not mutate its inputs', () => {
    const y0 = Float64Array.from([1, 0]);
    const tEval = [0, 1, 2];
    integrate(oscillator, 0, y0, 2, { tEval });
    expect(Array.from(y0)).toEqual([1, 0]);
    expect(tEval).toEqual([0, 1, 2]);
  });
});

describe.each(methods)('integrate with method %s', (method) => {
  it('records non-terminal events with direction filtering', () => {
    // y = sin t: zeros at k pi; rising at even k, falling at odd k (Source: analytic solution)
    const r = integrate(oscillator, 0.1, [Math.sin(0.1), Math.cos(0.1)], 20, {
      method,
      rtol: 1e-10,
      atol: 1e-12,
      events: [
        { name: 'up', g: (_t, y) => y[0], direction: 1, terminal: false },
        { name: 'down', g: (_t, y) => y[0], direction: -1, terminal: false },
        { name: 'any', g: (_t, y) => y[0], terminal: false },
      ],
    });
    expect(r.status).toBe('success');
    const up = r.events.filter((e) => e.name === 'up').map((e) => e.t);
    const down = r.events.filter((e) => e.name === 'down').map((e) => e.t);
    const any = r.events.filter((e) => e.name === 'any').map((e) => e.t);
    expect(up).toHaveLength(3);
    expect(down).toHaveLength(3);
    expect(any).toHaveLength(6);
    up.forEach((t, i) => expect(Math.abs(t - 2 * (i + 1) * Math.PI)).toBeLessThan(1e-8));
    down.forEach((t, i) => expect(Math.abs(t - (2 * i + 1) * Math.PI)).toBeLessThan(1e-8));
    // events are reported in time order
    for (let i = 1; i < r.events.length; i++) expect(r.events[i].t).toBeGreaterThanOrEqual(r.events[i - 1].t);
  });

  it('stops at the first terminal event in the wanted direction; later tEval points are not reported', () => {
    const r = integrate(oscillator, 0.1, [Math.sin(0.1), Math.cos(0.1)], 20, {
      method,
      rtol: 1e-10,
      atol: 1e-12,
      tEval: [1, 5, 7, 15],
      events: [
        { name: 'rising', g: (_t, y) => y[0], direction: 1 },
        { name: 'passes 0.5', g: (_t, y) => y[0] - 0.5, terminal: false },
      ],
    });
    expect(r.status).toBe('event');
    // Source: analytic solution, first rising zero of sin t after 0.1 is 2 pi
    expect(Math.abs(r.t - 2 * Math.PI)).toBeLessThan(1e-8);
    expect(r.tOut).toEqual([1, 5]);
    expect(r.events.map((e) => e.name)).toEqual(['passes 0.5', 'passes 0.5', 'rising']);
    // Source: analytic solution, sin t = 0.5 at pi/6 and 5 pi/6
    expect(Math.abs(r.events[0].t - Math.PI / 6)).toBeLessThan(1e-8);
    expect(Math.abs(r.events[1].t - (5 * Math.PI) / 6)).toBeLessThan(1e-8);
  });

  it('locates an event when integrating backwards in time', () => {
    const r = integrate(decay, 0, [1], -2, {
      method,
      rtol: 1e-10,
      atol: 1e-12,
      tEval: [0, -0.5, -1],
      events: [{ name: 'double', g: (_t, y) => y[0] - 2, direction: 1 }],
    });
    expect(r.status).toBe('event');
    // Source: analytic solution y = exp(-t) = 2 at t = -ln 2
    expect(Math.abs(r.t + Math.LN2)).toBeLessThan(1e-9);
    expect(r.tOut).toEqual([0, -0.5]);
    expect(Math.abs(r.yOut[1][0] - Math.exp(0.5))).toBeLessThan(1e-8);
  });

  it('respects maxEvaluations and reports where it stopped', () => {
    const r = integrate(oscillator, 0, [0, 1], 1000, { method, rtol: 1e-10, atol: 1e-12, maxEvaluations: 500 });
    expect(r.status).toBe('max-evaluations');
    expect(r.success).toBe(false);
    expect(r.stats.rhsEvaluations).toBeLessThanOrEqual(500);
    expect(r.message).toMatch(/maxEvaluations/);
    expect(r.message).toMatch(/stopped at t = /);
    expect(r.t).toBeGreaterThan(0);
    expect(r.t).toBeLessThan(1000);
    // the returned state belongs to the returned time (Source: analytic solution y = sin t)
    expect(Math.abs(r.y[0] - Math.sin(r.t))).toBeLessThan(1e-7);
  });

  it('respects maxSteps', () => {
    const r = integrate(oscillator, 0, [0, 1], 1000, { method, rtol: 1e-10, atol: 1e-12, maxSteps: 50 });
    expect(r.status).toBe('max-steps');
    expect(r.stats.steps).toBeLessThanOrEqual(51);
    expect(r.t).toBeLessThan(1000);
  });

  it("gives 'non-finite' when f turns NaN for good", () => {
    const f: OdeRhs = (t, y, out) => {
      out[0] = t > 1 ? NaN : -y[0];
    };
    const r = integrate(f, 0, [1], 3, { method });
    expect(r.status).toBe('non-finite');
    expect(r.success).toBe(false);
    expect(r.t).toBeLessThanOrEqual(1);
    expect(r.t).toBeGreaterThan(0.5);
    expect(Number.isFinite(r.y[0])).toBe(true);
  });

  it('rejects and shrinks a step that leaves the domain of f, then succeeds', () => {
    const f: OdeRhs = (_t, y, out) => {
      out[0] = y[0] < 0 ? NaN : -Math.sqrt(y[0]) - y[0];
    };
    const r = integrate(f, 0, [1], 1, { method, initialStep: 0.9, rtol: 1e-9, atol: 1e-12 });
    expect(r.status).toBe('success');
    // Source: analytic solution of y' = -sqrt(y) - y: sqrt(y) = 2 exp(-t/2) - 1
    const exact = (2 * Math.exp(-0.5) - 1) ** 2;
    expect(Math.abs(r.y[0] - exact)).toBeLessThan(1e-7);
  });

  it("gives 'step-size-too-small' (or non-finite) at a blow-up", () => {
    // y' = y^2, y(0) = 1 blows up at t = 1 (Source: analytic solution y = 1/(1 - t))
    const r = integrate((_t, y, out) => { out[0] = y[0] * y[0]; }, 0, [1], 2, { method, maxSteps: 20000 });
    expect(['step-size-too-small', 'non-finite', 'max-steps']).toContain(r.status);
    expect(r.success).toBe(false);
    // the numerical pole sits within the accumulated error of the exact one
    expect(Math.abs(r.t - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.y[0])).toBeGreaterThan(1e6);
  });
});

describe('integrate: method details', () => {
  it('Dormand-Prince uses 6 evaluations per step (FSAL)', () => {
    const r = integrate(decay, 0, [1], 10, { method: 'nonstiff', rtol: 1e-8 });
    expect(r.stats.rejectedSteps).toBe(0);
    // 1 initial f + 1 for the starting-step heuristic + 6 per step
    expect(r.stats.rhsEvaluations).toBe(2 + 6 * r.stats.steps);
    expect(r.stats.method).toBe('nonstiff');
  });

  it('a non-finite event function never fires, and a later crossing is still found', () => {
    const r = integrate(decay, 0, [1], 5, {
      rtol: 1e-10,
      atol: 1e-12,
      events: [
        { name: 'nan', g: () => NaN },
        { name: 'half', g: (_t, y) => (y[0] > 0.8 ? Math.log(-1) : y[0] - 0.5) },
      ],
    });
    expect(r.status).toBe('event');
    expect(r.events.map((e) => e.name)).toEqual(['half']);
    // Source: analytic solution exp(-t) = 0.5 at t = ln 2
    expect(Math.abs(r.t - Math.LN2)).toBeLessThan(1e-10);
  });

  it("'auto' stays non-stiff on a non-stiff problem", () => {
    const r = integrate(oscillator, 0, [0, 1], 50, { rtol: 1e-6 });
    expect(r.stats.method).toBe('nonstiff');
    expect(r.warnings).toEqual([]);
  });

  it('odex agrees with Dormand-Prince on Lotka-Volterra (independent cross-check)', () => {
    const lv: OdeRhs = (_t, y, out) => {
      out[0] = y[0] * (1.5 - y[1]);
      out[1] = y[1] * (y[0] - 3);
    };
    const opts: OdeOptions = { rtol: 1e-11, atol: 1e-13, tEval: [1, 5, 10, 20] };
    const a = integrate(lv, 0, [1, 1], 20, { ...opts, method: 'nonstiff' });
    const b = integrate(lv, 0, [1, 1], 20, { ...opts, method: 'odex' });
    expect(a.status).toBe('success');
    expect(b.status).toBe('success');
    expect(b.stats.method).toBe('odex');
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 2; j++) expect(Math.abs(a.yOut[i][j] - b.yOut[i][j]) / Math.abs(a.yOut[i][j])).toBeLessThan(1e-8);
    }
  });

  it('an analytic Jacobian saves evaluations in the stiff method', () => {
    const k = 1e4;
    const f: OdeRhs = (t, y, out) => {
      out[0] = -k * (y[0] - Math.cos(t));
    };
    const fd = integrate(f, 0, [0], 2, { method: 'stiff', rtol: 1e-8 });
    const an = integrate(f, 0, [0], 2, { method: 'stiff', rtol: 1e-8, jac: (_t, _y, J) => { J[0] = -k; } });
    expect(fd.status).toBe('success');
    expect(an.status).toBe('success');
    expect(an.stats.rhsEvaluations).toBeLessThan(fd.stats.rhsEvaluations);
    // Source: analytic solution of y' = -k (y - cos t): y = (k^2 cos t + k sin t)/(k^2 + 1) + transient
    const exact = (k * k * Math.cos(2) + k * Math.sin(2)) / (k * k + 1);
    expect(Math.abs(an.y[0] - exact)).toBeLessThan(1e-7);
    expect(Math.abs(fd.y[0] - exact)).toBeLessThan(1e-7);
  });
});
