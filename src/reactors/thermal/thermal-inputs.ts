/**
 * Input checks of a non-isothermal tube (ThermalTubeSpec): every refusal is a RateloomError naming
 * the case-file field under `heat` and the fix. There is no isothermal fallback: a cooled or
 * adiabatic mode with missing data is refused, never solved as isothermal.
 */
import { RateloomError } from '../../core/errors.js';
import type { ThermalTubeSpec } from './tube-balances.js';
import type { HeatCapacity } from './heat-capacity.js';

/** Refuse a spec the balances cannot use; species names for the messages. */
export function checkThermalSpec(spec: ThermalTubeSpec, species: readonly string[]): void {
  if (spec.mode === 'isothermal') return;
  if (!(Number.isFinite(spec.T0) && spec.T0 > 0)) {
    throw new RateloomError('E_VALUE', `inlet temperature ${spec.T0} K is not positive`, { path: ['temperature'], fix: 'Give the inlet temperature in K or degC.' });
  }
  checkHeatCapacities(spec.F0, spec.cp, species);
  for (let i = 0; i < spec.enthalpy.nR; i++) {
    if (!Number.isFinite(spec.enthalpy.atReference[i])) {
      throw new RateloomError('E_VALUE', `reaction ${i + 1} has no finite reaction enthalpy`, {
        path: ['heat', 'reactionEnthalpy'], fix: 'Give heat.reactionEnthalpy for every reaction, for example { "r1": "-45 kJ/mol" }.',
      });
    }
  }
  if (spec.mode === 'adiabatic') return;
  if (!(Number.isFinite(spec.Ua) && spec.Ua > 0)) {
    throw new RateloomError('E_VALUE', `the heat-exchange term U a is ${spec.Ua}; a cooled tube needs it positive`, {
      path: ['heat', 'overallCoefficient'],
      fix: 'Give a positive heat.overallCoefficient (W/(m2 K)) and tubes.innerDiameter, or set heat.mode to "adiabatic".',
    });
  }
  if (!(Number.isFinite(spec.coolantTemperature) && spec.coolantTemperature > 0)) {
    throw new RateloomError('E_VALUE', `coolant temperature ${spec.coolantTemperature} K is not positive`, {
      path: ['heat', 'coolant', 'temperature'], fix: 'Give heat.coolant.temperature in K or degC.',
    });
  }
  if (spec.mode !== 'constant-coolant' && !(Number.isFinite(spec.coolantFlowCapacity) && spec.coolantFlowCapacity > 0)) {
    throw new RateloomError('E_VALUE', `coolant flow times heat capacity is ${spec.coolantFlowCapacity} W/K; co- and counter-current coolant need it positive`, {
      path: ['heat', 'coolant', 'flow'],
      fix: 'Give positive heat.coolant.flow (kg/s) and heat.coolant.heatCapacity (J/(kg K)), or use "mode": "constant-coolant".',
    });
  }
}

/** Refuse a species that is present (fed or charged) without a heat capacity. */
export function checkHeatCapacities(amounts: ArrayLike<number>, cp: readonly (HeatCapacity | undefined)[], species: readonly string[]): void {
  species.forEach((name, j) => {
    if (amounts[j] > 0 && !cp[j]) {
      throw new RateloomError('E_MISSING_FIELD', `species '${name}' flows but has no heat capacity`, {
        path: ['heat', 'heatCapacities', name],
        fix: `Add "${name}": "35 J/(mol K)" (or a Shomate form) to heat.heatCapacities; every species that flows needs one for the energy balance.`,
      });
    }
  });
}
