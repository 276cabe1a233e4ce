/**
 * A study as a regression model: the bridge between the validated study (runs, observations) and
 * estimation, which knows models only through RegressionModel. Given the full parameter vector in
 * the estimation space, it solves every run's reactor once (plus one solve per profile position),
 * and fills the prediction of every observation. Its Jacobian comes from the reactors' exact
 * forward sensitivities (stirred tank: implicit differentiation), chained through the per-run
 * parameter mapping and the log transform; rate data are predicted from the rate law directly,
 * without integration.
 */
import { RateloomError } from '../core/errors.js';
import type { Parameter } from '../core/parameter.js';
import { compileKinetics, type CompiledKineticsInfo } from '../kinetics/compile.js';
import type { RateLawSpec } from '../kinetics/spec.js';
import { solveReactor } from '../reactors/index.js';
import { prepareFlowTube, solvePreparedTube, type PreparedTube } from '../reactors/flow-tube.js';
import type { ReactorOptions, ReactorSolution, RunConditions } from '../reactors/types.js';
import type { PredictionFailure, RegressionModel } from '../estimation/model.js';
import type { CandidateSet, Observation, Study, StudyRun } from '../study/types.js';
import { RunValues } from './run-values.js';
import { measuredStarts } from './tank-start.js';
import { ActivityTerms } from './activity-terms.js';
import { isLabResponse, labGradient, labValue } from './lab-predict.js';
import { GAS_CONSTANT } from '../core/constants.js';

/** Options of the study model. */
export interface StudyModelOptions {
  /** ODE relative tolerance of each reactor solve; default 1e-8. */
  rtol?: number;
  /** ODE absolute tolerance; default 1e-12 (SI state units). */
  atol?: number;
  /** Provide the exact Jacobian from sensitivities; default true (false: estimation differences). */
  exactJacobian?: boolean;
  /** ODE integrator of every reactor solve; default 'auto'. 'odex' is the fit cross-check's (no sensitivities: use with exactJacobian false). */
  odeMethod?: 'auto' | 'nonstiff' | 'stiff' | 'odex';
}

/** One solve of one run: the size (full, or a profile position) and the observations it feeds. */
interface SolveTask {
  runIndex: number;
  /** Size of this solve (kg, m3 or s); the run's own size for outlet observations. */
  size: number;
  observations: Observation[];
  /** The run as solved (the run itself, or a copy at the profile position), built once. */
  run: RunConditions;
  /** The run checked once with its constants resolved (tubular reactors), else undefined. */
  prepared?: PreparedTube;
  /** Stirred tank: solve options starting Newton at the measured outlet (tank-start.ts). */
  plainOptions?: ReactorOptions;
  sensOptions?: ReactorOptions;
}

/** The rate-law set a model is built from: the study's own, or a candidate's. */
export interface ModelVariant {
  name: string;
  reactions: Study['reactions'];
  parameters: Parameter[];
}

export function baseVariant(study: Study): ModelVariant {
  return { name: 'base', reactions: study.reactions, parameters: study.parameters };
}

export function candidateVariant(c: CandidateSet): ModelVariant {
  return { name: c.name, reactions: c.reactions, parameters: c.parameters };
}

/** Base name of a parameter: 'a@charge2' -> 'a'. */
const baseName = (name: string): string => name.split('@')[0];

