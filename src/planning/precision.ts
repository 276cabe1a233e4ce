/**
 * Precision mode: choose runs that maximise the information of all runs, old and planned, under
 * the D-, Ds- or A-criterion (criteria.ts), by greedy construction and Fedorov exchange
 * (exchange.ts), locally at the estimate or averaged over parameter draws (draws.ts). Reports the
 * expected standard errors and linear-interval widths after the planned runs beside today's.
 */
import { RateloomError } from '../core/errors.js';
import { normalQuantile, studentTQuantile } from '../estimation/distributions.js';
import type { StudyFit } from '../workflow/fit-study.js';
import { criterionValue, inverseSpd, type Criterion, type CriterionKind } from './criteria.js';
import { pointOfFit, studyInformation, type PlanContext } from './context.js';
import { parameterDraws } from './draws.js';
import { greedyExchange, type ExchangeResult } from './exchange.js';
import { runInformation, type InformationPoint } from './information.js';
import type { ParameterPrecision } from '../report/types.js';

export interface PrecisionOptions {
  /** Runs to plan. */
  n: number;
  criterion: CriterionKind;
  /** Ds: names of the parameters of interest. */
  subset?: readonly string[];
  /** Parameter draws to average over (0: local design). */
  draws: number;
  seed: number;
  /** Confidence level of the interval widths. */
  level: number;
}

export interface PrecisionPlan {
  /** Chosen candidate indices (into ctx.candidates). */
  chosen: number[];
  exchange: ExchangeResult;
  /** Per chosen run: criterion lost without it, and the parameters whose variance it cuts most. */
  contributions: number[];
  informs: string[][];
  precision: ParameterPrecision[];
  freeNames: string[];
  draws: number;
  warnings: string[];
}

/** Diagonal scaling s_i = 1 / sqrt(F_ii) of the information in hand (criteria are invariant to it up to a constant). */
function scaling(F: Float64Array, infos: readonly Float64Array[], p: number): Float64Array {
  const s = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    let d = F[i * p + i];
    if (!(d > 0)) for (const A of infos) d = Math.max(d, A[i * p + i]);
    s[i] = d > 0 ? 1 / Math.sqrt(d) : 1;
  }
  return s;
}

function scaled(F: Float64Array, s: Float64Array, p: number): Float64Array {
  const out = new Float64Array(p * p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) out[i * p + j] = F[i * p + j] * s[i] * s[j];
  return out;
}

/** The criterion object for the free parameters (Ds subset resolved by name, A weighted by today's variances). */
export function buildCriterion(kind: CriterionKind, freeNames: readonly string[], prior: Float64Array, subset?: readonly string[]): Criterion {
  const p = freeNames.length;
  if (kind === 'Ds') {
    const names = subset ?? [];
    if (!names.length) throw new RateloomError('E_VALUE', 'the Ds criterion needs the parameters of interest', { path: ['subset'], fix: `Name some of: ${freeNames.join(', ')}.` });
    const idx = names.map((n) => {
      const i = freeNames.indexOf(n);
      if (i < 0) throw new RateloomError('E_UNKNOWN_PARAMETER', `'${n}' is not a free parameter of the rate-law set`, { path: ['subset', n], fix: `Use some of: ${freeNames.join(', ')}.` });
      return i;
    });
    if (idx.length === p) return { kind: 'D' };
    return { kind: 'Ds', subset: idx };
  }
  if (kind === 'A') {
    const inv = inverseSpd(prior, p);
    return { kind: 'A', weights: Float64Array.from({ length: p }, (_, i) => (inv && inv[i * p + i] > 0 ? 1 / inv[i * p + i] : 1)) };
  }
  return { kind: 'D' };
}

/** Information in hand and of every usable candidate at each point, scaled alike. */
function informationAt(ctx: PlanContext, points: InformationPoint[], p: number): { priors: Float64Array[]; infos: Float64Array[][]; usable: number[] } {
  const raw = points.map((pt) => ({ prior: studyInformation(ctx.study, pt), cand: runInformation(ctx.candidateStudy, pt).infos }));
  const usable = ctx.usable.filter((c) => raw.every((r) => r.cand[c] !== null));
  const s = scaling(raw[0].prior, usable.map((c) => raw[0].cand[c] as Float64Array), p);
  return {
    priors: raw.map((r) => scaled(r.prior, s, p)),
    infos: raw.map((r) => usable.map((c) => scaled(r.cand[c] as Float64Array, s, p))),
    usable,
  };
}

