/**
 * Fit a study (or one of its candidate rate-law sets): build the study model, the fit data, run
 * the estimator, and assemble the fitted-kinetics hand-off for design.
 */
import { tankBranchWarnings, tankSteadyStates, type TankRunStates } from './tank-branches.js';
import { PREDICTION_ROUND_OFF_NOTE, roundOffPredictions } from './round-off-predictions.js';
import { fitModelSteps } from '../estimation/fit.js';
import { prepareFit } from '../estimation/solve.js';
import { runStepsHere, type JobSteps } from '../core/jobs.js';
import { multistartSteps, type Minimum, type StartRun } from '../estimation/multistart.js';
import type { FitOptions, FitResult } from '../estimation/fit-types.js';
import { HANDOFF_FORMAT, HANDOFF_VERSION, type FittedKinetics } from '../design/handoff.js';
import { handoffHash } from '../design/handoff-hash.js';
import { RateloomError, closestName } from '../core/errors.js';
import type { Study } from '../study/types.js';
import { studyCoverage } from './coverage.js';
import { nameObservations } from './observation-names.js';
import { derivedQuantities, type DerivedQuantity } from './derived.js';
import { driftCheck } from './drift.js';
import { studyFitData, type StudyFitData } from './fit-data.js';
import { StudyModel, baseVariant, candidateVariant, type ModelVariant, type StudyModelOptions } from './study-model.js';
import { estimateStartValues, type StartValueOptions, type StartValues } from './start-values.js';
import { VERSION } from '../version.js';
import { fittedLabTransport, type LabTransport } from './lab-transport.js';
import { checkArgs, is } from '../core/args.js';

export interface StudyFitOptions extends FitOptions {
  /** Candidate rate-law set to fit ('base' = the study's own rate laws); default 'base'. */
  variant?: string;
  /** Reactor solve tolerances and Jacobian choice. */
  model?: StudyModelOptions;
  /**
   * Latin-hypercube starts in addition to the given start (0 = a single fit); default 0, or 20
   * when the study left any start of this rate-law set to rateloom (see start-values.ts).
   */
  starts?: number;
  /** Rules of the start-value estimate (conversion limits of the differential method). */
  startValues?: StartValueOptions;
  /** Seed of the multistart design; default 1. */
  seed?: number;
  /** Progress of a multistart, (done, total). */
  progress?: (done: number, total: number) => void;
}

export interface StudyFit {
  variant: string;
  fit: FitResult;
  model: StudyModel;
  data: StudyFitData;
  /** Distinct minima found by the multistart, lowest SSR first (absent for a single fit). */
  minima?: Minimum[];
  /** Every start of the multistart with its end point, SSR and status (absent for a single fit). */
  starts?: StartRun[];
  /** Pre-exponential factors (Arrhenius) and van 't Hoff factors with their intervals. */
  derived: DerivedQuantity[];
  /** The starting values rateloom estimated, and how (absent when the study gave every value). */
  startValues?: StartValues;
  /** Transport diagnostics of the lab runs with the fitted rates (study with a lab pellet only). */
  transport?: LabTransport;
  /** Stirred tanks: every run's steady states at the fitted values and the one the fit used. */
  steadyStates?: TankRunStates[];
  /** The round-off rule, stated when some negative predictions were shown as 0. */
  roundOff?: string;
}

/** Names of the parameters of a rate-law set whose start the study left open. */
export function openStarts(study: Study, variant: string): string[] {
  if (variant === 'base') return study.autoStart ?? [];
  return study.candidates.find((c) => c.name === variant)?.autoStart ?? [];
}

/** The rate-law sets of a study: 'base' first, then its candidates. */
export function studyVariants(study: Study): ModelVariant[] {
  checkArgs('studyVariants', [study], [{ name: 'study', check: is.study }]);
  return [baseVariant(study), ...study.candidates.map(candidateVariant)];
}

export function findVariant(study: Study, name: string): ModelVariant {
  const all = studyVariants(study);
  const v = all.find((x) => x.name === name);
  if (!v) {
    const near = closestName(name, all.map((x) => x.name));
    throw new RateloomError('E_VALUE', `no rate-law set named '${name}'`, {
      path: ['candidates'],
      fix: `Use one of: ${all.map((x) => x.name).join(', ')}${near ? ` (did you mean '${near}'?)` : ''}.`,
    });
  }
  return v;
}

/**
 * The fit with the drift warning of repeated reference conditions added (src/workflow/drift.ts),
 * and a warning when lab responses of a run carry the same measurement twice (fit-data.ts).
 */
