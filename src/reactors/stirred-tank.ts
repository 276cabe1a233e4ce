/**
 * Isothermal continuous stirred-tank reactor at steady state, liquid or gas:
 *   G_j(F) = F_j0 - F_j + sum_i nu_ij w_i r_i(C(F)) = 0,
 * w_i = V (run.size, m3) for volume-basis rates and W (run.catalystMass, kg; or run.size when every
 * rate is mass-basis) for mass-basis rates; liquid C_j = F_j / v0, gas C_j = C_T0 F_j / F_T (outlet
 * at the inlet pressure, p = 1).
 *
 * Method: damped Newton (numerics/newton.ts, Dennis & Schnabel 1983) with the exact Jacobian
 * dG/dF = -I + (dR/dC)(dC/dF) from CompiledKinetics.ratesJacC, flows kept non-negative; then a residual check, and a search for further steady states: a scan of
 * the scalar residual along the extent of reaction when there is one reaction, Newton from starting
 * points spread between feed and full conversion otherwise. Sensitivities by implicit
 * differentiation, (dG/dF) dF/dtheta = -dG/dtheta, with the LU at the solution.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { luFactor, luSolve } from '../numerics/lu.js';
import { newton } from '../numerics/newton.js';
import {
  basisWeights, checkRunInputs, checkPositive, checkPressure, checkSpeciesVector, runPath,
} from './checks.js';
import { RateloomError } from '../core/errors.js';
import { gasConcentrationJacobian, gasConcentrations, sumFirst, totalConcentration } from './gas.js';
import { RateTerms } from './rate-terms.js';
import { STATUS_SUCCESS } from './status.js';
import type { Warning } from '../core/outcome.js';
import { tankStability, nearestState, type SteadyState } from './steady-states.js';
import type { ReactorModel, ReactorOptions, ReactorSolution, ReactorSpec, RunConditions } from './types.js';

/** Residual tolerance of the steady state, relative to the total feed flow. */
export const CSTR_RESIDUAL_TOL = 1e-10;
const MAX_ITER = 100;

/** The steady-state balances of one tank with preallocated buffers. */
class TankSystem {
  readonly nS: number;
  readonly nP: number;
  private readonly rt: RateTerms;
  private readonly C: Float64Array;
  private readonly R: Float64Array;
  private readonly dRdC: Float64Array;
  private readonly dCdF: Float64Array;
  private readonly dCdp: Float64Array;
  // Newton work
  readonly J: Float64Array;
  readonly piv: Int32Array;
  evaluations = 0;
  jacobians = 0;
  iterations = 0;

  constructor(
    readonly kinetics: CompiledKinetics,
    readonly theta: Float64Array,
    readonly T: number,
    readonly F0: Float64Array,
    readonly w: Float64Array,
    readonly gas: boolean,
    readonly cT0: number,
    readonly v0: number,
  ) {
    const nS = (this.nS = kinetics.speciesNames.length);
    this.nP = kinetics.parameterNames.length;
    this.rt = new RateTerms(kinetics);
    this.C = new Float64Array(nS);
    this.R = new Float64Array(nS);
    this.dRdC = new Float64Array(nS * nS);
    this.dCdF = new Float64Array(nS * nS);
    this.dCdp = new Float64Array(nS);
    this.J = new Float64Array(nS * nS);
    this.piv = new Int32Array(nS);
  }

  conc(F: Float64Array, out: Float64Array): void {
    if (this.gas) gasConcentrations(F, this.nS, 1, this.cT0, out);
    else for (let j = 0; j < this.nS; j++) out[j] = F[j] / this.v0;
  }

  /** G(F) into out; returns max |G_j|. */
  residual(F: Float64Array, out: Float64Array): number {
    this.evaluations++;
    this.conc(F, this.C);
    this.rt.net(this.C, this.T, this.theta, this.w, this.R);
    let m = 0;
    for (let j = 0; j < this.nS; j++) {
      out[j] = this.F0[j] - F[j] + this.R[j];
      const a = Math.abs(out[j]);
      if (!(a <= m)) m = a; // NaN propagates as non-comparable
    }
    return m;
  }

