/**
 * Constant-volume isothermal batch reactor, liquid or gas, in time t:
 *   dN_j/dt = V R_j(C)  (volume-basis rates),  W R'_j(C)  (mass-basis rates, W = run.catalystMass),
 *   C_j = N_j / V,  N_j(0) = C_j0 V with C_j0 = run.initialConcentrations.
 * V = run.initialVolume (m3); default 1 m3, so the amounts are then per m3 of mixture.
 * Gas phase: the reported pressure ratio is P/P0 = N_T/N_T0 (constant V and T).
 * Method: batch mole balances; integrated by numerics/integrate with the exact Jacobian
 * df/dN = (dR/dC) / V from CompiledKinetics.ratesJacC. RHS and Jacobian do not allocate.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import {
  basisWeights, checkRunInputs, checkOptions, checkPositive, checkPressure, checkSpeciesVector,
  profilePositions, runPath,
} from './checks.js';
import { sumFirst } from './gas.js';
import { runOde, type OdeCore } from './ode-driver.js';
import { RateTerms } from './rate-terms.js';
import { buildSolution, type StateReader } from './solution.js';
import type { ReactorModel, ReactorOptions, ReactorSolution, ReactorSpec, RunConditions } from './types.js';

/** Default batch volume when run.initialVolume is absent, m3. */
export const DEFAULT_BATCH_VOLUME = 1;

export function solveBatch(
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  checkRunInputs(run, kinetics, theta);
  checkPressure(run, false);
  const C0 = checkSpeciesVector(run, 'initialConcentrations', kinetics, true);
  const tEnd = checkPositive(run, 'size', 's', true);
  const V = run.initialVolume === undefined ? DEFAULT_BATCH_VOLUME : checkPositive(run, 'initialVolume', 'm3');
  const W = run.catalystMass === undefined ? undefined : checkPositive(run, 'catalystMass', 'kg', true);
  checkOptions(options, tEnd);
  const nS = kinetics.speciesNames.length;
  const nP = kinetics.parameterNames.length;
  const T = run.temperature;
  const weights = basisWeights(kinetics, V, W, {
    volume: [['reactions'], 'unreachable', ''],
    mass: [runPath(run, 'catalystMass'), 'a mass-basis rate in a batch reactor needs the catalyst mass',
      'Give the run its catalystMass in kg.'],
  });
  const invV = 1 / V;
  const rt = new RateTerms(kinetics);
  const C = new Float64Array(nS);
  const dRdC = new Float64Array(nS * nS);
  const N0 = new Float64Array(nS);
  for (let j = 0; j < nS; j++) N0[j] = C0[j] * V;
  const NT0 = sumFirst(N0, nS);
  const conc = (y: Float64Array, out: Float64Array): void => {
    for (let j = 0; j < nS; j++) out[j] = y[j] * invV;
  };
  const core: OdeCore = {
    n: nS,
    nP,
    atol: new Float64Array(nS).fill((options.atol ?? 1e-10) * NT0),
    rhs: (_t, y, out) => {
      conc(y, C);
      rt.net(C, T, theta, weights, out);
    },
    jac: (_t, y, out) => {
      conc(y, C);
      rt.jacC(C, T, theta, weights, dRdC);
      for (let i = 0; i < nS * nS; i++) out[i] = dRdC[i] * invV;
    },
    dtheta: (_t, y, out) => {
      conc(y, C);
      rt.jacP(C, T, theta, weights, out);
    },
  };
  const profileX = options.profile ? profilePositions(options, tEnd) : undefined;
  const res = runOde(core, N0, tEnd, theta, options, profileX);
  const gas = spec.phase === 'gas';
  const reader: StateReader = {
    nS,
    coordinate: 't',
    concentrations: conc,
    pressureRatio: (y) => (gas ? sumFirst(y, nS) / NT0 : 1),
    pressureSensitivity: (_y, S, np, out) => {
      out.fill(0);
      if (!gas) return;
      for (let j = 0; j < nS; j++) for (let k = 0; k < np; k++) out[k] += S[j * np + k] / NT0;
    },
  };
  return buildSolution(run, res, reader, nP);
}

export const batchReactor: ReactorModel = { kind: 'batch', solve: solveBatch };
