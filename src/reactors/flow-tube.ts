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
 * The right-hand side (generated per kinetics, tube-rhs.ts), the Jacobian and the sensitivity
 * right-hand side use buffers allocated once per compiled kinetics (TubeWork, cached) and do not
 * allocate. A run is checked and its constants
 * (alpha, basis weights, permeation) resolved once by prepareFlowTube; solvePreparedTube then solves
 * it for any theta without re-validating (the study model prepares its runs at construction).
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import {
  basisWeights, bulkDensity, checkRunInputs, checkOptions, checkPositive, checkPressure,
  checkSpeciesVector, profilePositions, runPath, speciesIndex,
} from './checks.js';
import { resolveAlpha } from './ergun.js';
import { gasConcentrationJacobian, gasConcentrations, sumFirst, totalConcentration } from './gas.js';
import { runOde, type OdeCore } from './ode-driver.js';
import { buildSolution, type StateReader } from './solution.js';
import { makeTubeRhs, type TubeRhsState } from './tube-rhs.js';
import { speciesFromReactions } from './rate-terms.js';
import type { ReactorOptions, ReactorSolution, ReactorSpec, RunConditions } from './types.js';
import { RateloomError } from '../core/errors.js';

export type TubeKind = 'packed-bed' | 'plug-flow' | 'membrane';

/** A checked run with its constants resolved; solve it with solvePreparedTube. */
export interface PreparedTube {
  readonly kind: TubeKind;
  readonly run: RunConditions;
  readonly kinetics: CompiledKinetics;
  readonly gas: boolean;
  readonly size: number;
  readonly T: number;
  readonly cT0: number;
  readonly FT0: number;
  readonly invV0: number;
  readonly alpha: number;
  readonly weights: Float64Array;
  readonly perm: Float64Array;
  readonly sweep: Float64Array;
  readonly F0: Float64Array;
}

/** Why a rate basis is refused, per tube kind (built once: basisWeights reads it only to throw). */
const refusals = (kind: TubeKind): Parameters<typeof basisWeights>[3] => ({
  volume: [['reactor', 'bulkDensity'], 'a volume-basis rate in a packed bed needs the bed bulk density',
    'Give reactor.bulkDensity (kg/m3) or write the rate per kg of catalyst (basis: mass).'],
  mass: [['reactor', 'bulkDensity'], `a mass-basis rate in a ${kind} reactor sized by volume needs the bed bulk density`,
    'Give reactor.bulkDensity (kg/m3), or model the reactor as a packed bed.'],
});
const REFUSALS: Readonly<Record<TubeKind, Parameters<typeof basisWeights>[3]>> = {
  'packed-bed': refusals('packed-bed'),
  'plug-flow': refusals('plug-flow'),
  membrane: refusals('membrane'),
};

/** Solve one tubular reactor (see the file header). Throws RateloomError only for bad input. */
export function solveFlowTube(
  kind: TubeKind,
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  checkRunInputs(run, kinetics, theta);
  const prep = prepareChecked(kind, spec, run, kinetics);
  checkOptions(options, prep.size);
  return solvePreparedTube(prep, theta, options);
}

/** Check a run and resolve its constants (throws RateloomError for bad input). */
export function prepareFlowTube(kind: TubeKind, spec: ReactorSpec, run: RunConditions, kinetics: CompiledKinetics): PreparedTube {
  checkRunInputs(run, kinetics);
  return prepareChecked(kind, spec, run, kinetics);
}

/** prepareFlowTube after checkRunInputs. */
function prepareChecked(kind: TubeKind, spec: ReactorSpec, run: RunConditions, kinetics: CompiledKinetics): PreparedTube {
  const gas = spec.phase === 'gas';
  const P0 = checkPressure(run, gas);
  const F0 = checkSpeciesVector(run, 'feed', kinetics, true);
  const size = checkPositive(run, 'size', kind === 'packed-bed' ? 'kg' : 'm3', true);
  const v0 = gas ? 0 : checkPositive(run, 'volumetricFlow', 'm3/s');
  const nS = kinetics.speciesNames.length;
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
  const weights = basisWeights(kinetics, inMass ? (rb !== undefined ? 1 / rb : undefined) : 1, inMass ? 1 : rb, REFUSALS[kind]);

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
        throw new RateloomError('E_VALUE', `permeation coefficient of '${name}' is ${k} 1/s; it must be >= 0`, {
          path, fix: 'Give the permeation coefficient in 1/s as a non-negative number.',
        });
      }
      perm[j] = k;
    }
    for (const [name, c] of Object.entries(m.sweep ?? {})) {
      const path = ['reactor', 'membrane', 'sweep', name];
      const j = speciesIndex(kinetics, name, path);
      if (!(Number.isFinite(c) && c >= 0)) {
        throw new RateloomError('E_VALUE', `sweep concentration of '${name}' is ${c} mol/m3; it must be >= 0`, {
          path, fix: 'Give the sweep-side concentration in mol/m3 as a non-negative number.',
        });
      }
      sweep[j] = c;
    }
  }

  return {
    kind, run, kinetics, gas, size, T, alpha, weights, perm, sweep,
    F0: Float64Array.from(F0),
    cT0: gas ? totalConcentration(P0 as number, T) : 0,
    FT0: sumFirst(F0, nS),
    invV0: gas ? 0 : 1 / v0,
  };
}

