import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { sizeReactor } from '../../src/design/size';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { equilibriumConversion } from '../../src/design/feasibility';
import { CAUTIONS } from '../../src/design/cautions';
import { handoff, param } from '../design/handoff-fixture';

// Invented gas reaction A + B <=> C on a catalyst, K_eq = 0.14 m3/mol (constant), T = 500 K, 3 bar.
const K = 0.14;
const h = handoff(
  ['A', 'B', 'C'],
  [{ id: 'r1', equation: 'A + B <=> C', rate: { form: 'reversible-power-law', basis: 'mass', rateConstant: { k: 'k' }, equilibriumConstant: { K: 'Keq' } } }],
  [param('k', 2e-5, 'log', 'm6/(kg mol s)'), param('Keq', K, 'log', 'm3/mol')],
  { names: ['k', 'Keq'], matrix: [[0.01, 0], [0, 0.0004]] },
  { temperature: { min: 480, max: 520, unit: 'K' }, pressure: { min: 2e5, max: 4e5, unit: 'Pa' } },
  500,
);
const dk = kineticsFromHandoff(h);
const mk = (X: number, extra: Record<string, unknown> = {}) =>
  loadCase(
    {
      name: 'equilibrium-limited bed',
      reactor: { kind: 'packed-bed', phase: 'gas' },
      feed: { totalFlow: '10 mol/s', moleFractions: { A: 0.5, B: 0.5 } },
      temperature: '500 K',
      pressure: '3 bar',
      target: { conversion: X, species: 'A' },
      ...extra,
    },
    ['A', 'B', 'C'],
    ['r1'],
  );

// Independent root-find of K = C_C/(C_A C_B) with C_j = C_T0 F_j/F_T for an equimolar A/B feed:
// X (2 - X) = a (1 - X)^2, a = K C_T0, by bisection.
function independentXeq(): number {
  const a = K * (3e5 / (8.314462618 * 500));
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < 200; i++) {
    const m = (lo + hi) / 2;
    if (m * (2 - m) - a * (1 - m) ** 2 < 0) lo = m;
    else hi = m;
  }
  return (lo + hi) / 2;
}

describe('equilibrium limit', () => {
  const Xeq = independentXeq();
  it('equilibrium conversion matches an independent root-find', () => {
    const e = equilibriumConversion(dk.kinetics, mk(0.5), [2e-5, K], 'A');
    // Source: independent bisection on the equilibrium condition in this test; closed form 1 - (1 + K C_T0)^-1/2.
    expect(e.conversion).toBeCloseTo(Xeq, 10);
    expect(Xeq).toBeCloseTo(1 - 1 / Math.sqrt(1 + K * (3e5 / (8.314462618 * 500))), 12);
    expect(e.method).toBe('equilibrium');
  });
  it('refuses a target beyond equilibrium with the equilibrium conversion in the message', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: mk(Xeq + 0.02), options: { draws: 0 } });
    expect(r.status).toBe('target-unreachable');
    expect(r.success).toBe(false);
    // Source: independent bisection above (6 significant digits in the message).
    expect(r.message).toContain(String(Number(Xeq.toPrecision(6))));
    expect(r.message).toContain('equilibrium conversion');
    expect(r.cautions).toEqual([...CAUTIONS]);
  });
  it('sizes a target below equilibrium; warns on extrapolation with value, range and amount', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: mk(0.5, { temperature: '530 K' }), options: { draws: 200, profileDraws: 10 } });
    expect(r.status).toBe('sized');
    expect(r.size!.unit).toBe('kg');
    const w = r.warnings.find((x) => x.code === 'W_EXTRAPOLATION');
    expect(w?.message).toContain('temperature 530 K lies above the fitted data range [480, 520] K by 10 K');
    expect(r.cautions).toEqual([...CAUTIONS]);
    expect(r.spaceTime!.value).toBeCloseTo(r.size!.value / 5, 10);
    expect(r.outlet!.conversion!.value).toBeCloseTo(0.5, 7);
  });
  it('pressure outside coverage is reported in bar', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: { ...mk(0.3), pressure: 6e5 }, options: { draws: 0 } });
    expect(r.warnings.map((w) => w.message).join('\n')).toContain('pressure 6 bar lies above the fitted data range [2, 4] bar by 2 bar');
  });
});
