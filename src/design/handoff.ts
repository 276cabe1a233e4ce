/**
 * The fitted-kinetics hand-off: everything a designer needs to reproduce the fitted model's
 * predictions, written by `rateloom fit` and read by `rateloom size`. Plain JSON, SI units.
 */
import type { SpeciesSpec } from '../chemistry/spec.js';
import type { ReactionSpec } from '../kinetics/spec.js';
import type { ReactorSpec } from '../reactors/types.js';
import type { Transform } from '../core/parameter.js';

export const HANDOFF_FORMAT = 'rateloom.fitted-kinetics';
/** Version 2 added the verdict, the covariance status and the content hash. */
export const HANDOFF_VERSION = 2;

export interface HandoffParameter {
  name: string;
  /** SI unit of `value`. */
  unit: string;
  /** Fitted (or fixed) value, SI. */
  value: number;
  /** Linearised standard error of `value`, SI (null when fixed or not estimable). */
  stdError: number | null;
  fixed: boolean;
  transform: Transform;
  /** Value in the estimation space (ln value for 'log'); the covariance refers to these. */
  internalValue: number;
  /** 95% intervals, SI, where computed. */
  ci?: { level: number; linear?: [number, number]; profile?: [number, number] };
}

/** Range of one condition covered by the data. */
export interface Range {
  min: number;
  max: number;
  unit: string;
}

export interface FittedKinetics {
  format: typeof HANDOFF_FORMAT;
  formatVersion: typeof HANDOFF_VERSION;
  tool: { name: 'rateloom'; version: string };
  /** Name of the study the kinetics came from. */
  study: string;
  /** Name of the candidate rate-law set that was fitted ('base' when none). */
  model: string;
  species: SpeciesSpec[];
  reactions: ReactionSpec[];
  /** Reference temperature of the Arrhenius and van 't Hoff terms, K. */
  referenceTemperature: number;
  parameters: HandoffParameter[];
  /** Covariance of the free parameters in the estimation space (names in order). */
  covariance: { space: 'internal'; names: string[]; matrix: number[][] };
  statistics: { n: number; p: number; dof: number; residualStdDev: number; covarianceBasis: string };
  /** Fit status at hand-off time. */
  fitStatus: string;
  /** The fit's verdict (estimation/verdict.ts): trustworthy or not, its status and every reason. */
  verdict: { trustworthy: boolean; status: string; message: string; reasons: { code: string; message: string }[] };
  /** Whether `covariance` is a usable positive-definite matrix, or was singular / unavailable at the fit (then it is all zeros). */
  covarianceStatus: 'positive-definite' | 'singular' | 'unavailable';
  /** 'sha256:<hex>' of the document without this field (design/handoff-hash.ts); `size` checks it. */
  contentHash: string;
  /** The lab reactor the data came from. */
  labReactor: ReactorSpec;
  /** What the data covered: temperature (K), pressure (Pa), feed mole fractions per species, conversion of the key reactant. */
  coverage: {
    temperature: Range;
    pressure?: Range;
    feedMoleFraction?: Record<string, Range>;
    conversion?: Range & { species: string };
  };
  /** Present when the lab data were fitted with a catalyst activity model: the kinetics are those of the fresh catalyst. */
  catalyst?: { activityModel: string; note: string };
}
