/**
 * The pressure-drop parameter alpha of a packed bed from the Ergun equation.
 *
 * Method: Ergun's equation for flow through packed columns (S. Ergun, "Fluid flow through packed
 * columns", Chem. Eng. Prog. 48 (1952) 89-94), in the common design form
 *   beta0 = G (1 - phi) / (rho0 gc Dp phi^3) * [150 (1 - phi) mu / Dp + 1.75 G]   (Pa/m, SI, gc = 1)
 *   alpha = 2 beta0 / (Ac (1 - phi) rho_c P0)                                       (1/kg)
 * so that, for constant total moles and temperature, p = P/P0 = (1 - alpha W)^(1/2).
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import type { ErgunInputs, PressureDropSpec } from './types.js';

function positive(value: number, name: string, path: FieldPath, unit: string): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new RateloomError('E_VALUE', `Ergun input ${name} must be a positive number (${unit}), got ${value}`, {
      path: [...path, name],
      fix: `Give ${name} as a positive number in ${unit}.`,
    });
  }
}

/**
 * Ergun pressure-gradient parameter beta0 (Pa/m) at the inlet.
 * Throws RateloomError (E_VALUE) for a void fraction outside (0, 1) or a non-positive input.
 */
export function ergunBeta0(inputs: ErgunInputs, path: FieldPath = ['reactor', 'pressureDrop', 'ergun']): number {
  const { particleDiameter: Dp, voidFraction: phi, superficialMassFlux: G, viscosity: mu, inletDensity: rho0 } = inputs;
  if (!(Number.isFinite(phi) && phi > 0 && phi < 1)) {
    throw new RateloomError('E_VALUE', `Ergun input voidFraction must lie strictly between 0 and 1, got ${phi}`, {
      path: [...path, 'voidFraction'],
      fix: 'Give the bed void fraction as a fraction between 0 and 1 (typically 0.35-0.5).',
    });
  }
  positive(Dp, 'particleDiameter', path, 'm');
  positive(G, 'superficialMassFlux', path, 'kg/(m2 s)');
  positive(mu, 'viscosity', path, 'Pa s');
  positive(rho0, 'inletDensity', path, 'kg/m3');
  return ((G * (1 - phi)) / (rho0 * Dp * phi ** 3)) * ((150 * (1 - phi) * mu) / Dp + 1.75 * G);
}

/**
 * Pressure-drop parameter alpha (1/kg) from Ergun inputs and the inlet pressure P0 (Pa):
 * alpha = 2 beta0 / (Ac (1 - phi) rho_c P0).
 * Throws RateloomError (E_VALUE) for bad inputs, naming the field under `path`.
 */
export function ergunAlpha(
  inputs: ErgunInputs,
  inletPressure: number,
  path: FieldPath = ['reactor', 'pressureDrop', 'ergun'],
  pressurePath: FieldPath = ['pressure'],
): number {
  const beta0 = ergunBeta0(inputs, path);
  positive(inputs.crossSection, 'crossSection', path, 'm2');
  positive(inputs.catalystDensity, 'catalystDensity', path, 'kg/m3');
  if (!(Number.isFinite(inletPressure) && inletPressure > 0)) {
    throw new RateloomError('E_VALUE', `inlet pressure must be positive to compute alpha, got ${inletPressure} Pa`, {
      path: pressurePath,
      fix: 'Give the inlet pressure in Pa as a positive number.',
    });
  }
  return (2 * beta0) / (inputs.crossSection * (1 - inputs.voidFraction) * inputs.catalystDensity * inletPressure);
}

/**
 * alpha of a reactor's pressure-drop description: the given alpha, or the Ergun value; 0 when no
 * pressure drop is described. Throws for a negative alpha or for both/neither forms given wrongly.
 */
export function resolveAlpha(
  spec: PressureDropSpec | undefined,
  inletPressure: number,
  path: FieldPath = ['reactor', 'pressureDrop'],
  pressurePath: FieldPath = ['pressure'],
): number {
  if (!spec) return 0;
  if (spec.alpha !== undefined && spec.ergun !== undefined) {
    throw new RateloomError('E_VALUE', 'pressure drop gives both alpha and Ergun inputs', {
      path,
      fix: 'Give either alpha or the Ergun inputs, not both.',
    });
  }
  if (spec.ergun) return ergunAlpha(spec.ergun, inletPressure, [...path, 'ergun'], pressurePath);
  const a = spec.alpha ?? 0;
  if (!(Number.isFinite(a) && a >= 0)) {
    throw new RateloomError('E_VALUE', `pressure-drop alpha must be a non-negative number, got ${a} (1/kg for a packed bed, 1/m3 for plug flow)`, {
      path: [...path, 'alpha'],
      fix: 'Give alpha in 1/kg (packed bed) or 1/m3 (plug flow) as a number >= 0.',
    });
  }
  return a;
}
