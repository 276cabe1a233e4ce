/**
 * Fit every rate-law set of a study (the study's own and each candidate) to the same data and rank
 * them with estimation/compare.ts (SSR, dof, AICc, BIC, Akaike weights, F tests for nested pairs).
 */
import { compareModels, type Comparison } from '../estimation/compare';
import type { Study } from '../study/types';
import { fitStudy, studyVariants, type StudyFit, type StudyFitOptions } from './fit-study';

export interface StudyComparison {
  fits: StudyFit[];
  comparison: Comparison;
}

export interface StudyCompareOptions extends Omit<StudyFitOptions, 'variant'> {
  /** Called after each model is fitted with (done, total). */
  progress?: (done: number, total: number) => void;
}

/**
 * Nested pairs: a candidate that declares `nests` (the name of a simpler set it contains) — when
 * the study format gives it; otherwise pairs whose parameter sets are strict subsets of each other
 * and whose rate-law forms allow it are not assumed, only declared pairs are tested.
 */
function nestedPairs(study: Study): Array<readonly [string, string]> {
  const out: Array<readonly [string, string]> = [];
  for (const c of study.candidates as Array<{ name: string; nests?: string }>) {
    if (c.nests) out.push([c.nests, c.name] as const);
  }
  return out;
}

export function compareStudy(study: Study, options: StudyCompareOptions = {}): StudyComparison {
  const variants = studyVariants(study);
  const fits: StudyFit[] = [];
  variants.forEach((v, i) => {
    fits.push(fitStudy(study, { ...options, variant: v.name }));
    options.progress?.(i + 1, variants.length);
  });
  const comparison = compareModels(
    fits.map((f) => ({ name: f.variant, fit: f.fit })),
    { nested: nestedPairs(study) },
  );
  return { fits, comparison };
}
