/**
 * The demo: the committed data are exactly what the generator writes from truth.json, and the
 * in-process demo pipeline (check, compare, fit, size, reports) finds the flaws injected into the
 * data and recovers the recorded true parameter values within its 95% intervals.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO_DIR, generateDemoData, readTruth } from '../../datasets-demo/generate';
import { runDemo, type DemoResult } from '../../cli/demo';
import { isRateloomError } from '../../src/core/errors';

describe('demo data generator', () => {
  it('reproduces the committed CSV files byte for byte', () => {
    const files = generateDemoData();
    expect(files.map((f) => f.path)).toEqual(['pbr/runs.csv', 'batch/runs.csv', 'batch/samples.csv', 'cstr/runs.csv', 'gc/runs.csv']);
    for (const f of files) expect(f.content, f.path).toBe(readFileSync(join(DEMO_DIR, f.path), 'utf8'));
  });

  it('is deterministic (same truth, same bytes)', () => {
    const a = generateDemoData();
    const b = generateDemoData();
    expect(a).toEqual(b);
  });

  it('the plant cases carry the invented heat data recorded in truth.json', () => {
    const rec = (readTruth() as unknown as { plantHeat: Record<string, unknown> }).plantHeat;
    for (const name of ['plant', 'plant-adiabatic']) {
      const heat = JSON.parse(readFileSync(join(DEMO_DIR, 'pbr', `${name}.case.json`), 'utf8')).heat;
      for (const k of ['reactionEnthalpy', 'referenceTemperature', 'heatCapacities', 'maxTemperature', 'maxTubeLength']) expect(heat[k], `${name} ${k}`).toEqual(rec[k]);
      if (heat.mode !== 'adiabatic') {
        expect(heat.overallCoefficient).toEqual(rec.overallCoefficient);
        expect(heat.coolant).toEqual(rec.coolant);
      }
    }
  });

  it('writes the flaws recorded in truth.json', () => {
    const truth = readTruth();
    const csv = readFileSync(join(DEMO_DIR, 'pbr/runs.csv'), 'utf8');
    const nd = truth.pbr.flaws.find((f) => f.kind === 'non-numeric')!;
    expect(csv.split('\n').find((l) => l.startsWith(`${nd.run},`))).toContain(nd.text);
  });
});

describe('demo pipeline (in-process)', () => {
  let r: DemoResult;
  let out: string;
  beforeAll(async () => {
    out = mkdtempSync(join(tmpdir(), 'rateloom-demo-'));
    r = await runDemo({ outDir: out, draws: 400 });
  }, 120_000);

  it('writes every report and an index page linking them', () => {
    for (const name of ['index.html', 'pbr-check.txt', 'pbr-compare.html', 'pbr-compare.md', 'pbr-fit.html', 'pbr-fit.md', 'pbr-kinetics.json', 'plant-sizing.html', 'plant-sizing.md', 'plant-sizing.json', 'plant-adiabatic-sizing.html', 'hot-sizing.html', 'batch-fit.html', 'cstr-fit.html']) {
      expect(existsSync(join(out, name)), name).toBe(true);
    }
    const index = readFileSync(join(out, 'index.html'), 'utf8');
    for (const link of ['pbr-compare.html', 'pbr-fit.html', 'plant-sizing.html', 'hot-sizing.html', 'batch-fit.html', 'cstr-fit.html']) expect(index).toContain(`href="${link}"`);
    expect(r.files.every((f) => existsSync(f))).toBe(true);
  });

  it('prints the sizing cautions in its own summary, not only in the reports', () => {
    expect(r.text).toMatch(/CAUTIONS/);
    expect(r.text).toMatch(/licensed engineers/);
    for (const s of r.sizing) expect(s.cautions.length).toBeGreaterThan(0);
  });

  it('check finds the injected flaws and the replicate set', () => {
    // Source: the flaws injected by datasets-demo/generate.ts (truth.json): one non-numeric cell,
    // one run with an inflated ethanol flow (element balance), four centre-point replicates.
    expect(r.check.rowsIn).toBe(52);
    expect(r.check.rowsUsed).toBe(50);
    expect(r.check.rowsRejected).toBe(2);
    expect(r.check.rejections.map((x) => x.reason).sort()).toEqual(['element-balance', 'non-numeric']);
    expect(r.check.replicateGroups).toBe(1);
    expect(r.check.observations).toBe(200);
  });

  it('compare prefers the true rate-law set and rules out the irreversible one', () => {
    expect(r.comparison.best).toBe('base');
    const irr = r.comparison.ranking.find((x) => x.name === 'irreversible')!;
    expect(irr.delta ?? 0).toBeGreaterThan(100);
  });

  it('the 95% intervals of every fit contain the recorded true values', () => {
    // Source: the recorded true values of our own generator (datasets-demo/truth.json).
    expect(r.fit.converged).toBe(true);
    expect(r.fit.lackOfFitP ?? 0).toBeGreaterThan(0.05);
    const all = [r.fit, ...r.liquids];
    expect(all).toHaveLength(3);
    for (const s of all) {
      expect(s.converged, s.study).toBe(true);
      for (const p of s.parameters) {
        expect(Number.isFinite(p.truth), `${s.study} ${p.name}`).toBe(true);
        expect(p.linear, `${s.study} ${p.name}`).not.toBeNull();
        expect(p.truth, `${s.study} ${p.name} lower`).toBeGreaterThanOrEqual(p.linear![0]);
        expect(p.truth, `${s.study} ${p.name} upper`).toBeLessThanOrEqual(p.linear![1]);
        expect(p.covered, `${s.study} ${p.name} profile`).toBe(true);
      }
    }
  });

  it('sizes the in-range case without and the hot case with an extrapolation warning', () => {
    const [plant, , hot] = r.sizing;
    expect(plant.success).toBe(true);
    expect(plant.unit).toBe('kg');
    expect(plant.size!).toBeGreaterThan(0);
    expect(plant.p95!).toBeGreaterThanOrEqual(plant.p90!);
    expect(plant.warnings.some((w) => w.startsWith('[W_EXTRAPOLATION]'))).toBe(false);
    expect(hot.warnings.some((w) => w.startsWith('[W_EXTRAPOLATION]') && w.includes('temperature'))).toBe(true);
  });

  it('sizes the plant as a cooled multitubular bed and shows why the adiabatic variant fails', () => {
    const [plant, adiabatic] = r.sizing;
    const cooled = JSON.parse(readFileSync(plant.json, 'utf8'));
    expect(cooled.thermal.mode).toBe('constant-coolant');
    expect(cooled.thermal.design.length).toBeLessThanOrEqual(12);
    expect(cooled.thermal.hotSpot.temperature).toBeLessThanOrEqual(cooled.thermal.hotSpot.limit);
    expect(cooled.thermal.runaway.margin).toBeGreaterThan(0);
    expect(plant.thermal).toMatch(/binding (tube length|pressure drop|target conversion)/);
    expect(readFileSync(plant.report.markdown, 'utf8')).toMatch(/Energy balance/);
    // without cooling the hot spot passes the 260 degC limit: reported as not met (exit 1)
    expect(adiabatic.status).toBe('hot-spot-exceeded');
    expect(adiabatic.success).toBe(false);
    expect(adiabatic.thermal).toMatch(/NOT MET/);
  });

  it('refuses a foreign non-empty folder and leaves its files alone', async () => {
    const foreign = mkdtempSync(join(tmpdir(), 'rateloom-foreign-'));
    writeFileSync(join(foreign, 'notes.txt'), 'mine');
    let err: unknown;
    try {
      await runDemo({ outDir: foreign, liquids: false, draws: 10 });
    } catch (e) {
      err = e;
    }
    expect(isRateloomError(err) && err.code).toBe('E_EXISTS');
    expect(readFileSync(join(foreign, 'notes.txt'), 'utf8')).toBe('mine');
    expect(existsSync(join(foreign, 'index.html'))).toBe(false);
  });
});
