/**
 * fitModel: weighted nonlinear least squares of a RegressionModel, with linearised statistics,
 * t-based (or normal, when sigma is known) intervals, profile-likelihood intervals, residual and
 * influence diagnostics, lack of fit and identifiability warnings.
 *
 * Method: trust-region Levenberg-Marquardt (lm.ts, More 1978) in the estimation space; statistics
 * as in statistics.ts (Bates & Watts 1988). Linear intervals are built in the estimation space,
 * theta_hat +- q se(theta_hat), and mapped back, so a log-transformed parameter gets the asymmetric
 * interval [v exp(-q se), v exp(+q se)] (ci.basis = 'transformed'); its stdError is the delta-method
 * value v se(ln v). q is Student's t(1 - (1-level)/2, n - p) when sigma is estimated and the
 * standard normal quantile when sigma is known.
 */
import { outcome, type Warning } from '../core/outcome.js';
import { externalDerivative, toExternal, type Parameter } from '../core/parameter.js';
import { chiSquareCdf, normalQuantile, studentTQuantile } from './distributions.js';
import type { FitData, FitOptions, FitResult, FittedParameter, ObservationDiagnostics, ParameterProfile } from './fit-types.js';
import { findInfluential } from './influence.js';
import type { LmResult } from './lm.js';
import type { RegressionModel } from './model.js';
import { profileParameter, profileTangent } from './profile.js';
import { makeProblem, prepareFit, solveFree, type PreparedFit } from './solve.js';
import { analyseJacobian, informationCriteria, lackOfFit, nullDirection, observationStats, type JacobianAnalysis } from './statistics.js';
import type { FitStatus } from './status.js';
import { FIT_STATUS } from './status.js';
import { applyVerdict, type VerdictRules } from './verdict.js';
import { batchOf, runStepsHere, type JobSteps } from '../core/jobs.js';

export type { FitData, FitOptions, FitResult } from './fit-types.js';

/**
 * Fit `model` to `data`, starting from `parameters` (matched by name to model.parameterNames; fixed
 * ones held). Throws RateloomError only for bad input; convergence trouble is the result's status.
 */
export function fitModel(
  model: RegressionModel,
  parameters: readonly Parameter[],
  data: FitData,
  options: FitOptions = {},
): FitResult {
  return runStepsHere(fitModelSteps(prepareFit(model, parameters, data, options)));
}

/** fitModel as steps (src/core/jobs.ts): the solve here, then the profiles as a batch of jobs. */
export function* fitModelSteps(prep: PreparedFit): JobSteps<FitResult> {
  const { result } = solveFree(prep, prep.thetaFull);
  return yield* fitSteps(prep, result);
}

const fmt = (v: number): string => (Math.abs(v) >= 1e-3 && Math.abs(v) < 1e5 ? v.toPrecision(4) : v.toExponential(3));

/** The model at the estimate: residuals, predictions, Jacobian, and whether every run evaluated. */
interface AtEstimate {
  thetaHat: Float64Array;
  r: Float64Array;
  pred: Float64Array;
  J: Float64Array;
  evaluated: boolean;
  exactJacobian: boolean;
  failureDetail?: string;
  failureWarning?: Warning;
}

function evaluateAtEstimate(prep: PreparedFit, lm: LmResult): AtEstimate {
  const m = prep.model.nObservations;
  const free = prep.freeIndex;
  const thetaHat = Float64Array.from(prep.thetaFull);
  free.forEach((j, k) => (thetaHat[j] = lm.x[k]));
  const problem = makeProblem(prep, thetaHat, free);
  const x = Float64Array.from(lm.x);
  const r = new Float64Array(m);
  const pred = new Float64Array(m);
  const J = new Float64Array(m * free.length);
  const evaluated = problem.predict(x, pred) && problem.residuals(x, r) && problem.jacobian(x, r, J);
  const out: AtEstimate = { thetaHat, r, pred, J, evaluated, exactJacobian: problem.usesExactJacobian };
  if (evaluated) return out;
  const fl = problem.failures;
  const runs = [...new Set(fl.map((f) => f.run))];
  pred.fill(0);
  r.fill(0);
  return {
    ...out,
    failureDetail: fl.length
      ? fl.slice(0, 3).map((f) => `${f.run}: ${f.message}`).join('; ') + (fl.length > 3 ? `; and ${fl.length - 3} more` : '')
      : 'the model could not be evaluated at the estimate',
    failureWarning: {
      code: 'model-failure-at-estimate',
      message: `the model cannot be evaluated at the reported parameter values (${runs.length ? `failing: ${runs.map((r) => (r === '*' ? 'model' : `run ${r}`)).join(', ')}` : 'no detail'}); no statistics are given`,
      path: runs,
    },
  };
}

