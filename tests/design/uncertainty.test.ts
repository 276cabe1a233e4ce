import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { sizeReactor } from '../../src/design/size';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { handoff, param } from './handoff-fixture';
import { GAS_CONSTANT } from '../../src/core/constants';

// Invented liquid plug-flow case, A -> B first order with Arrhenius (cheap per draw).
function setup(sdLnK: number, sdE: number) {
  const h = handoff(
    ['A', 'B'],
    [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
    [param('k', 2e-3, 'log', '1/s'), param('E', 60000, 'none', 'J/mol')],
    { names: ['k', 'E'], matrix: [[sdLnK ** 2, 0.5 * sdLnK * sdE], [0.5 * sdLnK * sdE, sdE ** 2]] },
    { temperature: { min: 330, max: 370, unit: 'K' } },
    350,
  );
  const dk = kineticsFromHandoff(h);
  const kase = loadCase(
    {
      name: 'liquid tube',
      reactor: { kind: 'plug-flow', phase: 'liquid' },
      feed: { flows: { A: '5 mol/s' }, volumetricFlow: '1e-3 m3/s' },
      temperature: '360 K',
      target: { conversion: 0.9, species: 'A' },
    },
    ['A', 'B'],
    ['r1'],
  );
  return { h, dk, kase };
}

describe('Monte Carlo sizing', () => {
  it('percentiles settle: two seeds agree within 1% at 10,000 draws', () => {
    const { h, dk, kase } = setup(0.1, 3000);
    const run = (seed: number) => sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, options: { seed, draws: 10000, profileDraws: 20 } });
    const a = run(1);
    const b = run(987654);
    expect(a.status).toBe('sized');
    expect(a.uncertainty!.failed.count).toBe(0);
    const ua = a.uncertainty!;
    const ub = b.uncertainty!;
    // Common practice, no source: Monte Carlo percentiles of 10,000 draws repeat within about 1%.
    expect(Math.abs(ua.median / ub.median - 1)).toBeLessThan(0.01);
    for (let i = 0; i < 2; i++) expect(Math.abs(ua.percentiles[i].value / ub.percentiles[i].value - 1)).toBeLessThan(0.01);
    expect(ua.percentiles.map((p) => p.level)).toEqual([0.9, 0.95]);
    expect(ua.percentiles[1].value).toBeGreaterThan(ua.percentiles[0].value);
    expect(ua.percentiles[0].value).toBeGreaterThan(ua.median);
  });

  it('agrees with the delta method when the uncertainty is small (1% relative)', () => {
    const { h, dk, kase } = setup(0.01, 300);
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, options: { seed: 7, draws: 10000, profileDraws: 10 } });
    const u = r.uncertainty!;
    const V = r.size!.value;
    // Size of a first-order PFR: V = v0/k(T) ln(1/(1-X)); d ln V / d ln k = -1,
    // d ln V / d E = (1/T - 1/T_ref)/R. Source: analytic derivative of the closed form.
    const dE = (1 / 360 - 1 / 350) / GAS_CONSTANT;
    expect(u.sensitivities[0].dLnQuantity).toBeCloseTo(-1, 6);
    expect(u.sensitivities[1].dLnQuantity / dE).toBeCloseTo(1, 5);
    for (let i = 0; i < 2; i++) {
      // Common practice, no source: for small uncertainty Monte Carlo and first-order propagation agree.
      const mc = u.percentiles[i].value - V;
      const dm = u.deltaMethod.percentiles[i].value - V;
      expect(Math.abs(mc / dm - 1)).toBeLessThan(0.03);
    }
    // ln V is exactly linear in (ln k, E) here, so ln V is normal with sd s = sd_delta / V and V is
    // log-normal: median V, mean V exp(s^2/2) (analytic). Bounds from the draw count n, four
    // standard errors each (common practice): the sample median has SE sqrt(pi/2) s V / sqrt(n)
    // (asymptotic SE of a sample median, 1/(2 f(median) sqrt(n))), the sample mean s V / sqrt(n).
    const n = u.draws;
    const s = u.deltaMethod.sd / V;
    expect(u.succeeded).toBe(n);
    expect(Math.abs(u.median / V - 1)).toBeLessThan((4 * Math.sqrt(Math.PI / 2) * s) / Math.sqrt(n));
    expect(Math.abs(u.mean / V - Math.exp((s * s) / 2))).toBeLessThan((4 * s) / Math.sqrt(n));
  });

  it('carries a conversion band and reports progress', () => {
    const { h, dk, kase } = setup(0.1, 3000);
    const seen: number[] = [];
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, options: { draws: 500, profileDraws: 50, onProgress: (d) => seen.push(d) } });
    const band = r.uncertainty!.band!;
    expect(seen[seen.length - 1]).toBe(500);
    expect(band.x.length).toBe(band.median.length);
    const atOne = band.x.indexOf(1);
    expect(band.median[atOne]).toBeCloseTo(0.9, 1);
    expect(band.p5[atOne]).toBeLessThan(band.median[atOne]);
    expect(band.p95[atOne]).toBeGreaterThan(band.median[atOne]);
    expect(band.median[0]).toBe(0);
  });
});

describe('rating a given size', () => {
  it('bands along the rated size (not the conversion) and an outlet band that brackets the nominal outlet', () => {
    const { h, dk } = setup(0.1, 3000);
    const kase = loadCase(
      {
        name: 'liquid tube rated',
        reactor: { kind: 'plug-flow', phase: 'liquid' },
        feed: { flows: { A: '5 mol/s' }, volumetricFlow: '1e-3 m3/s' },
        temperature: '360 K',
        target: { size: '0.4 m3' },
      },
      ['A', 'B'],
      ['r1'],
    );
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, options: { draws: 300, profileDraws: 60 } });
    expect(r.status).toBe('rated');
    const u = r.uncertainty!;
    const X = r.outlet!.conversion!.value;
    // At x = 1 the band is at the rated size itself, so its median is near the nominal conversion.
    expect(u.band!.median[u.band!.x.indexOf(1)]).toBeCloseTo(X, 1);
    expect(u.outletBand!.at).toBe(0.4);
    const o = r.outlet!;
    for (const s of ['A', 'B']) {
      expect(o.lo![s]).toBeLessThan(o.amounts[s]);
      expect(o.hi![s]).toBeGreaterThan(o.amounts[s]);
    }
    // Mole balance A + B = F_A0 holds for every draw, so the bands mirror each other.
    expect(o.lo!.A + o.hi!.B).toBeCloseTo(5, 6);
  });
});
