/**
 * Public surface of the estimation core (named exports only). It knows models only through
 * RegressionModel (model.ts).
 */
export type { RegressionModel, PredictionFailure } from './model';
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
} from './fit-types';
export { FIT_STATUS, type FitStatus } from './status';
export { fitModel, assembleFit } from './fit';
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
} from './verdict';
export { findInfluential, influenceThresholds, type InfluenceOptions, type InfluenceThresholds } from './influence';
export { multistartFit, latinHypercube, type MultistartOptions, type MultistartResult, type Minimum } from './multistart';
export { compareModels, type Comparison, type CompareOptions, type NestedTest, type RankedModel, type RivalFit } from './compare';
export { levenbergMarquardt, type LmOptions, type LmResult } from './lm';
export { cardLevenbergMarquardt, type CardLmOptions } from './card-lm';
export { ResidualProblem, type LeastSquaresProblem, type ResidualProblemInit } from './residuals';
export { profileParameter, type ProfileRequest } from './profile';
export { checkJacobian, type JacobianCheck, type JacobianCheckOptions } from './jacobian-check';
export { mulberry32, type Random } from './random';
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
} from './distributions';