/** The covariance in the estimation space (s^2 (J'J)^-1 or (J'J)^-1), p x p row-major, and the interval quantile. */
function covarianceOf(prep: PreparedFit, at: AtEstimate, analysis: JacobianAnalysis, ssr: number): { covInt: Float64Array | null; q: number | null } {
  const { data } = prep;
  const dof = prep.model.nObservations - prep.freeIndex.length;
  const level = prep.options.level ?? 0.95;
  const s2 = data.sigmaKnown ? 1 : dof > 0 ? ssr / dof : null;
  const covInt = at.evaluated && analysis.normalInverse && s2 !== null ? analysis.normalInverse.map((v) => v * s2) : null;
  const q = data.sigmaKnown ? normalQuantile(1 - (1 - level) / 2) : dof > 0 ? studentTQuantile(1 - (1 - level) / 2, dof) : null;
  return { covInt, q };
}

/** Every parameter with its value, standard error and linear interval (built in the estimation space). */
function fittedParameters(prep: PreparedFit, thetaHat: Float64Array, covInt: Float64Array | null, q: number | null): FittedParameter[] {
  const p = prep.freeIndex.length;
  const level = prep.options.level ?? 0.95;
  const freePos = new Map<number, number>();
  prep.freeIndex.forEach((j, k) => freePos.set(j, k));
  return prep.parameters.map((par, j) => {
    const k = freePos.get(j);
    const internalValue = thetaHat[j];
    const value = toExternal(par, internalValue);
    const seInt = k !== undefined && covInt ? Math.sqrt(Math.max(0, covInt[k * p + k])) : null;
    const se = seInt !== null ? Math.abs(externalDerivative(par, internalValue)) * seInt : null;
    const linear: [number, number] | null =
      seInt !== null && q !== null ? [toExternal(par, internalValue - q * seInt), toExternal(par, internalValue + q * seInt)] : null;
    const atBound = k !== undefined && (internalValue <= prep.lowerFull[j] || internalValue >= prep.upperFull[j]);
    return {
      ...par,
      value,
      stdError: se,
      ci: { level, basis: par.transform === 'log' ? 'transformed' : 'direct', linear },
      internalValue,
      internalStdError: seInt,
      atBound,
    };
  });
}

/** External covariance D C D, the internal one as rows, and the correlation, over the free parameters. */
function covarianceMatrices(prep: PreparedFit, thetaHat: Float64Array, covInt: Float64Array | null): Pick<FitResult, 'covariance' | 'correlation'> {
  const free = prep.freeIndex;
  const p = free.length;
  const names = free.map((j) => prep.parameters[j].name);
  if (!covInt) return { covariance: { names, internal: null, external: null }, correlation: { names, matrix: null } };
  const dfac = free.map((j) => externalDerivative(prep.parameters[j], thetaHat[j]));
  const rows = (f: (a: number, b: number) => number) => Array.from({ length: p }, (_, a) => Array.from({ length: p }, (_, b) => f(a, b)));
  const internal = rows((a, b) => covInt[a * p + b]);
  const external = rows((a, b) => dfac[a] * covInt[a * p + b] * dfac[b]);
  const matrix = rows((a, b) => {
    const den = Math.sqrt(covInt[a * p + a] * covInt[b * p + b]);
    return a === b ? 1 : den > 0 ? Math.max(-1, Math.min(1, covInt[a * p + b] / den)) : 0;
  });
  return { covariance: { names, internal, external }, correlation: { names, matrix } };
}

