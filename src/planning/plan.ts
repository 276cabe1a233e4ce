/**
 * The run planner: given a study, its fit(s) and the lab's limits, propose the next N runs, for
 * precision (D-, Ds-, A-optimal; precision.ts) or to tell rival rate laws apart (Box-Hill or
 * Hunter-Reiner; discrimination.ts). Returns the runs in the study's own CSV layout, why each was
 * chosen, and the expected precision or model probabilities after them. Bad input throws
 * RateloomError; a fit that cannot be trusted is planned with a warning and an unsuccessful status.
 */
import { RateloomError } from '../core/errors.js';
import { checkOption } from '../core/option-ranges.js';
import { outcome, type StatusTable, type Warning } from '../core/outcome.js';
import type { Study } from '../study/types.js';
import type { StudyFit } from '../workflow/fit-study.js';
import type { CriterionKind } from './criteria.js';
import { planContext, pointOfFit, type PlanContext } from './context.js';
import { rowsCsv } from './layout.js';
import type { LabLimits } from './limits.js';
import { planDiscrimination } from './discrimination.js';
import { planPrecision, precisionAfter, type PrecisionPlan } from './precision.js';
import { checkDistinctRivals, priorWeights } from './rivals.js';
import { conditionsOf, factorSummary, oldRunPoints, plannedRows } from './rows.js';
import type { DiscriminationCriterion, PlanMode, PlanResult, PlanStatus, PlannedRun } from '../report/types.js';
import { checkArgs, is } from '../core/args.js';

export const PLAN_STATUS: StatusTable<PlanStatus> = {
  planned: { success: true, message: 'runs planned' },
  'fewer-runs': { success: false, message: 'fewer runs than asked: the spacing rule or the limits leave no more admissible candidates' },
  'fit-not-trustworthy': { success: false, message: 'runs planned on a fit that cannot be trusted: treat the plan as a rough guide' },
  'no-candidates': { success: false, message: 'no candidate run inside the limits can be run (see the excluded candidates)' },
  indistinguishable: { success: false, message: 'no run inside the limits is expected to tell the rivals apart: their predictions agree everywhere, or today\'s data already rule all but one out' },
};

export interface PlanOptions {
  /** Runs to plan (integer >= 1). Required. */
  runs: number;
  /** 'precision' (default) or 'discrimination' (needs two or more fitted rate-law sets). */
  mode?: PlanMode;
  /** Precision criterion: 'D' (default), 'Ds' (with `subset`) or 'A'. */
  criterion?: CriterionKind;
  /** Ds: names of the parameters of interest, for example the activation energies. No default. */
  subset?: string[];
  /** Discrimination criterion: 'box-hill' (default) or 'hunter-reiner'. */
  discrimination?: DiscriminationCriterion;
  /** Discrimination: simulated outcomes per rival behind the expected posterior probabilities; default 400. */
  posteriorDraws?: number;
  /** Precision: parameter draws from the fit's covariance to average the criterion over; default 0 (local design). */
  draws?: number;
  /** Seed of the draws and of the posterior simulation; default 1. */
  seed?: number;
  /** Confidence level of the interval widths; default 0.95. */
  level?: number;
  /** Prefix of the planned run ids; default 'N' (N1, N2, ...; changed when the study uses such ids). */
  idPrefix?: string;
}

function checkOptions(o: PlanOptions, fits: readonly StudyFit[]): void {
  checkOption('runs', o.runs, ['runs']);
  if (o.draws !== undefined) checkOption('planDraws', o.draws, ['draws']);
  if (o.posteriorDraws !== undefined) checkOption('posteriorDraws', o.posteriorDraws, ['posteriorDraws']);
  if (o.seed !== undefined) checkOption('seed', o.seed, ['seed']);
  if (o.level !== undefined) checkOption('level', o.level, ['level']);
  if (!fits.length) throw new RateloomError('E_VALUE', 'planning needs a fit of the study', { path: ['fits'], fix: 'Pass the fit of the study (fitStudy), or one fit per rival rate-law set for discrimination.' });
}

/** Reported runs from chosen candidates with their reasons. */
function reportRuns(ctx: PlanContext, chosen: number[], reasons: string[], contributions: number[], prefix: string): { runs: PlannedRun[]; csv: string } {
  const rows = plannedRows(ctx.study, chosen, ctx.candidates.rows, prefix);
  const runs = rows.map((row, k) => ({
    id: row.id,
    conditions: conditionsOf(row, ctx.src, ctx.limits),
    reason: reasons[k],
    contribution: contributions[k],
    predictedConversion: ctx.conversions[chosen[k]],
    scaled: Array.from(ctx.candidates.points[chosen[k]]),
  }));
  const csv = rowsCsv(ctx.src, rows, 'Runs planned by rateloom: conditions filled, measured columns empty (fill them in the lab).');
  return { runs, csv };
}

const CRITERION_TEXT: Record<CriterionKind, string> = {
  D: 'log det of the information',
  Ds: 'minus log det of the covariance of the parameters of interest',
  A: 'the A-criterion (minus the mean ratio of variance after to variance now)',
};

