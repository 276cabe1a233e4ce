/**
 * The contract of reactor models: (reactor description, run conditions, compiled kinetics,
 * parameter values) -> outlet state, optional profile and optional parameter sensitivities.
 * All quantities SI: mol/s, mol/m3, Pa, K, kg, m3, s.
 */
import type { CompiledKinetics } from '../kinetics/compiled.js';
import type { Outcome } from '../core/outcome.js';
import type { SteadyState, SteadyStateStart } from './steady-states.js';

export type ReactorKind = 'packed-bed' | 'plug-flow' | 'stirred-tank' | 'batch' | 'membrane' | 'semibatch';
export type Phase = 'gas' | 'liquid';

/** Inputs of the Ergun equation, from which the pressure-drop parameter alpha is computed. */
export interface ErgunInputs {
  /** Particle diameter, m. */
  particleDiameter: number;
  /** Bed void fraction phi, dimensionless (0..1). */
  voidFraction: number;
  /** Superficial mass flux G, kg/(m2 s). */
  superficialMassFlux: number;
  /** Gas viscosity, Pa s. */
  viscosity: number;
  /** Gas density at the inlet, kg/m3. */
  inletDensity: number;
  /** Tube (or bed) cross-section, m2. */
  crossSection: number;
  /** Density of the solid catalyst particles, kg/m3. */
  catalystDensity: number;
}

export interface PressureDropSpec {
  /** alpha in 1/kg (packed bed) or 1/m3 (plug flow); p/p0 = (1 - alpha W)^(1/2) when moles are constant. */
  alpha?: number;
  /** Compute alpha from Ergun inputs instead. */
  ergun?: ErgunInputs;
}

export interface MembraneSpec {
  /** Permeation coefficient per species, k_C a in 1/s (flux per reactor volume = k * (C - C_sweep)). */
  permeation: Record<string, number>;
  /** Sweep-side concentration per species, mol/m3; default 0. */
  sweep?: Record<string, number>;
}

export interface ReactorSpec {
  kind: ReactorKind;
  phase: Phase;
  /** Pressure drop along a packed bed or plug-flow reactor (gas phase only); default none. */
  pressureDrop?: PressureDropSpec;
  membrane?: MembraneSpec;
  /**
   * Bulk density of the catalyst bed, kg catalyst per m3 of reactor, used to convert between
   * volume-basis and mass-basis rates (packed bed with a volume-basis rate, plug flow with a
   * mass-basis rate); default none (such a mix is refused).
   */
  bulkDensity?: number;
}

/** Conditions of one run (one lab experiment, or the production case). */
export interface RunConditions {
  id: string;
  /** Temperature, K (isothermal). */
  temperature: number;
  /** Inlet (or initial) total pressure, Pa. Required for gas phase. */
  pressure?: number;
  /** Feed molar flows per species (nS), mol/s. Flow reactors and semibatch feed. */
  feed?: Float64Array;
  /** Inlet volumetric flow, m3/s. Liquid flow reactors and semibatch feed. */
  volumetricFlow?: number;
  /**
   * Reactor size: catalyst mass W (kg) for a packed bed (and a stirred tank with mass-basis rates),
   * volume V (m3) for plug flow, stirred tank and membrane reactors, time t (s) for batch and semibatch.
   */
  size: number;
  /** Initial concentrations per species (nS), mol/m3 (batch, semibatch). */
  initialConcentrations?: Float64Array;
  /** Initial volume, m3 (semibatch). */
  initialVolume?: number;
  /** Catalyst mass for a stirred tank or batch with mass-basis rates, kg. */
  catalystMass?: number;
}

export interface ReactorOptions {
  /** Record the profile along the reactor (or in time); default false. */
  profile?: boolean;
  /** Positions (kg, m3 or s) at which to report the profile; default: 50 evenly spaced points. */
  profilePoints?: ArrayLike<number>;
  /** Also compute d outlet / d theta by forward sensitivities; default false. */
  sensitivities?: boolean;
  /** ODE relative tolerance; default 1e-8. */
  rtol?: number;
  /** ODE absolute tolerance; default 1e-10 (scaled to the state). */
  atol?: number;
  /** Step budget; default 100000. */
  maxSteps?: number;
  /** Force an integrator; default 'auto'. 'odex' (extrapolation, no sensitivities) serves as a cross-check. */
  method?: 'auto' | 'nonstiff' | 'stiff' | 'odex';
  /**
   * Stirred tank: look for further steady states after Newton converged ('always'), or only when
   * Newton from the feed failed ('on-failure', which a fit uses for speed); default 'always'.
   */
  steadyStateSearch?: 'always' | 'on-failure';
  /**
   * Stirred tank: outlet flows (mol/s, one per species) to start Newton from instead of the feed,
   * for example the measured outlet, so that the steady state of that branch is reported; default
   * none (start from the feed).
   */
  start?: Float64Array;
}

export type ReactorStatus =
  | 'success'
  | 'integration-failed'
  | 'pressure-exhausted'
  | 'newton-failed'
  | 'non-finite';

export interface ReactorProfile {
  /** 'W' (kg), 'V' (m3) or 't' (s). */
  coordinate: 'W' | 'V' | 't';
  unit: 'kg' | 'm3' | 's';
  x: number[];
  /** Molar flows (mol/s) for flow reactors, moles (mol) for batch/semibatch, one row per x. */
  amounts: Float64Array[];
  /** Concentrations, mol/m3, one row per x. */
  concentrations: Float64Array[];
  /** p/p0 per x (1 for liquid and constant-pressure cases). */
  pressureRatio: number[];
}

export interface ReactorSolution extends Outcome<ReactorStatus> {
  runId: string;
  /** Outlet molar flows, mol/s (flow reactors); final moles, mol (batch, semibatch). */
  outletAmounts: Float64Array;
  /** Outlet (final) concentrations, mol/m3. */
  outletConcentrations: Float64Array;
  /** Outlet p/p0. */
  pressureRatio: number;
  profile?: ReactorProfile;
  /**
   * d outletAmounts_j / d theta_k (nS x nP row-major) and d pressureRatio / d theta_k (nP),
   * when sensitivities were requested.
   */
  sensitivity?: { amounts: Float64Array; pressureRatio: Float64Array };
  /**
   * Stirred tank: every steady state found (when the search ran), with its stability and which
   * one is reported; and where Newton started for the reported one.
   */
  steadyStates?: SteadyState[];
  steadyStateStart?: SteadyStateStart;
  /** Where the pressure reached zero, in the size unit (kg or m3), when status is 'pressure-exhausted'. */
  exhaustedAt?: number;
  stats: { rhsEvaluations: number; jacobianEvaluations: number; steps: number; method: string };
}

/** One reactor model behind the common interface. */
export interface ReactorModel {
  readonly kind: ReactorKind;
  solve(
    spec: ReactorSpec,
    run: RunConditions,
    kinetics: CompiledKinetics,
    theta: Float64Array,
    options?: ReactorOptions,
  ): ReactorSolution;
}
