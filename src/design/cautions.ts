/**
 * The cautions every sizing result carries, whatever its status. They are part of the result (and
 * of the --json output) so that no printed size travels without them.
 */

export const CAUTIONS: readonly string[] = [
  'Preliminary estimate for screening only.',
  'Assumes isothermal operation; the heat of reaction must be removed or supplied to hold the temperature, and no temperature profile, hot spot or runaway was modelled.',
  'Heat removal, runaway, pressure relief and pressure-vessel design must be done by licensed engineers under the applicable local codes and standards.',
  'Kinetics are valid only within the range of the data; outside it the size is an extrapolation.',
];

/** The cautions of a result sized with the energy balance (heat.mode). */
export const THERMAL_CAUTIONS: readonly string[] = [
  'Preliminary estimate for screening only.',
  'The energy balance is a one-dimensional pseudo-homogeneous model: radial temperature and concentration gradients, the centre-line hot spot above the cross-section mean, gas-to-particle gradients and catalyst deactivation are not modelled.',
  'The runaway margin is a parametric-sensitivity estimate, not a safety analysis; heat removal, runaway protection, relief sizing and pressure design must be done by licensed engineers under the applicable local codes and standards.',
  'Kinetics are valid only within the range of the data; outside it the size is an extrapolation.',
];

/**
 * A fresh copy of the cautions for one result (the energy-balance set when `thermal`); a hand-off
 * fitted with a catalyst activity model adds its note that the kinetics are those of the fresh catalyst.
 */
export function cautions(handoff?: { catalyst?: { note: string } }, thermal = false): string[] {
  const base = thermal ? THERMAL_CAUTIONS : CAUTIONS;
  return handoff?.catalyst ? [...base, handoff.catalyst.note] : [...base];
}
