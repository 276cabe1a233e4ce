/**
 * `rateloom fit --cross-check`: a study fit checked by two independent numerical libraries.
 *   1. The optimum is re-solved from the reported estimates by the card package
 *      ml-levenberg-marquardt (src/estimation/cross-check.ts): shared significant digits of the
 *      estimates and the relative difference of the weighted SSR.
 *   2. Every run is re-integrated at the reported estimates by the card package odex (the
 *      Gragg-Bulirsch-Stoer extrapolation code ODEX of Hairer & Wanner, Solving ODEs I, 2nd ed.,
 *      sec. II.9; src/numerics/odex-solver.ts) at a tighter tolerance than the fit's
 *      (CROSS_CHECK_TOLERANCES.odexRtol): the largest relative difference of the predictions and
 *      the weighted SSR recomputed from them.
 * A difference beyond CROSS_CHECK_TOLERANCES is a warning (W_CROSS_CHECK) on the check; it does
 * not change the fit's verdict. A fit that found no minimum (verdict.ts minimumFound) is not
 * checked: the result says why.
 *
 * What it proves and what it does not: docs/cross-check.md.
 */
import type { Warning } from '../core/outcome.js';
import { crossCheckOptimum, sharedDigits, ssrOfPredictions, type OptimumCrossCheck } from '../estimation/cross-check.js';
import { minimumFound } from '../estimation/verdict.js';
import type { Study } from '../study/types.js';
import { findVariant, type StudyFit } from './fit-study.js';
import { StudyModel } from './study-model.js';

/** The agreement the cross-check asks for (stated in the output and in docs/cross-check.md). */
export const CROSS_CHECK_TOLERANCES = {
  /** Significant digits every free estimate must share with the package's re-solve. */
  estimateDigits: 6,
  /** Largest relative difference of the weighted SSR (re-solve, and odex predictions). */
  ssrRelative: 1e-6,
  /** Largest relative difference of a prediction, odex against the fit's integrator. */
  predictionRelative: 1e-6,
  /** Relative tolerance of the odex re-integration (the fit's own is 1e-8). */
  odexRtol: 1e-10,
} as const;

/** The runs re-integrated by odex and the agreement of the predictions. */
export interface IntegrationCrossCheck {
  odexRtol: number;
  /** Runs solved by integrating ODEs (tubes, batch, semibatch), re-integrated with odex. */
  runsIntegrated: number;
  /** Runs whose balances are algebraic (stirred tanks, rate-only runs): recomputed, not integrated. */
  runsAlgebraic: number;
  /** Largest |odex - reported| / |reported| over the observations (floor: 1e-9 of the largest |prediction|). */
  maxRelativeDifference: number;
  /** The observation where it occurs (run id, response, species). */
  worst: { runId: string; response: string; species?: string } | null;
  ssrReported: number;
  ssrOdex: number;
  ssrRelativeDifference: number;
}

/** The outcome of `fit --cross-check`. */
export type StudyCrossCheck =
  | { checked: true; agrees: boolean; tolerances: typeof CROSS_CHECK_TOLERANCES; optimum: OptimumCrossCheck; integration: IntegrationCrossCheck; warnings: Warning[] }
  | { checked: false; reason: string };

const INTEGRATED_KINDS = new Set(['packed-bed', 'plug-flow', 'batch', 'semibatch', 'membrane']);