export class StudyModel implements RegressionModel {
  readonly nObservations: number;
  readonly parameterNames: readonly string[];
  readonly parameters: readonly Parameter[];
  readonly kinetics: CompiledKineticsInfo;
  readonly study: Study;
  readonly variant: string;
  /** Per run: index into the full theta of each kinetics parameter. */
  private readonly runMap: Int32Array[];
  private readonly tasks: SolveTask[];
  private readonly rateObservations: Observation[];
  /** Stirred tank: Newton start of each run from its measured outlet (undefined where none). */
  readonly starts: (Float64Array | undefined)[];
  /** Feed flows and initial concentrations held by parameters; undefined when none. */
  private readonly runValues?: RunValues;
  private readonly thetaK: Float64Array;
  private readonly ext: Float64Array;
  private readonly dExt: Float64Array;
  private readonly reactorOptions: ReactorOptions;
  /** The two option objects of every solve, built once: without and with sensitivities. */
  private readonly plainOptions: ReactorOptions;
  private readonly sensOptions: ReactorOptions;
  private readonly exact: boolean;
  private readonly scratchC: Float64Array;
  private readonly scratchR: Float64Array;
  private readonly scratchJP: Float64Array;
  /** dg/dF of a lab response (nS). */
  private readonly scratchG: Float64Array;
  /** d a / d (activity parameter) of a run. */
  private readonly scratchA: Float64Array;
  private readonly activity: ActivityTerms;
  jacobian?: RegressionModel['jacobian'];
  /** Work counters since construction: reactor solves, right-hand-side and Jacobian evaluations. */
  readonly counters = { predictions: 0, jacobians: 0, solves: 0, rhsEvaluations: 0, jacobianEvaluations: 0, rateEvaluations: 0 };

  constructor(study: Study, variant: ModelVariant = baseVariant(study), options: StudyModelOptions = {}) {
    this.study = study;
    this.variant = variant.name;
    this.parameters = variant.parameters;
    this.parameterNames = variant.parameters.map((p) => p.name);
    const activityNames = new Set(study.activity?.parameters ?? []);
    const kinNames = [...new Set(this.parameterNames.filter((n) => !activityNames.has(n)).map(baseName))];
    this.kinetics = compileKinetics({
      chemistry: study.chemistry,
      rates: variant.reactions.map((r) => r.rate as RateLawSpec),
      parameterNames: kinNames,
      referenceTemperature: study.referenceTemperature,
    });
    const index = new Map(this.parameterNames.map((n, i) => [n, i]));
    this.runMap = study.runs.map((run) =>
      Int32Array.from(kinNames, (k) => {
        const member = run.group !== undefined ? index.get(`${k}@${run.group}`) : undefined;
        return member ?? index.get(k) ?? -1;
      }),
    );
    for (const [r, map] of this.runMap.entries()) {
      const missing = kinNames.filter((_, k) => map[k] < 0);
      if (missing.length) {
        throw new RateloomError('E_UNKNOWN_PARAMETER', `run '${study.runs[r].id}' has no value for parameter(s) ${missing.join(', ')} (group '${study.runs[r].group ?? ''}')`, { path: ['parameters'], fix: 'Declare the parameter, or give it scope per-run-group with a value for every group.' });
      }
    }
    this.nObservations = study.observations.length;
    this.rateObservations = study.observations.filter((o) => o.response === 'rate');
    this.tasks = buildTasks(study);
    this.runValues = RunValues.build(study.runs, this.parameterNames);
    if (this.runValues) for (const t of this.tasks) if (this.runValues.has(t.runIndex)) t.run = this.runValues.copyFor(t.run);
    const nS = study.chemistry.speciesNames.length;
    const nR = study.chemistry.reactionIds.length;
    this.thetaK = new Float64Array(kinNames.length);
    this.ext = new Float64Array(this.parameterNames.length);
    this.dExt = new Float64Array(this.parameterNames.length);
    this.scratchC = new Float64Array(nS);
    this.scratchR = new Float64Array(nR);
    this.scratchJP = new Float64Array(nR * kinNames.length);
    this.scratchG = new Float64Array(nS);
    this.activity = new ActivityTerms(study, this.parameterNames);
    this.scratchA = new Float64Array(this.activity.indices.length);
    // With an activity model every solve scales its own copy of the run's size.
    if (this.activity.active) for (const t of this.tasks) t.run = { ...t.run };
    this.reactorOptions = { rtol: options.rtol ?? 1e-8, atol: options.atol ?? 1e-12, ...(options.odeMethod ? { method: options.odeMethod } : {}) };
    // During a fit a stirred tank searches for other steady states only when Newton from the feed
    // fails; solveRun (reports, simulation) keeps the full search and its warning.
    this.plainOptions = { ...this.reactorOptions, steadyStateSearch: 'on-failure' };
    this.sensOptions = { ...this.reactorOptions, steadyStateSearch: 'on-failure', sensitivities: true };
    this.starts = measuredStarts(study);
    for (const t of this.tasks) {
      const start = this.starts[t.runIndex];
      if (!start || t.size !== study.runs[t.runIndex].size) continue;
      t.plainOptions = { ...this.plainOptions, start };
      t.sensOptions = { ...this.sensOptions, start };
    }
    // Check each tubular run once here; its solves then skip the input checks. A run that fails the
    // checks (or tolerances that do) keeps the checked path, whose error becomes a prediction failure.
    const tolOk = [this.reactorOptions.rtol, this.reactorOptions.atol].every((v) => Number.isFinite(v) && (v as number) > 0);
    const kind = study.reactor.kind;
    if (tolOk && !this.activity.active && (kind === 'packed-bed' || kind === 'plug-flow' || kind === 'membrane') && (study.reactor.phase === 'gas' || study.reactor.phase === 'liquid')) {
      for (const task of this.tasks) {
        if (this.runValues?.has(task.runIndex)) continue; // its feed changes with the parameters
        try {
          task.prepared = prepareFlowTube(kind, study.reactor, task.run, this.kinetics);
        } catch {
          task.prepared = undefined;
        }
      }
    }
    this.exact = (options.exactJacobian ?? true) && !this.runValues;
    if (this.exact) this.jacobian = (theta, pred, J, failures) => this.evaluate(theta, pred, J, failures);
  }

