/**
 * Internal effectiveness factor of an isothermal pellet with one first-order reaction, in closed
 * form (E.W. Thiele, "Relation between catalytic activity and size of particle", Ind. Eng. Chem.
 * 31 (1939) 916-920; the cylinder from the same balance with Bessel functions, as in R. Aris, The
 * Mathematical Theory of Diffusion and Reaction in Permeable Catalysts, Oxford 1975, vol. 1 ch. 3):
 *
 *   slab (half-thickness L, phi = L sqrt(k/De)):     eta = tanh(phi) / phi
 *   infinite cylinder (radius R, phi = R sqrt(k/De)): eta = 2 I1(phi) / (phi I0(phi))
 *   sphere (radius R, phi = R sqrt(k/De)):            eta = (3/phi^2) (phi coth(phi) - 1)
 *
 * with k the first-order rate constant per m3 of pellet (1/s). Each shape uses its own modulus
 * (half-thickness or radius), as written above; `normalizedModulus` converts to Aris' common one.
 */
import { besselRatioI1I0 } from './bessel.js';

/** Shape exponent: 1 slab, 2 cylinder, 3 sphere. */
export type ShapeExponent = 1 | 2 | 3;

/** Below this modulus the closed forms lose digits to cancellation; their Taylor series is used. */
const SMALL = 0.02;

/** Sphere: (3/phi^2)(phi coth phi - 1). */
export function etaSphereFirstOrder(phi: number): number {
  if (phi < SMALL) {
    const p2 = phi * phi;
    return 1 - p2 / 15 + (2 * p2 * p2) / 315;
  }
  const coth = phi > 20 ? 1 + 2 * Math.exp(-2 * phi) : 1 / Math.tanh(phi);
  return (3 / (phi * phi)) * (phi * coth - 1);
}

/** Slab: tanh(phi)/phi. */
export function etaSlabFirstOrder(phi: number): number {
  if (phi < SMALL) {
    const p2 = phi * phi;
    return 1 - p2 / 3 + (2 * p2 * p2) / 15;
  }
  return Math.tanh(phi) / phi;
}

/** Infinite cylinder: 2 I1(phi) / (phi I0(phi)). */
export function etaCylinderFirstOrder(phi: number): number {
  if (phi < SMALL) {
    const p2 = phi * phi;
    return 1 - p2 / 8 + (p2 * p2) / 48;
  }
  return (2 * besselRatioI1I0(phi)) / phi;
}

/** First-order eta for shape exponent a with the shape's own modulus phi = R sqrt(k/De). */
export function etaFirstOrder(a: ShapeExponent, phi: number): number {
  if (!(phi >= 0)) return NaN;
  return a === 1 ? etaSlabFirstOrder(phi) : a === 2 ? etaCylinderFirstOrder(phi) : etaSphereFirstOrder(phi);
}

/** Aris' normalised modulus (length Vp/Sp = R/a) from the shape's own modulus. */
export function normalizedModulus(a: ShapeExponent, phi: number): number {
  return phi / a;
}
