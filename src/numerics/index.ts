/**
 * Public surface of the numerics layer (pure numerical methods; no chemistry, no I/O).
 */
export type { OdeRhs, OdeJac, OdeEvent, OdeOptions, OdeStatus, OdeResult } from './ode-types';
export { integrate, ODE_STATUS, AUTO_STIFFNESS_THRESHOLD, OdeWorkspace } from './integrate';
export { Dopri5, type Dopri5Options } from './dopri5';
export { Rosenbrock, RODAS4, type RosenbrockOptions } from './rosenbrock';
export type { Stepper, StepperSettings, StepCode, OdeCounters } from './ode-common';
export { newCounters } from './ode-common';
export {
  luFactor,
  luSolve,
  luSolveTranspose,
  luRcond,
  luDecompose,
  solveLinear,
  norm1,
  LU_STATUS,
  ILL_CONDITIONED_RCOND,
  type LuStatus,
  type LuDecomposition,
  type LinearSolveResult,
} from './lu';
export {
  newton,
  NEWTON_STATUS,
  type NewtonStatus,
  type NewtonOptions,
  type NewtonResult,
  type NewtonResidual,
  type NewtonJacobian,
} from './newton';
export {
  brent,
  findAllRoots,
  BRENT_STATUS,
  ALL_ROOTS_STATUS,
  type BrentStatus,
  type BrentOptions,
  type BrentResult,
  type AllRootsStatus,
  type AllRootsOptions,
  type AllRootsResult,
} from './roots';
