/**
 * Isothermal liquid semibatch reactor in time t: a batch fed continuously,
 *   dN_j/dt = F_j0 + V R_j(C)  (volume-basis),  + W R'_j(C)  (mass-basis, W = run.catalystMass),
 *   dV/dt = v0,   C_j = N_j / V,
 * with F_j0 = run.feed (mol/s), v0 = run.volumetricFlow (m3/s), V(0) = run.initialVolume (m3) and
 * N_j(0) = run.initialConcentrations_j V(0). Liquid phase only (constant density).
 * Method: semibatch mole balances with the exact Jacobian in (N, V) from CompiledKinetics.ratesJacC:
 *   d f_N/dN = (dR/dC)/V,  d f_N/dV = R_vol + (dR/dC)(-N/V^2).  RHS and Jacobian do not allocate.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { RateloomError } from '../core/errors.js';
import {
  basisWeights, checkRunInputs, checkOptions, checkPositive, checkSpeciesVector,
  profilePositions, runPath,
} from './checks.js';
import { sumFirst } from './gas.js';
import { runOde, type OdeCore } from './ode-driver.js';
import { RateTerms } from './rate-terms.js';
import { buildSolution, type StateReader } from './solution.js';
import type { ReactorModel, ReactorOptions, ReactorSolution, ReactorSpec, RunConditions } from './types.js';

export function solveSemibatch(
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  const { F0, C0, tEnd, V0, v0, W } = checkSemibatchRun(spec, run, kinetics, theta, options);
  const nS = kinetics.speciesNames.length;
  const nP = kinetics.parameterNames.length;
  const T = run.temperature;
  const isVol = basisWeights(kinetics, 1, 0, {
    volume: [['reactions'], 'unreachable', ''], mass: [['reactions'], 'unreachable', ''],
  });
  // check mass-basis rates have a catalyst mass
  basisWeights(kinetics, 1, W, {
    volume: [['reactions'], 'unreachable', ''],
    mass: [runPath(run, 'catalystMass'), 'a mass-basis rate in a semibatch reactor needs the catalyst mass',
      'Give the run its catalystMass in kg.'],
  });
  const Wm = W ?? 0;
  const n = nS + 1;
  const rt = new RateTerms(kinetics);
  const w = new Float64Array(isVol.length);
  const C = new Float64Array(nS);
  const Rv = new Float64Array(nS);
  const dRdC = new Float64Array(nS * nS);
  const setWeights = (V: number): void => {
    for (let i = 0; i < w.length; i++) w[i] = isVol[i] === 1 ? V : Wm;
  };
  const conc = (y: Float64Array, out: Float64Array): void => {
    const inv = 1 / y[nS];
    for (let j = 0; j < nS; j++) out[j] = y[j] * inv;
  };
  const N0 = new Float64Array(n);
  for (let j = 0; j < nS; j++) N0[j] = C0[j] * V0;
  N0[nS] = V0;
  const scale = Math.max(sumFirst(N0, nS), sumFirst(F0, nS) * tEnd, 1e-300);
  const atol = options.atol ?? 1e-10;
  const core: OdeCore = {
    n,
    nP,
    atol: new Float64Array(n).fill(atol * scale),
    rhs: (_t, y, out) => {
      conc(y, C);
      setWeights(y[nS]);
      rt.net(C, T, theta, w, out);
      for (let j = 0; j < nS; j++) out[j] += F0[j];
      out[nS] = v0;
    },
    jac: (_t, y, out) => {
      const V = y[nS];
      conc(y, C);
      setWeights(V);
      rt.jacC(C, T, theta, w, dRdC);
      rt.net(C, T, theta, isVol, Rv);
      out.fill(0, 0, n * n);
      const invV = 1 / V;
      for (let j = 0; j < nS; j++) {
        let dV = Rv[j];
        for (let k = 0; k < nS; k++) {
          const a = dRdC[j * nS + k];
          out[j * n + k] = a * invV;
          dV -= a * C[k] * invV;
        }
        out[j * n + nS] = dV;
      }
    },
    dtheta: (_t, y, out) => {
      conc(y, C);
      setWeights(y[nS]);
      rt.jacP(C, T, theta, w, out);
      out.fill(0, nS * nP, n * nP);
    },
  };
  core.atol[nS] = atol * Math.max(V0, v0 * tEnd);
  const profileX = options.profile ? profilePositions(options, tEnd) : undefined;
  const res = runOde(core, N0, tEnd, theta, options, profileX);
  const reader: StateReader = { nS, coordinate: 't', concentrations: conc, pressureRatio: () => 1, pressureSensitivity: (_y, _S, _np, out) => out.fill(0) };
  return buildSolution(run, res, reader, nP);
}

/** Input checks of a semibatch run; its feed, charge, time, volumes and catalyst mass (SI). */
function checkSemibatchRun(spec: ReactorSpec, run: RunConditions, kinetics: CompiledKinetics, theta: Float64Array, options: ReactorOptions) {
  checkRunInputs(run, kinetics, theta);
  if (spec.phase !== 'liquid') {
    throw new RateloomError('E_VALUE', 'the semibatch reactor is modelled for the liquid phase only', {
      path: ['reactor', 'phase'],
      fix: "Set phase to 'liquid', or model the gas-phase case as a flow reactor.",
    });
  }
  const F0 = checkSpeciesVector(run, 'feed', kinetics, false);
  const C0 = checkSpeciesVector(run, 'initialConcentrations', kinetics, false);
  const tEnd = checkPositive(run, 'size', 's', true);
  const V0 = checkPositive(run, 'initialVolume', 'm3');
  const v0 = checkPositive(run, 'volumetricFlow', 'm3/s', true);
  // A zero catalyst mass (a blank run) is accepted: mass-basis rates then contribute nothing.
  const W = run.catalystMass === undefined ? undefined : checkPositive(run, 'catalystMass', 'kg', true);
  checkOptions(options, tEnd);
  return { F0, C0, tEnd, V0, v0, W };
}

export const semibatchReactor: ReactorModel = { kind: 'semibatch', solve: solveSemibatch };