/** Rank deficiency, ill conditioning, high correlation, large standard errors, estimates on bounds. */
function identifiabilityWarnings(prep: PreparedFit, analysis: JacobianAnalysis, evaluated: boolean, corr: number[][] | null, fitted: FittedParameter[]): Warning[] {
  const { options } = prep;
  const free = prep.freeIndex;
  const p = free.length;
  const names = free.map((j) => prep.parameters[j].name);
  const weak = nullDirection(analysis).map((k) => names[k]);
  const warnings: Warning[] = [];
  if (analysis.singular && evaluated) {
    warnings.push({
      code: 'not-identifiable',
      message: `the data cannot separate ${weak.length > 1 ? 'the parameters ' + weak.join(', ') : 'parameter ' + weak.join('')} (the Jacobian is rank-deficient); fix one of them or add informative data`,
      path: weak,
    });
  }
  const condWarn = options.conditionWarning ?? 1e8;
  const corrWarn = options.correlationWarning ?? 0.95;
  if (evaluated && p > 0 && !(analysis.conditionNumber <= condWarn)) {
    warnings.push({
      code: 'ill-conditioned',
      message: `the column-scaled J'J has condition number ${Number.isFinite(analysis.conditionNumber) ? fmt(analysis.conditionNumber) : 'infinity'} (> ${fmt(condWarn)}): the parameters are poorly determined jointly${weak.length ? ` (mostly ${weak.join(', ')})` : ''}`,
      path: weak,
    });
  }
  for (let a = 0; a < (corr ? p : 0); a++) {
    for (let b = a + 1; b < p; b++) {
      const c = (corr as number[][])[a][b];
      if (Math.abs(c) > corrWarn) {
        warnings.push({ code: 'high-correlation', message: `parameters ${names[a]} and ${names[b]} are correlated (r = ${c.toFixed(4)}); the data barely separate them`, path: [names[a], names[b]] });
      }
    }
  }
  for (const fp of fitted) {
    if (fp.fixed) continue;
    if (fp.stdError !== null && fp.stdError > Math.abs(fp.value)) {
      warnings.push({ code: 'large-std-error', message: `parameter ${fp.name} has standard error ${fmt(fp.stdError)} larger than its estimate ${fmt(fp.value)}`, path: [fp.name] });
    }
    if (fp.atBound) warnings.push({ code: 'at-bound', message: `parameter ${fp.name} ended on a bound (${fmt(fp.value)}); its interval is not valid`, path: [fp.name] });
  }
  return warnings;
}

/** Per-observation diagnostics and the influential observations (influence.ts thresholds). */
function observationDiagnostics(prep: PreparedFit, at: AtEstimate, analysis: JacobianAnalysis, ssr: number): Pick<FitResult, 'observations' | 'influential'> {
  if (!at.evaluated) return { observations: [], influential: [] };
  const { data } = prep;
  const m = prep.model.nObservations;
  const p = prep.freeIndex.length;
  const dof = m - p;
  const s = data.sigmaKnown ? 1 : dof > 0 ? Math.sqrt(ssr / dof) : 0;
  const st = observationStats(at.r, analysis.leverage, s, p);
  const observations: ObservationDiagnostics[] = [];
  for (let i = 0; i < m; i++) {
    observations.push({
      index: i,
      measured: data.measured[i],
      predicted: at.pred[i],
      residual: data.measured[i] - at.pred[i],
      weightedResidual: at.r[i],
      studentizedResidual: st.studentized[i],
      leverage: analysis.leverage[i],
      cooksDistance: st.cooks[i],
    });
  }
  const outlierLevel = prep.options.outlierLevel;
  const influential = findInfluential(st.studentized, st.cooks, m, p, data.sigmaKnown, outlierLevel !== undefined ? { outlierLevel } : {});
  return { observations, influential };
}

