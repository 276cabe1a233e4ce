/**
 * Public surface of the estimation core (named exports only). It knows models only through
 * RegressionModel (model.ts).
 */
export type { RegressionModel, PredictionFailure } from './model.js';
export type {
  FitData,
  FitOptions,
  FitResult,
  FitStatistics,
  FittedParameter,
  InfluentialObservation,
  LackOfFit,
  ObservationDiagnostics,
  ParameterInterval,
  ParameterProfile,
  ProfileEnd,
  ProfilePoint,
  SolverName,
} from './fit-types.js';
export { FIT_STATUS, type FitStatus } from './status.js';
export { fitModel, assembleFit } from './fit.js';
export {
  applyVerdict,
  decideFitVerdict,
  minimumFound,
  verdictInput,
  DEFAULT_VERDICT_RULES,
  type FitVerdict,
  type FitVerdictInput,
  type FitVerdictStatus,
  type VerdictRules,
} from './verdict.js';
export { findInfluential, influenceThresholds, type InfluenceOptions, type InfluenceThresholds } from './influence.js';
export { multistartFit, latinHypercube, type MultistartOptions, type MultistartResult, type Minimum } from './multistart.js';
export { compareModels, type Comparison, type CompareOptions, type NestedTest, type RankedModel, type RivalFit } from './compare.js';
export { levenbergMarquardt, type LmOptions, type LmResult } from './lm.js';
export { cardLevenbergMarquardt, type CardLmOptions } from './card-lm.js';
export { ResidualProblem, type LeastSquaresProblem, type ResidualProblemInit } from './residuals.js';
export { profileParameter, type ProfileRequest } from './profile.js';
export { checkJacobian, type JacobianCheck, type JacobianCheckOptions } from './jacobian-check.js';
export { mulberry32, type Random } from './random.js';
export {
  chiSquareCdf,
  chiSquareQuantile,
  fCdf,
  fQuantile,
  fSurvival,
  normalCdf,
  normalQuantile,
  studentTCdf,
  studentTQuantile,
} from './distributions.js';