/**
 * Buffers and closures of the tube balances for one compiled kinetics and variant (gas or liquid,
 * with or without permeation): created once and reused by every solve (solves are synchronous, so
 * one workspace per variant suffices). The closures, the state reader and the pressure slope are
 * made here, never per solve; a solve only sets the run (`p` and the numeric fields, which the
 * generated right-hand side of tube-rhs.ts and the Jacobian helpers below read) and `theta`.
 */
class TubeWork implements TubeRhsState {
  p!: PreparedTube;
  theta: Float64Array = new Float64Array(0);
  cT0 = 0;
  FT0 = 1;
  alpha = 0;
  T = 1;
  invV0 = 0;
  weights: Float64Array = new Float64Array(0);
  perm: Float64Array = new Float64Array(0);
  sweep: Float64Array = new Float64Array(0);
  readonly kinetics: CompiledKinetics;
  readonly gas: boolean;
  readonly membrane: boolean;
  /** Species, parameters, reactions, state size (nS + 1 for gas: the pressure ratio p). */
  readonly nS: number;
  readonly nP: number;
  readonly nR: number;
  readonly n: number;
  /** Concentrations at the current state (nS). */
  readonly C: Float64Array;
  /** Reaction-level derivatives dr_i/dC (nR x nS) and dr_i/dtheta (nR x nP). */
  readonly jc: Float64Array;
  readonly jp: Float64Array;
  /** Gas concentration derivatives dC/dF (nS x nS) and dC/dp (nS). */
  readonly dCdF: Float64Array;
  readonly dCdp: Float64Array;
  /** Species-level dR/dC minus permeation (nS x nS). */
  readonly dRdC: Float64Array;
  /** dC/dtheta along the solution (nS x nP). */
  readonly dC: Float64Array;
  /** Weighted reaction sensitivities w_i dr_i/dtheta (nR x nP). */
  readonly g: Float64Array;
  readonly core: OdeCore;
  /** Inlet state of the current solve. */
  readonly y0: Float64Array;
  readonly reader: TubeReader;
  /** -d(p^2)/dx at state y (for the extrapolated exhaustion point). */
  readonly slope: (y: Float64Array) => number;
  constructor(kinetics: CompiledKinetics, gas: boolean, membrane: boolean) {
    const nS = kinetics.speciesNames.length;
    const nP = kinetics.parameterNames.length;
    const nR = kinetics.reactionIds.length;
    const n = gas ? nS + 1 : nS;
    this.kinetics = kinetics;
    this.gas = gas;
    this.membrane = membrane;
    this.nS = nS;
    this.nP = nP;
    this.nR = nR;
    this.n = n;
    this.C = new Float64Array(nS);
    this.jc = new Float64Array(nR * nS);
    this.jp = new Float64Array(nR * nP);
    this.dCdF = new Float64Array(nS * nS);
    this.dCdp = new Float64Array(nS);
    this.dRdC = new Float64Array(nS * nS);
    this.dC = new Float64Array(nS * nP);
    this.g = new Float64Array(nR * nP);
    this.core = {
      n,
      nP,
      atol: new Float64Array(n),
      // the hot path: generated per kinetics (tube-rhs.ts), reading the run from this object
      rhs: makeTubeRhs(kinetics, gas, membrane, this, this.C, new Float64Array(nR)),
      jac: (_x, y, out) => tubeJacobian(this, y, out),
      dtheta: (_x, y, out) => tubeParameterJacobian(this, y, out),
      sensRhs: (_x, y, out) => tubeSensitivityRhs(this, y, out),
    };
    if (gas) this.core.pressureIndex = nS;
    this.y0 = new Float64Array(n);
    this.reader = new TubeReader(nS, gas, this);
    this.slope = (y) => this.alpha * (sumFirst(y, nS) / this.FT0);
  }

