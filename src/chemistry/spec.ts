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

/** A reaction as chemistry sees it: an id and an equation (the rate law is added in kinetics/spec.ts). */
export interface ReactionEquationSpec {
  /** Short unique id, for example 'r1'. */
  id: string;
  /** Equation such as 'A + 2 B <=> C' (reversible) or 'A -> B' (irreversible). */
  equation: string;
}