function withStudyWarnings(fit: FitResult, study: Study, data: StudyFitData): FitResult {
  const w = driftCheck(study)?.warning;
  const runs = data.dependentRuns;
  const twice = runs.length
    ? { code: 'lab-responses-dependent', message: `the fitted lab responses of ${runs.length} run(s) (${runs.slice(0, 5).join(', ')}${runs.length > 5 ? ', ...' : ''}) are computed from the same fractions twice (for example a ratio and the conversion derived from it): their errors were taken as independent, so the intervals are too narrow; list one of them in labData.fit`, path: ['labData', 'fit'] }
    : undefined;
  const add = [w, twice].filter((x): x is NonNullable<typeof x> => x !== undefined);
  return add.length ? { ...fit, warnings: [...fit.warnings, ...add] } : fit;
}

/** What fitStudy fits: the rate-law set (with any estimated starts), its model and data, the starts. */
export interface StudyFitPlan {
  variant: ModelVariant;
  model: StudyModel;
  data: StudyFitData;
  startValues?: StartValues;
  /** Latin-hypercube starts of the multistart (0 = a single fit). */
  starts: number;
}

/** Resolve the rate-law set, estimate open starting values and build the model and fit data. */
export function planStudyFit(study: Study, options: StudyFitOptions = {}): StudyFitPlan {
  const given = findVariant(study, options.variant ?? 'base');
  const open = openStarts(study, given.name).filter((n) => given.parameters.some((p) => p.name === n && !p.fixed));
  const startValues = open.length ? estimateStartValues(study, given, open, options.startValues) : undefined;
  const variant: ModelVariant = startValues ? { ...given, parameters: startValues.parameters } : given;
  const model = new StudyModel(study, variant, options.model);
  const data = studyFitData(study);
  const starts = options.starts ?? (startValues ? 20 : 0);
  return { variant, model, data, starts, ...(startValues ? { startValues } : {}) };
}

/** The StudyFit of a plan from its finished fit (observations named by run, derived quantities). */
export function finishStudyFit(study: Study, plan: StudyFitPlan, fit: FitResult, minima?: Minimum[], starts?: StartRun[]): StudyFit {
  const steadyStates = tankSteadyStates(study, plan.model, Float64Array.from(fit.parameters, (p) => p.value));
  const branches = tankBranchWarnings(study, steadyStates);
  const shown = roundOffPredictions(fit, study);
  const named = withStudyWarnings(nameObservations(branches.length ? { ...shown.fit, warnings: [...shown.fit.warnings, ...branches] } : shown.fit, study), study, plan.data);
  const derived = derivedQuantities(named, plan.variant.reactions.map((r) => r.rate), study.referenceTemperature);
  const transport = fittedLabTransport(study, plan.model, named);
  return {
    ...(transport ? { transport } : {}),
    variant: plan.variant.name,
    fit: transport ? { ...named, warnings: [...named.warnings, ...transport.warnings] } : named,
    model: plan.model,
    data: plan.data,
    ...(minima ? { minima } : {}),
    ...(starts ? { starts } : {}),
    derived,
    ...(plan.startValues ? { startValues: plan.startValues } : {}),
    ...(steadyStates.length ? { steadyStates } : {}),
    ...(shown.clamped ? { roundOff: PREDICTION_ROUND_OFF_NOTE } : {}),
  };
}

/** Fit one rate-law set of a study. Bad input throws; convergence trouble is the fit's status. */
export function fitStudy(study: Study, options: StudyFitOptions = {}): StudyFit {
  return fitPlannedStudy(study, planStudyFit(study, options), options);
}

/** fitStudy for a plan made by planStudyFit(study, options) (same options). */
export function fitPlannedStudy(study: Study, plan: StudyFitPlan, options: StudyFitOptions = {}): StudyFit {
  return runStepsHere(studyFitSteps(study, plan, options));
}

/**
 * The fit of a plan as steps (src/core/jobs.ts): multistart starts and profiles are batches of
 * jobs that any runner may run (fitStudyParallel hands them to worker threads).
 */
export function* studyFitSteps(study: Study, plan: StudyFitPlan, options: StudyFitOptions = {}): JobSteps<StudyFit> {
  const { model, variant, data, starts } = plan;
  if (starts > 0) {
    const msOptions = { ...options, starts, seed: options.seed ?? 1 };
    const ms = yield* multistartSteps(prepareFit(model, variant.parameters, data, msOptions), msOptions);
    return finishStudyFit(study, plan, ms.best, ms.minima, ms.runs);
  }
  return finishStudyFit(study, plan, yield* fitModelSteps(prepareFit(model, variant.parameters, data, options)));
}