  /** dG/dF into this.J (not factored). */
  jacobian(F: Float64Array): void {
    this.jacobians++;
    const { nS, J, dRdC, dCdF } = this;
    this.conc(F, this.C);
    this.rt.jacC(this.C, this.T, this.theta, this.w, dRdC);
    if (this.gas) gasConcentrationJacobian(F, nS, 1, this.cT0, dCdF, this.dCdp);
    J.fill(0);
    for (let j = 0; j < nS; j++) {
      for (let m = 0; m < nS; m++) {
        const a = dRdC[j * nS + m];
        if (a === 0) continue;
        if (this.gas) for (let k = 0; k < nS; k++) J[j * nS + k] += a * dCdF[m * nS + k];
        else J[j * nS + m] += a / this.v0;
      }
      J[j * nS + j] -= 1;
    }
  }

  /** dG/dtheta (nS x nP) into out. */
  dtheta(F: Float64Array, out: Float64Array): void {
    this.conc(F, this.C);
    this.rt.jacP(this.C, this.T, this.theta, this.w, out);
  }

  /**
   * Damped Newton (numerics/newton.ts) from x, kept at non-negative flows; x is updated in place.
   * Returns the final max-norm residual (Infinity when Newton failed without a finite point).
   */
  newton(x: Float64Array, tol: number): number {
    const res = newton(
      (F, out) => {
        this.residual(F, out);
      },
      x,
      {
        jac: (F, out) => {
          this.jacobian(F);
          out.set(this.J);
        },
        ftol: tol,
        lower: 0,
        maxIterations: MAX_ITER,
      },
    );
    this.iterations += res.iterations;
    if (!res.x.every(Number.isFinite)) return Infinity;
    x.set(res.x);
    if (res.success) return res.residualNorm;
    return Number.isFinite(res.residualNorm) ? Math.max(res.residualNorm, 2 * tol) : Infinity;
  }
}

export function solveStirredTank(
  spec: ReactorSpec,
  run: RunConditions,
  kinetics: CompiledKinetics,
  theta: Float64Array,
  options: ReactorOptions = {},
): ReactorSolution {
  checkRunInputs(run, kinetics, theta);
  const gas = spec.phase === 'gas';
  const P0 = checkPressure(run, gas);
  const F0 = checkSpeciesVector(run, 'feed', kinetics, true);
  const size = checkPositive(run, 'size', 'm3 (or kg)', true);
  const v0 = gas ? 0 : checkPositive(run, 'volumetricFlow', 'm3/s');
  if (spec.pressureDrop) {
    throw new RateloomError('E_VALUE', 'a pressure drop is given for a stirred tank', {
      path: ['reactor', 'pressureDrop'], fix: 'Remove the pressure drop; a stirred tank has a uniform pressure.',
    });
  }
  const allMass = kinetics.basis.every((b) => b === 'mass');
  const W = run.catalystMass !== undefined ? checkPositive(run, 'catalystMass', 'kg', true) : allMass ? size : undefined;
  const w = basisWeights(kinetics, size, W, {
    volume: [runPath(run, 'size'), 'unreachable', ''],
    mass: [runPath(run, 'catalystMass'), 'a mass-basis rate in a stirred tank needs the catalyst mass',
      'Give the run its catalystMass in kg.'],
  });
  const nS = kinetics.speciesNames.length;
  const nP = kinetics.parameterNames.length;
  const FT0 = sumFirst(F0, nS);
  const cT0 = gas ? totalConcentration(P0 as number, run.temperature) : 0;
  const sys = new TankSystem(kinetics, theta, run.temperature, F0, w, gas, cT0, v0);
  const tol = CSTR_RESIDUAL_TOL * FT0;
  const warnings: Warning[] = [];

  const start = options.start && options.start.length === nS && options.start.every((x) => Number.isFinite(x) && x >= 0) ? options.start : undefined;
  const { F, g, found, search } = solveSteadyStates(sys, kinetics, F0, start, tol, options, warnings, run);
  if (found.length > 1) {
    const key = keySpecies(kinetics, F0);
    const list = found.map((s) => `${kinetics.speciesNames[key]} = ${s[key].toPrecision(6)} mol/s`).join('; ');
    warnings.push({
      code: 'multiple-steady-states',
      message: `the tank has ${found.length} steady states (${list}); the one reached from ${start ? 'the given start (the measured outlet)' : 'the feed composition'} is reported, and start-up decides which one the plant reaches`,
      path: runPath(run),
    });
  }
  const ok = g <= tol;
  const status = ok ? 'success' : 'newton-failed';
  const C = new Float64Array(nS);
  const outF = ok ? Float64Array.from(F) : Float64Array.from(F0);
  sys.conc(outF, C);
  const sol: ReactorSolution = {
    runId: run.id,
    status,
    success: STATUS_SUCCESS[status],
    message: ok
      ? 'steady state solved'
      : `the steady-state balances were not solved (residual ${Number.isFinite(g) ? (g / FT0).toExponential(2) : 'non-finite'} of the feed flow); the feed is reported in place of the outlet`,
    warnings,
    outletAmounts: outF,
    outletConcentrations: C,
    pressureRatio: 1,
    stats: { rhsEvaluations: sys.evaluations, jacobianEvaluations: sys.jacobians, steps: sys.iterations, method: 'newton' },
    steadyStateStart: start ? 'given' : 'feed',
  };
  if (search && found.length) sol.steadyStates = describeStates(sys, found, ok ? outF : undefined);
  if (ok && options.sensitivities && nP > 0) tankSensitivities(sys, outF, sol, warnings, run);
  return sol;
}