function precisionReasons(pp: PrecisionPlan, kind: CriterionKind): string[] {
  return pp.contributions.map((c, k) => {
    const informs = pp.informs[k].length ? `; it cuts the variance of ${pp.informs[k].join(' and ')}` : '';
    return `${kind}-optimal: without it ${CRITERION_TEXT[kind]} would drop by ${c.toPrecision(3)}${informs}`;
  });
}

function statusOf(ctx: PlanContext, chosen: number, n: number, fitOk: boolean, indistinguishable = false): PlanStatus {
  if (!ctx.usable.length || (chosen === 0 && n > 0)) return 'no-candidates';
  if (indistinguishable) return 'indistinguishable';
  if (!fitOk) return 'fit-not-trustworthy';
  return chosen < n ? 'fewer-runs' : 'planned';
}

function precisionResult(study: Study, limits: LabLimits, sf: StudyFit, o: PlanOptions, ctx: PlanContext, warnings: Warning[]): PlanResult {
  const kind = o.criterion ?? 'D';
  const level = o.level ?? 0.95;
  const pp = ctx.usable.length
    ? planPrecision(ctx, sf, { n: o.runs, criterion: kind, ...(o.subset ? { subset: o.subset } : {}), draws: o.draws ?? 0, seed: o.seed ?? 1, level })
    : null;
  for (const w of pp?.warnings ?? []) warnings.push({ code: 'local-design', message: w });
  const { runs, csv } = reportRuns(ctx, pp?.chosen ?? [], pp ? precisionReasons(pp, kind) : [], pp?.contributions ?? [], o.idPrefix ?? 'N');
  const status = statusOf(ctx, runs.length, o.runs, sf.fit.success);
  return {
    ...outcome(PLAN_STATUS, status, warnings),
    mode: 'precision',
    criterion: kind,
    ...(kind === 'Ds' && o.subset ? { subset: o.subset } : {}),
    model: sf.variant,
    draws: pp?.draws ?? 0,
    runs,
    csv,
    precision: pp?.precision ?? [],
    level,
    candidates: { count: ctx.candidates.runs.length, usable: ctx.usable.length, excluded: ctx.excluded },
    oldRuns: oldRunPoints(study, ctx.src, limits),
    factors: factorSummary(ctx.src, limits),
  };
}

function discriminationResult(study: Study, limits: LabLimits, fits: readonly StudyFit[], o: PlanOptions, warnings: Warning[]): PlanResult {
  checkDistinctRivals(fits.map((f) => pointOfFit(f).variant));
  const notes: string[] = [];
  const prior = priorWeights(fits, notes);
  const leader = Math.max(0, prior.indexOf(Math.max(...prior)));
  const sf = fits[leader];
  const ctx = planContext(study, limits, pointOfFit(sf));
  const kind = o.discrimination ?? 'box-hill';
  const level = o.level ?? 0.95;
  const dp = ctx.usable.length ? planDiscrimination(ctx, fits, prior, { n: o.runs, criterion: kind, posteriorDraws: o.posteriorDraws ?? 400, seed: o.seed ?? 1 }) : null;
  for (const w of [...notes, ...(dp?.warnings ?? [])]) warnings.push({ code: 'discrimination', message: w });
  const chosen = dp?.chosen ?? [];
  const { runs, csv } = reportRuns(ctx, chosen, dp?.reasons ?? [], dp?.contributions ?? [], o.idPrefix ?? 'N');
  const precision = chosen.length ? precisionAfter(ctx, sf, chosen, level) : [];
  const status = statusOf(ctx, runs.length, o.runs, sf.fit.success, dp?.indistinguishable ?? false);
  return {
    ...outcome(PLAN_STATUS, status, warnings),
    mode: 'discrimination',
    criterion: kind,
    model: sf.variant,
    draws: 0,
    runs,
    csv,
    precision,
    level,
    ...(dp ? { discrimination: dp.summary } : {}),
    candidates: { count: ctx.candidates.runs.length, usable: ctx.usable.length, excluded: ctx.excluded },
    oldRuns: oldRunPoints(study, ctx.src, limits),
    factors: factorSummary(ctx.src, limits),
  };
}

/** Plan the next runs of a study. `fits`: the fit to plan for (precision), or every rival's fit. */
export function planRuns(study: Study, limits: LabLimits, fits: readonly StudyFit[], options: PlanOptions): PlanResult {
  checkArgs('planRuns', [study, limits, fits, options], [{ name: 'study', check: is.study }, { name: 'limits', check: is.object }, { name: 'fits', check: is.list(is.studyFit) }, { name: 'options', check: is.object }]);
  checkOptions(options, fits);
  const warnings: Warning[] = [];
  for (const f of fits) {
    if (!f.fit.success) warnings.push({ code: 'fit-not-trustworthy', message: `the fit of '${f.variant}' is not trustworthy (${f.fit.status}: ${f.fit.message}); the plan rests on it`, path: [f.variant] });
  }
  const mode = options.mode ?? 'precision';
  if (mode === 'discrimination') return discriminationResult(study, limits, fits, options, warnings);
  const sf = fits[0];
  const ctx = planContext(study, limits, pointOfFit(sf));
  return precisionResult(study, limits, sf, options, ctx, warnings);
}