/**
 * Per-run-group parameters ('a@c1', 'a@c2': one value per catalyst charge, say) describe the lab
 * runs, not the plant. The hand-off carries one value under the base name: the mean over the
 * groups, held fixed (it takes no part in the covariance). Global parameters pass unchanged.
 */
function collapseGroups(params: FitResult['parameters']): FitResult['parameters'] {
  const out: FitResult['parameters'] = [];
  const groups = new Map<string, FitResult['parameters']>();
  for (const p of params) {
    const at = p.name.indexOf('@');
    if (at < 0) out.push(p);
    else groups.set(p.name.slice(0, at), [...(groups.get(p.name.slice(0, at)) ?? []), p]);
  }
  for (const [base, members] of groups) {
    const value = members.reduce((s, m) => s + m.value, 0) / members.length;
    out.push({ ...members[0], name: base, value, internalValue: members[0].transform === 'log' ? Math.log(value) : value, fixed: true, stdError: null, internalStdError: null, ci: { ...members[0].ci, linear: null } });
  }
  return out;
}

/** The fitted-kinetics hand-off file of a study fit (plain JSON, SI). */
export function buildHandoff(study: Study, sf: StudyFit): FittedKinetics {
  checkArgs('buildHandoff', [study, sf], [{ name: 'study', check: is.study }, { name: 'sf', check: is.studyFit }]);
  const variant = findVariant(study, sf.variant);
  const activity = new Set(study.activity?.parameters ?? []);
  const { fit } = sf;
  const doc: Omit<FittedKinetics, 'contentHash'> = {
    format: HANDOFF_FORMAT,
    formatVersion: HANDOFF_VERSION,
    tool: { name: 'rateloom', version: VERSION },
    study: study.title ?? study.studyPath,
    model: sf.variant,
    species: study.species,
    reactions: variant.reactions,
    referenceTemperature: study.referenceTemperature,
    parameters: collapseGroups(fit.parameters.filter((p) => !activity.has(p.name))).map((p) => ({
      name: p.name,
      unit: p.unit,
      value: p.value,
      stdError: p.stdError,
      fixed: p.fixed,
      transform: p.transform,
      internalValue: p.internalValue,
      ...(p.ci.linear || p.ci.profile
        ? {
            ci: {
              level: p.ci.level,
              ...(p.ci.linear ? { linear: p.ci.linear } : {}),
              ...(p.ci.profile && p.ci.profile[0] !== null && p.ci.profile[1] !== null ? { profile: p.ci.profile as [number, number] } : {}),
            },
          }
        : {}),
    })),
    covariance: withoutActivity(fit, activity),
    statistics: {
      n: fit.statistics.n,
      p: fit.statistics.p,
      dof: fit.statistics.dof,
      residualStdDev: fit.statistics.residualStdDev ?? NaN,
      covarianceBasis: fit.statistics.covarianceBasis,
    },
    fitStatus: fit.status,
    verdict: { trustworthy: fit.verdict.trustworthy, status: fit.verdict.status, message: fit.verdict.message, reasons: fit.verdict.reasons.map((r) => ({ code: r.code, message: r.message })) },
    covarianceStatus: fit.covariance.internal ? 'positive-definite' : fit.verdict.status === 'singular' ? 'singular' : 'unavailable',
    labReactor: study.reactor,
    coverage: studyCoverage(study),
    ...(study.activity ? { catalyst: freshCatalyst(study) } : {}),
  };
  return { ...doc, contentHash: handoffHash(doc) };
}

/**
 * The covariance of the kinetic parameters alone: the rows and columns of the activity parameters
 * are dropped (the marginal covariance of the others, exact for a normal approximation).
 */
function withoutActivity(fit: FitResult, activity: ReadonlySet<string>): FittedKinetics['covariance'] {
  const names = fit.covariance.names;
  const matrix = fit.covariance.internal ?? names.map(() => names.map(() => 0));
  const keep = names.map((n, i) => (activity.has(n) ? -1 : i)).filter((i) => i >= 0);
  return { space: 'internal', names: keep.map((i) => names[i]), matrix: keep.map((i) => keep.map((j) => matrix[i][j])) };
}

/** The hand-off note on a study fitted with an activity model: the kinetics are the fresh catalyst's. */
function freshCatalyst(study: Study): NonNullable<FittedKinetics['catalyst']> {
  const model = study.activity?.model ?? 'none';
  return {
    activityModel: model,
    note: `Rate constants of the fresh catalyst (activity 1): the lab campaign was fitted with the ${model} activity model, whose parameters (${study.activity?.parameters.join(', ')}) are not part of this hand-off. A size from these kinetics does not allow for deactivation.`,
  };
}
