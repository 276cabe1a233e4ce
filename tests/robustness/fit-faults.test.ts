/**
 * Numerical faults during a fit of a real (small) study: the fit never throws for them, rejects
 * failing trial steps and goes on where it can, and its status and warnings say what happened and
 * to which runs. No non-finite number anywhere in the FitResult.
 */
import { describe, expect, it } from 'vitest';
import { FIT_STATUS } from '../../src/estimation/status';
import type { FitResult } from '../../src/estimation/fit-types';
import { fitStudy } from '../../src/workflow/fit-study';
import { baseStudy, load } from '../data/helpers';

/**
 * Paths of every non-finite number inside a value: NaN anywhere, and Infinity except for a
 * parameter's `lower` / `upper` (an infinite bound means 'no bound' by the Parameter contract).
 */
function nonFinite(v: unknown, path = '$', out: string[] = []): string[] {
  if (typeof v === 'number') {
    const bound = /\.(lower|upper)$/.test(path) && Math.abs(v) === Infinity;
    if (!Number.isFinite(v) && !bound) out.push(`${path} = ${v}`);
  } else if (v instanceof Float64Array) {
    v.forEach((x, i) => nonFinite(x, `${path}[${i}]`, out));
  } else if (v && typeof v === 'object') {
    for (const [k, c] of Object.entries(v)) nonFinite(c, `${path}.${k}`, out);
  }
  return out;
}

function fitVariant(mutate: (s: any) => void, profile = false): FitResult {
  const s = baseStudy();
  mutate(s);
  const { study } = load(s);
  return fitStudy(study, { profile }).fit;
}

/** Common checks: a known status, success derived from it, no non-finite number, JSON round trip. */
function checkResult(fit: FitResult): void {
  expect(Object.keys(FIT_STATUS)).toContain(fit.status);
  expect(fit.success).toBe(FIT_STATUS[fit.status].success);
  expect(fit.message.length).toBeGreaterThan(0);
  expect(nonFinite(fit)).toEqual([]);
}

const expressionRate = (expression: string) => (s: any) => {
  s.reactions[0].rate = { form: 'expression', basis: 'mass', expression };
};
const ARRH = 'k1*exp(-E1/R*(1/T-1/T_ref))';

describe('fit faults', () => {
  it('a huge starting k (stiff, fast reaction) still converges to the same minimum', () => {
    const ref = fitVariant(() => {});
    const fit = fitVariant((s) => {
      s.parameters[0].value = 0.9;
      s.parameters[1].value = 250;
    });
    checkResult(fit);
    expect(fit.success).toBe(true);
    expect(fit.parameters[0].value).toBeCloseTo(ref.parameters[0].value, 8);
  });

  it('pressure exhausted at some trial values: steps rejected, the fit converges, the run is named', () => {
    // alpha W = 1.03 for the 1 g runs: the bed runs out of pressure unless enough moles are consumed.
    const fit = fitVariant((s) => {
      s.reactor.pressureDrop.alpha.value = 1030;
      s.parameters[0].value = 0.01;
    });
    checkResult(fit);
    expect(fit.statistics.solverStatus).toMatch(/^converged/);
    // The data were made with another pressure drop: with the stated sigma the verdict is a misfit.
    expect(fit.verdict.status).toBe('misfit');
    const w = fit.warnings.find((x) => x.code === 'model-evaluation-failed');
    expect(w, JSON.stringify(fit.warnings)).toBeDefined();
    expect(w!.path).toContain('R2');
    expect(w!.message).toMatch(/run R2 \(\d+x: the pressure falls to zero/);
  });

  it('pressure exhausted near the estimate: status model-failure, the runs named, no NaN', () => {
    const fit = fitVariant((s) => {
      s.reactor.pressureDrop.alpha.value = 1045;
      s.parameters[0].value = 0.01;
    }, true);
    checkResult(fit);
    expect(fit.status).toBe('model-failure');
    expect(fit.success).toBe(false);
    const w = fit.warnings.find((x) => x.code === 'model-evaluation-failed');
    expect(w?.path).toContain('R2');
  });

  it('log(C_B) with B absent from the feed: every run fails at the start, each one named', () => {
    const fit = fitVariant(expressionRate(`${ARRH}*C_A*log(C_B)`), true);
    checkResult(fit);
    expect(fit.status).toBe('model-failure');
    expect(fit.message).toMatch(/R1: .*non-finite/);
    const w = fit.warnings.find((x) => x.code === 'model-evaluation-failed');
    expect(w?.path).toEqual(expect.arrayContaining(['R1', 'R2', 'R3', 'R4', 'R5', 'R6', 'R7']));
    const at = fit.warnings.find((x) => x.code === 'model-failure-at-estimate');
    expect(at?.path).toContain('R1');
    expect(fit.covariance.internal).toBeNull();
    expect(fit.parameters.every((p) => p.stdError === null && p.ci.linear === null)).toBe(true);
  });

  it('a rate NaN for part of the parameter space (sqrt of a negative): the start fails and says where', () => {
    const fit = fitVariant((s) => {
      expressionRate(`${ARRH}*C_A*C_H2^0.5*sqrt(1.5e-3 - k1)/sqrt(1.5e-3 - k1)`)(s);
      s.parameters[0].value = 0.01;
    });
    checkResult(fit);
    expect(fit.status).toBe('model-failure');
    expect(fit.warnings.map((w) => w.code)).toContain('model-evaluation-failed');
  });

  it('C_A^-0.5 (infinite only at zero concentration, which the data never reach) fits', () => {
    const fit = fitVariant(expressionRate(`${ARRH}*C_A^-0.5*C_H2`));
    checkResult(fit);
    expect(fit.statistics.solverStatus).toMatch(/^converged/);
    // Not the law the data came from: the chi-square test with the stated sigma rejects it.
    expect(fit.verdict.status).toBe('misfit');
    expect(fit.success).toBe(false);
  });

  it('two parameters that enter only as a product: status singular, both named', () => {
    const fit = fitVariant((s) => {
      expressionRate(`k1*kx*exp(-E1/R*(1/T-1/T_ref))*C_A*C_H2^0.5`)(s);
      s.parameters.push({ name: 'kx', value: 1, unit: '1' });
    }, true);
    checkResult(fit);
    expect(fit.status).toBe('singular');
    expect(fit.success).toBe(false);
    const w = fit.warnings.find((x) => x.code === 'not-identifiable');
    expect(w?.path).toEqual(expect.arrayContaining(['k1', 'kx']));
    expect(fit.covariance.internal).toBeNull();
  });

  it('a free parameter that does not enter the model: singular, named', () => {
    const fit = fitVariant((s) => s.parameters.push({ name: 'kz', value: 1, unit: '1' }));
    checkResult(fit);
    expect(fit.status).toBe('singular');
    expect(fit.warnings.find((x) => x.code === 'not-identifiable')?.path).toEqual(['kz']);
  });
});
