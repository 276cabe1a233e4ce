/**
 * Isothermal steady plug flow through a tube, in catalyst mass W (packed bed) or volume V
 * (plug flow, membrane): the shared mole balances of packed-bed.ts, plug-flow.ts and membrane.ts.
 *
 *   dF_j/dx = R_j - k_j (C_j - C_sweep,j)          (permeation only in a membrane reactor)
 *   dp/dx   = -alpha / (2 p) (F_T / F_T0)           (gas with pressure drop; isothermal, T = T0)
 *   gas: C_j = C_T0 (F_j / F_T) p,  liquid: C_j = F_j / v0
 *
 * Method: mole balances of an ideal plug-flow reactor with the Ergun pressure-drop relation in its
 * differential form (Ergun 1952, common design form); integrated by numerics/integrate with the
 * exact Jacobian by the chain rule df/dy = (dR/dC - diag(k)) dC/dy from CompiledKinetics.ratesJacC.
 * The right-hand side and Jacobian use buffers allocated once per solve and do not allocate.
 */
import type { CompiledKinetics } from '../kinetics/compiled';
import {
  basisWeights, bulkDensity, checkKinetics, checkOptions, checkPositive, checkPressure,
  checkSpeciesVector, checkTemperature, checkTheta, profilePositions, runPath, speciesIndex,
} from './checks';
import { resolveAlpha } from './ergun';
import { gasConcentrationJacobian, gasConcentrations, sumFirst, totalConcentration } from './gas';
import { runOde, type OdeCore } from './ode-driver';
import { RateTerms } from './rate-terms';
import { buildSolution, type StateReader } from './solution';
import type { ReactorOptions, ReactorSolution, ReactorSpec, RunConditions } from './types';
import { RateloomError } from '../core/errors';

export type TubeKind = 'packed-bed' | 'plug-flow' | 'membrane';

