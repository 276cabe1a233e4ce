/**
 * Input description of rate laws (before compilation). Every constant is a reference to a named
 * parameter of the study. Rates are per unit reactor volume (mol/(m3 s)) or per unit catalyst mass
 * (mol/(kg s)) according to `basis`. Concentrations are in mol/m3, partial pressures in Pa,
 * temperatures in K: SI throughout.
 */
import type { ReactionEquationSpec } from '../chemistry/spec.js';

/** A reaction as written in a study file: its equation (chemistry) and its rate law. */
export interface ReactionSpec extends ReactionEquationSpec {
  /** The rate law of this reaction. */
  rate: RateLawSpec;
}

/** Where the rate is counted: per m3 of reacting fluid, or per kg of catalyst. */
export type RateBasis = 'volume' | 'mass';

/**
 * A rate constant with Arrhenius temperature dependence about the kinetics' reference temperature:
 * k(T) = k_ref * exp(-E/R * (1/T - 1/T_ref)). `activationEnergy` omitted means k independent of T.
 */
export interface ArrheniusRef {
  /** Name of the parameter holding k at T_ref. */
  k: string;
  /** Name of the parameter holding E in J/mol. */
  activationEnergy?: string;
}

/**
 * An equilibrium or adsorption constant with van 't Hoff dependence about T_ref:
 * K(T) = K_ref * exp(-dH/R * (1/T - 1/T_ref)). `enthalpy` omitted means K independent of T.
 */
export interface VantHoffRef {
  /** Name of the parameter holding K at T_ref. */
  K: string;
  /** Name of the parameter holding dH in J/mol. */
  enthalpy?: string;
}

/** An order: a number, or the name of a fitted parameter. */
export type Order = number | string;

/**
 * r = k * prod_j C_j^a_j. Orders default to the reactants' stoichiometric coefficients. When
 * `orders` (or `reverseOrders`) is given it lists every species of that term: unlisted species
 * have order 0 (the same rule applies to the other forms).
 */
export interface PowerLawSpec {
  form: 'power-law';
  basis?: RateBasis;
  rateConstant: ArrheniusRef;
  orders?: Record<string, Order>;
  /** Use partial pressures (Pa) instead of concentrations; default false. */
  pressureBasis?: boolean;
}

/**
 * r = k * (prod_reactants C^a - prod_products C^b / K_eq). Forward orders default to the reactant
 * coefficients, reverse orders to the product coefficients. The units of K_eq follow from the orders.
 */
export interface ReversiblePowerLawSpec {
  form: 'reversible-power-law';
  basis?: RateBasis;
  rateConstant: ArrheniusRef;
  equilibriumConstant: VantHoffRef;
  orders?: Record<string, Order>;
  reverseOrders?: Record<string, Order>;
  pressureBasis?: boolean;
}

/**
 * Langmuir-Hinshelwood-Hougen-Watson form:
 * r = k * driving / (1 + sum_i K_i X_i)^n, where X is C (mol/m3) or p (Pa) per `pressureBasis`,
 * and driving = prod_reactants X^a - (if equilibriumConstant) prod_products X^b / K_eq.
 */
export interface LhhwSpec {
  form: 'lhhw';
  basis?: RateBasis;
  rateConstant: ArrheniusRef;
  equilibriumConstant?: VantHoffRef;
  orders?: Record<string, Order>;
  reverseOrders?: Record<string, Order>;
  /** Adsorption constants per species. */
  adsorption: Record<string, VantHoffRef>;
  /** Exponent n of the denominator; default 1. */
  exponent?: number;
  pressureBasis?: boolean;
}

/**
 * A custom rate in ordinary math notation. Symbols: C_<species> (mol/m3), p_<species> (Pa), T (K),
 * R (J/(mol K)), T_ref (K), and parameter names. Operators + - * / ^, parentheses, and the
 * functions exp, log, ln, sqrt, abs, min, max, pow.
 */
export interface ExpressionSpec {
  form: 'expression';
  basis?: RateBasis;
  expression: string;
}

export type RateLawSpec = PowerLawSpec | ReversiblePowerLawSpec | LhhwSpec | ExpressionSpec;
