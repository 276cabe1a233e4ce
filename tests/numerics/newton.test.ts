import { describe, expect, it } from 'vitest';
import { newton } from '../../src/numerics/newton';

describe('damped Newton', () => {
  // x^2 + y^2 = 4, x = y  ->  x = y = sqrt(2) (Source: analytic solution)
  const circle = (x: Float64Array, out: Float64Array) => {
    out[0] = x[0] * x[0] + x[1] * x[1] - 4;
    out[1] = x[0] - x[1];
  };
  it('finds the analytic root with a finite-difference Jacobian', () => {
    const r = newton(circle, [1, 0.5]);
    expect(r.status).toBe('converged');
    expect(r.success).toBe(true);
    // Source: analytic solution x = y = sqrt(2)
    expect(r.x[0]).toBeCloseTo(Math.SQRT2, 12);
    expect(r.x[1]).toBeCloseTo(Math.SQRT2, 12);
    expect(r.residualNorm).toBeLessThanOrEqual(1e-10);
    expect(r.iterations).toBeGreaterThan(2);
    // each iteration: n = 2 FD columns + at least one line-search trial
    expect(r.evaluations).toBeGreaterThanOrEqual(1 + 3 * r.iterations);
    expect(r.jacobianEvaluations).toBe(r.iterations);
  });

  it('uses an analytic Jacobian when given', () => {
    const r = newton(circle, [3, -1], {
      jac: (x, J) => {
        J[0] = 2 * x[0];
        J[1] = 2 * x[1];
        J[2] = 1;
        J[3] = -1;
      },
    });
    expect(r.status).toBe('converged');
    // Source: analytic solution x = y = sqrt(2)
    expect(Math.abs(r.x[0] - Math.SQRT2)).toBeLessThan(1e-12);
    expect(r.jacobianEvaluations).toBe(r.iterations);
    // no finite-difference columns: one F per line-search trial plus the start
    expect(r.evaluations).toBeGreaterThanOrEqual(r.iterations + 1);
    expect(r.evaluations).toBeLessThan(3 * r.iterations + 1);
  });

  it('reports a singular Jacobian as a status', () => {
    const r = newton((x, out) => {
      out[0] = x[0] + x[1] - 1;
      out[1] = 2 * x[0] + 2 * x[1] - 3;
    }, [0, 0]);
    expect(r.status).toBe('singular-jacobian');
    expect(r.success).toBe(false);
    for (const v of r.x) expect(Number.isFinite(v)).toBe(true);
  });

  it('damps a Newton step that would diverge (atan)', () => {
    // plain Newton on atan(x - 0.1) diverges from x0 = 2; the line search rescues it
    const r = newton((x, out) => {
      out[0] = Math.atan(x[0] - 0.1);
    }, [2]);
    expect(r.status).toBe('converged');
    expect(r.x[0]).toBeCloseTo(0.1, 10);
  });

  it('respects lower bounds by step truncation', () => {
    const seen: number[] = [];
    const r = newton(
      (x, out) => {
        seen.push(x[0], x[1]);
        out[0] = Math.atan(x[0] - 0.1);
        out[1] = x[1] * x[1] - 1e-6; // root 1e-3 (and -1e-3, excluded by the bound)
      },
      [2, 1],
      { lower: 0 },
    );
    expect(r.status).toBe('converged');
    expect(r.x[0]).toBeCloseTo(0.1, 10);
    // |F| <= 1e-10 with F' = 2e-3 at the root bounds the error by 5e-8
    expect(Math.abs(r.x[1] - 1e-3)).toBeLessThan(5e-8);
    expect(Math.min(...seen)).toBeGreaterThanOrEqual(0);
  });

  it('raises a start point below its bound, with a warning', () => {
    const r = newton((x, out) => {
      out[0] = x[0] - 2;
    }, [-1], { lower: 0 });
    expect(r.status).toBe('converged');
    expect(r.warnings.map((w) => w.code)).toEqual(['x0-clamped']);
  });

  it('fails honestly without a root', () => {
    const r = newton((x, out) => {
      out[0] = x[0] * x[0] + 1;
    }, [1]);
    expect(r.success).toBe(false);
    expect(['singular-jacobian', 'line-search-failed', 'max-iterations']).toContain(r.status);
  });

  it('stops at maxIterations', () => {
    const r = newton(circle, [10, -7], { maxIterations: 2 });
    expect(r.status).toBe('max-iterations');
    expect(r.iterations).toBe(2);
  });

  it('reports a non-finite start and bad input', () => {
    expect(newton((_x, out) => { out[0] = NaN; }, [1]).status).toBe('non-finite');
    expect(newton(circle, [NaN, 1]).status).toBe('bad-input');
    expect(newton(circle, [1, 1], { lower: [0] }).status).toBe('bad-input');
  });
});
