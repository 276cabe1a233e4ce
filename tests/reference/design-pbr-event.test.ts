import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { loadCase } from '../../src/design/case';
import { buildSystem } from '../../src/design/system';
import { Sizer } from '../../src/design/sizer';
import { sizeReactor } from '../../src/design/size';
import { fixtureKinetics } from '../design/kinetics-fixtures';
import { handoff, param } from '../design/handoff-fixture';

const ref = JSON.parse(readFileSync(new URL('./scipy/design_pbr_event.json', import.meta.url), 'utf8'));
const species = ['A', 'B', 'C', 'I'];
// A + B -> C, r' = k C_A C_B per kg catalyst; k at T_ref = 480 K.
const kin = fixtureKinetics(species, ['k'], [{ id: 'r1', nu: [-1, -1, 1, 0], k: 0, E: -1, K: -1, basis: 'mass' }], 480);

function gasCase(alpha: number) {
  return loadCase(
    {
      name: 'scipy reference bed',
      reactor: { kind: 'packed-bed', phase: 'gas' },
      feed: { totalFlow: '20 mol/s', moleFractions: { A: 0.4, B: 0.4, I: 0.2 } },
      temperature: '480 K',
      pressure: '5 bar',
      target: { conversion: 0.6, species: 'A' },
      ...(alpha > 0 ? { pressureDrop: { alpha: { value: alpha, unit: '1/kg' } } } : {}),
    },
    species,
    ['r1'],
  );
}

describe('gas packed bed with pressure drop against SciPy solve_ivp (terminal event)', () => {
  for (const s of ref.sized) {
    it(`alpha = ${s.alpha} 1/kg`, () => {
      const sz = new Sizer(buildSystem(kin, gasCase(s.alpha), [ref.case.k]));
      const res = sz.size();
      expect(res.status).toBe('sized');
      // Source: SciPy solve_ivp, script tests/reference/scipy/design_pbr_event.py
      expect(Math.abs(res.size / s.W - 1)).toBeLessThan(1e-6);
      const p = s.alpha > 0 ? Math.sqrt(res.y[4]) : 1;
      // Source: SciPy solve_ivp, script tests/reference/scipy/design_pbr_event.py
      expect(Math.abs(p - s.pressureRatio)).toBeLessThan(1e-7);
    });
  }
  it('reports where the pressure runs out (catalyst mass)', () => {
    const e = ref.exhausted;
    const h = handoff(species, [{ id: 'r1', equation: 'A + B -> C' }], [param('k', ref.case.k, 'log')], { names: ['k'], matrix: [[1e-4]] }, { temperature: { min: 450, max: 500, unit: 'K' } }, 480);
    const r = sizeReactor({ handoff: h, kinetics: kin, kase: gasCase(e.alpha), options: { draws: 0 } });
    expect(r.status).toBe('pressure-exhausted');
    expect(r.success).toBe(false);
    const m = /falls to zero at ([\d.]+) kg of catalyst/.exec(r.message);
    expect(m).not.toBeNull();
    // Source: SciPy solve_ivp, script tests/reference/scipy/design_pbr_event.py (4 significant digits in the message)
    expect(Number(m![1])).toBeCloseTo(e.exhaustedAt, 2);
    expect(r.message).toContain(`only ${Number(e.conversionThere.toPrecision(4))}`);
    expect(r.cautions.length).toBe(4);
  });
});