/** Newton from the start (or the feed), then the search for further steady states. */
function solveSteadyStates(sys: TankSystem, kinetics: CompiledKinetics, F0: Float64Array, start: Float64Array | undefined, tol: number, options: ReactorOptions, warnings: Warning[], run: RunConditions) {
  const nS = sys.nS;
  const F = Float64Array.from(start ?? F0);
  let g = sys.newton(F, tol);
  const found: Float64Array[] = [];
  if (g <= tol) found.push(Float64Array.from(F));
  // other steady states (and a second chance when Newton from the feed failed)
  const search = options.steadyStateSearch !== 'on-failure' || !(g <= tol);
  const others = search ? searchSteadyStates(sys, kinetics, F0, tol) : [];
  for (const s of others) addDistinct(found, s, sumFirst(F0, nS));
  if (!(g <= tol) && found.length > 0) {
    F.set(found[0]);
    g = sys.residual(F, new Float64Array(nS));
    warnings.push({ code: 'newton-restarted', message: `Newton from the ${start ? 'given start' : 'feed composition'} failed; the steady state was found from another start`, path: runPath(run) });
  }
  return { F, g, found, search };
}

/** d F / d theta by implicit differentiation, (dG/dF) dF/dtheta = -dG/dtheta, with the LU at the solution. */
function tankSensitivities(sys: TankSystem, outF: Float64Array, sol: ReactorSolution, warnings: Warning[], run: RunConditions): void {
  const { nS, nP } = sys;
  sys.jacobian(outF);
  const J = sys.J;
  if (luFactor(J, nS, sys.piv) !== 0) {
    warnings.push({ code: 'singular-jacobian', message: 'the Jacobian at the steady state is singular; no sensitivities', path: runPath(run) });
    return;
  }
  const dG = new Float64Array(nS * nP);
  sys.dtheta(outF, dG);
  const col = new Float64Array(nS);
  const amounts = new Float64Array(nS * nP);
  for (let k = 0; k < nP; k++) {
    for (let j = 0; j < nS; j++) col[j] = -dG[j * nP + k];
    luSolve(J, nS, sys.piv, col);
    for (let j = 0; j < nS; j++) amounts[j * nP + k] = col[j];
  }
  sol.sensitivity = { amounts, pressureRatio: new Float64Array(nP) };
}

/** Every steady state found, with its concentrations, stability and which one is reported. */
function describeStates(sys: TankSystem, found: Float64Array[], reported: Float64Array | undefined): SteadyState[] {
  const nS = sys.nS;
  const at = reported ? nearestState(found, reported) : -1;
  return found.map((F, i) => {
    const C = new Float64Array(nS);
    sys.conc(F, C);
    sys.jacobian(F);
    const stability: SteadyState['stability'] = tankStability(sys.J, nS);
    return { outletAmounts: Float64Array.from(F), outletConcentrations: C, stability, reported: i === at };
  });
}

/** The species with the largest feed among the reactants of reaction 0 (the key reactant). */
function keySpecies(kinetics: CompiledKinetics, F0: Float64Array): number {
  const nS = kinetics.speciesNames.length;
  let best = 0;
  let bestScore = -Infinity;
  for (let j = 0; j < nS; j++) {
    let consumed = false;
    for (let i = 0; i < kinetics.reactionIds.length; i++) if (kinetics.stoich[i * nS + j] < 0) consumed = true;
    const score = (consumed ? 1e300 : 0) + F0[j];
    if (consumed && score > bestScore) {
      bestScore = score;
      best = j;
    }
  }
  return best;
}

