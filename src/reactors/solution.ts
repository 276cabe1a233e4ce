/**
 * Assembly of a ReactorSolution from an ODE driver result: outlet amounts and concentrations,
 * pressure ratio, profile rows and sensitivities. No numerics here; no external reference.
 * Allocates only the arrays and objects of the result (no views, no temporaries).
 */
import type { OdeDriverResult } from './ode-driver.js';
import type { ReactorProfile, ReactorSolution, RunConditions } from './types.js';
import { STATUS_SUCCESS } from './status.js';

/** How a model reads its state: concentrations and p/p0 from a state row. */
export interface StateReader {
  nS: number;
  /** Concentrations (mol/m3) of state y into out. Must not keep references. */
  concentrations(y: Float64Array, out: Float64Array): void;
  /** p/p0 of state y. */
  pressureRatio(y: Float64Array): number;
  /** Row of the state holding p (for its sensitivity), if any. */
  pressureIndex?: number;
  /** d(pressureRatio)/d(y): custom sensitivity of p/p0 (batch gas: N_T/N_T0), into out (nP) from S. */
  pressureSensitivity?: (y: Float64Array, S: Float64Array, nP: number, out: Float64Array) => void;
  coordinate: ReactorProfile['coordinate'];
}

export function buildSolution(run: RunConditions, r: OdeDriverResult, reader: StateReader, nP: number): ReactorSolution {
  const { nS } = reader;
  const C = new Float64Array(nS);
  reader.concentrations(r.y, C);
  const sol: ReactorSolution = {
    runId: run.id,
    status: r.status,
    success: STATUS_SUCCESS[r.status],
    message: r.message,
    warnings: r.warnings.length === 0 ? [] : r.warnings.map((w) => ({ ...w, path: ['runs', run.id] })),
    outletAmounts: r.y.slice(0, nS),
    outletConcentrations: C,
    pressureRatio: reader.pressureRatio(r.y),
    stats: r.stats,
  };
  if (r.exhaustedAt !== undefined) sol.exhaustedAt = r.exhaustedAt;
  if (r.profileX.length > 0 || r.profileY.length > 0) {
    const unit = reader.coordinate === 'W' ? 'kg' : reader.coordinate === 'V' ? 'm3' : 's';
    const profile: ReactorProfile = { coordinate: reader.coordinate, unit, x: [], amounts: [], concentrations: [], pressureRatio: [] };
    for (let i = 0; i < r.profileX.length; i++) {
      const y = r.profileY[i];
      const c = new Float64Array(nS);
      reader.concentrations(y, c);
      profile.x.push(r.profileX[i]);
      profile.amounts.push(y.slice(0, nS));
      profile.concentrations.push(c);
      profile.pressureRatio.push(reader.pressureRatio(y));
    }
    sol.profile = profile;
  }
  if (r.S) {
    const amounts = r.S.slice(0, nS * nP);
    const pr = new Float64Array(nP);
    if (reader.pressureSensitivity) reader.pressureSensitivity(r.y, r.S, nP, pr);
    else if (reader.pressureIndex !== undefined) pr.set(r.S.subarray(reader.pressureIndex * nP, (reader.pressureIndex + 1) * nP));
    sol.sensitivity = { amounts, pressureRatio: pr };
  }
  return sol;
}
