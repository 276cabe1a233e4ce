/**
 * Counter-current coolant: a two-point boundary-value problem. The coolant enters at the tube
 * outlet (x = L) at its inlet temperature Ta,in and leaves at x = 0; the reacting gas enters at
 * x = 0. The unknown is the coolant temperature at x = 0, s = Ta(0).
 *
 * Method: shooting (H.B. Keller, Numerical Methods for Two-Point Boundary-Value Problems, 1968):
 * march the initial-value problem from x = 0 with Ta(0) = s and solve the scalar equation
 * g(s) = Ta(L; s) - Ta,in = 0 by Brent's method (numerics/roots.ts) on a bracket found by stepping
 * outward from s = Ta,in (first step 10 K, each next one 1.5 times longer, at most 40 steps each side). A march that runs away or
 * fails gives no value and the bracket search steps past it. The report says whether it converged,
 * the iterations, the final residual |Ta(L) - Ta,in| and the bracket; a failure is the status
 * 'bvp-not-converged' with a message naming the coolant inputs and what to change.
 */
import { outcome } from '../../core/outcome.js';
import { brent } from '../../numerics/roots.js';
import type { ThermalSolveOptions, ThermalTube, ThermalTubeSolution } from './thermal-tube.js';
import { THERMAL_STATUS } from './thermal-tube.js';

export interface ShootingReport {
  method: 'shooting on the coolant temperature at the gas inlet (Brent)';
  converged: boolean;
  iterations: number;
  /** |Ta(L) - Ta,in| at the solution, K. */
  residual: number;
  /** Coolant temperature at x = 0 (its outlet), K. */
  coolantOutlet: number;
  /** Bracket of Ta(0) that held the root, K. */
  bracket: [number, number] | null;
}

const NOT_FOUND = 'no coolant outlet temperature between the bracket limits satisfies the coolant inlet condition';

/** Solve the counter-current tube of `size` by shooting; see the file header. */
export function shootCounterCurrent(tube: ThermalTube, size: number, options: ThermalSolveOptions): ThermalTubeSolution {
  const taIn = tube.spec.coolantTemperature;
  const plain: ThermalSolveOptions = { ...options };
  delete plain.profile;
  delete plain.target;
  let evals = 0;
  const g = (s: number): number => {
    evals++;
    const r = tube.march(size, s, plain);
    return r.status === 'success' && r.coolant.atOutlet !== null ? r.coolant.atOutlet - taIn : NaN;
  };
  const bracket = findBracket(g, taIn);
  const tol = options.shootingTolerance ?? 1e-7;
  if (!bracket) return failed(tube, size, options, taIn, evals, null, NOT_FOUND);
  const br = brent(g, bracket[0], bracket[1], { xtol: tol, maxIterations: 100 });
  const sol = tube.march(size, br.x, options);
  const residual = sol.coolant.atOutlet !== null ? Math.abs(sol.coolant.atOutlet - taIn) : NaN;
  const converged = br.status === 'converged' && sol.success && residual <= Math.max(1e-5, 100 * tol);
  const report: ShootingReport = {
    method: 'shooting on the coolant temperature at the gas inlet (Brent)',
    converged, iterations: br.iterations, residual, coolantOutlet: br.x, bracket,
  };
  if (!converged) return failed(tube, size, options, br.x, evals, bracket, `Brent ended with '${br.status}', residual ${residual.toPrecision(3)} K`);
  return { ...sol, bvp: report };
}

/** A bracket of a sign change of g, stepping outward from s0 (NaN values are stepped over). */
function findBracket(g: (s: number) => number, s0: number): [number, number] | null {
  let prevUp = s0;
  let gUp = g(s0);
  if (gUp === 0) return [s0, s0 + 1e-9];
  let prevDn = s0;
  let gDn = gUp;
  let step = 10;
  for (let k = 0; k < 40; k++) {
    const up = prevUp + step;
    const gu = g(up);
    if (Number.isFinite(gu) && Number.isFinite(gUp) && gu * gUp <= 0) return [prevUp, up];
    if (Number.isFinite(gu)) [prevUp, gUp] = [up, gu];
    const dn = Math.max(prevDn - step, 1);
    const gd = g(dn);
    if (Number.isFinite(gd) && Number.isFinite(gDn) && gd * gDn <= 0) return [dn, prevDn];
    if (Number.isFinite(gd)) [prevDn, gDn] = [dn, gd];
    step *= 1.5;
  }
  return null;
}

function failed(
  tube: ThermalTube, size: number, options: ThermalSolveOptions, s: number, evals: number,
  bracket: [number, number] | null, why: string,
): ThermalTubeSolution {
  const sol = tube.march(size, s, options);
  const residual = sol.coolant.atOutlet !== null ? Math.abs(sol.coolant.atOutlet - tube.spec.coolantTemperature) : NaN;
  return {
    ...sol,
    ...outcome(THERMAL_STATUS, 'bvp-not-converged', [], `${why} after ${evals} marches; check heat.coolant (flow, heat capacity, temperature) and heat.overallCoefficient, or use co-current coolant`),
    bvp: {
      method: 'shooting on the coolant temperature at the gas inlet (Brent)',
      converged: false, iterations: evals, residual: Number.isFinite(residual) ? residual : -1, coolantOutlet: s, bracket,
    },
  };
}
