/**
 * Output side of integrate(): solution rows at tEval points and event location on the dense
 * output of each accepted step. An event fires where g changes sign between step ends (so two
 * sign changes inside one step are not seen; limit maxStep if that matters). The crossing is
 * located by the Illinois variant of regula falsi (Dowell & Jarratt 1971, BIT 11) on the dense
 * output, to about 1e-12 relative in t; the reported time is the end of the final bracket on the
 * far side of the crossing, so g has changed sign at the reported state. A non-finite g value
 * never fires an event.
 *
 * Per step this allocates nothing unless a tEval row or an event is recorded.
 */
import type { OdeEvent, OdeResult, OdeStatus } from './ode-types.js';
import { ODE_STATUS, type OdeCounters } from './ode-common.js';
import { outcome } from '../core/outcome.js';

/** Anything that can interpolate on its last accepted step. */
export interface DenseSource {
  dense(s: number, out: Float64Array): void;
}

/** Relative tolerance of event times. */
export const EVENT_RTOL = 1e-12;
const EVENT_MAX_ITER = 200;

/** Records tEval rows and events step by step; tells the driver when a terminal event fired. */
export class OdeRecorder {
  tOut: number[] = [];
  yOut: Float64Array[] = [];
  events: { name: string; t: number; y: Float64Array }[] = [];
  /** Set when a terminal event stopped the integration. */
  stopT = NaN;
  stopY: Float64Array;

  private n: number;
  private tEval: Float64Array;
  private nextEval = 0;
  private defs: OdeEvent[];
  private gPrev: Float64Array;
  private gNew: Float64Array;
  private roots: Float64Array;
  private fired: Uint8Array;
  private work: Float64Array;
  private direction: number;

  constructor(n: number, tEval: Float64Array, events: OdeEvent[], direction: number) {
    this.n = n;
    this.tEval = tEval;
    this.defs = events;
    this.direction = direction;
    const m = events.length;
    this.gPrev = new Float64Array(m);
    this.gNew = new Float64Array(m);
    this.roots = new Float64Array(m);
    this.fired = new Uint8Array(m);
    this.work = new Float64Array(n);
    this.stopY = new Float64Array(n);
  }

  /**
   * Prepare the recorder for a new integration of the same dimension: fresh output lists (the
   * previous ones belong to the previous result), work arrays kept when large enough.
   */
  reset(tEval: Float64Array, events: OdeEvent[], direction: number): void {
    this.tEval = tEval;
    this.defs = events;
    this.direction = direction;
    this.nextEval = 0;
    this.tOut = [];
    this.yOut = [];
    this.events = [];
    this.stopT = NaN;
    const m = events.length;
    if (this.gPrev.length < m) {
      this.gPrev = new Float64Array(m);
      this.gNew = new Float64Array(m);
      this.roots = new Float64Array(m);
      this.fired = new Uint8Array(m);
    }
  }

  /** State dimension the recorder was built for. */
  get dimension(): number {
    return this.n;
  }

  /** Record the initial point: tEval entries equal to t0, and g(t0, y0). */
  start(t0: number, y0: Float64Array): void {
    while (this.nextEval < this.tEval.length && this.tEval[this.nextEval] === t0) {
      this.tOut.push(t0);
      this.yOut.push(Float64Array.from(y0));
      this.nextEval++;
    }
    for (let k = 0; k < this.defs.length; k++) this.gPrev[k] = this.evalG(k, t0, y0);
  }

  /** g_k(t, y), or NaN when g is not finite there (NaN never signals a crossing). */
  private evalG(k: number, t: number, y: Float64Array): number {
    const v = this.defs[k].g(t, y);
    return Number.isFinite(v) ? v : NaN;
  }

  /** True when g went from gp to gn across zero in the event's allowed direction. */
  private crossed(k: number, gp: number, gn: number): boolean {
    const dirWanted = this.defs[k].direction ?? 0;
    const rising = gp < 0 && gn >= 0;
    const falling = gp > 0 && gn <= 0;
    if (dirWanted === 1) return rising;
    if (dirWanted === -1) return falling;
    return rising || falling;
  }