/** Re-integrate every run with odex at the reported estimates and compare the predictions. */
export function crossCheckIntegration(study: Study, sf: StudyFit): IntegrationCrossCheck | string {
  const { reactions } = findVariant(study, sf.variant);
  const model = new StudyModel(study, { name: sf.variant, reactions, parameters: [...sf.model.parameters] }, { odeMethod: 'odex', rtol: CROSS_CHECK_TOLERANCES.odexRtol, exactJacobian: false });
  const theta = Float64Array.from(sf.fit.parameters, (p) => p.internalValue);
  const pred = new Float64Array(model.nObservations);
  const failures: { run: string; message: string }[] = [];
  if (!model.predict(theta, pred, failures)) return `odex could not integrate every run at the reported estimates (${failures[0]?.run ?? '?'}: ${failures[0]?.message ?? 'failed'})`;
  const obs = sf.fit.observations;
  let scale = 0;
  for (const o of obs) scale = Math.max(scale, Math.abs(o.predicted));
  let maxRel = 0;
  let worst: IntegrationCrossCheck['worst'] = null;
  // From the predictions just integrated: integrating every run again at rtol 1e-10 would double the cost.
  const ssrOdex = ssrOfPredictions(sf.data, pred);
  for (const o of obs) {
    const rel = Math.abs(pred[o.index] - o.predicted) / Math.max(Math.abs(o.predicted), 1e-9 * scale);
    if (rel > maxRel || worst === null) {
      maxRel = Math.max(rel, maxRel);
      const so = study.observations[o.index];
      worst = { runId: so.runId, response: so.response, ...(so.species !== undefined ? { species: so.species } : {}) };
    }
  }
  const integrated = INTEGRATED_KINDS.has(study.reactor.kind) ? study.runs.filter((r) => Number.isFinite(r.size)).length : 0;
  const ssrReported = sf.fit.statistics.ssr;
  return {
    odexRtol: CROSS_CHECK_TOLERANCES.odexRtol,
    runsIntegrated: integrated,
    runsAlgebraic: study.runs.length - integrated,
    maxRelativeDifference: maxRel,
    worst,
    ssrReported,
    ssrOdex,
    ssrRelativeDifference: Math.abs(ssrOdex - ssrReported) / Math.max(ssrReported, Number.MIN_VALUE),
  };
}

/** Warnings for every agreement the tolerances do not reach. */
function disagreements(optimum: OptimumCrossCheck, integration: IntegrationCrossCheck): Warning[] {
  const t = CROSS_CHECK_TOLERANCES;
  const w: Warning[] = [];
  const warn = (message: string) => w.push({ code: 'W_CROSS_CHECK', message });
  if (optimum.digits < t.estimateDigits) {
    const e = optimum.estimates.reduce((a, b) => (sharedDigits(b.recheck, b.reported) < sharedDigits(a.recheck, a.reported) ? b : a));
    warn(`ml-levenberg-marquardt ends ${e.name} at ${e.recheck} ${e.unit} against the reported ${e.reported} ${e.unit} (${optimum.digits.toFixed(1)} shared digits, ${t.estimateDigits} asked; its status ${optimum.solverStatus})`);
  }
  if (optimum.ssrRelativeDifference > t.ssrRelative) warn(`ml-levenberg-marquardt ends at weighted SSR ${optimum.ssrRecheck} against the reported ${optimum.ssrReported}`);
  if (integration.maxRelativeDifference > t.predictionRelative) {
    const o = integration.worst;
    warn(`odex predictions differ by up to ${integration.maxRelativeDifference.toExponential(2)} (relative; tolerance ${t.predictionRelative}) from the fit's${o ? `, at run ${o.runId} ${o.response}${o.species ? ` ${o.species}` : ''}` : ''}`);
  }
  if (integration.ssrRelativeDifference > t.ssrRelative) warn(`the weighted SSR from odex predictions is ${integration.ssrOdex} against the reported ${integration.ssrReported}`);
  return w;
}

/** Cross-check a study fit with ml-levenberg-marquardt and odex (see the file header). */
export function crossCheckStudyFit(study: Study, sf: StudyFit): StudyCrossCheck {
  if (!minimumFound(sf.fit)) {
    return { checked: false, reason: `the fit found no minimum to check (${sf.fit.verdict.status}: ${sf.fit.verdict.message})` };
  }
  if (sf.fit.observations.length !== study.observations.length) {
    return { checked: false, reason: 'the fit has no predictions at its estimates (the model could not be evaluated there)' };
  }
  const integration = crossCheckIntegration(study, sf);
  if (typeof integration === 'string') return { checked: false, reason: integration };
  const optimum = crossCheckOptimum(sf.model, sf.data, sf.fit);
  const warnings = disagreements(optimum, integration);
  return { checked: true, agrees: warnings.length === 0, tolerances: CROSS_CHECK_TOLERANCES, optimum, integration, warnings };
}
