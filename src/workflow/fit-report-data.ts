/**
 * From a study fit (and optionally the rival-model comparison) to the report's view model
 * (report/types.ts). Only reshapes numbers it is handed, plus one profile solve per profiled run
 * at the fitted parameters for the predicted curves.
 */
import { transportReportData } from './pellet-report-data.js';
import type { Comparison } from '../estimation/compare.js';
import type { FitReportData, ParameterRowData, RunObservationData, RunProfileData, RivalModelData, StartValuesData } from '../report/types.js';
import type { Study } from '../study/types.js';
import type { StudyFit } from './fit-study.js';
import { feedRatio, responseLabel, spaceTime } from './labels.js';
import { labReportData } from './lab-report-data.js';
import { influentialTable } from './observation-names.js';
import { shownDerived, shownParameters } from './shown-results.js';
import { studyDisplay, type StudyDisplay } from '../study/display.js';
import { shownDifference, shownValue } from '../units/index.js';
import { VERSION } from '../version.js';
import { checkArgs, is } from '../core/args.js';

const COVARIANCE_TEXT: Record<string, string> = {
  's2-scaled': 's² (JᵀJ)⁻¹ at the optimum (sigma scale estimated from the residuals)',
  'known-sigma': '(JᵀJ)⁻¹ at the optimum (measurement sigma taken as known)',
};

/** How the covariance was formed, and why: error models with relative weights only are named. */
function covarianceText(sf: StudyFit): string {
  const basis = sf.fit.statistics.covarianceBasis;
  const text = COVARIANCE_TEXT[basis] ?? basis;
  const w = sf.data.weightsOnly ?? [];
  return w.length && basis === 's2-scaled' ? `${text}; error model${w.length > 1 ? 's' : ''} ${w.map((n) => `'${n}'`).join(', ')} give${w.length > 1 ? '' : 's'} relative weights only, so no chi-square test is made` : text;
}

function parameterRows(sf: StudyFit, display: StudyDisplay): ParameterRowData[] {
  const flagsFor = new Map<string, string[]>();
  for (const w of sf.fit.warnings) {
    const name = w.path?.find((s) => typeof s === 'string' && sf.fit.parameters.some((p) => p.name === s));
    if (typeof name === 'string') flagsFor.set(name, [...(flagsFor.get(name) ?? []), w.code]);
  }
  return shownParameters(display, sf.fit.parameters).map((p) => ({
    name: p.name,
    unit: p.unit,
    value: p.value,
    stdError: p.stdError,
    ciLevel: p.ci.level,
    linearCI: p.ci.linear,
    profileCI: p.ci.profile ?? null,
    fixed: p.fixed,
    flags: [...(p.atBound ? ['at bound'] : []), ...(flagsFor.get(p.name) ?? [])],
  }));
}

/** A run's temperature and pressure in the units of their columns (pressure in kPa when no column gives one). */
function runConditions(study: Study, runIndex: number, display: StudyDisplay): Pick<RunObservationData['conditions'], 'temperature' | 'pressure' | 'temperatureUnit' | 'pressureUnit'> {
  const run = study.runs[runIndex];
  const t = display.condition('temperature', runIndex, 'K');
  const p = display.condition('pressure', runIndex, 'Pa', 'kPa');
  return { temperature: shownValue(t, run.temperature) as number, temperatureUnit: t.unit, pressure: run.pressure === undefined ? NaN : (shownValue(p, run.pressure) as number), pressureUnit: p.unit };
}

function runRows(study: Study, sf: StudyFit, display: StudyDisplay): RunObservationData[] {
  const byRun = new Map<number, RunObservationData>();
  for (const o of study.observations) {
    if (o.position !== undefined) continue;
    const run = study.runs[o.runIndex];
    let row = byRun.get(o.runIndex);
    if (!row) {
      row = {
        runId: run.id,
        conditions: {
          ...runConditions(study, o.runIndex, display),
          spaceTime: spaceTime(run, study),
          feedRatio: feedRatio(run, study),
        },
        responses: [],
      };
      byRun.set(o.runIndex, row);
    }
    const d = sf.fit.observations[o.index];
    const { label } = responseLabel(o, study);
    const c = display.observation(o);
    const unit = c.unit;
    // A run the model could not evaluate at the estimate has no fitted observation: shown as failed.
    if (!d || !Number.isFinite(d.predicted)) row.responses.push({ response: label, unit, measured: shownValue(c, o.value) as number, predicted: null, residual: null, studentized: null });
    else row.responses.push({ response: label, unit, measured: shownValue(c, d.measured) as number, predicted: shownValue(c, d.predicted), residual: shownDifference(c, d.residual), studentized: d.studentizedResidual });
  }
  return [...byRun.values()];
}

