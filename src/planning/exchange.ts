/**
 * Greedy construction followed by Fedorov exchange over a finite candidate set (Fedorov 1972,
 * "Theory of Optimal Experiments", Academic Press, ch. 3; the one-point exchange as described by
 * Cook & Nachtsheim 1980, Technometrics 22, 315-324). The design is the information already in hand
 * plus the information of N chosen candidates; each step adds, then swaps, the candidate that
 * raises the criterion most, until no swap improves it. The criterion may be averaged over several
 * parameter draws (a Bayesian-style design: Chaloner & Verdinelli 1995, Statistical Science 10,
 * 273-304): each draw has its own prior information and candidate informations.
 */
import { criterionValue, type Criterion } from './criteria.js';

export interface ExchangeProblem {
  /** Number of free parameters. */
  p: number;
  /** Per parameter draw: the information already in hand (p x p). */
  priors: Float64Array[];
  /** Per draw, per candidate: the information one run at that candidate adds (p x p). */
  infos: Float64Array[][];
  /** Per candidate: coordinates scaled to [0, 1] per factor, for the spacing rule. */
  points: Float64Array[];
  /** Runs to choose (>= 1). */
  n: number;
  /** Smallest Euclidean distance between two chosen runs in scaled coordinates; 0 allows repeats. */
  minSpacing: number;
  criterion: Criterion;
  /** Exchange passes at most; default 20. */
  maxPasses?: number;
}

export interface ExchangeResult {
  /** Candidate index of each chosen run, in the order they were added. */
  chosen: number[];
  /** Criterion (mean over draws) of the final design. */
  value: number;
  /** Criterion of the information in hand alone. */
  startValue: number;
  /** Criterion gain when each run was added in the greedy pass. */
  gains: number[];
  /** Exchange passes made and swaps accepted. */
  passes: number;
  swaps: number;
}

function distance(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] - b[i]) ** 2;
  return Math.sqrt(s);
}

/** Mean criterion over draws of (prior + chosen candidates + extra candidate). */
function designValue(pr: ExchangeProblem, chosen: readonly number[], extra: number, skip: number): number {
  const pp = pr.p * pr.p;
  const F = new Float64Array(pp);
  let total = 0;
  for (let d = 0; d < pr.priors.length; d++) {
    F.set(pr.priors[d]);
    for (let k = 0; k < chosen.length; k++) {
      if (k === skip) continue;
      const A = pr.infos[d][chosen[k]];
      for (let i = 0; i < pp; i++) F[i] += A[i];
    }
    if (extra >= 0) {
      const A = pr.infos[d][extra];
      for (let i = 0; i < pp; i++) F[i] += A[i];
    }
    total += criterionValue(F, pr.p, pr.criterion);
  }
  return total / pr.priors.length;
}

/** Whether candidate c keeps the spacing rule against `chosen` (without position `skip`). */
export function spacedApart(points: readonly Float64Array[], minSpacing: number, chosen: readonly number[], c: number, skip: number): boolean {
  if (minSpacing <= 0) return true;
  for (let k = 0; k < chosen.length; k++) {
    if (k !== skip && distance(points[chosen[k]], points[c]) < minSpacing) return false;
  }
  return true;
}

/**
 * Any set criterion the greedy-plus-exchange search can maximise: `value(chosen, extra, skip)` is
 * the criterion of `chosen` without position `skip` (-1: none) plus candidate `extra` (-1: none).
 */
export interface SearchProblem {
  /** Number of candidates. */
  count: number;
  /** Runs to choose. */
  n: number;
  value(chosen: readonly number[], extra: number, skip: number): number;
  admissible(chosen: readonly number[], c: number, skip: number): boolean;
  /** Exchange passes at most; default 20. */
  maxPasses?: number;
}

/** Best admissible candidate to add to `chosen` (without position `skip`); -1 when none. */
function bestAddition(pr: SearchProblem, chosen: readonly number[], skip: number): { index: number; value: number } {
  let index = -1;
  let value = -Infinity;
  for (let c = 0; c < pr.count; c++) {
    if (!pr.admissible(chosen, c, skip)) continue;
    const v = pr.value(chosen, c, skip);
    if (v > value || index < 0) {
      value = v;
      index = c;
    }
  }
  return { index, value };
}

/** One exchange pass over every chosen position; returns the swaps made. */
function exchangePass(pr: SearchProblem, chosen: number[], current: { value: number }): number {
  let swaps = 0;
  for (let k = 0; k < chosen.length; k++) {
    const best = bestAddition(pr, chosen, k);
    const tol = 1e-10 * Math.max(1, Math.abs(current.value));
    if (best.index >= 0 && best.index !== chosen[k] && best.value > current.value + tol) {
      chosen[k] = best.index;
      current.value = best.value;
      swaps++;
    }
  }
  return swaps;
}

/**
 * When the information in hand is singular (no runs yet, or too few), every first addition scores
 * -Infinity and the greedy pass cannot rank them. A ridge of 1e-9 times the mean candidate
 * information's diagonal breaks the tie (it changes the criterion by a relative 1e-9 or so).
 */
function withRidge(pr: ExchangeProblem): ExchangeProblem {
  const p = pr.p;
  const priors = pr.priors.map((F, d) => {
    if (Number.isFinite(criterionValue(F, p, { kind: 'D' }))) return F;
    const out = Float64Array.from(F);
    for (let i = 0; i < p; i++) {
      let mean = 0;
      for (const A of pr.infos[d]) mean += A[i * p + i];
      mean /= Math.max(1, pr.infos[d].length);
      out[i * p + i] += 1e-9 * (mean > 0 ? mean : 1);
    }
    return out;
  });
  return { ...pr, priors };
}

/**
 * Choose pr.n candidates: greedy additions, then exchange passes until none improves the design.
 * Fewer than n runs come back when the admissibility rule leaves no candidate.
 */
export function exchangeSearch(pr: SearchProblem): ExchangeResult {
  const chosen: number[] = [];
  const gains: number[] = [];
  const startValue = pr.value([], -1, -1);
  let value = startValue;
  for (let step = 0; step < pr.n; step++) {
    const best = bestAddition(pr, chosen, -1);
    if (best.index < 0) break;
    chosen.push(best.index);
    gains.push(best.value - value);
    value = best.value;
  }
  const current = { value };
  let passes = 0;
  let swaps = 0;
  const maxPasses = pr.maxPasses ?? 20;
  while (passes < maxPasses) {
    passes++;
    const s = exchangePass(pr, chosen, current);
    swaps += s;
    if (s === 0) break;
  }
  return { chosen, value: current.value, startValue, gains, passes, swaps };
}

/** Greedy construction and Fedorov exchange of an information-based design (see the file header). */
export function greedyExchange(problem: ExchangeProblem): ExchangeResult {
  const pr = withRidge(problem);
  return exchangeSearch({
    count: pr.points.length,
    n: pr.n,
    value: (chosen, extra, skip) => designValue(pr, chosen, extra, skip),
    admissible: (chosen, c, skip) => spacedApart(pr.points, pr.minSpacing, chosen, c, skip),
    ...(pr.maxPasses !== undefined ? { maxPasses: pr.maxPasses } : {}),
  });
}
