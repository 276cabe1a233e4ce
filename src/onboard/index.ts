/** From lab CSV files to a study skeleton (`rateloom new`). */
export { studySkeleton, parseOrders, type SkeletonOptions, type StudySkeleton, type LocatedTodo } from './skeleton.js';
export { inferStudy, type SkeletonFile, type SkeletonLayout, type Inference } from './infer.js';
export { recogniseColumn, splitHeader, unitHints, type RecognisedColumn, type ColumnRole } from './header.js';
export { rateConstantUnit, equilibriumConstantUnit, type UserUnits } from './rate-units.js';
