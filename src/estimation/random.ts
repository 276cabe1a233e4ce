/**
 * Seeded generators of the estimation module: mulberry32 (with Box-Muller normals) and the Random
 * interface live in numerics/random.ts; re-exported here for existing imports.
 */
export { mulberry32 } from '../numerics/random.js';
