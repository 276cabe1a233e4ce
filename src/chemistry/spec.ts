/**
 * Input description of the chemistry, as written in a study file (before validation).
 */

export interface SpeciesSpec {
  /** Name used in equations, rate laws and CSV column mappings (letters, digits, '_'; starts with a letter). */
  name: string;
  /** Optional molecular formula such as 'C2H6O', used for element-balance checks. */
  formula?: string;
  /** Molar mass in kg/mol; derived from the formula when omitted. */
  molarMass?: number;
  /** True for a species that takes part in no reaction (diluent); default false. */
  inert?: boolean;
}

export interface ReactionSpec {
  /** Short unique id, for example 'r1'. */
  id: string;
  /** Equation such as 'A + 2 B <=> C' (reversible) or 'A -> B' (irreversible). */
  equation: string;
  /** The rate law of this reaction (see kinetics/spec.ts). */
  rate: import('../kinetics/spec.js').RateLawSpec;
}
