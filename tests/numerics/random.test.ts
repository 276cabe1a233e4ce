/**
 * The seeded generators of numerics/random.ts: their streams are pinned (seeded fits and Monte Carlo
 * sizes depend on them), the old import paths give the same generators, and the draws look uniform
 * and standard normal.
 */
import { describe, expect, it } from 'vitest';
import { SeededRandom, mulberry32, type Random } from '../../src/numerics/random';
import { SeededRandom as DesignSeeded } from '../../src/design/random';
import { mulberry32 as estimationMulberry } from '../../src/estimation/random';

describe('seeded streams', () => {
  it('are the streams of the generators before they moved to numerics/random.ts', () => {
    const a = new SeededRandom(42);
    const b = mulberry32(42);
    const got: number[] = [];
    for (let i = 0; i < 3; i++) got.push(a.uniform(), a.normal(), b.next(), b.normal());
    // Source: values printed by src/design/random.ts and src/estimation/random.ts at commit c08ab55
    // (seed 42, the same call order), before the generators were folded into one file.
    expect(got).toEqual([
      0.6606157208001621, 1.5576636023738426, 0.6011037519201636, 0.7603579045861287,
      0.5346049376113521, -0.019829215651034723, 0.6697340414393693, -1.0131550879041271,
      0.15794549143200243, -0.27180054900549255, 0.17481389874592423, -0.1647039026273102,
    ]);
  });

  it('old import paths give the same generators', () => {
    expect(DesignSeeded).toBe(SeededRandom);
    expect(estimationMulberry).toBe(mulberry32);
  });
});

describe('distribution of the draws', () => {
  const gens: [string, () => Random][] = [
    ['xoshiro128**', () => new SeededRandom(7)],
    ['mulberry32', () => mulberry32(7)],
  ];
  for (const [name, make] of gens) {
    it(`${name}: uniform mean 1/2, normal mean 0 and variance 1`, () => {
      const g = make();
      const m = 40000;
      let su = 0;
      let sz = 0;
      let szz = 0;
      for (let i = 0; i < m; i++) {
        const u = g.next();
        expect(u >= 0 && u < 1).toBe(true);
        su += u;
        const z = g.normal();
        sz += z;
        szz += z * z;
      }
      // Source: uniform mean 1/2 (sd of the mean 0.29/sqrt(m) = 0.0014); normal mean 0 (sd 0.005),
      // variance 1 (sd sqrt(2/m) = 0.007); bounds at about 5 standard deviations
      expect(Math.abs(su / m - 0.5)).toBeLessThan(0.0075);
      expect(Math.abs(sz / m)).toBeLessThan(0.025);
      expect(Math.abs(szz / m - 1)).toBeLessThan(0.035);
    });
  }
});
