/**
 * Shared machinery of the one-step ODE integrators: the status table, work counters and budgets,
 * the weighted RMS error norm and the starting step-size heuristic of Hairer, Norsett & Wanner,
 * Solving ODEs I, 2nd ed., sec. II.4 ("Starting step size", the HINIT routine).
 *
 * A stepper advances one accepted step at a time and then offers dense output on its last step;
 * integrate.ts drives tEval output, event location and method switching on top of that.
 */
import type { OdeRhs, OdeStatus } from './ode-types.js';
import type { StatusTable } from '../core/outcome.js';

/** Status table of integrate(); `success` is derived from the code. */
export const ODE_STATUS: StatusTable<OdeStatus> = {
  success: { success: true, message: 'integration reached the final time' },
  event: { success: true, message: 'integration stopped at a terminal event' },
  'max-steps': { success: false, message: 'the step budget (maxSteps) was used up before the final time' },
  'max-evaluations': {
    success: false,
    message: 'the right-hand-side evaluation budget (maxEvaluations) was used up before the final time',
  },
  'step-size-too-small': {
    success: false,
    message: 'the step size fell below the rounding level of t; the problem may be singular or too stiff',
  },
  'non-finite': {
    success: false,
    message: 'the right-hand side kept returning non-finite values (NaN or Infinity) even for tiny steps',
  },
  'bad-input': { success: false, message: 'the integration input is invalid' },
};

/** Work counters shared by all steppers of one integrate() call (budgets apply to the sum). */
export interface OdeCounters {
  rhs: number;
  jac: number;
  steps: number;
  rejected: number;
  lu: number;
}

export function newCounters(): OdeCounters {
  return { rhs: 0, jac: 0, steps: 0, rejected: 0, lu: 0 };
}

/** Settings common to all steppers (already validated). */
export interface StepperSettings {
  f: OdeRhs;
  n: number;
  rtol: number;
  /** Per-component absolute tolerance (length n). */
  atol: Float64Array;
  /** Largest |h|. */
  hmax: number;
  maxSteps: number;
  maxEvaluations: number;
  counters: OdeCounters;
}

/** Result code of one stepper call: 'ok' means one step was accepted. */
export type StepCode = 'ok' | Exclude<OdeStatus, 'success' | 'event' | 'bad-input'>;

/** What integrate() needs from a one-step method. */
export interface Stepper {
  /** Time and state after the last accepted step (owned by the stepper; copy before keeping). */
  readonly t: number;
  readonly y: Float64Array;
  /** Start of the last accepted step. */
  readonly tOld: number;
  /** Proposed size of the next step (signed). */
  readonly h: number;
  /** Set by a non-stiff stepper once its stiffness test has fired repeatedly. */
  readonly stiff: boolean;
  /** Advance by one accepted step, never past tEnd; returns 'ok' or a failure status. */
  step(tEnd: number): StepCode;
  /** Dense output on the last accepted step, for tOld <= s <= t (either direction). */
  dense(s: number, out: Float64Array): void;
}

/** Consecutive non-finite trial steps tolerated before giving up with 'non-finite'. */
export const MAX_NONFINITE_RETRIES = 40;

/** True when every entry is finite. */
export function allFinite(v: Float64Array, n: number): boolean {
  for (let i = 0; i < n; i++) if (!Number.isFinite(v[i])) return false;
  return true;
}

/**
 * Weighted RMS norm sqrt(mean((e_i / sc_i)^2)), sc_i = atol_i + rtol max(|y0_i|, |y1_i|)
 * (Hairer, Norsett & Wanner I, eq. II.4.11). Returns Infinity for non-finite input.
 */
export function errorNorm(
  e: Float64Array,
  y0: Float64Array,
  y1: Float64Array,
  rtol: number,
  atol: Float64Array,
  n: number,
): number {
  let s = 0;
  for (let i = 0; i < n; i++) {
    const sc = atol[i] + rtol * Math.max(Math.abs(y0[i]), Math.abs(y1[i]));
    const r = e[i] / sc;
    s += r * r;
  }
  const v = Math.sqrt(s / Math.max(1, n));
  return Number.isFinite(v) ? v : Infinity;
}

/**
 * Starting step size (HINIT of Hairer, Norsett & Wanner I, sec. II.4): an explicit Euler trial
 * step estimates the second derivative; `order` is the method order. Uses one extra evaluation
 * of f (written into work arrays y1/f1). Returns a signed step; never 0.
 */
export function initialStep(
  f: OdeRhs,
  t0: number,
  y0: Float64Array,
  f0: Float64Array,
  direction: number,
  order: number,
  settings: StepperSettings,
  y1: Float64Array,
  f1: Float64Array,
): number {
  const { n, rtol, atol, hmax } = settings;
  let dnf = 0;
  let dny = 0;
  for (let i = 0; i < n; i++) {
    const sk = atol[i] + rtol * Math.abs(y0[i]);
    dnf += (f0[i] / sk) ** 2;
    dny += (y0[i] / sk) ** 2;
  }
  let h = dnf <= 1e-10 || dny <= 1e-10 ? 1e-6 : Math.sqrt(dny / dnf) * 0.01;
  h = Math.min(h, hmax);
  for (let i = 0; i < n; i++) y1[i] = y0[i] + direction * h * f0[i];
  f(t0 + direction * h, y1, f1);
  settings.counters.rhs++;
  let der2 = 0;
  for (let i = 0; i < n; i++) {
    const sk = atol[i] + rtol * Math.abs(y0[i]);
    der2 += ((f1[i] - f0[i]) / sk) ** 2;
  }
  der2 = Math.sqrt(der2) / h;
  const der12 = Math.max(Math.abs(der2), Math.sqrt(dnf));
  const h1 = !Number.isFinite(der12) ? h * 1e-3 : der12 <= 1e-15 ? Math.max(1e-6, h * 1e-3) : (0.01 / der12) ** (1 / order);
  h = Math.min(100 * h, h1, hmax);
  if (!(h > 0) || !Number.isFinite(h)) h = Math.min(1e-6, hmax);
  return direction * h;
}

/** Smallest step magnitude allowed at time t (rounding level). */
export function minStep(t: number, h: number): number {
  return 16 * Number.EPSILON * Math.max(Math.abs(t), Math.abs(t + h));
}
