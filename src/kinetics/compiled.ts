/**
 * The contract between kinetics and reactors: a compiled, allocation-free rate evaluator with exact
 * derivatives. Reactors never see rate-law forms; they see this.
 *
 * Layouts: vectors are Float64Array; matrices are row-major Float64Array.
 *   nS species, nR reactions, nP parameters (physical values, in `parameterNames` order).
 */
export interface CompiledKinetics {
  readonly speciesNames: readonly string[];
  readonly reactionIds: readonly string[];
  readonly parameterNames: readonly string[];
  /** Stoichiometric matrix nu (nR x nS, row-major): negative for reactants, positive for products. */
  readonly stoich: Float64Array;
  /** Per reaction: rate counted per m3 of fluid ('volume') or per kg catalyst ('mass'). */
  readonly basis: readonly ('volume' | 'mass')[];
  /** Reference temperature of Arrhenius and van 't Hoff terms, K. */
  readonly referenceTemperature: number;
  /**
   * Reaction rates r_i (length nR) at concentrations C (mol/m3, length nS), temperature T (K),
   * parameters theta (physical values, length nP). Negative concentrations are treated as zero.
   */
  rates(C: Float64Array, T: number, theta: Float64Array, out: Float64Array): void;
  /** d r_i / d C_j, nR x nS row-major. */
  ratesJacC(C: Float64Array, T: number, theta: Float64Array, out: Float64Array): void;
  /** d r_i / d theta_k, nR x nP row-major. */
  ratesJacP(C: Float64Array, T: number, theta: Float64Array, out: Float64Array): void;
}