  /** Point the workspace at a prepared run and parameter vector (no allocation). */
  bind(prep: PreparedTube, theta: Float64Array, atol: number): void {
    this.p = prep;
    this.theta = theta;
    this.cT0 = prep.cT0;
    this.FT0 = prep.FT0;
    this.alpha = prep.alpha;
    this.T = prep.T;
    this.invV0 = prep.invV0;
    this.weights = prep.weights;
    this.perm = prep.perm;
    this.sweep = prep.sweep;
    this.reader.coordinate = prep.kind === 'packed-bed' ? 'W' : 'V';
    const nS = prep.F0.length;
    const a = this.core.atol;
    for (let j = 0; j < nS; j++) a[j] = atol * prep.FT0;
    if (prep.gas) a[nS] = atol;
  }
}

/*
 * The Jacobian and sensitivity steps below run on every Jacobian or sensitivity evaluation of a
 * solve: plain functions of the bound workspace, writing only into its buffers and `out`.
 */

/** Concentrations at state y into out: gas C_j = C_T0 (F_j / F_T) p (unclamped p, as in the right-hand side), liquid F_j / v0. */
function tubeConcentrations(w: TubeWork, y: Float64Array, out: Float64Array): void {
  const nS = w.nS;
  if (w.gas) gasConcentrations(y, nS, y[nS], w.cT0, out);
  else {
    const invV0 = w.invV0;
    for (let j = 0; j < nS; j++) out[j] = y[j] * invV0;
  }
}

/** df/dy (n x n) at state y by the chain rule (dR/dC - diag(k)) dC/dy, with the pressure row for gas. */
function tubeJacobian(w: TubeWork, y: Float64Array, out: Float64Array): void {
  const { nS, n, dRdC, perm } = w;
  tubeConcentrations(w, y, w.C);
  w.kinetics.ratesJacC(w.C, w.T, w.theta, w.jc);
  speciesFromReactions(w.kinetics.stoich, w.weights, w.jc, w.nR, nS, nS, dRdC);
  for (let j = 0; j < nS; j++) dRdC[j * nS + j] -= perm[j];
  for (let q = 0; q < n * n; q++) out[q] = 0;
  if (w.gas) gasJacobianRows(w, y, out);
  else {
    const invV0 = w.invV0;
    for (let j = 0; j < nS; j++) for (let k = 0; k < nS; k++) out[j * n + k] = dRdC[j * nS + k] * invV0;
  }
}

/** Gas rows of df/dy into a zeroed out: species rows through dC/dF and dC/dp, then the pressure row. */
function gasJacobianRows(w: TubeWork, y: Float64Array, out: Float64Array): void {
  const { nS, n, dRdC, dCdF, dCdp, alpha, FT0 } = w;
  const p = y[nS];
  gasConcentrationJacobian(y, nS, p, w.cT0, dCdF, dCdp);
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
}

/** df/dtheta (n x nP) at state y: the species-level dR/dtheta; zero pressure row (gas). */
function tubeParameterJacobian(w: TubeWork, y: Float64Array, out: Float64Array): void {
  const { nS, nP, n } = w;
  tubeConcentrations(w, y, w.C);
  w.kinetics.ratesJacP(w.C, w.T, w.theta, w.jp);
  speciesFromReactions(w.kinetics.stoich, w.weights, w.jp, w.nR, nS, nP, out);
  if (w.gas) for (let q = nS * nP; q < n * nP; q++) out[q] = 0;
}

/**
 * dS/dx = (df/dy) S + df/dtheta without forming df/dy (S = y[n..], row-major n x nP): dC/dtheta
 * first, then the weighted reaction sensitivities, then their stoichiometric sum into out[n..].
 */
function tubeSensitivityRhs(w: TubeWork, y: Float64Array, out: Float64Array): void {
  tubeConcentrations(w, y, w.C);
  w.kinetics.ratesJacC(w.C, w.T, w.theta, w.jc);
  w.kinetics.ratesJacP(w.C, w.T, w.theta, w.jp);
  if (w.gas) gasConcentrationSensitivities(w, y, out);
  else liquidConcentrationSensitivities(w, y);
  weightedRateSensitivities(w);
  speciesRateSensitivities(w, out);
}

/** dC/dtheta (w.dC) from the flow and pressure sensitivities, and the pressure rows of out. */
function gasConcentrationSensitivities(w: TubeWork, y: Float64Array, out: Float64Array): void {
  const { nS, nP, n, dC, cT0, alpha, FT0 } = w;
  let FT = 0;
  for (let j = 0; j < nS; j++) FT += y[j];
  const p = y[nS];
  for (let k = 0; k < nP; k++) {
    if (FT > 0) {
      let dFT = 0;
      for (let m = 0; m < nS; m++) dFT += y[n + m * nP + k];
      const a = (cT0 * p) / FT;
      const Sp = y[n + nS * nP + k];
      for (let j = 0; j < nS; j++) {
        dC[j * nP + k] = a * (y[n + j * nP + k] - (y[j] / FT) * dFT) + ((cT0 * y[j]) / FT) * Sp;
      }
      if (alpha !== 0) {
        const pp = p > 1e-12 ? p : 1e-12;
        out[n + nS * nP + k] = (-alpha / (2 * pp * FT0)) * dFT + (alpha / (2 * pp * pp)) * (FT / FT0) * Sp;
      } else out[n + nS * nP + k] = 0;
    } else {
      for (let j = 0; j < nS; j++) dC[j * nP + k] = 0;
      out[n + nS * nP + k] = 0;
    }
  }
}

