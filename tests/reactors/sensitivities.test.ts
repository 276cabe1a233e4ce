/**
 * Forward sensitivities (ODE reactors) and implicit-differentiation sensitivities (stirred tank)
 * against central finite differences of the outlet.
 */
import { describe, expect, it } from 'vitest';
import { solveReactor } from '../../src/reactors';
import type { ReactorSpec, RunConditions } from '../../src/reactors/types';
import type { CompiledKinetics } from '../../src/kinetics/compiled';
import { compile, pl, rpl } from './compiled';

const opts = { rtol: 1e-12, atol: 1e-16 };

function checkAgainstCentral(spec: ReactorSpec, run: RunConditions, kin: CompiledKinetics, theta: Float64Array): void {
  const s = solveReactor(spec, run, kin, theta, { ...opts, sensitivities: true });
  expect(s.status).toBe('success');
  const sens = s.sensitivity!;
  const nS = kin.speciesNames.length;
  const nP = kin.parameterNames.length;
  for (let k = 0; k < nP; k++) {
    const h = 1e-4 * Math.abs(theta[k]);
    const tp = Float64Array.from(theta);
    const tm = Float64Array.from(theta);
    tp[k] += h;
    tm[k] -= h;
    const sp = solveReactor(spec, run, kin, tp, opts);
    const sm = solveReactor(spec, run, kin, tm, opts);
    let scale = 0;
    for (let j = 0; j < nS; j++) scale = Math.max(scale, Math.abs((sp.outletAmounts[j] - sm.outletAmounts[j]) / (2 * h)));
    // floor: the finite-difference noise, about 1e-9 of the total flow per unit relative change of theta_k
    let total = 0;
    for (let j = 0; j < nS; j++) total += s.outletAmounts[j];
    const floor = (1e-9 * total) / Math.abs(theta[k]);
    for (let j = 0; j < nS; j++) {
      const fd = (sp.outletAmounts[j] - sm.outletAmounts[j]) / (2 * h);
      // Source: central differences of the outlet (common practice, no source)
      expect(Math.abs(sens.amounts[j * nP + k] - fd)).toBeLessThan(1e-6 * scale + floor);
    }
    const fdp = (sp.pressureRatio - sm.pressureRatio) / (2 * h);
    expect(Math.abs(sens.pressureRatio[k] - fdp)).toBeLessThan(1e-6 * Math.abs(fdp) + 1e-9 / Math.abs(theta[k]));
  }
}

const multi = compile(
  ['A', 'B', 'C', 'D', { name: 'I', inert: true }],
  [
    { equation: 'A + B <=> C', rate: rpl('k1', 'K1', 'mass') },
    { equation: 'C -> D', rate: pl('k2', 'mass') },
  ],
  ['k1', 'K1', 'k2'],
);
const thetaMulti = Float64Array.from([1e-5, 0.05, 5e-4]);
const gasRun: RunConditions = { id: 'g', temperature: 500, pressure: 5e5, feed: Float64Array.from([1, 1.2, 0, 0, 0.8]), size: 50 };

describe('sensitivities equal central differences within 1e-6 relative', () => {
  it('packed bed, two reactions, pressure drop', () => {
    checkAgainstCentral({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: 0.012 } }, gasRun, multi, thetaMulti);
  });

  it('packed bed, forced stiff method', () => {
    const s = solveReactor({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: 0.012 } }, gasRun, multi, thetaMulti, {
      ...opts, sensitivities: true, method: 'stiff',
    });
    const r = solveReactor({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: 0.012 } }, gasRun, multi, thetaMulti, {
      ...opts, sensitivities: true, method: 'nonstiff',
    });
    expect(s.stats.method).toBe('stiff');
    for (let i = 0; i < r.sensitivity!.amounts.length; i++) {
      // Source: the non-stiff integration of the same sensitivity equations (common practice, no source)
      expect(Math.abs(s.sensitivity!.amounts[i] - r.sensitivity!.amounts[i])).toBeLessThan(1e-6 * Math.abs(r.sensitivity!.amounts[i]) + 1e-6);
    }
  });

  it('stiff packed bed (fast A <=> B beside slow B -> C)', () => {
    const kin = compile(['A', 'B', 'C', { name: 'I', inert: true }], [
      { equation: 'A <=> B', rate: rpl('k1', 'K1', 'mass') },
      { equation: 'B -> C', rate: pl('k2', 'mass') },
    ], ['k1', 'K1', 'k2']);
    checkAgainstCentral({ kind: 'packed-bed', phase: 'gas', pressureDrop: { alpha: 0.004 } },
      { id: 'st', temperature: 450, pressure: 3e5, feed: Float64Array.from([1, 0, 0, 1]), size: 100 }, kin, Float64Array.from([50, 1.5, 2e-4]));
  });

  it('stirred tank (gas), implicit differentiation', () => {
    checkAgainstCentral({ kind: 'stirred-tank', phase: 'gas' }, { ...gasRun, size: 30 }, multi, thetaMulti);
  });

  it('batch (liquid) and semibatch', () => {
    const kin = compile(['A', 'B', 'C'], [
      { equation: '2 A -> B', rate: pl('k1') },
      { equation: 'A + B <=> C', rate: rpl('k2', 'K2') },
    ], ['k1', 'k2', 'K2']);
    const theta = Float64Array.from([2e-5, 1e-5, 0.02]);
    checkAgainstCentral({ kind: 'batch', phase: 'liquid' }, { id: 'b', temperature: 320, initialConcentrations: Float64Array.from([900, 10, 0]), size: 600, initialVolume: 0.3 }, kin, theta);
    checkAgainstCentral({ kind: 'semibatch', phase: 'liquid' }, {
      id: 's', temperature: 320, initialConcentrations: Float64Array.from([100, 0, 0]), feed: Float64Array.from([0.5, 0, 0]),
      volumetricFlow: 5e-4, initialVolume: 0.3, size: 800,
    }, kin, theta);
  });

  it('gas batch with a mole change (pressure-ratio sensitivity)', () => {
    const kin = compile(['A', 'B', 'C'], [{ equation: 'A <=> 2 B', rate: rpl('k', 'K') }, { equation: 'B -> C', rate: pl('k2') }], ['k', 'K', 'k2']);
    checkAgainstCentral({ kind: 'batch', phase: 'gas' }, { id: 'gb', temperature: 500, pressure: 2e5, initialConcentrations: Float64Array.from([40, 0, 0]), size: 50 }, kin, Float64Array.from([0.03, 10, 0.01]));
  });

  it('membrane reactor (gas)', () => {
    const kin = compile(['A', 'B', 'H'], [{ equation: 'A <=> B + H', rate: rpl('k', 'K') }], ['k', 'K']);
    checkAgainstCentral({ kind: 'membrane', phase: 'gas', membrane: { permeation: { H: 0.8 } } },
      { id: 'm', temperature: 600, pressure: 2e5, feed: Float64Array.from([1, 0, 0]), size: 0.5 }, kin, Float64Array.from([0.3, 2]));
  });
});
