/**
 * `fit --cross-check` (src/workflow/cross-check-study.ts, src/estimation/cross-check.ts): the two
 * card packages are the outside check. On two NIST StRD sets the optimum re-solved by
 * ml-levenberg-marquardt from rateloom's estimates agrees with the certified values; on the demo
 * packed bed both the re-solve and the odex re-integration agree within the stated tolerances;
 * estimates moved off the optimum are caught; a fit that found no minimum is not checked.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { makeParameter } from '../../src/core/parameter';
import { fitModel } from '../../src/estimation/fit';
import { crossCheckOptimum, sharedDigits } from '../../src/estimation/cross-check';
import { loadStudy } from '../../src/api/study';
import { fitStudy, type StudyFit } from '../../src/workflow/fit-study';
import { CROSS_CHECK_TOLERANCES, crossCheckStudyFit } from '../../src/workflow/cross-check-study';
import { readNist } from './nist-strd-data';
import { NIST_MODELS, nistModel } from './nist-strd-models';

const demo = (p: string) => join(import.meta.dirname, '../../datasets-demo', p);

describe('cross-check on NIST StRD sets (certified values)', () => {
  for (const name of ['Misra1a', 'Chwirut2']) {
    it(`${name}: ml-levenberg-marquardt from rateloom's estimates ends at the certified values`, () => {
      const d = readNist(name);
      const model = nistModel(d, NIST_MODELS[name]);
      const data = { measured: Float64Array.from(d.y), sigma: new Float64Array(d.y.length).fill(1), sigmaKnown: false };
      const params = d.starts[1].map((v, i) => makeParameter({ name: `b${i + 1}`, value: v }));
      const fit = fitModel(model, params, data, { profile: false });
      expect(fit.success).toBe(true);
      const cc = crossCheckOptimum(model, data, fit);
      expect(cc.digits).toBeGreaterThanOrEqual(CROSS_CHECK_TOLERANCES.estimateDigits);
      cc.estimates.forEach((e, i) => {
        // Source: NIST StRD, <name>, certified values (given to 10 significant digits; the re-solve shares at least 8).
        expect(sharedDigits(e.recheck, d.certified[i])).toBeGreaterThanOrEqual(8);
      });
      // Source: NIST StRD, <name>, certified residual sum of squares.
      expect(sharedDigits(cc.ssrRecheck, d.rss)).toBeGreaterThanOrEqual(8);
    });
  }
});

describe('cross-check of a study fit (demo packed bed)', () => {
  const study = loadStudy(demo('pbr/pbr.study.json')).study;
  const sf = fitStudy(study, { profile: false });

  it('agrees: re-solve and odex re-integration within the stated tolerances, every run integrated', () => {
    const cc = crossCheckStudyFit(study, sf);
    if (!cc.checked) throw new Error(cc.reason);
    expect(cc.warnings).toEqual([]);
    expect(cc.agrees).toBe(true);
    expect(cc.optimum.digits).toBeGreaterThanOrEqual(CROSS_CHECK_TOLERANCES.estimateDigits);
    expect(cc.integration.runsIntegrated).toBe(study.runs.length);
    expect(cc.integration.maxRelativeDifference).toBeLessThanOrEqual(CROSS_CHECK_TOLERANCES.predictionRelative);
    expect(cc.integration.ssrRelativeDifference).toBeLessThanOrEqual(CROSS_CHECK_TOLERANCES.ssrRelative);
  });

  it('estimates moved 0.1 % off the optimum disagree, with warnings naming the parameter and the run', () => {
    const moved = sf.fit.parameters.map((p, i) => (i === 0 ? { ...p, value: p.value * 1.001, internalValue: p.transform === 'log' ? Math.log(p.value * 1.001) : p.value * 1.001 } : p));
    const bad: StudyFit = { ...sf, fit: { ...sf.fit, parameters: moved } };
    const cc = crossCheckStudyFit(study, bad);
    if (!cc.checked) throw new Error(cc.reason);
    expect(cc.agrees).toBe(false);
    expect(cc.optimum.digits).toBeLessThan(CROSS_CHECK_TOLERANCES.estimateDigits);
    const text = cc.warnings.map((w) => w.message).join('\n');
    expect(text).toContain(sf.fit.parameters[0].name);
    expect(text).toMatch(/odex predictions differ .* at run /);
    expect(cc.warnings.every((w) => w.code === 'W_CROSS_CHECK')).toBe(true);
  });

  it('a fit that found no minimum is not checked, and the reason says why', () => {
    const stopped = fitStudy(study, { profile: false, maxIterations: 1 });
    expect(stopped.fit.verdict.trustworthy).toBe(false);
    const cc = crossCheckStudyFit(study, stopped);
    expect(cc.checked).toBe(false);
    if (!cc.checked) expect(cc.reason).toMatch(/no minimum to check \(not-converged/);
  });
});

describe('rateloom fit --cross-check', () => {
  it('on a fit stopped by --max-iterations 1: exit 1, the check not done and why (text), crossCheck.checked false (JSON)', () => {
    const out = mkdtempSync(join(tmpdir(), 'rateloom-cc-'));
    try {
      const run = (...extra: string[]) => spawnSync(process.execPath, ['--import', 'tsx', join(import.meta.dirname, '../../cli/main.ts'), 'fit', demo('cstr/cstr.study.json'), '--no-report', '--no-profile', '--force', '--out', out, '--max-iterations', '1', '--cross-check', ...extra], { encoding: 'utf8', timeout: 60_000 });
      const text = run();
      expect(text.status).toBe(1);
      expect(text.stdout + text.stderr).toMatch(/Cross-check: not done - the fit found no minimum to check/);
      const json = run('--json');
      expect(json.status).toBe(1);
      const doc = JSON.parse(json.stdout) as { crossCheck: { checked: boolean; reason: string } };
      expect(doc.crossCheck.checked).toBe(false);
      expect(doc.crossCheck.reason).toMatch(/not-converged/);
    } finally {
      rmSync(out, { recursive: true, force: true });
    }
  }, 120_000);
});