function addDistinct(list: Float64Array[], s: Float64Array, FT0: number): void {
  for (const t of list) {
    let d = 0;
    for (let j = 0; j < s.length; j++) d = Math.max(d, Math.abs(s[j] - t[j]));
    if (d <= 1e-6 * FT0) return;
  }
  list.push(Float64Array.from(s));
}

/** Largest forward extent (mol/s) of reaction i before a reactant runs out, and largest reverse extent. */
function extentRange(kinetics: CompiledKinetics, F0: Float64Array, i: number): [number, number] {
  const nS = kinetics.speciesNames.length;
  let hi = Infinity;
  let lo = -Infinity;
  for (let j = 0; j < nS; j++) {
    const nu = kinetics.stoich[i * nS + j];
    if (nu < 0) hi = Math.min(hi, F0[j] / -nu);
    if (nu > 0) lo = Math.max(lo, -F0[j] / nu);
  }
  return [Number.isFinite(lo) ? lo : 0, Number.isFinite(hi) ? hi : 0];
}

/** Steady states other than (or besides) the one from the feed. */
function searchSteadyStates(sys: TankSystem, kinetics: CompiledKinetics, F0: Float64Array, tol: number): Float64Array[] {
  const nS = sys.nS;
  const nR = kinetics.reactionIds.length;
  const out: Float64Array[] = [];
  const FT0 = sumFirst(F0, nS);
  const F = new Float64Array(nS);
  if (nR === 1) {
    // scalar residual along the extent: h(xi) = w r(C(F0 + nu xi)) - xi; G = nu h
    const [lo, hi] = extentRange(kinetics, F0, 0);
    const G = new Float64Array(nS);
    const nu = kinetics.stoich;
    let j0 = 0;
    for (let j = 0; j < nS; j++) if (Math.abs(nu[j]) > Math.abs(nu[j0])) j0 = j;
    const h = (xi: number): number => {
      for (let j = 0; j < nS; j++) F[j] = Math.max(F0[j] + nu[j] * xi, 0);
      sys.residual(F, G);
      return G[j0] / nu[j0];
    };
    const M = 400;
    let xa = lo;
    let ha = h(xa);
    for (let m = 1; m <= M; m++) {
      const xb = lo + ((hi - lo) * m) / M;
      const hb = h(xb);
      if (ha === 0) out.push(stateAt(F0, nu, xa, nS));
      else if (Number.isFinite(ha) && Number.isFinite(hb) && ha * hb < 0) {
        // bisection to the root (the scalar residual is continuous between the scan points)
        let a = xa;
        let b = xb;
        let fa = ha;
        for (let k = 0; k < 200 && b - a > 1e-15 * Math.max(1, Math.abs(a), Math.abs(b)) * FT0; k++) {
          const c = 0.5 * (a + b);
          const fc = h(c);
          if (fc === 0) { a = b = c; break; }
          if (fa * fc < 0) b = c;
          else { a = c; fa = fc; }
        }
        const s = stateAt(F0, nu, 0.5 * (a + b), nS);
        sys.newton(s, tol); // polish on the full system
        if (sys.residual(s, G) <= tol) out.push(s);
      }
      xa = xb;
      ha = hb;
    }
    if (ha === 0) out.push(stateAt(F0, nu, xa, nS));
    return out;
  }
  for (let i = 0; i < nR; i++) {
    const [, hi] = extentRange(kinetics, F0, i);
    for (const s of [0.25, 0.5, 0.75, 0.95, 0.999]) {
      for (let j = 0; j < nS; j++) F[j] = Math.max(F0[j] + kinetics.stoich[i * nS + j] * s * hi, 0);
      const g = sys.newton(F, tol);
      if (g <= tol) out.push(Float64Array.from(F));
    }
  }
  return out;
}

function stateAt(F0: Float64Array, nu: Float64Array, xi: number, nS: number): Float64Array {
  const s = new Float64Array(nS);
  for (let j = 0; j < nS; j++) s[j] = Math.max(F0[j] + nu[j] * xi, 0);
  return s;
}

export const stirredTank: ReactorModel = { kind: 'stirred-tank', solve: solveStirredTank };
