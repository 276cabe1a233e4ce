/**
 * fitModel against scipy.optimize.least_squares on an integrated second-order batch rate law with
 * Arrhenius temperature dependence (invented data, seeded; see the script's header).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import type { RegressionModel } from '../../src/estimation/model';

const here = path.dirname(fileURLToPath(import.meta.url));
// Source: SciPy least_squares, script tests/reference/scipy/integrated_kinetics.py
const ref = JSON.parse(readFileSync(path.join(here, 'scipy', 'integrated_kinetics.json'), 'utf8'));
const { T, C0, t, measured, sigma } = ref.data as Record<string, number[]>;
const R: number = ref.R;
const Tref: number = ref.T_ref;

/** theta = (ln k_ref, E); C = C0 / (1 + 2 k C0 t). */
function batchModel(withJacobian: boolean): RegressionModel {
  const n = t.length;
  const model: RegressionModel = {
    nObservations: n,
    parameterNames: ['k_ref', 'E'],
    predict(theta, out) {
      for (let i = 0; i < n; i++) {
        const k = Math.exp(theta[0] - (theta[1] / R) * (1 / T[i] - 1 / Tref));
        out[i] = C0[i] / (1 + 2 * k * C0[i] * t[i]);
      }
      return true;
    },
  };
  if (withJacobian) {
    model.jacobian = (theta, pred, J) => {
      for (let i = 0; i < n; i++) {
        const a = 1 / T[i] - 1 / Tref;
        const k = Math.exp(theta[0] - (theta[1] / R) * a);
        const den = 1 + 2 * k * C0[i] * t[i];
        pred[i] = C0[i] / den;
        const dCdk = (-2 * C0[i] * C0[i] * t[i]) / (den * den);
        J[i * 2] = dCdk * k;
        J[i * 2 + 1] = dCdk * (-k * a / R);
      }
      return true;
    };
  }
  return model;
}

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('integrated second-order kinetics vs SciPy least_squares', () => {
  for (const exact of [true, false]) {
    it(`matches estimates and standard errors to 1e-5 (${exact ? 'exact' : 'finite-difference'} Jacobian)`, () => {
      const params = [
        makeParameter({ name: 'k_ref', value: Math.exp(ref.start.ln_k_ref), unit: 'm3/(mol s)', transform: 'log' }),
        makeParameter({ name: 'E', value: ref.start.E, unit: 'J/mol' }),
      ];
      const fit = fitModel(
        batchModel(exact),
        params,
        { measured: Float64Array.from(measured), sigma: Float64Array.from(sigma), sigmaKnown: false },
        { profile: false },
      );
      expect(fit.success, fit.message).toBe(true);
      expect(fit.statistics.covarianceBasis).toBe('s2-scaled');
      const [k, E] = fit.parameters;
      // Source: SciPy least_squares, script tests/reference/scipy/integrated_kinetics.py
      expect(rel(k.internalValue, ref.theta.ln_k_ref)).toBeLessThan(1e-5);
      expect(rel(E.value, ref.theta.E)).toBeLessThan(1e-5);
      expect(rel(k.value, ref.k_ref)).toBeLessThan(1e-5);
      // Source: SciPy least_squares, s^2 (J'J)^-1 in the same script.
      expect(rel(k.internalStdError!, ref.stdError.ln_k_ref)).toBeLessThan(1e-5);
      expect(rel(E.stdError!, ref.stdError.E)).toBeLessThan(1e-5);
      expect(rel(k.stdError!, ref.k_ref_stdError_delta)).toBeLessThan(1e-5);
      expect(rel(fit.statistics.ssr, ref.ssr)).toBeLessThan(1e-8);
      expect(rel(fit.correlation.matrix![0][1], ref.correlation)).toBeLessThan(1e-5);
      expect(fit.statistics.exactJacobian).toBe(exact);
      // The log-parameter interval is built in ln space: asymmetric about k, and its ends are
      // exp(ln k +- t se). Source: common practice, no source.
      expect(k.ci.basis).toBe('transformed');
      const [lo, hi] = k.ci.linear!;
      expect(Math.log(hi) + Math.log(lo)).toBeCloseTo(2 * k.internalValue, 10);
    });
  }
});
