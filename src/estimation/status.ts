/**
 * The status table shared by the least-squares solvers and the fit (see core/outcome.ts):
 * `success` follows from the code alone. Only the three convergence tests count as success, and
 * a fit keeps one of them only when its verdict (verdict.ts) is trustworthy; the last five codes
 * are verdict statuses.
 */
import type { StatusTable } from '../core/outcome.js';

export type FitStatus =
  | 'converged-ftol'
  | 'converged-xtol'
  | 'converged-gtol'
  | 'max-iterations'
  | 'max-evaluations'
  | 'model-failure'
  | 'singular'
  | 'no-search'
  | 'degenerate'
  | 'no-dof'
  | 'misfit'
  | 'not-identifiable';

export const FIT_STATUS: StatusTable<FitStatus> = {
  'converged-ftol': {
    success: true,
    message: 'Converged: the relative reduction of the sum of squares fell below ftol',
  },
  'converged-xtol': {
    success: true,
    message: 'Converged: the relative change of the scaled parameters fell below xtol',
  },
  'converged-gtol': {
    success: true,
    message: 'Converged: the scaled gradient (cosine between residuals and Jacobian columns) fell below gtol',
  },
  'max-iterations': {
    success: false,
    message: 'Not converged: the iteration limit was reached',
  },
  'max-evaluations': {
    success: false,
    message: 'Not converged: the model-evaluation limit was reached',
  },
  'model-failure': {
    success: false,
    message: 'Not converged: the model could not be evaluated',
  },
  singular: {
    success: false,
    message: 'The Jacobian at the solution is rank-deficient: some parameters are not identifiable from these data',
  },
  'no-search': {
    success: false,
    message: 'Not trustworthy: a convergence test was met before any step was accepted',
  },
  degenerate: {
    success: false,
    message: 'Not trustworthy: the search ended at a degenerate solution',
  },
  'no-dof': {
    success: false,
    message: 'Not trustworthy: no degrees of freedom are left to estimate the error scale',
  },
  misfit: {
    success: false,
    message: 'Not trustworthy: the model does not fit the data within the stated measurement error',
  },
  'not-identifiable': {
    success: false,
    message: 'Not trustworthy: some parameters are not identifiable from these data',
  },
};
