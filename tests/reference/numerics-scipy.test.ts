/**
 * Stiff problems against SciPy: the Robertson chemical kinetics problem (Robertson 1966) and
 * Van der Pol with mu = 1000. Reference values: SciPy solve_ivp Radau at rtol 1e-12 (Robertson)
 * and 1e-10 (Van der Pol), script tests/reference/scipy/robertson.py, output robertson.json.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { integrate } from '../../src/numerics/integrate';
import type { OdeJac, OdeRhs } from '../../src/numerics/ode-types';

const ref = JSON.parse(readFileSync(new URL('./scipy/robertson.json', import.meta.url), 'utf8')) as {
  robertson: { t: number[]; y: number[][] };
  vanDerPol: { mu: number; t: number; y: number[] };
};

const robertson: OdeRhs = (_t, y, out) => {
  const a = 0.04 * y[0];
  const b = 1e4 * y[1] * y[2];
  const c = 3e7 * y[1] * y[1];
  out[0] = -a + b;
  out[1] = a - b - c;
  out[2] = c;
};
const robertsonJac: OdeJac = (_t, y, J) => {
  J[0] = -0.04;
  J[1] = 1e4 * y[2];
  J[2] = 1e4 * y[1];
  J[3] = 0.04;
  J[4] = -1e4 * y[2] - 6e7 * y[1];
  J[5] = -1e4 * y[1];
  J[6] = 0;
  J[7] = 6e7 * y[1];
  J[8] = 0;
};
const atol = Float64Array.from([1e-12, 1e-16, 1e-12]);

function expectRobertson(yOut: Float64Array[], tol: number): void {
  for (let i = 0; i < ref.robertson.t.length; i++) {
    for (let j = 0; j < 3; j++) {
      const want = ref.robertson.y[i][j];
      // Source: SciPy solve_ivp Radau rtol 1e-12, script tests/reference/scipy/robertson.py
      expect(Math.abs(yOut[i][j] - want) / Math.abs(want)).toBeLessThan(tol);
    }
  }
}

describe('Robertson problem (Robertson 1966)', () => {
  it("'auto' switches to the stiff method and matches SciPy within 5000 steps", () => {
    const r = integrate(robertson, 0, [1, 0, 0], 400, {
      method: 'auto',
      rtol: 1e-8,
      atol,
      maxSteps: 5000,
      tEval: ref.robertson.t,
      autonomous: true,
    });
    expect(r.status).toBe('success');
    expect(r.stats.method).toBe('nonstiff+stiff');
    expect(r.warnings.some((w) => w.code === 'stiffness-switch')).toBe(true);
    // the switch comes early (t ~ 0.03), so far fewer steps than the budget are needed
    expect(r.stats.steps).toBeLessThan(1000);
    expectRobertson(r.yOut, 1e-5);
    // mass conservation y1 + y2 + y3 = 1 (Source: analytic invariant of the reaction system)
    expect(Math.abs(r.y[0] + r.y[1] + r.y[2] - 1)).toBeLessThan(1e-10);
  });

  it("'stiff' with finite-difference and with analytic Jacobian", () => {
    for (const jac of [undefined, robertsonJac]) {
      const r = integrate(robertson, 0, [1, 0, 0], 400, {
        method: 'stiff',
        rtol: 1e-9,
        atol,
        maxSteps: 5000,
        tEval: ref.robertson.t,
        ...(jac ? { jac } : {}),
      });
      expect(r.status).toBe('success');
      expect(r.stats.method).toBe('stiff');
      expect(r.stats.jacobianEvaluations).toBeGreaterThan(0);
      expect(r.stats.luDecompositions).toBeGreaterThanOrEqual(r.stats.steps - r.stats.rejectedSteps);
      expectRobertson(r.yOut, 1e-6);
    }
  });

  it('the non-stiff method alone runs out of its step budget instead of hanging', () => {
    const r = integrate(robertson, 0, [1, 0, 0], 400, { method: 'nonstiff', rtol: 1e-9, atol, maxSteps: 5000 });
    expect(r.status).toBe('max-steps');
    expect(r.success).toBe(false);
    expect(r.stats.steps).toBe(5000);
    expect(r.t).toBeGreaterThan(0);
    expect(r.t).toBeLessThan(400);
    expect(r.message).toMatch(/maxSteps/);
    expect(r.warnings.some((w) => w.code === 'stiffness-detected')).toBe(true);
    for (const v of r.y) expect(Number.isFinite(v)).toBe(true);
  });
});

describe('Van der Pol, mu = 1000', () => {
  const mu = ref.vanDerPol.mu;
  const vdp: OdeRhs = (_t, y, out) => {
    out[0] = y[1];
    out[1] = mu * (1 - y[0] * y[0]) * y[1] - y[0];
  };
  it("'auto' completes and matches SciPy at t = 3000", () => {
    const r = integrate(vdp, 0, [2, 0], ref.vanDerPol.t, { method: 'auto', rtol: 1e-8, atol: 1e-10, maxSteps: 20000 });
    expect(r.status).toBe('success');
    expect(r.stats.method).toBe('nonstiff+stiff');
    // Source: SciPy solve_ivp Radau rtol 1e-10, script tests/reference/scipy/robertson.py
    expect(Math.abs(r.y[0] - ref.vanDerPol.y[0]) / Math.abs(ref.vanDerPol.y[0])).toBeLessThan(1e-5);
    expect(Math.abs(r.y[1] - ref.vanDerPol.y[1]) / Math.abs(ref.vanDerPol.y[1])).toBeLessThan(1e-4);
  });
});
