/**
 * Bad input throws RateloomError naming the field; numerical trouble (pressure exhaustion) is a
 * status with no NaN anywhere in the output.
 */
import { describe, expect, it } from 'vitest';
import { RateloomError, formatPath } from '../../src/core/errors';
import { solveReactor } from '../../src/reactors';
import { ergunAlpha, ergunBeta0 } from '../../src/reactors/ergun';
import type { ReactorSolution, RunConditions } from '../../src/reactors/types';
import { compile, pl } from './compiled';

const kinMass = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k', 'mass') }], ['k']);
const kinVol = compile(['A', 'B'], [{ equation: 'A -> B', rate: pl('k') }], ['k']);
const theta = Float64Array.from([1e-4]);
const base: RunConditions = { id: 'run7', temperature: 500, pressure: 2e5, feed: Float64Array.from([1, 0]), size: 10 };
const pbr = { kind: 'packed-bed' as const, phase: 'gas' as const };

function thrown(f: () => unknown): RateloomError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(RateloomError);
    return e as RateloomError;
  }
  throw new Error('expected a RateloomError');
}

function noNaN(s: ReactorSolution): void {
  const all = [...s.outletAmounts, ...s.outletConcentrations, s.pressureRatio, s.exhaustedAt ?? 0];
  if (s.profile) for (let i = 0; i < s.profile.x.length; i++) all.push(s.profile.x[i], ...s.profile.amounts[i], ...s.profile.concentrations[i], s.profile.pressureRatio[i]);
  for (const v of all) expect(Number.isFinite(v)).toBe(true);
}

describe('input checks', () => {
  it.each([0, -10, NaN])('temperature %s -> error naming runs.<id>.temperature', (T) => {
    const e = thrown(() => solveReactor(pbr, { ...base, temperature: T }, kinMass, theta));
    expect(e.path).toEqual(['runs', 'run7', 'temperature']);
    expect(e.fix).toMatch(/kelvin/);
  });

  it.each([0, -1e5])('pressure %s -> error naming runs.<id>.pressure', (P) => {
    const e = thrown(() => solveReactor(pbr, { ...base, pressure: P }, kinMass, theta));
    expect(formatPath(e.path)).toBe('runs.run7.pressure');
  });

  it('missing pressure in gas phase, negative feed, missing size, missing volumetric flow', () => {
    const { pressure: _p, ...noP } = base;
    expect(thrown(() => solveReactor(pbr, noP, kinMass, theta)).code).toBe('E_MISSING_FIELD');
    const neg = thrown(() => solveReactor(pbr, { ...base, feed: Float64Array.from([1, -0.1]) }, kinMass, theta));
    expect(neg.path).toEqual(['runs', 'run7', 'feed', 'B']);
    const { size: _s, ...noSize } = base;
    expect(thrown(() => solveReactor(pbr, noSize as RunConditions, kinMass, theta)).path).toEqual(['runs', 'run7', 'size']);
    const liq = thrown(() => solveReactor({ kind: 'plug-flow', phase: 'liquid' }, base, kinVol, theta));
    expect(liq.path).toEqual(['runs', 'run7', 'volumetricFlow']);
    const nofeed = thrown(() => solveReactor(pbr, { ...base, feed: Float64Array.from([0, 0]) }, kinMass, theta));
    expect(nofeed.path).toEqual(['runs', 'run7', 'feed']);
  });

  it('unknown species in membrane permeation names the closest species', () => {
    const e = thrown(() =>
      solveReactor({ kind: 'membrane', phase: 'gas', membrane: { permeation: { Bb: 0.1 } } }, base, kinVol, theta));
    expect(e.code).toBe('E_UNKNOWN_SPECIES');
    expect(e.path).toEqual(['reactor', 'membrane', 'permeation', 'Bb']);
    expect(e.details?.closest).toBe('B');
  });

  it('a volume-basis rate in a packed bed needs the bulk density; with it, rates are divided by it', () => {
    const e = thrown(() => solveReactor(pbr, base, kinVol, theta));
    expect(e.path).toEqual(['reactor', 'bulkDensity']);
    // with bulk density rho_b, r' = r / rho_b: a bed of W kg equals a plug flow of W / rho_b m3
    const a = solveReactor({ ...pbr, bulkDensity: 800 }, base, kinVol, Float64Array.from([0.05]), { rtol: 1e-11 });
    const b = solveReactor({ kind: 'plug-flow', phase: 'gas' }, { ...base, size: 10 / 800 }, kinVol, Float64Array.from([0.05]), { rtol: 1e-11 });
    expect(Math.abs(a.outletAmounts[0] - b.outletAmounts[0])).toBeLessThan(1e-9);
    expect(a.outletAmounts[0]).toBeLessThan(0.999);
  });

  it('wrong parameter count and unknown reactor kind', () => {
    expect(thrown(() => solveReactor(pbr, base, kinMass, new Float64Array(2))).path).toEqual(['parameters']);
    expect(thrown(() => solveReactor({ kind: 'fluid-bed' as never, phase: 'gas' }, base, kinMass, theta)).path).toEqual(['reactor', 'kind']);
  });
});

