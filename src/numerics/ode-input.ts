/**
 * Input checking for integrate(). Policy (documented on integrate): invalid input never throws;
 * it yields status 'bad-input' with a message naming the field, because in a fit the initial
 * state is computed from trial parameters and may legitimately be non-finite. Callers must check
 * `success` before using the result.
 */
import type { OdeEvent, OdeJac, OdeOptions, OdeRhs } from './ode-types.js';

/** Validated, defaulted integration settings. */
export interface OdeConfig {
  n: number;
  y0: Float64Array;
  rtol: number;
  atol: Float64Array;
  method: 'auto' | 'nonstiff' | 'stiff' | 'odex';
  jac?: OdeJac;
  maxSteps: number;
  maxEvaluations: number;
  initialStep?: number;
  hmax: number;
  autonomous: boolean;
  tEval: Float64Array;
  events: OdeEvent[];
  direction: 1 | -1;
  warnings: { code: string; message: string }[];
}

export type OdeInputCheck = { ok: true; config: OdeConfig } | { ok: false; message: string; n: number };

/** Smallest relative tolerance honoured; smaller requests are raised with a warning. */
export const MIN_RTOL = 1e-14;

/** Shared empty tEval (read only). */
const NO_TIMES = new Float64Array(0);
/** Shared empty event list (never modified). */
const NO_EVENTS: OdeEvent[] = [];

/**
 * Work arrays a caller may lend to checkOdeInput so that a repeated solve allocates nothing here:
 * `buffers(n)` returns arrays of length n that become config.y0 and config.atol (and are
 * overwritten by the next call that borrows them).
 */
export type OdeInputBuffers = (n: number) => { y: Float64Array; atol: Float64Array };

/** A failed check (a plain function: a closure here would be created on every call). */
function bad(n: number, message: string): OdeInputCheck {
  return { ok: false, message, n };
}

export function checkOdeInput(
  f: OdeRhs,
  t0: number,
  y0: ArrayLike<number>,
  t1: number,
  options: OdeOptions,
  buffers?: OdeInputBuffers,
): OdeInputCheck {
  const n = y0 && typeof y0.length === 'number' ? y0.length : 0;
  if (typeof f !== 'function') return bad(n, 'f must be a function (t, y, out) => void');
  if (n === 0) return bad(n, 'y0 must have at least one component');
  const lent = buffers ? buffers(n) : undefined;
  const y = lent ? lent.y : new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = Number(y0[i]);
    if (!Number.isFinite(v)) return bad(n, `y0[${i}] is not finite (${y0[i]})`);
    y[i] = v;
  }
  if (!Number.isFinite(t0)) return bad(n, `t0 is not finite (${t0})`);
  if (!Number.isFinite(t1)) return bad(n, `t1 is not finite (${t1})`);
  if (t1 === t0) return bad(n, 't1 equals t0; there is nothing to integrate');
  const warnings: { code: string; message: string }[] = [];

  let rtol = options.rtol ?? 1e-8;
  if (!(rtol > 0) || !Number.isFinite(rtol)) return bad(n, `rtol must be a positive finite number (got ${rtol})`);
  if (rtol < MIN_RTOL) {
    warnings.push({ code: 'rtol-raised', message: `rtol ${rtol} is below ${MIN_RTOL} and was raised to it` });
    rtol = MIN_RTOL;
  }
  const atol = lent ? lent.atol : new Float64Array(n);
  const atolIn = options.atol ?? 1e-10;
  if (typeof atolIn === 'number') {
    if (!(atolIn > 0) || !Number.isFinite(atolIn)) return bad(n, `atol must be a positive finite number (got ${atolIn})`);
    atol.fill(atolIn);
  } else {
    if (atolIn.length !== n) return bad(n, `atol has ${atolIn.length} entries but y0 has ${n}`);
    for (let i = 0; i < n; i++) {
      if (!(atolIn[i] > 0) || !Number.isFinite(atolIn[i])) return bad(n, `atol[${i}] must be a positive finite number (got ${atolIn[i]})`);
      atol[i] = atolIn[i];
    }
  }

  const method = options.method ?? 'auto';
  if (method !== 'auto' && method !== 'nonstiff' && method !== 'stiff' && method !== 'odex') {
    return bad(n, `method must be 'auto', 'nonstiff', 'stiff' or 'odex' (got '${String(method)}')`);
  }
  if (options.jac !== undefined && typeof options.jac !== 'function') return bad(n, 'jac must be a function');

  const maxSteps = options.maxSteps ?? 100000;
  if (!Number.isInteger(maxSteps) || maxSteps < 1) return bad(n, `maxSteps must be a positive integer (got ${maxSteps})`);
  const maxEvaluations = options.maxEvaluations ?? 2000000;
  if (!Number.isInteger(maxEvaluations) || maxEvaluations < 1) {
    return bad(n, `maxEvaluations must be a positive integer (got ${maxEvaluations})`);
  }
  const span = Math.abs(t1 - t0);
  if (options.initialStep !== undefined && (!(options.initialStep !== 0) || !Number.isFinite(options.initialStep))) {
    return bad(n, `initialStep must be a non-zero finite number (got ${options.initialStep})`);
  }
  const hmax = options.maxStep ?? span;
  if (!(hmax > 0) || !Number.isFinite(hmax)) return bad(n, `maxStep must be a positive finite number (got ${hmax})`);

  const direction: 1 | -1 = t1 > t0 ? 1 : -1;
  const tEvalIn = options.tEval ?? NO_TIMES;
  const tEval = tEvalIn.length === 0 ? NO_TIMES : new Float64Array(tEvalIn.length);
  const lo = Math.min(t0, t1);
  const hi = Math.max(t0, t1);
  for (let i = 0; i < tEvalIn.length; i++) {
    const v = tEvalIn[i];
    if (!Number.isFinite(v)) return bad(n, `tEval[${i}] is not finite (${v})`);
    if (v < lo || v > hi) return bad(n, `tEval[${i}] = ${v} lies outside the integration interval [${lo}, ${hi}]`);
    if (i > 0 && direction * (v - tEval[i - 1]) < 0) {
      return bad(n, `tEval must be sorted in the direction of integration (${direction > 0 ? 'increasing' : 'decreasing'}); tEval[${i}] = ${v} is out of order`);
    }
    tEval[i] = v;
  }
  const events = options.events ?? NO_EVENTS;
  for (let k = 0; k < events.length; k++) {
    const e = events[k];
    if (!e || typeof e.g !== 'function') return bad(n, `events[${k}].g must be a function (t, y) => number`);
    if (e.direction !== undefined && e.direction !== -1 && e.direction !== 0 && e.direction !== 1) {
      return bad(n, `events[${k}].direction must be -1, 0 or 1`);
    }
  }

  const config: OdeConfig = {
    n, y0: y, rtol, atol, method, maxSteps, maxEvaluations, hmax,
    autonomous: options.autonomous ?? false,
    tEval, events, direction, warnings,
  };
  if (options.jac) config.jac = options.jac;
  if (options.initialStep !== undefined) config.initialStep = Math.abs(options.initialStep);
  return { ok: true, config };
}
