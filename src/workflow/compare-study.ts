/**
 * Fit every rate-law set of a study (the study's own and each candidate) to the same data and rank
 * them with estimation/compare.ts (SSR, dof, AICc, BIC, Akaike weights, F tests for nested pairs).
 */
import { compareModels, type Comparison } from '../estimation/compare.js';
import type { Study } from '../study/types.js';
import { fitStudy, studyVariants, type StudyFit, type StudyFitOptions } from './fit-study.js';
import { FIT_OPTIONS, checkArgs, is, options as options_ } from '../core/args.js';

export interface StudyComparison {
  fits: StudyFit[];
  comparison: Comparison;
}

export interface StudyCompareOptions extends Omit<StudyFitOptions, 'variant'> {
  /** Called after each model is fitted with (done, total). */
  progress?: (done: number, total: number) => void;
}

/** Nested pairs are those the study declares (candidate `nests`); none is assumed. */
function nestedPairs(study: Study): Array<readonly [string, string]> {
  const out: Array<readonly [string, string]> = [];
  for (const c of study.candidates) {
    if (c.nests) out.push([c.nests, c.name] as const);
  }
  return out;
}

export function compareStudy(study: Study, options: StudyCompareOptions = {}): StudyComparison {
  checkArgs('compareStudy', [study, options], [{ name: 'study', check: is.study }, options_('options', FIT_OPTIONS)]);
  const variants = studyVariants(study);
  const fits: StudyFit[] = [];
  variants.forEach((v, i) => {
    fits.push(fitStudy(study, { ...options, variant: v.name }));
    options.progress?.(i + 1, variants.length);
  });
  return rankStudyFits(study, fits);
}

/** Rank the fits of a study's rate-law sets (in studyVariants order) against each other. */
export function rankStudyFits(study: Study, fits: StudyFit[]): StudyComparison {
  const comparison = compareModels(
    fits.map((f) => ({ name: f.variant, fit: f.fit })),
    { nested: nestedPairs(study) },
  );
  return { fits, comparison };
}