  predict(theta: Float64Array, out: Float64Array, failures?: PredictionFailure[]): boolean {
    return this.evaluate(theta, out, undefined, failures);
  }

  /** Solve one run at the given external (SI) parameter values, for reports and simulation. */
  solveRun(runIndex: number, external: Float64Array, options: ReactorOptions = {}): ReactorSolution {
    this.fillKinetics(runIndex, external);
    const base = this.study.runs[runIndex];
    const withValues = this.runValues ? this.runValues.run(runIndex, base, external) : base;
    const a = this.activity.value(runIndex, external);
    const run = a === 1 ? withValues : { ...withValues, size: a * withValues.size };
    const start = this.starts[runIndex];
    return solveReactor(this.study.reactor, run, this.kinetics, this.thetaK.slice(), { ...this.reactorOptions, ...(start ? { start } : {}), ...options });
  }

  /** The kinetics' parameter vector of one run from external (SI) values of all parameters (a copy). */
  kineticsTheta(runIndex: number, external: Float64Array): Float64Array {
    this.fillKinetics(runIndex, external);
    return this.thetaK.slice();
  }

  /** External (SI) values from estimation-space values. */
  toExternal(theta: Float64Array, out: Float64Array = new Float64Array(theta.length)): Float64Array {
    this.parameters.forEach((p, i) => {
      out[i] = p.transform === 'log' ? Math.exp(theta[i]) : theta[i];
    });
    return out;
  }

  private fillKinetics(runIndex: number, external: Float64Array): void {
    const map = this.runMap[runIndex];
    for (let k = 0; k < map.length; k++) this.thetaK[k] = external[map[k]];
  }

  private evaluate(theta: Float64Array, out: Float64Array, J: Float64Array | undefined, failures?: PredictionFailure[]): boolean {
    const nP = this.parameterNames.length;
    this.toExternal(theta, this.ext);
    for (let i = 0; i < nP; i++) this.dExt[i] = this.parameters[i].transform === 'log' ? this.ext[i] : 1;
    if (J) {
      J.fill(0);
      this.counters.jacobians++;
    } else this.counters.predictions++;
    let ok = true;
    for (const task of this.tasks) if (!this.evaluateTask(task, out, J, failures)) ok = false;
    for (const o of this.rateObservations) if (!this.evaluateRate(o, out, J, failures)) ok = false;
    return ok;
  }

