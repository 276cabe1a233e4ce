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
import { outcome, type Warning } from '../core/outcome';
import { externalDerivative, toExternal, type Parameter } from '../core/parameter';
import { chiSquareCdf, normalQuantile, studentTQuantile } from './distributions';
import type {
  FitData,
  FitOptions,
  FitResult,
  FittedParameter,
  InfluentialObservation,
  ObservationDiagnostics,
  ParameterProfile,
} from './fit-types';
import type { LmResult } from './lm';
import type { RegressionModel } from './model';
import { profileParameter } from './profile';
import { makeProblem, prepareFit, solveFree, type PreparedFit } from './solve';
import { analyseJacobian, informationCriteria, lackOfFit, nullDirection, observationStats } from './statistics';
import type { FitStatus } from './status';
import { FIT_STATUS } from './status';

export type { FitData, FitOptions, FitResult } from './fit-types';

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
  const prep = prepareFit(model, parameters, data, options);
  const { result } = solveFree(prep, prep.thetaFull);
  return assembleFit(prep, result);
}

const fmt = (v: number): string => (Math.abs(v) >= 1e-3 && Math.abs(v) < 1e5 ? v.toPrecision(4) : v.toExponential(3));

/** Build the FitResult from a solver result (also used by the multistart driver). */
export function assembleFit(prep: PreparedFit, lm: LmResult, withProfile = prep.options.profile ?? true): FitResult {
  const { model, data, options } = prep;
  const m = model.nObservations;
  const free = prep.freeIndex;
  const p = free.length;
  const dof = m - p;
  const level = options.level ?? 0.95;
  const warnings: Warning[] = [...lm.warnings];
  const thetaHat = Float64Array.from(prep.thetaFull);
  free.forEach((j, k) => (thetaHat[j] = lm.x[k]));

  const problem = makeProblem(prep, thetaHat, free);
  const x = Float64Array.from(lm.x);
  const r = new Float64Array(m);
  const pred = new Float64Array(m);
  const J = new Float64Array(m * p);
  let status: FitStatus = lm.status;
  const base = FIT_STATUS[lm.status].message + ': ';
  let detail: string | undefined = lm.message.startsWith(base) ? lm.message.slice(base.length) : undefined;
  const evaluated = problem.predict(x, pred) && problem.residuals(x, r) && problem.jacobian(x, r, J);
  if (!evaluated) {
    status = 'model-failure';
    const fl = problem.failures;
    detail = fl.length
      ? fl.slice(0, 3).map((f) => `${f.run}: ${f.message}`).join('; ') + (fl.length > 3 ? `; and ${fl.length - 3} more` : '')
      : 'the model could not be evaluated at the estimate';
    const runs = [...new Set(fl.map((f) => f.run))];
    warnings.push({
      code: 'model-failure-at-estimate',
      message: `the model cannot be evaluated at the reported parameter values (${runs.length ? `failing: ${runs.map((r) => (r === '*' ? 'model' : `run ${r}`)).join(', ')}` : 'no detail'}); no statistics are given`,
      path: runs,
    });
    pred.fill(0);
    r.fill(0);
  }
  if (lm.failedTrials > 0) {
    warnings.push({
      code: 'model-failed-at-trial-points',
      message: `the model could not be evaluated at ${lm.failedTrials} trial point(s) during the fit; those steps were rejected`,
    });
  }
  let ssr = 0;
  for (let i = 0; i < m; i++) ssr += r[i] * r[i];
  const analysis = analyseJacobian(J, m, p);
  if (evaluated && FIT_STATUS[status].success && analysis.singular) status = 'singular';
  if (analysis.singular && evaluated) {
    const names = nullDirection(analysis).map((k) => prep.parameters[free[k]].name);
    warnings.push({
      code: 'not-identifiable',
      message: `the data cannot separate ${names.length > 1 ? 'the parameters ' + names.join(', ') : 'parameter ' + names.join('')} (the Jacobian is rank-deficient); fix one of them or add informative data`,
      path: names,
    });
  }

  const s2 = data.sigmaKnown ? 1 : dof > 0 ? ssr / dof : null;
  const covInt: Float64Array | null = evaluated && analysis.normalInverse && s2 !== null ? analysis.normalInverse.map((v) => v * s2) : null;
  const q = data.sigmaKnown ? normalQuantile(1 - (1 - level) / 2) : dof > 0 ? studentTQuantile(1 - (1 - level) / 2, dof) : null;
  if (dof <= 0) {
    warnings.push({ code: 'no-dof', message: `${m} observations for ${p} free parameters leave no degrees of freedom for uncertainty` });
  }

  const freePos = new Map<number, number>();
  free.forEach((j, k) => freePos.set(j, k));
  const fitted: FittedParameter[] = prep.parameters.map((par, j) => {
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

  // External covariance D C D and correlation, over the free parameters.
  const names = free.map((j) => prep.parameters[j].name);
  let covExt: number[][] | null = null;
  let covIntRows: number[][] | null = null;
  let corr: number[][] | null = null;
  if (covInt) {
    const dfac = free.map((j) => externalDerivative(prep.parameters[j], thetaHat[j]));
    covIntRows = [];
    covExt = [];
    corr = [];
    for (let a = 0; a < p; a++) {
      covIntRows.push(Array.from({ length: p }, (_, b) => covInt[a * p + b]));
      covExt.push(Array.from({ length: p }, (_, b) => dfac[a] * covInt[a * p + b] * dfac[b]));
      corr.push(
        Array.from({ length: p }, (_, b) => {
          const den = Math.sqrt(covInt[a * p + a] * covInt[b * p + b]);
          return a === b ? 1 : den > 0 ? Math.max(-1, Math.min(1, covInt[a * p + b] / den)) : 0;
        }),
      );
    }
  }

  // Identifiability warnings.
  const condWarn = options.conditionWarning ?? 1e8;
  const corrWarn = options.correlationWarning ?? 0.95;
  if (evaluated && p > 0 && !(analysis.conditionNumber <= condWarn)) {
    warnings.push({
      code: 'ill-conditioned',
      message: `the column-scaled J'J has condition number ${Number.isFinite(analysis.conditionNumber) ? fmt(analysis.conditionNumber) : 'infinity'} (> ${fmt(condWarn)}): the parameters are poorly determined jointly`,
    });
  }
  if (corr) {
    for (let a = 0; a < p; a++) {
      for (let b = a + 1; b < p; b++) {
        if (Math.abs(corr[a][b]) > corrWarn) {
          warnings.push({
            code: 'high-correlation',
            message: `parameters ${names[a]} and ${names[b]} are correlated (r = ${corr[a][b].toFixed(4)}); the data barely separate them`,
            path: [names[a], names[b]],
          });
        }
      }
    }
  }
  for (const fp of fitted) {
    if (fp.fixed) continue;
    if (fp.stdError !== null && fp.stdError > Math.abs(fp.value)) {
      warnings.push({
        code: 'large-std-error',
        message: `parameter ${fp.name} has standard error ${fmt(fp.stdError)} larger than its estimate ${fmt(fp.value)}`,
        path: [fp.name],
      });
    }
    if (fp.atBound) {
      warnings.push({ code: 'at-bound', message: `parameter ${fp.name} ended on a bound (${fmt(fp.value)}); its interval is not valid`, path: [fp.name] });
    }
  }

  // Observation diagnostics.
  const s = data.sigmaKnown ? 1 : s2 !== null ? Math.sqrt(s2) : 0;
  const obsStats = observationStats(r, analysis.leverage, s, p);
  const observations: ObservationDiagnostics[] = [];
  const influential: InfluentialObservation[] = [];
  for (let i = 0; i < (evaluated ? m : 0); i++) {
    const stud = obsStats.studentized[i];
    const cook = obsStats.cooks[i];
    observations.push({
      index: i,
      measured: data.measured[i],
      predicted: pred[i],
      residual: data.measured[i] - pred[i],
      weightedResidual: r[i],
      studentizedResidual: stud,
      leverage: analysis.leverage[i],
      cooksDistance: cook,
    });
    const reasons: string[] = [];
    if (cook !== null && cook > 4 / m) reasons.push(`Cook's distance ${cook.toFixed(3)} > 4/n = ${(4 / m).toFixed(3)}`);
    if (stud !== null && Math.abs(stud) > 3) reasons.push(`|studentized residual| ${Math.abs(stud).toFixed(2)} > 3`);
    if (reasons.length) influential.push({ index: i, cooksDistance: cook, studentizedResidual: stud, reason: reasons.join('; ') });
  }
  if (influential.length) {
    warnings.push({
      code: 'influential-observations',
      message: `${influential.length} influential observation(s): ${influential.map((o) => o.index).join(', ')}`,
    });
  }

  const lof = data.groups && evaluated ? lackOfFit(data.measured, data.sigma, data.groups, ssr, dof) : null;
  if (lof && lof.pValue < 1 - level) {
    warnings.push({
      code: 'lack-of-fit',
      message: `lack-of-fit test rejects the model (F = ${fmt(lof.F)}, p = ${lof.pValue.toExponential(2)}): misfit exceeds replicate scatter`,
    });
  }
  const ic = informationCriteria(ssr, m, p, data.sigmaKnown);

  // Profiles.
  const profiles: ParameterProfile[] = [];
  if (withProfile && FIT_STATUS[status].success && covInt && dof > 0) {
    free.forEach((j, k) => {
      profiles.push(
        profileParameter({
          prep,
          thetaHat,
          index: j,
          ssrMin: ssr,
          internalStdError: Math.sqrt(covInt[k * p + k]),
          linear: fitted[j].ci.linear,
        }),
      );
      options.profileProgress?.(k + 1, free.length);
    });
  }

  const result: FitResult = {
    ...outcome(FIT_STATUS, status, warnings, detail),
    parameters: fitted,
    correlation: { names, matrix: corr },
    covariance: { names, internal: covIntRows, external: covExt },
    statistics: {
      n: m,
      p,
      dof,
      ssr,
      residualStdDev: dof > 0 ? Math.sqrt(ssr / dof) : null,
      chiSquare: ssr,
      chiSquarePValue: data.sigmaKnown && dof > 0 ? chiSquareSurvival(ssr, dof) : null,
      aic: ic.aic,
      aicc: ic.aicc,
      bic: ic.bic,
      conditionNumber: Number.isFinite(analysis.conditionNumber) && !analysis.singular ? analysis.conditionNumber : null,
      covarianceBasis: data.sigmaKnown ? 'known-sigma' : 's2-scaled',
      lackOfFit: lof,
      iterations: lm.iterations,
      evaluations: lm.evaluations,
      solver: options.solver ?? 'trust-region',
      exactJacobian: problem.usesExactJacobian,
    },
    observations,
    influential,
    profiles: [],
  };
  return profiles.length ? applyProfiles(result, profiles) : result;
}

/**
 * Attach profile-likelihood intervals to a fit (computed here or on worker threads): each profile's
 * interval goes into ci.profile of the parameter of that name, the profiles into `profiles` (after
 * any already there), and a warning is added where the profile disagrees with the linear interval.
 * Returns a new result; the input is not changed.
 */
export function applyProfiles(fit: FitResult, profiles: readonly ParameterProfile[]): FitResult {
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
  return { ...fit, warnings, parameters, profiles: [...fit.profiles, ...profiles] };
}

function chiSquareSurvival(x: number, k: number): number {
  return Math.max(0, 1 - chiSquareCdf(x, k));
}
