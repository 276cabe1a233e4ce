/** From lab CSV files to a study skeleton (`rateloom new`). */
export { studySkeleton, parseOrders, type SkeletonOptions, type StudySkeleton, type LocatedTodo } from './skeleton.js';
export type { SkeletonFile } from './infer.js';
export { recogniseColumn, splitHeader } from './header.js';
export { rateConstantUnit } from './rate-units.js';
