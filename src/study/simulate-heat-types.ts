/**
 * The energy-balance part of a simulated run (filled by design/simulate-heat.ts when simulate is
 * given heat inputs); declared here so the simulation result type stays in the study layer.
 */
import type { ShootingReport } from '../reactors/thermal/counter-current.js';
import type { CoolingMode } from '../reactors/thermal/layout.js';

/** The energy-balance part of a simulated run (SI: K, kg, m3, s). */
export interface SimulatedHeat {
  mode: Exclude<CoolingMode, 'isothermal'>;
  model: string;
  /** Feed (inlet, initial) temperature: the run's temperature, K. */
  feedTemperature: number;
  /** Outlet (final, tank) temperature, K. */
  outletTemperature: number;
  /** Highest temperature and where (kg, m3 or s); position null in a stirred tank (uniform). */
  hotSpot: { temperature: number; position: number | null; unit: 'kg' | 'm3' | 's' };
  /** Coolant (jacket) temperature given, and for a tube at its gas inlet and outlet, K; null adiabatic. */
  coolant: { temperature: number | null; atInlet: number | null; atOutlet: number | null };
  /** heat.maxTemperature and whether the hot spot passes it. */
  limit?: { maxTemperature: number; exceeded: boolean };
  /** Temperature (and coolant temperature) along the reactor or in time. */
  profile?: { x: number[]; unit: 'kg' | 'm3' | 's'; T: number[]; Ta: (number | null)[] };
  /** Stirred tank: every steady state, with conversion of the key reactant and stability. */
  steadyStates?: { temperature: number; conversion: number | null; stable: boolean; reported: boolean; outlet: number[] }[];
  stabilityCriterion?: string;
  /** Counter-current coolant: how the boundary-value problem converged. */
  bvp?: ShootingReport;
}