/** Solve one tubular reactor (see the file header). Throws RateloomError only for bad input. */
export function solveFlowTube(
  kind: TubeKind,
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  checkKinetics(kinetics);
  checkTheta(kinetics, theta);
  checkTemperature(run);
  const gas = spec.phase === 'gas';
  const P0 = checkPressure(run, gas);
  const F0 = checkSpeciesVector(run, 'feed', kinetics, true);
  const size = checkPositive(run, 'size', kind === 'packed-bed' ? 'kg' : 'm3', true);
  const v0 = gas ? 0 : checkPositive(run, 'volumetricFlow', 'm3/s');
  checkOptions(options, size);
  const nS = kinetics.speciesNames.length;
  const nP = kinetics.parameterNames.length;
  const T = run.temperature;

  let alpha = 0;
  if (spec.pressureDrop) {
    if (!gas) {
      throw new RateloomError('E_VALUE', 'a pressure drop is given for a liquid-phase reactor', {
        path: ['reactor', 'pressureDrop'],
        fix: 'Remove the pressure drop (liquid concentrations do not depend on pressure) or set phase to gas.',
      });
    }
    alpha = resolveAlpha(spec.pressureDrop, P0 as number, ['reactor', 'pressureDrop'], runPath(run, 'pressure'));
  }

  const rb = bulkDensity(spec);
  const inMass = kind === 'packed-bed';
  const weights = basisWeights(kinetics, inMass ? (rb !== undefined ? 1 / rb : undefined) : 1, inMass ? 1 : rb, {
    volume: [['reactor', 'bulkDensity'], 'a volume-basis rate in a packed bed needs the bed bulk density',
      'Give reactor.bulkDensity (kg/m3) or write the rate per kg of catalyst (basis: mass).'],
    mass: [['reactor', 'bulkDensity'], `a mass-basis rate in a ${kind} reactor sized by volume needs the bed bulk density`,
      'Give reactor.bulkDensity (kg/m3), or model the reactor as a packed bed.'],
  });

  // membrane permeation
  const perm = new Float64Array(nS);
  const sweep = new Float64Array(nS);
  if (kind === 'membrane') {
    const m = spec.membrane;
    if (!m) {
      throw new RateloomError('E_MISSING_FIELD', 'a membrane reactor needs its permeation coefficients', {
        path: ['reactor', 'membrane'],
        fix: 'Give reactor.membrane.permeation, for example { "H2": 0.5 } (1/s).',
      });
    }
    for (const [name, k] of Object.entries(m.permeation)) {
      const path = ['reactor', 'membrane', 'permeation', name];
      const j = speciesIndex(kinetics, name, path);
      if (!(Number.isFinite(k) && k >= 0)) {
        throw new RateloomError('E_VALUE', `permeation coefficient of '${name}' is ${k}; it must be >= 0`, {
          path, fix: 'Give the permeation coefficient in 1/s as a non-negative number.',
        });
      }
      perm[j] = k;
    }
    for (const [name, c] of Object.entries(m.sweep ?? {})) {
      const path = ['reactor', 'membrane', 'sweep', name];
      const j = speciesIndex(kinetics, name, path);
      if (!(Number.isFinite(c) && c >= 0)) {
        throw new RateloomError('E_VALUE', `sweep concentration of '${name}' is ${c}; it must be >= 0`, {
          path, fix: 'Give the sweep-side concentration in mol/m3 as a non-negative number.',
        });
      }
      sweep[j] = c;
    }
  }

  const cT0 = gas ? totalConcentration(P0 as number, T) : 0;
  const FT0 = sumFirst(F0, nS);
  const n = gas ? nS + 1 : nS;
  const rt = new RateTerms(kinetics);
  const C = new Float64Array(nS);
  const R = new Float64Array(nS);
  const dCdF = new Float64Array(nS * nS);
  const dCdp = new Float64Array(nS);
  const dRdC = new Float64Array(nS * nS);
  const dRdP = new Float64Array(nS * nP);
  const invV0 = gas ? 0 : 1 / v0;

  const conc = (y: Float64Array, out: Float64Array): void => {
    if (gas) gasConcentrations(y, nS, y[nS], cT0, out);
    else for (let j = 0; j < nS; j++) out[j] = y[j] * invV0;
  };

  const core: OdeCore = {
    n,
    nP,
    atol: new Float64Array(n),
    rhs: (_x, y, out) => {
      conc(y, C);
      rt.net(C, T, theta, weights, R);
      for (let j = 0; j < nS; j++) out[j] = R[j] - perm[j] * (C[j] - sweep[j]);
      if (gas) {
        const p = y[nS] > 1e-12 ? y[nS] : 1e-12;
        out[nS] = alpha === 0 ? 0 : (-alpha / (2 * p)) * (sumFirst(y, nS) / FT0);
      }
    },
    jac: (_x, y, out) => {
      conc(y, C);
      rt.jacC(C, T, theta, weights, dRdC);
      for (let j = 0; j < nS; j++) dRdC[j * nS + j] -= perm[j];
      out.fill(0, 0, n * n);
      if (gas) {
        const p = y[nS];
        gasConcentrationJacobian(y, nS, p, cT0, dCdF, dCdp);
        for (let j = 0; j < nS; j++) {
          let sp = 0;
          for (let m = 0; m < nS; m++) {
            const a = dRdC[j * nS + m];
            if (a === 0) continue;
            sp += a * dCdp[m];
            for (let k = 0; k < nS; k++) out[j * n + k] += a * dCdF[m * nS + k];
          }
          out[j * n + nS] = sp;
        }
        if (alpha !== 0) {
          const pp = p > 1e-12 ? p : 1e-12;
          const d = -alpha / (2 * pp * FT0);
          for (let k = 0; k < nS; k++) out[nS * n + k] = d;
          out[nS * n + nS] = (alpha / (2 * pp * pp)) * (sumFirst(y, nS) / FT0);
        }
      } else {
        for (let j = 0; j < nS; j++) for (let k = 0; k < nS; k++) out[j * n + k] = dRdC[j * nS + k] * invV0;
      }
    },
    dtheta: (_x, y, out) => {
      conc(y, C);
      rt.jacP(C, T, theta, weights, dRdP);
      out.set(dRdP);
      if (gas) out.fill(0, nS * nP, n * nP);
    },
  };
  const atol = options.atol ?? 1e-10;
  for (let j = 0; j < nS; j++) core.atol[j] = atol * FT0;
  if (gas) {
    core.atol[nS] = atol;
    core.pressureIndex = nS;
  }
  const y0 = new Float64Array(n);
  y0.set(F0);
  if (gas) y0[nS] = 1;
  const profileX = options.profile ? profilePositions(options, size) : undefined;
  const res = runOde(core, y0, size, theta, options, profileX, (y) => alpha * (sumFirst(y, nS) / FT0));
  const reader: StateReader = {
    nS,
    coordinate: kind === 'packed-bed' ? 'W' : 'V',
    concentrations: (y, out) => {
      if (gas) gasConcentrations(y, nS, Math.max(y[nS], 0), cT0, out);
      else for (let j = 0; j < nS; j++) out[j] = y[j] * invV0;
    },
    pressureRatio: (y) => (gas ? Math.max(y[nS], 0) : 1),
    ...(gas ? { pressureIndex: nS } : {}),
  };
  return buildSolution(run, res, reader, nP);
}
