/**
 * The steady states of a stirred tank as a result: each one's outlet flows and concentrations,
 * its stability where it can be judged, and which one the solution reports.
 *
 * Stability (isothermal liquid tank, one reaction): along the reaction line F = F0 + nu xi the
 * balances reduce to h(xi) = w r(C(F0 + nu xi)) - xi = 0, and the Jacobian of the tank's dynamics
 * (V/v0) dF/dt = G(F) is -I plus a rank-one term whose only non-trivial eigenvalue is dh/dxi; the
 * steady state is stable when dh/dxi < 0 (the slope condition for an isothermal tank, van Heerden,
 * Ind. Eng. Chem. 45 (1953) 1242-1247; Aris and Amundson 1958). Here dh/dxi = (J nu)_j0 / nu_j0
 * with J = dG/dF at the state. Gas tanks and several reactions: 'not-assessed'.
 */

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
 * Stability from J = dG/dF (nS x nS, row-major) at a steady state of a liquid tank with one
 * reaction of stoichiometry nu (length nS).
 */
export function singleReactionStability(J: Float64Array, nu: ArrayLike<number>, nS: number): 'stable' | 'unstable' | 'not-assessed' {
  let j0 = 0;
  for (let j = 0; j < nS; j++) if (Math.abs(nu[j]) > Math.abs(nu[j0])) j0 = j;
  if (nu[j0] === 0) return 'not-assessed';
  let s = 0;
  for (let k = 0; k < nS; k++) s += J[j0 * nS + k] * nu[k];
  const slope = s / nu[j0];
  if (!Number.isFinite(slope) || slope === 0) return 'not-assessed';
  return slope < 0 ? 'stable' : 'unstable';
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