/** Leave-one-out criterion loss of each chosen run, and the parameters whose variance it cuts most. */
function explain(prior: Float64Array, infos: Float64Array[], chosen: number[], p: number, crit: Criterion, freeNames: readonly string[]): { contributions: number[]; informs: string[][] } {
  const sum = (skip: number) => {
    const F = Float64Array.from(prior);
    chosen.forEach((c, k) => {
      if (k !== skip) for (let i = 0; i < p * p; i++) F[i] += infos[c][i];
    });
    return F;
  };
  const full = sum(-1);
  const vFull = criterionValue(full, p, crit);
  const invFull = inverseSpd(full, p);
  const contributions: number[] = [];
  const informs: string[][] = [];
  chosen.forEach((_, k) => {
    const without = sum(k);
    contributions.push(vFull - criterionValue(without, p, crit));
    const inv = inverseSpd(without, p);
    const cut = freeNames.map((name, i) => ({ name, r: inv && invFull ? 1 - invFull[i * p + i] / inv[i * p + i] : 0 }));
    informs.push(cut.sort((a, b) => b.r - a.r).slice(0, 2).filter((c) => c.r > 0.01).map((c) => `${c.name} (variance -${(100 * c.r).toFixed(0)} %)`));
  });
  return { contributions, informs };
}

/** Standard errors and interval widths now and after, from the unscaled information. */
export function precisionTable(sf: StudyFit, at: InformationPoint, now: Float64Array, after: Float64Array, addedObservations: number, level: number): ParameterPrecision[] {
  const p = at.free.length;
  const invNow = inverseSpd(now, p);
  const invAfter = inverseSpd(after, p);
  const st = sf.fit.statistics;
  const known = st.covarianceBasis === 'known-sigma';
  const q = (dof: number) => (known ? normalQuantile(1 - (1 - level) / 2) : dof > 0 ? studentTQuantile(1 - (1 - level) / 2, dof) : NaN);
  return at.free.map((idx, i) => {
    const fp = sf.fit.parameters[idx];
    const log = fp.transform === 'log';
    const se = (inv: Float64Array | null) => (inv && inv[i * p + i] > 0 ? Math.sqrt(inv[i * p + i]) : null);
    const width = (s: number | null, qq: number) => (s === null || !Number.isFinite(qq) ? null : log ? fp.value * (Math.exp(qq * s) - Math.exp(-qq * s)) : 2 * qq * s);
    const sNow = se(invNow);
    const sAfter = se(invAfter);
    const wNow = width(sNow, q(st.dof));
    const wAfter = width(sAfter, q(st.dof + addedObservations));
    return {
      name: fp.name,
      unit: fp.unit,
      value: fp.value,
      stdErrorNow: sNow === null ? null : log ? fp.value * sNow : sNow,
      stdErrorAfter: sAfter === null ? null : log ? fp.value * sAfter : sAfter,
      widthNow: wNow,
      widthAfter: wAfter,
      shrink: wNow !== null && wAfter !== null && wNow > 0 ? 1 - wAfter / wNow : null,
    };
  });
}

/** Standard errors and interval widths of a fit now and after the chosen candidates (unscaled information at the estimate). */
export function precisionAfter(ctx: PlanContext, sf: StudyFit, chosen: readonly number[], level: number): ParameterPrecision[] {
  const at = pointOfFit(sf);
  const p = at.free.length;
  const now = studyInformation(ctx.study, at);
  const cand = runInformation(ctx.candidateStudy, at).infos;
  const after = Float64Array.from(now);
  for (const c of chosen) {
    const A = cand[c];
    if (A) for (let i = 0; i < p * p; i++) after[i] += A[i];
  }
  const perRun = ctx.candidateStudy.observations.length / Math.max(1, ctx.candidateStudy.runs.length);
  return precisionTable(sf, at, now, after, chosen.length * perRun, level);
}

/** Plan n runs for precision of a fitted rate-law set. */
export function planPrecision(ctx: PlanContext, sf: StudyFit, o: PrecisionOptions): PrecisionPlan {
  const at = pointOfFit(sf);
  const p = at.free.length;
  if (p === 0) throw new RateloomError('E_VALUE', `the rate-law set '${sf.variant}' has no free parameters, so there is nothing to plan for`, { path: ['parameters'], fix: 'Free at least one parameter (remove "fixed": true).' });
  const freeNames = at.free.map((i) => sf.fit.parameters[i].name);
  const warnings: string[] = [];
  const d = parameterDraws(at, sf, o.draws, o.seed);
  if (d.warning) warnings.push(d.warning);
  const info = informationAt(ctx, d.points, p);
  const crit = buildCriterion(o.criterion, freeNames, info.priors[0], o.subset);
  const exchange = greedyExchange({ p, priors: info.priors, infos: info.infos, points: info.usable.map((c) => ctx.candidates.points[c]), n: o.n, minSpacing: ctx.limits.minSpacing, criterion: crit });
  const { contributions, informs } = explain(info.priors[0], info.infos[0], exchange.chosen, p, crit, freeNames);
  const chosen = exchange.chosen.map((k) => info.usable[k]);
  const precision = precisionAfter(ctx, sf, chosen, o.level);
  return { chosen, exchange, contributions, informs, precision, freeNames, draws: d.points.length > 1 ? d.points.length : 0, warnings };
}
