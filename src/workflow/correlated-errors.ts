/**
 * Correlated errors of lab responses within a run. Responses computed from the same analyser
 * fractions share errors: every ratio y_i / y_s of a run carries the error of the standard's
 * fraction y_s, and a conversion, selectivity or yield combines several fractions. With the error
 * loadings l = (dh/dy_i) sigma_i of each response (src/study/lab-measures.ts, delta method, first
 * order), two responses a, b of a run have covariance l_a . l_b and correlation
 * R_ab = l_a . l_b / (|l_a| |l_b|). Each run whose lab responses are correlated becomes one
 * whitening block of the fit (src/estimation/whiten.ts, generalised least squares).
 *
 * A run whose R is singular (two responses carry the same numbers, e.g. a ratio and the conversion
 * derived from it) cannot be whitened: it is fitted as independent and named, so that the fit can
 * warn that the same measurement counts twice.
 */
import { whitenBlock, type WhitenBlock } from '../estimation/whiten.js';
import type { Observation, Study } from '../study/types.js';

/** Correlations below this are treated as zero (no block). */
const NEGLIGIBLE = 1e-12;

export interface CorrelatedErrors {
  blocks: WhitenBlock[];
  /** Runs whose lab responses are linearly dependent (fitted as independent). */
  dependentRuns: string[];
}

function dot(a: readonly number[], b: readonly number[]): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/** Correlation matrix of one run's lab responses and whether any correlation is not negligible. */
function correlation(obs: readonly Observation[]): { R: Float64Array; correlated: boolean } {
  const k = obs.length;
  const R = new Float64Array(k * k);
  const norm = obs.map((o) => Math.sqrt(dot(o.errorLoadings!, o.errorLoadings!)));
  let correlated = false;
  for (let a = 0; a < k; a++) {
    for (let b = 0; b < k; b++) {
      const r = a === b ? 1 : dot(obs[a].errorLoadings!, obs[b].errorLoadings!) / (norm[a] * norm[b]);
      R[a * k + b] = r;
      if (a !== b && Math.abs(r) > NEGLIGIBLE) correlated = true;
    }
  }
  return { R, correlated };
}

/** The whitening blocks of a study's lab responses, one per run with correlated responses. */
export function correlatedLabErrors(study: Study): CorrelatedErrors {
  const byRun = new Map<number, Observation[]>();
  for (const o of study.observations) {
    if (!o.errorLoadings || !(dot(o.errorLoadings, o.errorLoadings) > 0)) continue;
    const list = byRun.get(o.runIndex) ?? [];
    list.push(o);
    byRun.set(o.runIndex, list);
  }
  const blocks: WhitenBlock[] = [];
  const dependentRuns: string[] = [];
  for (const obs of byRun.values()) {
    if (obs.length < 2) continue;
    const { R, correlated } = correlation(obs);
    if (!correlated) continue;
    const block = whitenBlock(obs.map((o) => o.index), R);
    if (block) blocks.push(block);
    else dependentRuns.push(obs[0].runId);
  }
  return { blocks, dependentRuns };
}
