/**
 * The learning pass of the plant pellet's effectiveness-factor table: the bed is integrated from
 * the inlet in segments of the key conversion, and the pellet is solved once at the end of each
 * segment, at the state the integration reached there.
 *
 * Method: a predictor-corrector march with error control, as in the step-size control of
 * ODE solvers (E. Hairer, S.P. Norsett, G. Wanner, Solving Ordinary Differential Equations I,
 * 2nd ed., Springer 1993, sec. II.4). Inside a segment the bed balances use eta predicted by
 * Lagrange extrapolation of the last (up to three) entries (EtaTable.predict); at the segment's end
 * the pellet solve gives the corrector, which is stored. The difference of the two estimates the
 * local error of the quadratic extrapolation; the next conversion step is h (tol/err)^(1/3) (the
 * extrapolation error grows as h^3), kept within [h/4, 2h] and within [minStep, maxStep]. Table
 * entries are eta at the states the bed reaches; the sizing afterwards reads them by quadratic
 * interpolation, whose error is smaller than the extrapolation error the control bounds
 * (K.E. Atkinson, An Introduction to Numerical Analysis, 2nd ed., 1989, sec. 3.2).
 */
import type { OdeEvent } from '../numerics/ode-types.js';
import type { EtaTable } from '../pellets/eta-table.js';
import { Marcher } from './march.js';
import type { DesignSystem } from './system.js';

/** Relative error of the extrapolated eta the learning pass aims at per segment (default of `tol`). */
export const ETA_LEARN_TOL = 1e-3;

export interface LearnOptions {
  /** The bed system, bound to the hook that reads the table (it predicts while `learning`). */
  sys: DesignSystem;
  table: EtaTable;
  /** Conversion of the key species at state y. */
  progress: (y: Float64Array) => number;
  /** Solve the pellet at bed state y (size coordinate t) and return eta per reaction. */
  solveAt: (t: number, y: Float64Array) => Float64Array;
  /** Conversion up to which the table is filled. */
  end: number;
  /** Largest conversion step between entries. */
  maxStep: number;
  /** Size coordinate beyond which no segment ends are sought (kg, m3); asked once the inlet entry is in the table. */
  sizeLimit: () => number;
  /** Target relative error of the extrapolated eta per segment; default ETA_LEARN_TOL. */
  tol?: number;
}

/** Largest relative difference between predicted and solved eta. */
function relativeGap(pred: Float64Array, eta: Float64Array): number {
  let err = 0;
  for (let i = 0; i < eta.length; i++) err = Math.max(err, Math.abs(pred[i] - eta[i]) / Math.max(Math.abs(eta[i]), 1e-12));
  return err;
}

/**
 * Fill `table` along the bed (see the file header). Stops at `end`, where the pressure runs out,
 * or where the conversion stops growing (equilibrium, or the size limit).
 */
export function learnEtaTable(o: LearnOptions): void {
  const { sys, table } = o;
  const tol = o.tol ?? ETA_LEARN_TOL;
  const minStep = o.maxStep / 16;
  const marcher = new Marcher(sys.dim);
  let t = 0;
  let y = Float64Array.from(sys.y0);
  let x = o.progress(y);
  table.insert(x, o.solveAt(t, y), t);
  const limit = o.sizeLimit();
  let h = o.maxStep / 4;
  const pred = new Float64Array(table.nR);
  while (x < o.end && limit > 0) {
    const next = Math.min(x + h, o.end);
    const events: OdeEvent[] = [{ name: 'next', g: (_t, yy) => o.progress(yy) - next, direction: 1, terminal: true }];
    if (sys.hasPressure) events.push({ name: 'pressure', g: (_t, yy) => yy[sys.nS], direction: -1, terminal: true });
    const res = marcher.integrate(sys.rhs, t, y, limit, { rtol: 1e-8, events });
    const hit = res.events.find((e) => e.name === 'next');
    if (!hit) break;
    t = hit.t;
    y = Float64Array.from(hit.y);
    x = o.progress(y);
    table.predict(x, pred);
    const eta = o.solveAt(t, y);
    table.insert(x, eta, t);
    const err = relativeGap(pred, eta);
    const grow = err > 0 ? 0.9 * Math.cbrt(tol / err) : 2;
    h = Math.min(o.maxStep, Math.max(minStep, h * Math.min(2, Math.max(0.25, grow))));
  }
}
