/**
 * The pellet's geometry for the reaction-diffusion problem.
 *
 * Slab (thickness 2L, both faces open), sphere (radius R) and infinitely long cylinder (radius R)
 * are modelled exactly. A ring, or a cylinder with a given length, becomes the sphere with the same
 * volume-to-external-surface ratio Vp/Sp: R_eq = 3 Vp/Sp. Rule: R. Aris, "On shape factors for
 * irregular particles I", Chem. Eng. Sci. 6 (1957) 262-268, showed that with the length Vp/Sp the
 * effectiveness factors of all shapes nearly coincide (exactly at both ends of the modulus range).
 * The diameter used by packed-bed correlations is 6 Vp/Sp (common practice for non-spherical
 * particles; it equals the diameter of a sphere).
 */
import type { PelletGeometry, PelletSpec } from './types.js';

/** Volume and external surface of one pellet (per unit length for an infinite cylinder). */
function volumeAndSurface(p: PelletSpec): { V: number; S: number } {
  const r = p.diameter / 2;
  if (p.shape === 'ring') {
    const ri = (p.innerDiameter ?? 0) / 2;
    const h = p.length ?? Infinity;
    if (!Number.isFinite(h)) return { V: Math.PI * (r * r - ri * ri), S: 2 * Math.PI * (r + ri) };
    return { V: Math.PI * (r * r - ri * ri) * h, S: 2 * Math.PI * (r + ri) * h + 2 * Math.PI * (r * r - ri * ri) };
  }
  const h = p.length as number;
  return { V: Math.PI * r * r * h, S: 2 * Math.PI * r * h + 2 * Math.PI * r * r };
}

/** The model geometry of a (checked) pellet. */
export function pelletGeometry(p: PelletSpec): PelletGeometry {
  const d = p.diameter;
  if (p.shape === 'sphere') {
    return { a: 3, R: d / 2, volumeToSurface: d / 6, equivalentDiameter: d, rule: 'sphere' };
  }
  if (p.shape === 'slab') {
    return { a: 1, R: d / 2, volumeToSurface: d / 2, equivalentDiameter: 3 * d, rule: 'slab, both faces open' };
  }
  if (p.shape === 'cylinder' && p.length === undefined) {
    return { a: 2, R: d / 2, volumeToSurface: d / 4, equivalentDiameter: 1.5 * d, rule: 'infinitely long cylinder' };
  }
  const { V, S } = volumeAndSurface(p);
  const vs = V / S;
  return {
    a: 3,
    R: 3 * vs,
    volumeToSurface: vs,
    equivalentDiameter: 6 * vs,
    rule: `${p.shape} as the sphere of equal Vp/Sp (radius ${(3 * vs * 1000).toPrecision(4)} mm; Aris 1957)`,
  };
}
