/**
 * The steady states of a stirred tank as a result: each one's outlet flows and concentrations,
 * its stability where it can be judged, and which one the solution reports.
 *
 * Stability (isothermal liquid tank, constant density): the tank's dynamics are
 * (V/v0) dF/dt = G(F), so a steady state is locally stable when every eigenvalue of J = dG/dF has a
 * negative real part (Lyapunov's indirect method; for one reaction this is the slope condition of
 * van Heerden, Ind. Eng. Chem. 45 (1953) 1242-1247), decided by numerics/lyapunov.ts.
 *
 * Gas tank (ideal gas, constant T, P and V, perfectly mixed, the outlet flow adjusting at once): the
 * holdup N = C_T V is constant and the holdups n obey dn/dt = F0 - y F_out + P(C), C = n / V,
 * F_out = sum F0 + sum P, with P the species production of the tank. Its Jacobian is
 * A = -(F_out/N) I + (I - y 1') (dP/dC) / V. The steady-state Jacobian the solver uses is
 * dG/dF = -I + (dP/dC) (C_T/F_T) (I - y 1'); since XY and YX have the same eigenvalues and
 * F_T = F_out at the state, dG/dF has the eigenvalues of (N/F_out) A, a positive multiple: the same
 * Hurwitz test decides a gas tank (checked against direct integration with SciPy,
 * tests/reference/scipy/gas_tank_states.py).
 */
import { hurwitz } from '../numerics/lyapunov.js';

/** One steady state of a stirred tank. */
export interface SteadyState {
  /** Outlet molar flows, mol/s. */
  outletAmounts: Float64Array;
  /** Outlet concentrations, mol/m3. */
  outletConcentrations: Float64Array;
  stability: 'stable' | 'unstable' | 'not-assessed';
  /** True for the steady state the solution reports. */
  reported: boolean;
}

/** Where Newton started for the reported steady state. */
export type SteadyStateStart = 'feed' | 'given';

/**
 * Stability of a tank's steady state from J = dG/dF (nS x nS, row-major) at the state: stable when
 * J is Hurwitz (liquid: the dynamics are (V/v0) dF/dt = G(F); gas: see the header).
 */
export function tankStability(J: Float64Array, nS: number): SteadyState['stability'] {
  const v = hurwitz(J, nS);
  return v === 'undecided' ? 'not-assessed' : v;
}

/** Index of the state in `list` nearest to `F` (max-norm), or -1 for an empty list. */
export function nearestState(list: readonly Float64Array[], F: Float64Array): number {
  let best = -1;
  let bestD = Infinity;
  list.forEach((s, i) => {
    let d = 0;
    for (let j = 0; j < s.length; j++) d = Math.max(d, Math.abs(s[j] - F[j]));
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  });
  return best;
}