  /** Solve one task's reactor (with its fitted run values, at the activity-scaled size) and fill its observations. */
  private evaluateTask(task: SolveTask, out: Float64Array, J: Float64Array | undefined, failures?: PredictionFailure[]): boolean {
    const run = this.study.runs[task.runIndex];
    this.fillKinetics(task.runIndex, this.ext);
    if (this.runValues) this.runValues.fill(task.runIndex, task.run, this.ext);
    if (this.activity.active) task.run.size = this.activity.value(task.runIndex, this.ext) * task.size;
    const sol = this.solveTask(task, J ? (task.sensOptions ?? this.sensOptions) : (task.plainOptions ?? this.plainOptions), failures);
    if (!sol) return false;
    let ok = true;
    for (const o of task.observations) {
      const v = outletValue(o, task.run, sol, this.study);
      if (!Number.isFinite(v)) {
        failures?.push({ run: run.id, message: `prediction of ${o.response} ${o.species ?? ''} is not finite` });
        ok = false;
      }
      out[o.index] = v;
      if (J && sol.sensitivity) this.chainOutlet(o, task.run, sol, task, J);
    }
    if (J && this.activity.active && !this.chainActivity(task, J, failures)) ok = false;
    return ok;
  }

  /** One reactor solve of a task with the current kinetics; undefined (and a failure) when it fails. */
  private solveTask(task: SolveTask, opts: ReactorOptions, failures?: PredictionFailure[]): ReactorSolution | undefined {
    const run = this.study.runs[task.runIndex];
    let sol: ReactorSolution;
    try {
      sol =
        task.prepared && allFinite(this.thetaK)
          ? solvePreparedTube(task.prepared, this.thetaK, opts)
          : solveReactor(this.study.reactor, task.run, this.kinetics, this.thetaK, opts);
    } catch (e) {
      failures?.push({ run: run.id, message: (e as Error).message });
      return undefined;
    }
    this.counters.solves++;
    this.counters.rhsEvaluations += sol.stats.rhsEvaluations;
    this.counters.jacobianEvaluations += sol.stats.jacobianEvaluations;
    if (!sol.success) {
      failures?.push({ run: run.id, message: sol.message });
      return undefined;
    }
    return sol;
  }

  /**
   * Jacobian columns of the activity parameters: d y / d phi = (d y / d size_eff) size da/dphi,
   * with d y / d size_eff by central differences (relative step 1e-5) at the scaled size.
   */
  private chainActivity(task: SolveTask, J: Float64Array, failures?: PredictionFailure[]): boolean {
    const eff = task.run.size;
    const h = 1e-5 * eff;
    const values: number[][] = [];
    for (const sz of [eff + h, eff - h]) {
      task.run.size = sz;
      const sol = this.solveTask(task, task.plainOptions ?? this.plainOptions, failures);
      if (!sol) return false;
      values.push(task.observations.map((o) => outletValue(o, task.run, sol, this.study)));
    }
    task.run.size = eff;
    const nP = this.parameterNames.length;
    const idx = this.activity.indices;
    this.activity.derivative(task.runIndex, this.ext, this.scratchA);
    task.observations.forEach((o, q) => {
      const dy = (values[0][q] - values[1][q]) / (2 * h);
      for (let k = 0; k < idx.length; k++) J[o.index * nP + idx[k]] += dy * task.size * this.scratchA[k] * this.dExt[idx[k]];
    });
    return true;
  }

