/**
 * Membrane reactor in volume V: plug flow with species-specific permeation out through the wall,
 *   dF_j/dV = R_j - k_j (C_j - C_sweep,j),   k_j in 1/s (reactor.membrane.permeation),
 * C_sweep,j from reactor.membrane.sweep (default 0). Unknown species names are refused.
 * Method: membrane-reactor mole balances with a linear (first-order) transport law through the wall;
 * the balances live in flow-tube.ts.
 */
import { solveFlowTube } from './flow-tube.js';
import type { ReactorModel } from './types.js';

export const membraneReactor: ReactorModel = {
  kind: 'membrane',
  solve: (spec, run, kinetics, theta, options) => solveFlowTube('membrane', spec, run, kinetics, theta, options),
};
