/**
 * The invented gas-analyser campaign of the demo (datasets-demo/gc): the fit of the dry-basis
 * fraction ratios with the exponential activity model recovers the true values recorded in
 * datasets-demo/truth.json within its 95 % intervals (the truth is the outside reference: the
 * data were simulated from it); the repeated reference condition is flagged as drifting when the
 * activity model is removed; the hand-off carries the fresh-catalyst note and no activity parameter.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DIR, readTruth } from '../../datasets-demo/generate';
import { cautions } from '../../src/design/cautions';
import { loadStudy } from '../../src/study/load';
import { compoundToSI } from '../../src/units';
import { driftCheck } from '../../src/workflow/drift';
import { buildHandoff, fitStudy, type StudyFit } from '../../src/workflow/fit-study';
import { fitReportData } from '../../src/workflow/fit-report-data';

const studyPath = join(DEMO_DIR, 'gc/gc.study.json');
const load = (mutate: (raw: any) => void = () => {}) => {
  const raw = JSON.parse(readFileSync(studyPath, 'utf8'));
  mutate(raw);
  return loadStudy(JSON.stringify(raw), studyPath, (abs) => readFileSync(abs, 'utf8')).study;
};

describe('gas-analyser demo campaign', () => {
  let sf: StudyFit;
  const study = load();
  beforeAll(() => {
    sf = fitStudy(study, { profile: false });
  });
  it('recovers the recorded truth (rate constants and decay rate) within the 95 % intervals', () => {
    expect(sf.fit.success).toBe(true);
    const truth = readTruth().gc.parameters;
    for (const [name, t] of Object.entries(truth)) {
      const p = sf.fit.parameters.find((q) => q.name === name)!;
      const si = compoundToSI(t.value, t.unit).value;
      const [lo, hi] = p.ci.linear!;
      expect(si, name).toBeGreaterThanOrEqual(lo);
      expect(si, name).toBeLessThanOrEqual(hi);
    }
    expect(sf.fit.warnings.some((w) => w.code === 'activity-drift')).toBe(false);
  });
  it('no lack-of-fit test from reference runs at different times on stream (their activity differs)', () => {
    // Pooled as replicates, the drift made the pure error exceed the SSR (F = 0, p = 1): a test that means nothing.
    expect(study.replicateGroups.length).toBeGreaterThan(0);
    expect(sf.fit.statistics.lackOfFit).toBeNull();
  });
  it('reports the decay rate with its interval and the fresh-catalyst basis; the hand-off drops the activity', () => {
    const lab = fitReportData(study, sf).lab!;
    expect(lab.notes.join('\n')).toMatch(/activity_kd = 0\.00\d+ 1\/h \(95 % interval 0\.00\d+ to 0\.00\d+ 1\/h\)/);
    expect(lab.notes.join('\n')).toMatch(/fresh catalyst/);
    expect(lab.drift!.points.length).toBeGreaterThanOrEqual(7);
    const h = buildHandoff(study, sf);
    expect(h.parameters.map((p) => p.name)).toEqual(['k1', 'E1', 'k2', 'E2']);
    expect(h.covariance.names).toEqual(['k1', 'E1', 'k2', 'E2']);
    expect(cautions(h).at(-1)).toMatch(/fresh catalyst/);
  });
  it('without the activity model the reference spread is flagged, and the fit warns', () => {
    const plain = load((raw) => delete raw.activity);
    const d = driftCheck(plain)!;
    expect(d.exceeds).toBe(true);
    expect(d.warning?.code).toBe('activity-drift');
    expect(driftCheck(study)!.warning).toBeUndefined(); // the activity model is used: no warning
  });
});
