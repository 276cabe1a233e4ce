/**
 * Seeded pseudo-random numbers (reproducible: same seed, same draws) for the whole library. Two
 * generators, kept because seeded results already depend on their exact streams:
 *
 *   - mulberry32 (Tommy Ettinger, 2017; a 32-bit state generator with a Weyl-sequence step and an
 *     output mix, public domain), period 2^32, normals by the Box-Muller transform (Box & Muller
 *     1958, Ann. Math. Statist. 29, 610-611). Used by estimation (multistart designs, tests).
 *   - SeededRandom: xoshiro128** (D. Blackman, S. Vigna, "Scrambled linear pseudorandom number
 *     generators", ACM Trans. Math. Softw. 47 (2021) 36), state seeded from one 32-bit seed through
 *     SplitMix32 (the seeding the authors recommend); doubles carry 53 random bits; normals by
 *     Marsaglia's polar method (G. Marsaglia, T.A. Bray, "A convenient method for generating normal
 *     variables", SIAM Review 6 (1964) 260-264), caching the second variate. Used by the Monte
 *     Carlo sizing of design.
 *
 * Both satisfy the `Random` interface. Neither is for cryptography.
 */

/** A seeded generator of uniform numbers in [0, 1) and standard normal deviates. */
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

/** xoshiro128** with polar normals (see the file header). */
export class SeededRandom implements Random {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare = 0;
  private hasSpare = false;

  /** @param seed any integer (taken modulo 2^32) */
  constructor(seed: number) {
    let x = seed >>> 0;
    const next = () => {
      // SplitMix32
      x = (x + 0x9e3779b9) >>> 0;
      let z = x;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.s0 = next();
    this.s1 = next();
    this.s2 = next();
    this.s3 = next();
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  /** Next 32-bit unsigned integer (xoshiro128**). */
  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5) >>> 0, 7), 9) >>> 0;
    const t = (this.s1 << 9) >>> 0;
    this.s2 = (this.s2 ^ this.s0) >>> 0;
    this.s3 = (this.s3 ^ this.s1) >>> 0;
    this.s1 = (this.s1 ^ this.s2) >>> 0;
    this.s0 = (this.s0 ^ this.s3) >>> 0;
    this.s2 = (this.s2 ^ t) >>> 0;
    this.s3 = rotl(this.s3, 11);
    return result;
  }

  /** Uniform double in [0, 1) (the Random interface; same as uniform()). */
  next(): number {
    return this.uniform();
  }

  /** Uniform double in [0, 1) with 53 random bits. */
  uniform(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Standard normal variate (polar method). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    let u: number, v: number, s: number;
    do {
      u = 2 * this.uniform() - 1;
      v = 2 * this.uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    this.spare = v * f;
    this.hasSpare = true;
    return u * f;
  }
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}

/**
 * Normal draws from mulberry32 uniforms by the cosine branch of Box-Muller only (two uniforms per
 * draw, no spare; u is offset by 1e-300 so log(0) cannot occur). Test fixtures and benchmarks whose
 * committed data were generated this way use it, so their data stay reproducible.
 */
export function cosineNormals(seed: number): () => number {
  const u = mulberry32(seed).next;
  return () => Math.sqrt(-2 * Math.log(u() + 1e-300)) * Math.cos(2 * Math.PI * u());
}
