/**
 * Public surface of the estimation core (named exports only). It knows models only through
 * RegressionModel (model.ts).
 */
export type { RegressionModel } from './model.js';
export type { FitData, FitOptions, FitResult, FittedParameter } from './fit-types.js';

export { fitModel } from './fit.js';
export { applyVerdict, decideFitVerdict, minimumFound, DEFAULT_VERDICT_RULES, type FitVerdict, type FitVerdictInput, type FitVerdictStatus, type VerdictRules } from './verdict.js';

export { multistartFit } from './multistart.js';
export { compareModels, type Comparison } from './compare.js';
export { levenbergMarquardt } from './lm.js';

export { profileParameter } from './profile.js';

