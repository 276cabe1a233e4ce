/**
 * Small seeded pseudo-random generators for reproducible multistart designs and simulations.
 *
 * Uniforms: mulberry32 (Tommy Ettinger, 2017; a 32-bit state generator with a Weyl-sequence step and
 * an output mix, public domain). Period 2^32 and passes the usual quick statistical batteries; more
 * than enough for designing a few hundred starts, not for cryptography. Normals: Box-Muller
 * transform (Box & Muller 1958, Ann. Math. Statist. 29, 610-611).
 */

/** A seeded generator of uniform numbers in [0, 1). */
export interface Random {
  /** Next uniform in [0, 1). */
  next(): number;
  /** Next standard normal deviate. */
  normal(): number;
}

/** mulberry32 seeded with the 32-bit integer `seed` (other numbers are truncated to 32 bits). */
export function mulberry32(seed: number): Random {
  let a = seed >>> 0;
  let spare: number | null = null;
  const next = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = next();
    while (u === 0) u = next();
    const v = next();
    const rad = Math.sqrt(-2 * Math.log(u));
    spare = rad * Math.sin(2 * Math.PI * v);
    return rad * Math.cos(2 * Math.PI * v);
  };
  return { next, normal };
}
