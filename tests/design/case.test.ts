import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { parseHandoff } from '../../src/design/handoff-load';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor } from '../../src/design/size';
import { equilibriumConversion } from '../../src/design/feasibility';
import { RateloomError } from '../../src/core/errors';
import { readFileSync } from 'node:fs';
import { handoff, param } from './handoff-fixture';

const sp = ['A', 'B', 'C', 'N2'];
const base = () => JSON.parse(readFileSync('tests/design/fixtures/bed.case.json', 'utf8'));
const err = (f: () => unknown): RateloomError => {
  try {
    f();
  } catch (e) {
    if (e instanceof RateloomError) return e;
    throw e;
  }
  throw new Error('expected a RateloomError');
};

describe('case file loader', () => {
  it('converts units to SI', () => {
    const c = loadCase(base(), sp, ['r1']);
    expect(c.feed[0]).toBeCloseTo((180000 / 3600) * 0.4, 12);
    expect(c.pressure).toBe(5e5);
    expect(c.tubes!.innerDiameter).toBeCloseTo(0.025, 15);
    expect(c.heat!.reactionEnthalpy.r1).toBe(-90000);
    expect(c.uncertainty).toEqual({ draws: 2000, seed: 11, levels: [0.9, 0.95], designLevel: 0.95 });
  });
  it('reads the design level of the tubes and rejects one outside [0.5, 1)', () => {
    const raw = base();
    raw.uncertainty.designLevel = 0.9;
    expect(loadCase(raw, sp, ['r1']).uncertainty.designLevel).toBe(0.9);
    raw.uncertainty.designLevel = 1;
    const e = err(() => loadCase(raw, sp, ['r1']));
    expect(e.code).toBe('E_VALUE');
    expect(e.path).toEqual(['uncertainty', 'designLevel']);
  });
  it('names the closest field for a misspelt one', () => {
    const raw = base();
    raw.tubes.voidFracton = raw.tubes.voidFraction;
    delete raw.tubes.voidFraction;
    const e = err(() => loadCase(raw, sp, ['r1']));
    expect(e.code).toBe('E_UNKNOWN_FIELD');
    expect(e.path).toEqual(['tubes', 'voidFracton']);
    expect(e.fix).toContain("'voidFraction'");
  });
  it('rejects a wrong unit, unknown species, bad mole fractions and two targets', () => {
    const r1 = base();
    r1.pressure = '5 m';
    expect(err(() => loadCase(r1, sp, ['r1'])).code).toBe('E_UNIT');
    const r2 = base();
    r2.target.species = 'AA';
    const e2 = err(() => loadCase(r2, sp, ['r1']));
    expect(e2.code).toBe('E_UNKNOWN_SPECIES');
    expect(e2.fix).toContain("'A'");
    const r3 = base();
    r3.feed.moleFractions.A = 0.5;
    expect(err(() => loadCase(r3, sp, ['r1'])).message).toContain('sum to 1.1');
    const r4 = base();
    r4.target.size = '10 kg';
    expect(err(() => loadCase(r4, sp, ['r1'])).code).toBe('E_SCHEMA');
    const r5 = base();
    r5.reactor.kind = 'packed-bd';
    expect(err(() => loadCase(r5, sp, ['r1'])).fix).toContain("'packed-bed'");
  });
});

describe('hand-off validation', () => {
  const good = () => JSON.parse(readFileSync('tests/design/fixtures/bed.kinetics.json', 'utf8'));
  it('accepts the fixture and rejects a tampered one with typed errors', () => {
    expect(parseHandoff(good()).model).toBe('base');
    const a = good();
    a.format = 'something-else';
    expect(err(() => parseHandoff(a)).code).toBe('E_SCHEMA');
    const b = good();
    b.parameters[0].internalValue = 0;
    expect(err(() => parseHandoff(b)).path).toEqual(['parameters', 0, 'internalValue']);
    const c = good();
    c.covariance.matrix[0][1] = 99;
    expect(err(() => parseHandoff(c)).message).toContain('not symmetric');
    const d = good();
    d.covariance.names[1] = 'EE';
    expect(err(() => parseHandoff(d)).fix).toContain("'E'");
    const e = good();
    delete e.coverage;
    expect(err(() => parseHandoff(e)).code).toBe('E_MISSING_FIELD');
  });
});

describe('series reactions A -> B -> C (liquid, invented)', () => {
  const h = handoff(
    ['A', 'B', 'C'],
    [
      { id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k1' } } },
      { id: 'r2', equation: 'B -> C', rate: { form: 'power-law', rateConstant: { k: 'k2' } } },
    ],
    [param('k1', 0.01, 'log', '1/s'), param('k2', 0.004, 'log', '1/s')],
    { names: ['k1', 'k2'], matrix: [[0.0004, 0], [0, 0.0004]] },
    { temperature: { min: 300, max: 400, unit: 'K' } },
    350,
  );
  const dk = kineticsFromHandoff(h);
  const mk = (kind: string, target: Record<string, unknown>) =>
    loadCase({ name: 's', reactor: { kind, phase: 'liquid' }, feed: { flows: { A: '2 mol/s' }, volumetricFlow: '1e-3 m3/s' }, temperature: '350 K', target }, ['A', 'B', 'C'], ['r1', 'r2']);
  it('stirred tank sized for conversion: tau = X/(k1(1-X)); outlet B = k1 tau F_A/(1+k2 tau)', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: mk('stirred-tank', { conversion: 0.8, species: 'A' }), options: { draws: 100, profileDraws: 5 } });
    const tau = 0.8 / (0.01 * 0.2);
    // Source: analytic solution of the series-reaction stirred-tank balances.
    expect(r.size!.value / (tau * 1e-3) - 1).toBeCloseTo(0, 8);
    expect(r.outlet!.amounts.B).toBeCloseTo((0.01 * tau * 0.4) / (1 + 0.004 * tau), 7);
  });
  it('plug flow sized for production of B: closed form F_B(tau) = F_A0 k1/(k2-k1)(e^-k1 tau - e^-k2 tau)', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: mk('plug-flow', { production: '0.8 mol/s', species: 'B' }), options: { draws: 0 } });
    const tau = r.size!.value / 1e-3;
    // Source: analytic solution of the series-reaction plug-flow balances.
    expect(((2 * 0.01) / (0.004 - 0.01)) * (Math.exp(-0.01 * tau) - Math.exp(-0.004 * tau))).toBeCloseTo(0.8, 8);
  });
  it('several reactions: plateau conversion of A is complete', () => {
    const e = equilibriumConversion(dk.kinetics, mk('plug-flow', { conversion: 0.5, species: 'A' }), [0.01, 0.004], 'A');
    expect(e.method).toBe('plateau');
    expect(e.conversion).toBeCloseTo(1, 6);
  });
  it('production beyond the attainable maximum is unreachable, not a throw', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: mk('plug-flow', { production: '1.9 mol/s', species: 'B' }), options: { draws: 0 } });
    expect(r.status).toBe('target-unreachable');
    expect(r.cautions.length).toBe(4);
  });
});