  /** A measured rate at the run's measured (or inlet) composition, times the run's activity. */
  private evaluateRate(o: Observation, out: Float64Array, J: Float64Array | undefined, failures?: PredictionFailure[]): boolean {
    const run = this.runValues ? (this.runValues.run(o.runIndex, this.study.runs[o.runIndex], this.ext) as StudyRun) : this.study.runs[o.runIndex];
    const nP = this.parameterNames.length;
    this.fillKinetics(o.runIndex, this.ext);
    rateConcentrations(run, this.study, this.scratchC);
    this.kinetics.rates(this.scratchC, run.temperature, this.thetaK, this.scratchR);
    this.counters.rateEvaluations++;
    const a = this.activity.value(o.runIndex, this.ext);
    const j = o.speciesIndex ?? this.study.keyReactantIndex;
    const nS = this.study.chemistry.speciesNames.length;
    const nR = this.study.chemistry.reactionIds.length;
    let v = 0;
    for (let i = 0; i < nR; i++) v -= this.kinetics.stoich[i * nS + j] * this.scratchR[i];
    out[o.index] = a * v;
    const ok = Number.isFinite(v);
    if (!ok) failures?.push({ run: run.id, message: `rate of ${o.species ?? ''} is not finite` });
    if (!J) return ok;
    this.kinetics.ratesJacP(this.scratchC, run.temperature, this.thetaK, this.scratchJP);
    const map = this.runMap[o.runIndex];
    const nK = map.length;
    for (let k = 0; k < nK; k++) {
      let d = 0;
      for (let i = 0; i < nR; i++) d -= this.kinetics.stoich[i * nS + j] * this.scratchJP[i * nK + k];
      J[o.index * nP + map[k]] += a * d * this.dExt[map[k]];
    }
    if (this.activity.active) {
      this.activity.derivative(o.runIndex, this.ext, this.scratchA);
      const idx = this.activity.indices;
      for (let k = 0; k < idx.length; k++) J[o.index * nP + idx[k]] += v * this.scratchA[k] * this.dExt[idx[k]];
    }
    return ok;
  }

  private chainOutlet(o: Observation, run: RunConditions, sol: ReactorSolution, task: SolveTask, J: Float64Array): void {
    const nP = this.parameterNames.length;
    const map = this.runMap[task.runIndex];
    const nK = map.length;
    const sens = sol.sensitivity!;
    const j = o.speciesIndex ?? -1;
    const lab = isLabResponse(o);
    if (lab) labGradient(o, run, sol.outletAmounts, this.scratchG);
    for (let k = 0; k < nK; k++) {
      let d: number;
      switch (o.response) {
        case 'outlet-flow':
          d = sens.amounts[j * nK + k];
          break;
        case 'outlet-concentration':
          d = concentrationSensitivity(j, k, nK, run, sol, this.study, task.size);
          break;
        case 'conversion': {
          const a0 = initialAmount(j, run, this.study);
          d = -sens.amounts[j * nK + k] / a0;
          break;
        }
        case 'outlet-pressure':
          d = sens.pressureRatio[k] * (run.pressure ?? 0);
          break;
        default:
          d = lab ? dotColumn(this.scratchG, sens.amounts, k, nK) : 0;
      }
      J[o.index * nP + map[k]] += d * this.dExt[map[k]];
    }
  }
}

/** sum_s g_s d F_s / d theta_k over the species, from the flow sensitivities (nS x nK). */
function dotColumn(g: Float64Array, amounts: Float64Array, k: number, nK: number): number {
  let d = 0;
  for (let s = 0; s < g.length; s++) d += g[s] * amounts[s * nK + k];
  return d;
}

function allFinite(v: Float64Array): boolean {
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i])) return false;
  return true;
}

/** Group observations into solves: one per run for outlet values, one per distinct profile position. */
function buildTasks(study: Study): SolveTask[] {
  const tasks = new Map<string, SolveTask>();
  for (const o of study.observations) {
    if (o.response === 'rate') continue;
    const run = study.runs[o.runIndex];
    const size = o.position ?? run.size;
    const key = `${o.runIndex}|${size}`;
    let t = tasks.get(key);
    if (!t) {
      t = { runIndex: o.runIndex, size, observations: [], run: size === run.size ? run : { ...run, size } };
      tasks.set(key, t);
    }
    t.observations.push(o);
  }
  return [...tasks.values()];
}

/** Amount of species j entering (flow: mol/s) or present at the start (batch: mol). */
export function initialAmount(j: number, run: RunConditions, study: Study): number {
  const kind = study.reactor.kind;
  if (kind === 'batch') return (run.initialConcentrations?.[j] ?? 0) * batchVolume(run);
  // Semibatch: on the amount that entered, the charge plus the amount fed up to the run's time.
  if (kind === 'semibatch') return (run.initialConcentrations?.[j] ?? 0) * (run.initialVolume ?? 0) + (run.feed?.[j] ?? 0) * run.size;
  return run.feed?.[j] ?? 0;
}

