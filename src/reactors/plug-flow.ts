/**
 * Plug-flow reactor in volume V: isothermal, gas or liquid, with optional pressure drop (alpha per m3).
 * Volume-basis rates enter as they are; mass-basis rates are multiplied by the bed bulk density
 * (reactor.bulkDensity), and refused without it. The balances live in flow-tube.ts.
 * Method: plug-flow mole balances dF_j/dV = R_j.
 */
import { solveFlowTube } from './flow-tube.js';
import type { ReactorModel } from './types.js';

export const plugFlow: ReactorModel = {
  kind: 'plug-flow',
  solve: (spec, run, kinetics, theta, options) => solveFlowTube('plug-flow', spec, run, kinetics, theta, options),
};
