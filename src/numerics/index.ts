/**
 * Public surface of the numerics layer (pure numerical methods; no chemistry, no I/O).
 */
export type { OdeRhs, OdeJac, OdeEvent, OdeOptions, OdeStatus, OdeResult } from './ode-types.js';
export { integrate, ODE_STATUS, AUTO_STIFFNESS_THRESHOLD, OdeWorkspace } from './integrate.js';
export { Dopri5, type Dopri5Options } from './dopri5.js';
export { Rosenbrock, RODAS4, type RosenbrockOptions } from './rosenbrock.js';
export type { Stepper, StepperSettings, StepCode, OdeCounters } from './ode-common.js';
export { newCounters } from './ode-common.js';
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
} from './lu.js';
export {
  newton,
  NEWTON_STATUS,
  type NewtonStatus,
  type NewtonOptions,
  type NewtonResult,
  type NewtonResidual,
  type NewtonJacobian,
} from './newton.js';
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
} from './roots.js';
