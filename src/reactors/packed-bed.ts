/**
 * Packed-bed reactor in catalyst mass W: isothermal plug flow over a fixed bed with optional Ergun
 * pressure drop. Mass-basis rates enter as they are; volume-basis rates are divided by the bed bulk
 * density (reactor.bulkDensity), and refused without it. The balances live in flow-tube.ts.
 * Method: packed-bed mole balances dF_j/dW = R_j with dp/dW = -alpha/(2p) (F_T/F_T0) (Ergun 1952).
 */
import { solveFlowTube } from './flow-tube.js';
import type { ReactorModel } from './types.js';

export const packedBed: ReactorModel = {
  kind: 'packed-bed',
  solve: (spec, run, kinetics, theta, options) => solveFlowTube('packed-bed', spec, run, kinetics, theta, options),
};
