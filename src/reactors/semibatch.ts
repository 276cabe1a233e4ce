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

/** Solve one semibatch run (see the file header). Throws RateloomError only for bad input. */
export function solveSemibatch(
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  const inputs = checkSemibatchRun(spec, run, kinetics, theta, options);
  const nS = kinetics.speciesNames.length;
  const N0 = initialState(inputs.C0, inputs.V0, nS);
  const core = semibatchCore(kinetics, theta, run.temperature, inputs, volumeBasisFlags(kinetics, run, inputs.W));
  setTolerances(core, N0, inputs, options.atol ?? 1e-10);
  const profileX = options.profile ? profilePositions(options, inputs.tEnd) : undefined;
  const res = runOde(core, N0, inputs.tEnd, theta, options, profileX);
  const reader: StateReader = {
    nS, coordinate: 't', concentrations: (y, out) => molesToConcentrations(y, nS, out),
    pressureRatio: () => 1, pressureSensitivity: (_y, _S, _np, out) => out.fill(0),
  };
  return buildSolution(run, res, reader, kinetics.parameterNames.length);
}

/** Checked inputs of a semibatch run (SI): feed F0 (mol/s), charge C0 (mol/m3), end time (s), volumes (m3), flow (m3/s), catalyst mass (kg). */
type SemibatchInputs = ReturnType<typeof checkSemibatchRun>;

/**
 * Per reaction, 1 for a volume-basis rate (multiplied by V) and 0 for a mass-basis one (multiplied
 * by the catalyst mass); refuses mass-basis rates when the run gives no catalyst mass.
 */
function volumeBasisFlags(kinetics: CompiledKinetics, run: RunConditions, W: number | undefined): Float64Array {
  basisWeights(kinetics, 1, W, {
    volume: [['reactions'], 'unreachable', ''],
    mass: [runPath(run, 'catalystMass'), 'a mass-basis rate in a semibatch reactor needs the catalyst mass',
      'Give the run its catalystMass in kg.'],
  });
  return Float64Array.from(kinetics.basis, (b) => (b === 'volume' ? 1 : 0));
}

/** Initial state (N_j = C_j0 V0, then V0). */
function initialState(C0: Float64Array, V0: number, nS: number): Float64Array {
  const N0 = new Float64Array(nS + 1);
  for (let j = 0; j < nS; j++) N0[j] = C0[j] * V0;
  N0[nS] = V0;
  return N0;
}

/** Absolute tolerances: moles scaled by the largest amount charged or fed, volume by the largest volume. */
function setTolerances(core: OdeCore, N0: Float64Array, inputs: SemibatchInputs, atol: number): void {
  const { F0, tEnd, V0, v0 } = inputs;
  const nS = N0.length - 1;
  const scale = Math.max(sumFirst(N0, nS), sumFirst(F0, nS) * tEnd, 1e-300);
  core.atol.fill(atol * scale);
  core.atol[nS] = atol * Math.max(V0, v0 * tEnd);
}

/** C_j = N_j / V for state y = (N, V). */
function molesToConcentrations(y: Float64Array, nS: number, out: Float64Array): void {
  const inv = 1 / y[nS];
  for (let j = 0; j < nS; j++) out[j] = y[j] * inv;
}

/** The balances of one solve: right-hand side, Jacobian in (N, V) and df/dtheta, sharing preallocated buffers. */
function semibatchCore(kinetics: CompiledKinetics, theta: Float64Array, T: number, inputs: SemibatchInputs, isVol: Float64Array): OdeCore {
  const { F0, v0 } = inputs;
  const Wm = inputs.W ?? 0;
  const nS = kinetics.speciesNames.length;
  const nP = kinetics.parameterNames.length;
  const n = nS + 1;
  const rt = new RateTerms(kinetics);
  const w = new Float64Array(isVol.length);
  const C = new Float64Array(nS);
  const Rv = new Float64Array(nS);
  const dRdC = new Float64Array(nS * nS);
  const setWeights = (V: number): void => {
    for (let i = 0; i < w.length; i++) w[i] = isVol[i] === 1 ? V : Wm;
  };
  return {
    n,
    nP,
    atol: new Float64Array(n),
    rhs: (_t, y, out) => {
      molesToConcentrations(y, nS, C);
      setWeights(y[nS]);
      rt.net(C, T, theta, w, out);
      for (let j = 0; j < nS; j++) out[j] += F0[j];
      out[nS] = v0;
    },
    jac: (_t, y, out) => {
      const V = y[nS];
      molesToConcentrations(y, nS, C);
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
      molesToConcentrations(y, nS, C);
      setWeights(y[nS]);
      rt.jacP(C, T, theta, w, out);
      out.fill(0, nS * nP, n * nP);
    },
  };
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
