import { describe, expect, it } from 'vitest';
import { checkJacobian } from '../../src/estimation/jacobian-check';
import type { RegressionModel } from '../../src/estimation/model';

/** y_i = a exp(-b x_i); its Jacobian is known in closed form (common practice, no source). */
function model(wrong = false): RegressionModel {
  const x = [0, 0.5, 1, 2, 4];
  return {
    nObservations: x.length,
    parameterNames: ['a', 'b'],
    predict(t, out) {
      x.forEach((xi, i) => (out[i] = t[0] * Math.exp(-t[1] * xi)));
      return true;
    },
    jacobian(t, pred, J) {
      x.forEach((xi, i) => {
        const e = Math.exp(-t[1] * xi);
        pred[i] = t[0] * e;
        J[i * 2] = e;
        J[i * 2 + 1] = (wrong ? 1.01 : 1) * -t[0] * xi * e;
      });
      return true;
    },
  };
}

describe('checkJacobian', () => {
  it('finds a correct Jacobian correct and a 1% error in one column', () => {
    const theta = Float64Array.from([2, 0.7]);
    expect(checkJacobian(model(), theta).maxRelativeDifference).toBeLessThan(1e-8);
    const bad = checkJacobian(model(true), theta);
    expect(bad.ok).toBe(true);
    expect(bad.maxRelativeDifference).toBeGreaterThan(5e-3);
  });
});
