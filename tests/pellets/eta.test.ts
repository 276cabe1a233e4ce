/**
 * Pellet effectiveness factors: the numerical collocation solver against the closed forms, the
 * asymptote, and Bischoff's normalisation of the modulus.
 */
import { describe, expect, it } from 'vitest';
import { compile, pl } from '../reactors/compiled';
import { PelletSolver } from '../../src/pellets/pellet-bvp';
import { etaFirstOrder, etaSphereFirstOrder, etaSlabFirstOrder, etaCylinderFirstOrder } from '../../src/pellets/analytic';
import { besselI0, besselI1 } from '../../src/pellets/bessel';
import { generalizedModulus } from '../../src/pellets/generalized';

const R = 3e-3; // m
const De = 1e-6; // m2/s
const rho = 1000; // kg/m3 pellet

/** A -> B with r = k C_A^n per kg catalyst; k chosen for a target modulus at Cs. */
function pellet(a: 1 | 2 | 3, n: number, k: number) {
  const kin = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k', 'mass', { A: n }) }], ['k']);
  return new PelletSolver({ kinetics: kin, a, R, De: Float64Array.of(De, De), rateToPellet: Float64Array.of(rho) }, Float64Array.of(k));
}

describe('modified Bessel functions', () => {
  it('match tabulated values', () => {
    // Abramowitz & Stegun (1964) Table 9.8 (values from memory to 10 digits): I0(1), I1(1), I0(5), I1(5)
    expect(besselI0(1)).toBeCloseTo(1.266065878, 9);
    expect(besselI1(1)).toBeCloseTo(0.565159104, 9);
    expect(besselI0(5) / 27.23987182).toBeCloseTo(1, 9);
    expect(besselI1(5) / 24.33564214).toBeCloseTo(1, 9);
    // series (x <= 30) and asymptotic (x > 30) branches join smoothly
    expect(besselI1(30.000001) / besselI1(30)).toBeCloseTo(Math.exp(0.000001) * (1 - 0.5e-6 / 30), 9);
  });
});

describe('first-order eta: numerical pellet vs closed forms', () => {
  // Closed forms (Thiele 1939; cylinder with Bessel functions, Aris 1975): slab tanh(phi)/phi,
  // cylinder 2 I1(phi)/(phi I0(phi)), sphere (3/phi^2)(phi coth(phi) - 1).
  const closed = { 1: etaSlabFirstOrder, 2: etaCylinderFirstOrder, 3: etaSphereFirstOrder } as const;
  for (const a of [1, 2, 3] as const) {
    for (const phi of [0.05, 0.5, 1, 2, 5, 10, 30, 80]) {
      it(`shape a=${a}, phi=${phi}`, () => {
        const kv = ((phi / R) ** 2) * De; // 1/s per m3 pellet
        const sol = pellet(a, 1, kv / rho).solve(Float64Array.of(10, 0), 500);
        expect(sol.status).toBe('converged');
        expect(Math.abs(sol.eta[0] - closed[a](phi))).toBeLessThan(1e-6);
        expect(etaFirstOrder(a, phi)).toBe(closed[a](phi));
      });
    }
  }
  it('the default number of points (nodesFor) keeps the relative error below 1e-8 up to phi = 150', () => {
    // closed forms as above (Thiele 1939; Aris 1975), first order, all three shapes
    for (const a of [1, 2, 3] as const) {
      for (const phi of [0.5, 2, 5, 10, 20, 30, 50, 80, 150]) {
        const kv = ((phi / R) ** 2) * De;
        const sol = pellet(a, 1, kv / rho).solve(Float64Array.of(10, 0), 500);
        expect(Math.abs(sol.eta[0] / closed[a](phi) - 1)).toBeLessThan(1e-8);
      }
    }
  });

  it('a warm start from the previous profile gives the same eta as a cold start', () => {
    const s = pellet(3, 2, 0.05);
    for (let c = 10; c > 2; c -= 0.7) {
      const w = s.solve(Float64Array.of(c, 10 - c), 500, { warmStart: true });
      const cold = pellet(3, 2, 0.05).solve(Float64Array.of(c, 10 - c), 500);
      expect(Math.abs(w.eta[0] / cold.eta[0] - 1)).toBeLessThan(1e-10);
      expect(w.iterations).toBeLessThanOrEqual(cold.iterations);
    }
  });

  it('closed forms at hand-checked points', () => {
    // tanh(1)/1 = 0.761594156; sphere phi=1: 3(coth 1 - 1) = 3(1.313035285 - 1) = 0.939105856
    expect(etaSlabFirstOrder(1)).toBeCloseTo(0.761594156, 9);
    expect(etaSphereFirstOrder(1)).toBeCloseTo(0.939105856, 9);
    // cylinder phi=1: 2 I1(1)/I0(1) = 2 * 0.565159104 / 1.266065878 = 0.892779932
    expect(etaCylinderFirstOrder(1)).toBeCloseTo(0.892779932, 8);
  });
});