function profiles(study: Study, sf: StudyFit, display: StudyDisplay): RunProfileData[] {
  const external = Float64Array.from(sf.fit.parameters, (p) => p.value);
  const runs = new Map<number, typeof study.observations>();
  for (const o of study.observations) {
    if (o.position === undefined) continue;
    runs.set(o.runIndex, [...(runs.get(o.runIndex) ?? []), o]);
  }
  const out: RunProfileData[] = [];
  for (const [runIndex, obs] of runs) {
    const run = study.runs[runIndex];
    const xmax = Math.max(run.size, ...obs.map((o) => o.position ?? 0));
    const points = Array.from({ length: 61 }, (_, i) => (xmax * i) / 60);
    const sol = sf.model.solveRun(runIndex, external, { profile: true, profilePoints: points });
    if (!sol.profile) continue;
    const prof = sol.profile;
    const kind = obs[0].response;
    const useConc = kind === 'outlet-concentration';
    const species = [...new Set(obs.map((o) => o.speciesIndex ?? -1).filter((j) => j >= 0))];
    const cy = display.observation(obs[0]);
    const cx = display.condition('size', runIndex, prof.unit);
    const sx = (x: number) => shownValue(cx, x) as number;
    const sy = (y: number) => shownValue(cy, y) as number;
    out.push({
      runId: run.id,
      coordinate: { label: prof.coordinate, unit: cx.unit },
      quantity: { label: useConc ? 'C_j' : study.reactor.kind === 'batch' ? 'N_j' : 'F_j', unit: cy.unit },
      species: species.map((j) => ({
        species: study.chemistry.speciesNames[j],
        measured: obs.filter((o) => o.speciesIndex === j).map((o) => ({ x: sx(o.position!), y: sy(o.value) })),
        predicted: prof.x.map((x, i) => ({ x: sx(x), y: sy((useConc ? prof.concentrations[i] : prof.amounts[i])[j]) })),
      })),
    });
  }
  return out;
}

function rivals(comparison: Comparison): RivalModelData[] {
  return comparison.ranking.map((r) => ({
    name: r.name,
    ssr: r.ssr,
    dof: r.dof,
    aicc: r.aicc ?? NaN,
    bic: r.bic,
    akaikeWeight: r.akaikeWeight ?? 0,
    verdict: !r.converged
      ? 'did not converge'
      : r.rank === 1
        ? 'best supported'
        : comparison.indistinguishable.includes(r.name)
          ? 'cannot be told apart from the best'
          : 'less supported',
  }));
}

const START_METHOD_TEXT: Record<string, string> = {
  differential: 'differential rate analysis',
  default: 'documented default',
};

function startValues(sf: StudyFit, display: StudyDisplay): StartValuesData | null {
  const sv = sf.startValues;
  if (!sv || sv.estimated.length === 0) return null;
  return {
    rows: sv.estimated.map((e) => {
      const c = display.parameter(e.name, e.unit);
      return { parameter: e.name, value: shownValue(c, e.value) as number, unit: c.unit, method: START_METHOD_TEXT[e.method] ?? e.method, how: e.detail };
    }),
    points: sv.points,
    notes: [...sv.notes],
  };
}

/** The fit report view model of a study fit. */
export function fitReportData(study: Study, sf: StudyFit, comparison?: Comparison): FitReportData {
  checkArgs('fitReportData', [study, sf, comparison], [{ name: 'study', check: is.study }, { name: 'sf', check: is.studyFit }, { name: 'comparison', check: is.optional(is.object) }]);
  const { fit } = sf;
  const display = studyDisplay(study);
  const lab = labReportData(study, sf);
  const s = fit.statistics;
  const lof = s.lackOfFit;
  return {
    title: `Kinetic fit: ${study.title ?? study.studyPath}`,
    studyName: study.title ?? study.studyPath,
    generatedBy: `rateloom ${VERSION}`,
    status: fit.status,
    success: fit.success,
    message: fit.message,
    warnings: fit.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.path ? { path: w.path } : {}) })),
    parameters: [
      ...parameterRows(sf, display),
      ...shownDerived(display, sf.derived).map((q) => ({ name: q.name, unit: q.unit, value: q.value, stdError: q.stdError, ciLevel: q.ci.level, linearCI: q.ci.linear, profileCI: null, flags: [`derived = ${q.definition.split(',')[0]}`] })),
    ],
    correlation: fit.correlation.matrix ? { names: fit.correlation.names, matrix: fit.correlation.matrix } : null,
    statistics: {
      n: s.n,
      p: s.p,
      dof: s.dof,
      ssr: s.ssr,
      ssrUnit: '1',
      residualStdDev: s.residualStdDev ?? NaN,
      residualUnit: '1',
      aicc: s.aicc ?? NaN,
      bic: s.bic,
      covarianceBasis: covarianceText(sf),
      lackOfFit: lof
        ? {
            F: lof.F,
            dofLackOfFit: lof.dofLack,
            dofPureError: lof.dofPure,
            pValue: lof.pValue,
            conclusion: lof.pValue < 0.05 ? 'lack of fit is significant at the 5 % level' : 'no evidence of lack of fit at the 5 % level',
          }
        : null,
    },
    runs: runRows(study, sf, display),
    transport: sf.transport ? transportReportData(sf.transport) : null,
    profiles: profiles(study, sf, display),
    likelihoodProfiles: fit.profiles.map((pr) => {
      const p = fit.parameters.find((q) => q.name === pr.name)!;
      const c = display.parameter(p.name, p.unit);
      return {
        parameter: pr.name,
        unit: c.unit,
        estimate: shownValue(c, p.value) as number,
        objectiveLabel: 'SSR',
        objectiveUnit: '1',
        points: pr.points.map((pt) => ({ value: shownValue(c, pt.value) as number, objective: pt.ssr })),
        threshold: pr.threshold,
      };
    }),
    ...(comparison ? { rivalModels: rivals(comparison) } : {}),
    kinetics: sf.model.kinetics.describe().map((d) => `${d.id}: ${d.equation};  r = ${d.text}  [${d.rateUnit}]`),
    startValues: startValues(sf, display),
    influential: fit.influential.length ? influentialTable(fit, study) : null,
    ...(lab ? { lab } : {}),
  };
}