/** dC/dtheta (w.dC) = S / v0 for a liquid. */
function liquidConcentrationSensitivities(w: TubeWork, y: Float64Array): void {
  const { nS, nP, n, dC, invV0 } = w;
  for (let k = 0; k < nP; k++) {
    for (let j = 0; j < nS; j++) dC[j * nP + k] = y[n + j * nP + k] * invV0;
  }
}

/** d r_i/d theta_k along the solution, weighted: g = diag(w) (jc dC + jp) (nR x nP). */
function weightedRateSensitivities(w: TubeWork): void {
  const { nS, nP, nR, jc, jp, dC, g, weights } = w;
  for (let i = 0; i < nR; i++) {
    const wi = weights[i];
    for (let k = 0; k < nP; k++) {
      let v = jp[i * nP + k];
      for (let m = 0; m < nS; m++) {
        const c = jc[i * nS + m];
        if (c !== 0) v += c * dC[m * nP + k];
      }
      g[i * nP + k] = wi * v;
    }
  }
}

/** Species rows of the sensitivity right-hand side: dR_j/dtheta_k = sum_i nu_ij g_ik (minus permeation). */
function speciesRateSensitivities(w: TubeWork, out: Float64Array): void {
  const { nS, nP, nR, n, g, dC } = w;
  const nu = w.kinetics.stoich;
  for (let q = 0; q < nS * nP; q++) out[n + q] = 0;
  for (let i = 0; i < nR; i++) {
    for (let j = 0; j < nS; j++) {
      const c = nu[i * nS + j];
      if (c === 0) continue;
      for (let k = 0; k < nP; k++) out[n + j * nP + k] += c * g[i * nP + k];
    }
  }
  if (w.membrane) {
    const perm = w.perm;
    for (let j = 0; j < nS; j++) for (let k = 0; k < nP; k++) out[n + j * nP + k] -= perm[j] * dC[j * nP + k];
  }
}

/** How the tube state reads as concentrations and p/p0 (one per workspace; reads the bound run). */
class TubeReader implements StateReader {
  coordinate: 'W' | 'V' = 'W';
  readonly pressureIndex?: number;
  constructor(
    readonly nS: number,
    private readonly gas: boolean,
    private readonly run: TubeRhsState,
  ) {
    if (gas) this.pressureIndex = nS;
  }
  concentrations(y: Float64Array, out: Float64Array): void {
    const nS = this.nS;
    if (this.gas) gasConcentrations(y, nS, Math.max(y[nS], 0), this.run.cT0, out);
    else for (let j = 0; j < nS; j++) out[j] = y[j] * this.run.invV0;
  }
  pressureRatio(y: Float64Array): number {
    return this.gas ? Math.max(y[this.nS], 0) : 1;
  }
}

/** Workspaces of one kinetics, by variant: index (gas ? 1 : 0) + (membrane ? 2 : 0). */
const workspaces = new WeakMap<CompiledKinetics, (TubeWork | undefined)[]>();

function workspace(kinetics: CompiledKinetics, gas: boolean, membrane: boolean): TubeWork {
  let w = workspaces.get(kinetics);
  if (!w) workspaces.set(kinetics, (w = [undefined, undefined, undefined, undefined]));
  const key = (gas ? 1 : 0) + (membrane ? 2 : 0);
  return (w[key] ??= new TubeWork(kinetics, gas, membrane));
}

/**
 * Solve a prepared run at theta (physical values, kinetics.parameterNames order). The caller
 * guarantees a finite theta of the right length and valid options (solveFlowTube checks them).
 */
export function solvePreparedTube(prep: PreparedTube, theta: Float64Array, options: ReactorOptions = {}): ReactorSolution {
  const { kinetics, gas, size } = prep;
  const nS = kinetics.speciesNames.length;
  const work = workspace(kinetics, gas, prep.kind === 'membrane');
  work.bind(prep, theta, options.atol ?? 1e-10);
  const core = work.core;
  const y0 = work.y0; // read only by the integrator (copied into its own buffer)
  y0.set(prep.F0);
  if (gas) y0[nS] = 1;
  const profileX = options.profile ? profilePositions(options, size) : undefined;
  const res = runOde(core, y0, size, theta, options, profileX, work.slope);
  return buildSolution(prep.run, res, work.reader, kinetics.parameterNames.length);
}
