/**
 * Public surface of the numerics layer (pure numerical methods; no chemistry, no I/O).
 */
export type { OdeEvent, OdeOptions, OdeResult } from './ode-types.js';
export { integrate } from './integrate.js';

export { solveLinear } from './lu.js';
export { newton } from './newton.js';
export { brent, findAllRoots } from './roots.js';