  /** Illinois root of g_k on [ta, tb] using dense output. */
  private locate(k: number, ta: number, tb: number, ga: number, gb: number, src: DenseSource): number {
    if (gb === 0) return tb;
    const work = this.work;
    let a = ta;
    let b = tb;
    let fa = ga;
    let fb = gb;
    let side = 0;
    const tol = Math.max(EVENT_RTOL * Math.max(Math.abs(ta), Math.abs(tb)), 4 * Number.EPSILON * Math.abs(tb - ta));
    for (let it = 0; it < EVENT_MAX_ITER && Math.abs(b - a) > tol; it++) {
      let c = (fa * b - fb * a) / (fa - fb);
      if (!Number.isFinite(c) || (c - a) * (c - b) >= 0) c = 0.5 * (a + b);
      src.dense(c, work);
      const fc = this.evalG(k, c, work);
      if (fc === 0) return c;
      if (Number.isNaN(fc)) {
        // no information at c: keep the far side of the bracket and move it closer
        b = c;
        continue;
      }
      if (fc * fb > 0) {
        b = c;
        fb = fc;
        if (side === -1) fa *= 0.5;
        side = -1;
      } else {
        a = c;
        fa = fc;
        if (side === 1) fb *= 0.5;
        side = 1;
      }
    }
    return b;
  }

  /**
   * Process one accepted step [tOld, t] (y = state at t). Returns true when a terminal event
   * stopped the integration (then stopT/stopY hold the stopping point).
   */
  step(tOld: number, t: number, y: Float64Array, src: DenseSource): boolean {
    const dir = this.direction;
    let tStop = t;
    let stop = false;
    const m = this.defs.length;
    let anyFired = false;
    for (let k = 0; k < m; k++) {
      const gn = this.evalG(k, t, y);
      this.gNew[k] = gn;
      this.fired[k] = 0;
      if (this.crossed(k, this.gPrev[k], gn)) {
        // y is the stepper's buffer: evalG above must not be disturbed by dense() into work
        this.roots[k] = this.locate(k, tOld, t, this.gPrev[k], gn, src);
        this.fired[k] = 1;
        anyFired = true;
        if (this.defs[k].terminal !== false && dir * (this.roots[k] - tStop) < 0) tStop = this.roots[k];
        if (this.defs[k].terminal !== false) stop = true;
      }
    }
    // tEval rows up to the stopping point
    while (this.nextEval < this.tEval.length && dir * (this.tEval[this.nextEval] - tStop) <= 0) {
      const te = this.tEval[this.nextEval++];
      const row = new Float64Array(this.n);
      if (te === t) row.set(y);
      else src.dense(te, row);
      this.tOut.push(te);
      this.yOut.push(row);
    }
    if (anyFired) {
      // record fired events up to the stop, in time order
      for (;;) {
        let best = -1;
        for (let k = 0; k < m; k++) {
          if (this.fired[k] !== 1) continue;
          const rk = this.roots[k];
          if (dir * (rk - tStop) > 0) continue;
          if (best < 0 || dir * (rk - this.roots[best]) < 0) best = k;
        }
        if (best < 0) break;
        this.fired[best] = 2;
        const row = new Float64Array(this.n);
        const rt = this.roots[best];
        if (rt === t) row.set(y);
        else src.dense(rt, row);
        this.events.push({ name: this.defs[best].name, t: rt, y: row });
        if (stop && rt === tStop && this.defs[best].terminal !== false) break;
      }
    }
    if (stop) {
      this.stopT = tStop;
      if (tStop === t) this.stopY.set(y);
      else src.dense(tStop, this.stopY);
      return true;
    }
    // keep the last finite value of g so that a crossing behind a non-finite stretch is still seen
    for (let k = 0; k < m; k++) if (!Number.isNaN(this.gNew[k])) this.gPrev[k] = this.gNew[k];
    return false;
  }
}

/** Assemble an OdeResult (copies the state). */
export function buildResult(
  status: OdeStatus,
  t: number,
  y: Float64Array,
  recorder: OdeRecorder | undefined,
  counters: OdeCounters,
  method: OdeResult['stats']['method'],
  warnings: { code: string; message: string }[],
  detail?: string,
): OdeResult {
  const o = outcome(ODE_STATUS, status, warnings, detail);
  return {
    status: o.status,
    success: o.success,
    message: o.message,
    warnings: o.warnings,
    t,
    y: Float64Array.from(y),
    tOut: recorder ? recorder.tOut : [],
    yOut: recorder ? recorder.yOut : [],
    events: recorder ? recorder.events : [],
    stats: {
      rhsEvaluations: counters.rhs,
      jacobianEvaluations: counters.jac,
      steps: counters.steps,
      rejectedSteps: counters.rejected,
      method,
      luDecompositions: counters.lu,
    },
  };
}
