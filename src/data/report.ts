/**
 * The validation report of a data import: what was read, what was rejected (file, line, column,
 * reason), the rules applied, replicate groups and the pure-error estimates. Invariant, per source
 * and in total: rowsIn = rowsUsed + rowsRejected.
 */
import type { ResponseKind } from './spec.js';

export type RejectionReason =
  | 'non-numeric'
  | 'negative'
  | 'out-of-range'
  | 'missing'
  | 'column-count'
  | 'duplicate-run'
  | 'above-inlet'
  | 'element-balance'
  | 'unknown-run'
  | 'run-rejected'
  | 'unknown-species';

/** One problem with a cell or a row. Several problems may reject the same row. */
export interface Rejection {
  file: string;
  /** 1-based line of the row in the file. */
  line: number;
  /** Column header, when one cell is at fault. */
  column?: string;
  reason: RejectionReason;
  message: string;
}

/** Layout names of the data sources (schema/study.schema.json). */
export type SourceLayout = 'per-run' | 'long' | 'stacked' | 'run-file';

export interface SourceSummary {
  file: string;
  layout: SourceLayout;
  rowsIn: number;
  rowsUsed: number;
  rowsRejected: number;
}

export interface ReplicateGroup {
  /** Stable id 'rep1', 'rep2', ... */
  id: string;
  runIds: string[];
}

/** Pooled pure-error estimate of one response (over replicate runs and repeated rows). */
export interface PureError {
  response: ResponseKind;
  species?: string;
  /** SI unit of sigma. */
  unit: string;
  /** Sum of squared deviations from the group means, in unit^2. */
  sumSquares: number;
  /** Degrees of freedom: sum over groups of (n - 1). */
  dof: number;
  /** sqrt(sumSquares / dof), in unit. */
  sigma: number;
}

/** Thresholds of the data checks (all stated in the report). */
export interface CheckSettings {
  /** Largest accepted |out - in| / in of an element flow; default 0.02. */
  elementBalanceTolerance: number;
  /** A reactant's outlet may exceed its inlet by at most this many sigma; default 3. */
  noiseSigmas: number;
  /** Relative tolerance for equal conditions (replicates, duplicate run ids); default 1e-6. */
  replicateTolerance: number;
  /** Fallback noise when no sigma is known, as a fraction of the inlet value; default 0.01. */
  fallbackRelativeNoise: number;
}

export const DEFAULT_CHECKS: CheckSettings = {
  elementBalanceTolerance: 0.02,
  noiseSigmas: 3,
  replicateTolerance: 1e-6,
  fallbackRelativeNoise: 0.01,
};

export interface ValidationReport {
  sources: SourceSummary[];
  rowsIn: number;
  rowsUsed: number;
  rowsRejected: number;
  /** Every problem found, sorted by file and line. */
  rejections: Rejection[];
  /** The rules applied, in words, with their thresholds. */
  rules: string[];
  replicateGroups: ReplicateGroup[];
  pureError: PureError[];
  settings: CheckSettings;
}

/** The rules as stated in every report. */
export function describeRules(s: CheckSettings): string[] {
  return [
    'A row is rejected when a required cell is empty, a number cannot be read, or a flow, mass, volume, time or concentration is negative; temperature and pressure must be above zero.',
    `Duplicate run id: a later row with the same run id and conditions differing by more than a relative ${s.replicateTolerance} is rejected (equal conditions: the row adds measurements to the run).`,
    `Outlet above inlet: a reactant's measured outlet flow (or liquid concentration) more than ${s.noiseSigmas} sigma above its inlet value, or a conversion below -${s.noiseSigmas} sigma, is rejected; sigma comes from the sigma column or the error model, else ${s.fallbackRelativeNoise * 100}% of the inlet value.`,
    `Element balance: when every species has a formula and every outlet flow of a run is measured, each element's outlet flow must match its inlet flow within ${s.elementBalanceTolerance * 100}% of the inlet element flow.`,
    `Replicates: runs whose conditions (temperature, pressure, size, feed, group) agree within a relative ${s.replicateTolerance} form a replicate group; their spread gives the pure-error estimate.`,
  ];
}
