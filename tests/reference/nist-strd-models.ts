/**
 * The model functions of the NIST StRD nonlinear regression sets used by the tests (as written in
 * each set's file header, tests/reference/nist-strd/*.dat) and a RegressionModel over a set's data.
 */
import type { RegressionModel } from '../../src/estimation/model';
import type { NistDataset } from './nist-strd-data';

export type NistFn = (b: Float64Array, x: number) => number;

export const NIST_MODELS: Record<string, NistFn> = {
  Misra1a: (b, x) => b[0] * (1 - Math.exp(-b[1] * x)),
  Chwirut2: (b, x) => Math.exp(-b[0] * x) / (b[1] + b[2] * x),
  DanWood: (b, x) => b[0] * x ** b[1],
  BoxBOD: (b, x) => b[0] * (1 - Math.exp(-b[1] * x)),
};

export function nistModel(d: NistDataset, f: NistFn): RegressionModel {
  return {
    nObservations: d.x.length,
    parameterNames: d.certified.map((_, i) => `b${i + 1}`),
    predict(theta, out) {
      for (let i = 0; i < d.x.length; i++) out[i] = f(theta, d.x[i]);
      return true;
    },
  };
}
