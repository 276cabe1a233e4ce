/**
 * The shape of a run plan: the runs proposed, why each was chosen, the expected precision after
 * them beside today's, and (discrimination) the expected posterior model probabilities. Plain data,
 * SI values with their units; serialises to JSON as is.
 */
import type { Outcome } from '../core/outcome.js';

export type PlanStatus = 'planned' | 'fewer-runs' | 'fit-not-trustworthy' | 'no-candidates' | 'indistinguishable';

export type PlanMode = 'precision' | 'discrimination';

export type DiscriminationCriterion = 'box-hill' | 'hunter-reiner';

/** One condition of a planned run. */
export interface PlannedCondition {
  /** 'temperature' or 'feed.H2O'. */
  key: string;
  /** CSV header in the study's layout. */
  column: string;
  /** SI value and unit. */
  value: number;
  unit: string;
  /** The value in the column's own unit (as in the CSV) and that unit. */
  shown: number;
  shownUnit: string;
  /** Whether the plan chose it (true) or held it at the study's usual value. */
  varied: boolean;
}

export interface PlannedRun {
  id: string;
  conditions: PlannedCondition[];
  /** Why this run: its share of the criterion and what it informs. */
  reason: string;
  /** Criterion lost if this run were dropped from the plan (criterion units; see `criterion`). */
  contribution: number;
  /** Predicted conversion of the key reactant (fraction) at today's parameters, where defined. */
  predictedConversion: number | null;
  /** Factors scaled to 0..1 over the limits (for charts). */
  scaled: number[];
}

export interface ParameterPrecision {
  name: string;
  /** SI unit of the value, standard errors and widths. */
  unit: string;
  value: number;
  stdErrorNow: number | null;
  stdErrorAfter: number | null;
  /** Width of the linear interval at `level` (hi - lo, SI). */
  widthNow: number | null;
  widthAfter: number | null;
  /** 1 - widthAfter / widthNow; null when either is unknown. */
  shrink: number | null;
}

export interface ModelProbability {
  model: string;
  /** Akaike weight of the model on today's data (the prior of the plan). */
  now: number;
  /** Expected posterior probability of the model after the planned runs when it is the true one. */
  expectedIfTrue: number;
}

export interface DiscriminationSummary {
  criterion: DiscriminationCriterion;
  models: ModelProbability[];
  /** expected[i][j]: expected posterior probability of model j when model i is true. */
  expected: number[][];
  /** Monte Carlo draws behind `expected`. */
  draws: number;
}

export interface ExcludedCandidates {
  reason: string;
  count: number;
}

export interface PlanResult extends Outcome<PlanStatus> {
  mode: PlanMode;
  /** 'D', 'Ds', 'A' (precision) or 'box-hill' / 'hunter-reiner' (discrimination). */
  criterion: string;
  /** Ds: the parameters of interest. */
  subset?: string[];
  /** The rate-law set the precision is planned for (precision mode). */
  model: string;
  /** Parameter draws the criterion was averaged over (0: local design at the estimate). */
  draws: number;
  runs: PlannedRun[];
  /** The planned runs in the study's own CSV layout, inputs filled, measured columns empty. */
  csv: string;
  precision: ParameterPrecision[];
  level: number;
  discrimination?: DiscriminationSummary;
  candidates: { count: number; usable: number; excluded: ExcludedCandidates[] };
  /** The study's runs in the scaled condition space (for charts). */
  oldRuns: { id: string; scaled: number[]; values: number[] }[];
  /** The varied conditions: SI range and unit, and the range in the study's column unit (shownMin..shownMax). */
  factors: { key: string; column: string; unit: string; min: number; max: number; shownUnit: string; shownMin: number; shownMax: number }[];
}