describe('asymptote and generalized modulus', () => {
  it('sphere: eta -> 3/phi for large phi (numerical solver)', () => {
    // From the closed form: eta phi / 3 = coth(phi) - 1/phi -> 1 as phi grows.
    for (const phi of [50, 100, 200]) {
      const kv = ((phi / R) ** 2) * De;
      const sol = pellet(3, 1, kv / rho).solve(Float64Array.of(10, 0), 500);
      expect(Math.abs((sol.eta[0] * phi) / 3 - (1 - 1 / phi))).toBeLessThan(1e-6);
    }
  });

  it("Bischoff's modulus collapses n-th order curves (sphere), the naive one does not", () => {
    // Bischoff (AIChE J. 1965): with Phi = (Vp/Sp) sqrt((n+1) k Cs^(n-1) / (2 De)), eta Phi -> 1 for
    // large Phi whatever n. Here n = 1, 2, 3 at the same Phi: the spread of eta shrinks as Phi grows,
    // while at the same naive modulus R sqrt(k Cs^(n-1)/De) the curves stay apart by sqrt((n+1)/2).
    const Cs = 10;
    const spread = (Phi: number, bischoff: boolean): number => {
      const etas = [1, 2, 3].map((n) => {
        const norm = bischoff ? (n + 1) / 2 : 1;
        const kv = ((Phi * 3) / R) ** 2 * (De / (norm * Cs ** (n - 1)));
        const solver = pellet(3, n, kv / rho);
        const sol = solver.solve(Float64Array.of(Cs, 0), 500);
        expect(sol.status).toBe('converged');
        if (bischoff) {
          const g = generalizedModulus({
            kinetics: solver.problem.kinetics, theta: solver.theta, Cs: Float64Array.of(Cs, 0), Ts: 500,
            De: Float64Array.of(De, De), rateToPellet: Float64Array.of(rho), a: 3, volumeToSurface: R / 3,
          });
          expect(g.modulus[0]).toBeCloseTo(Phi, 8); // the quadrature reproduces the closed form
        }
        return sol.eta[0];
      });
      return (Math.max(...etas) - Math.min(...etas)) / Math.min(...etas);
    };
    expect(spread(30, true)).toBeLessThan(0.02);
    expect(spread(30, true)).toBeLessThan(spread(3, true));
    expect(spread(30, false)).toBeGreaterThan(0.3);
    for (const n of [1, 2, 3]) {
      const Phi = 60;
      const kv = ((Phi * 3) / R) ** 2 * (De / (((n + 1) / 2) * Cs ** (n - 1)));
      const sol = pellet(3, n, kv / rho).solve(Float64Array.of(Cs, 0), 500);
      expect(Math.abs(sol.eta[0] * Phi - 1)).toBeLessThan(0.02);
    }
  });
});