function batchVolume(run: RunConditions): number {
  return run.initialVolume ?? 1;
}

/** Volume of the mixture at the end of a run (batch: constant; semibatch: V0 + v0 t), m3. */
function mixtureVolume(run: RunConditions, study: Study, size: number): number {
  if (study.reactor.kind === 'semibatch') return (run.initialVolume ?? 0) + (run.volumetricFlow ?? 0) * size;
  return batchVolume(run);
}

/** Prediction of an outlet (or end, or profile-position) observation from a reactor solution. */
export function outletValue(o: Observation, run: RunConditions, sol: ReactorSolution, study: Study): number {
  const j = o.speciesIndex ?? -1;
  switch (o.response) {
    case 'outlet-flow':
      return sol.outletAmounts[j];
    case 'outlet-concentration':
      return sol.outletConcentrations[j];
    case 'conversion': {
      const a0 = initialAmount(j, run, study);
      return (a0 - sol.outletAmounts[j]) / a0;
    }
    case 'outlet-pressure':
      return sol.pressureRatio * (run.pressure ?? NaN);
    default:
      return labValue(o, run, sol.outletAmounts);
  }
}

/** d C_j / d theta_k at the outlet from the flow (or mole) sensitivities and the state. */
function concentrationSensitivity(j: number, k: number, nK: number, run: RunConditions, sol: ReactorSolution, study: Study, size: number): number {
  const sens = sol.sensitivity!;
  const dAmount = sens.amounts[j * nK + k];
  const kind = study.reactor.kind;
  // Batch and semibatch: C_j = N_j / V, with V independent of the parameters.
  if (kind === 'batch' || kind === 'semibatch') return dAmount / mixtureVolume(run, study, size);
  // Liquid flow: C_j = F_j / v0.
  if (study.reactor.phase === 'liquid') return dAmount / (run.volumetricFlow ?? NaN);
  // Gas flow (isothermal): C_j = C_T0 (F_j / F_T) p, so
  // dC_j = C_T0 [ (dF_j F_T - F_j dF_T) / F_T^2 p + (F_j / F_T) dp ].
  const F = sol.outletAmounts;
  const CT0 = (run.pressure ?? 0) / (GAS_CONSTANT * run.temperature);
  let FT = 0;
  let dFT = 0;
  for (let s = 0; s < F.length; s++) {
    FT += F[s];
    dFT += sens.amounts[s * nK + k];
  }
  const p = sol.pressureRatio;
  return CT0 * (((dAmount * FT - F[j] * dFT) / (FT * FT)) * p + (F[j] / FT) * sens.pressureRatio[k]);
}

/** Inlet concentrations of a run (mol/m3): gas from P, T and feed fractions; liquid from F/v0. */
export function inletConcentrations(run: RunConditions, study: Study, out: Float64Array): Float64Array {
  if (run.initialConcentrations) {
    out.set(run.initialConcentrations);
    return out;
  }
  const F = run.feed;
  if (!F) return out.fill(0);
  if (study.reactor.phase === 'gas') {
    let FT = 0;
    for (let j = 0; j < F.length; j++) FT += F[j];
    const CT = (run.pressure ?? 0) / (GAS_CONSTANT * run.temperature);
    for (let j = 0; j < F.length; j++) out[j] = (CT * F[j]) / FT;
  } else {
    const v0 = run.volumetricFlow ?? 1;
    for (let j = 0; j < F.length; j++) out[j] = F[j] / v0;
  }
  return out;
}

/**
 * Concentrations (mol/m3) at which a measured rate of the run is predicted: the measured
 * composition (rateComposition columns: stirred-tank outlet, differential-bed mean) when given,
 * else the inlet (initial) composition.
 */
export function rateConcentrations(run: StudyRun, study: Study, out: Float64Array): Float64Array {
  if (run.rateConcentrations) {
    out.set(run.rateConcentrations);
    return out;
  }
  return inletConcentrations(run, study, out);
}