/**
 * Whether profile-likelihood intervals are computed for a fit: the solver met a convergence test,
 * the model evaluated at the estimate and there is a covariance and degrees of freedom. (Not the
 * verdict: a misfit or poorly identified fit still gets its profiles, which the verdict reads.)
 */
export function profilesApply(fit: FitResult): boolean {
  return FIT_STATUS[fit.statistics.solverStatus].success && fit.observations.length > 0 && fit.covariance.internal !== null && fit.statistics.dof > 0;
}

/** One profile job: the profile-likelihood interval of the parameter at `index` of theta. */
export type ProfileJob = Omit<Parameters<typeof profileParameter>[0], 'prep'>;

/** The profile jobs of every free parameter (none unless profilesApply). */
function profileJobs(prep: PreparedFit, fit: FitResult, thetaHat: Float64Array): ProfileJob[] {
  const covInt = fit.covariance.internal;
  if (!profilesApply(fit) || !covInt) return [];
  const free = prep.freeIndex;
  return free.map((j, k) => ({
    thetaHat,
    index: j,
    ssrMin: fit.statistics.ssr,
    internalStdError: Math.sqrt(covInt[k][k]),
    linear: fit.parameters[j].ci.linear,
    tangent: profileTangent(covInt, free, k, thetaHat.length),
  }));
}

/** Build the FitResult from a solver result, profiles included unless withProfile is false. */
export function assembleFit(prep: PreparedFit, lm: LmResult, withProfile = prep.options.profile ?? true): FitResult {
  return runStepsHere(fitSteps(prep, lm, withProfile));
}

/**
 * assembleFit as steps: statistics and verdict at the solver's end point here, then the profile of
 * every free parameter as one batch of 'fit-profile' jobs (src/core/jobs.ts).
 */
export function* fitSteps(prep: PreparedFit, lm: LmResult, withProfile = prep.options.profile ?? true): JobSteps<FitResult> {
  const { fit, thetaHat } = fitAtEstimate(prep, lm);
  const jobs = withProfile ? profileJobs(prep, fit, thetaHat) : [];
  if (!jobs.length) return fit;
  const profiles = yield* batchOf<ProfileJob, ParameterProfile>({
    kind: 'fit-profile',
    jobs,
    runHere: (job) => profileParameter({ prep, ...job }),
    ...(prep.options.profileProgress ? { onProgress: prep.options.profileProgress } : {}),
  });
  return applyProfiles(fit, profiles, prep.options.verdict);
}