describe('pressure exhaustion', () => {
  it('no reaction, alpha W > 1: status pressure-exhausted at about 1/alpha, no NaN', () => {
    const alpha = 0.2; // 1/kg, so p reaches 0 at W = 5 kg inside a 10 kg bed
    const s = solveReactor({ ...pbr, pressureDrop: { alpha } }, base, kinMass, Float64Array.from([0]), { profile: true, sensitivities: true });
    expect(s.status).toBe('pressure-exhausted');
    expect(s.success).toBe(false);
    expect(s.message).toMatch(/pressure falls to zero/);
    // Source: analytic p = (1 - alpha W)^(1/2) reaches zero at W = 1/alpha
    expect(Math.abs(s.exhaustedAt! - 1 / alpha)).toBeLessThan(1e-6 / alpha);
    noNaN(s);
    expect(Math.max(...s.profile!.x)).toBeLessThanOrEqual(5);
  });
});

describe('integration trouble is a status, never a throw', () => {
  it('a step budget too small -> integration-failed with the integrator message, finite output', () => {
    const s = solveReactor(pbr, { ...base, size: 1e4 }, kinMass, Float64Array.from([5]), { maxSteps: 3, method: 'nonstiff', profile: true });
    expect(s.status).toBe('integration-failed');
    expect(s.success).toBe(false);
    expect(s.message).toMatch(/integration failed/);
    noNaN(s);
  });
});

describe('Ergun alpha', () => {
  const inputs = { particleDiameter: 0.004, voidFraction: 0.4, superficialMassFlux: 2, viscosity: 2.5e-5, inletDensity: 5, crossSection: 0.01, catalystDensity: 2000 };
  it('matches the formula written out', () => {
    const phi = 0.4;
    const beta0 = (2 * (1 - phi)) / (5 * 0.004 * phi ** 3) * ((150 * (1 - phi) * 2.5e-5) / 0.004 + 1.75 * 2);
    // Source: Ergun (1952), common design form (value computed here by hand from the formula)
    expect(ergunBeta0(inputs)).toBeCloseTo(beta0, 8);
    expect(ergunAlpha(inputs, 1e6)).toBeCloseTo((2 * beta0) / (0.01 * 0.6 * 2000 * 1e6), 14);
  });
  it.each([
    ['voidFraction', 1],
    ['voidFraction', 0],
    ['particleDiameter', -1],
    ['viscosity', 0],
    ['crossSection', 0],
  ] as const)('refuses %s = %s', (field, v) => {
    const e = thrown(() => ergunAlpha({ ...inputs, [field]: v }, 1e6));
    expect(e.path).toEqual(['reactor', 'pressureDrop', 'ergun', field]);
  });
  it('a packed bed with Ergun inputs uses the computed alpha', () => {
    const alpha = ergunAlpha(inputs, 2e5);
    const s = solveReactor({ ...pbr, pressureDrop: { ergun: inputs } }, { ...base, size: 0.5 / alpha }, kinMass, Float64Array.from([0]), { rtol: 1e-11 });
    // Source: analytic p = (1 - alpha W)^(1/2) with W = 0.5/alpha
    expect(s.pressureRatio).toBeCloseTo(Math.sqrt(0.5), 9);
  });
});