/** The FitResult without profiles at a solver result, and the full theta there. */
function fitAtEstimate(prep: PreparedFit, lm: LmResult): { fit: FitResult; thetaHat: Float64Array } {
  const { model, data, options } = prep;
  const m = model.nObservations;
  const p = prep.freeIndex.length;
  const dof = m - p;
  const at = evaluateAtEstimate(prep, lm);
  const warnings: Warning[] = [...lm.warnings];
  if (at.failureWarning) warnings.push(at.failureWarning);
  if (lm.failedTrials > 0) {
    warnings.push({ code: 'model-failed-at-trial-points', message: `the model could not be evaluated at ${lm.failedTrials} trial point(s) during the fit; those steps were rejected` });
  }
  let ssr = 0;
  for (let i = 0; i < m; i++) ssr += at.r[i] * at.r[i];
  const analysis = analyseJacobian(at.J, m, p);
  const { covInt, q } = covarianceOf(prep, at, analysis, ssr);
  if (dof <= 0) warnings.push({ code: 'no-dof', message: `${m} observations for ${p} free parameters leave no degrees of freedom for uncertainty` });
  const fitted = fittedParameters(prep, at.thetaHat, covInt, q);
  const matrices = covarianceMatrices(prep, at.thetaHat, covInt);
  warnings.push(...identifiabilityWarnings(prep, analysis, at.evaluated, matrices.correlation.matrix, fitted));
  const diag = observationDiagnostics(prep, at, analysis, ssr);
  if (diag.influential.length) {
    warnings.push({ code: 'influential-observations', message: `${diag.influential.length} influential observation(s): ${diag.influential.map((o) => o.index).join(', ')}` });
  }
  const lof = data.groups && at.evaluated ? lackOfFit(data.measured, data.sigma, data.groups, ssr, dof) : null;
  if (lof && lof.pValue < 1 - (options.level ?? 0.95)) {
    warnings.push({ code: 'lack-of-fit', message: `lack-of-fit test rejects the model (F = ${fmt(lof.F)}, p = ${lof.pValue.toExponential(2)}): misfit exceeds replicate scatter` });
  }
  const ic = informationCriteria(ssr, m, p, data.sigmaKnown);
  const solverStatus: FitStatus = at.evaluated ? lm.status : 'model-failure';
  const solverMessage = at.evaluated ? lm.message : outcome(FIT_STATUS, 'model-failure', [], at.failureDetail).message;
  const condJ = Math.sqrt(analysis.conditionNumber);
  const base: Omit<FitResult, 'verdict'> = {
    ...outcome(FIT_STATUS, solverStatus, warnings),
    message: solverMessage,
    parameters: fitted,
    ...matrices,
    statistics: {
      n: m,
      p,
      dof,
      ssr,
      residualStdDev: dof > 0 ? Math.sqrt(ssr / dof) : null,
      chiSquare: ssr,
      chiSquarePValue: data.sigmaKnown && dof > 0 && at.evaluated ? chiSquareSurvival(ssr, dof) : null,
      aic: ic.aic,
      aicc: ic.aicc,
      bic: ic.bic,
      conditionNumber: Number.isFinite(analysis.conditionNumber) && !analysis.singular ? analysis.conditionNumber : null,
      singularRatio: at.evaluated && p > 0 ? (condJ > 0 && Number.isFinite(condJ) ? 1 / condJ : 0) : null,
      covarianceBasis: data.sigmaKnown ? 'known-sigma' : 's2-scaled',
      lackOfFit: lof,
      solverStatus,
      solverMessage,
      iterations: lm.iterations,
      evaluations: lm.evaluations,
      solver: options.solver ?? 'trust-region',
      exactJacobian: at.exactJacobian,
    },
    ...diag,
    profiles: [],
  };
  return { fit: applyVerdict(base, options.verdict), thetaHat: at.thetaHat };
}

/**
 * Attach profile-likelihood intervals to a fit (computed here or on worker threads): each profile's
 * interval goes into ci.profile of the parameter of that name, the profiles into `profiles` (after
 * any already there), and a warning is added where the profile disagrees with the linear interval.
 * Returns a new result; the input is not changed.
 */
export function applyProfiles(fit: FitResult, profiles: readonly ParameterProfile[], rules?: VerdictRules): FitResult {
  const parameters = fit.parameters.slice();
  const warnings = fit.warnings.slice();
  for (const prof of profiles) {
    const j = parameters.findIndex((q) => q.name === prof.name);
    if (j < 0) continue;
    const fp = parameters[j];
    parameters[j] = { ...fp, ci: { ...fp.ci, profile: prof.interval } };
    if (prof.disagreesWithLinear) {
      const open = prof.interval[0] === null || prof.interval[1] === null;
      const why = prof.ends.filter((e) => e !== 'crossed');
      const reason = why.includes('refit-failed')
        ? 'a refit with the parameter held failed'
        : why.includes('bound')
          ? 'the profile reaches a bound first'
          : 'the search range (8 linear half-widths) ends first';
      warnings.push({
        code: open ? 'profile-open' : 'profile-disagrees',
        message: open
          ? `the profile interval of ${fp.name} is open on one side (${reason}): the linear interval understates the uncertainty or cannot be checked`
          : `the profile interval of ${fp.name} differs from the linear one by more than 10% of its width: the linear interval is unreliable`,
        path: [fp.name],
      });
    }
  }
  return applyVerdict({ ...fit, warnings, parameters, profiles: [...fit.profiles, ...profiles] }, rules);
}

function chiSquareSurvival(x: number, k: number): number {
  return Math.max(0, 1 - chiSquareCdf(x, k));
}
