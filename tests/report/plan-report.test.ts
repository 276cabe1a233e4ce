/**
 * The run-plan report (src/report/plan-report.ts, loaded lazily through src/report/lazy.ts): a
 * real plan of the demo packed bed over two conditions renders to one self-contained HTML
 * document with its charts drawn (no chart errors, the planned runs labelled in the condition
 * chart, axes spanning the limits in the study's units) and a Markdown summary with the same runs.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study/load';
import { fitStudy } from '../../src/workflow/fit-study';
import { parseLimits } from '../../src/planning/limits';
import { planRuns } from '../../src/planning/plan';
import { renderPlanReport } from '../../src/report/lazy';
import { planCharts } from '../../src/report/charts/plan';

const STUDY = resolve(import.meta.dirname, '../../datasets-demo/pbr/pbr.study.json');

describe('plan report', () => {
  it('renders the planned runs, the precision table and the charts of old and new runs', async () => {
    const study = loadStudy(readFileSync(STUDY, 'utf8'), STUDY, (p) => readFileSync(p, 'utf8')).study;
    const limits = parseLimits({ factors: { temperature: { min: 190, max: 260, unit: 'degC' }, catalystMass: { min: 5, max: 40, unit: 'g' } }, levels: 4, maxConversion: 0.6 }, study);
    const plan = planRuns(study, limits, [fitStudy(study, { profile: false })], { runs: 3 });
    expect(plan.factors.map((f) => [f.column, f.shownMin, f.shownMax])).toEqual([['T_C', 190, 260], ['W_g', 5, 40]]);
    const specs = planCharts(plan);
    expect(specs.map((c) => c.id)).toEqual(['plan-conditions', 'plan-shrink']);
    // The condition chart's axes span the limits in the study's own units.
    const enc = (specs[0].spec as { layer: { encoding: { x: { scale: { domain: number[] } } } }[] }).layer[0].encoding;
    expect(enc.x.scale.domain).toEqual([190, 260]);
    const r = await renderPlanReport(plan, { studyName: 'pbr', generatedBy: 'rateloom test', csvPath: 'reports/pbr-plan.csv' });
    expect(r.warnings).toEqual([]);
    expect(r.charts.every((c) => c.svg && !c.error)).toBe(true);
    expect((r.html.match(/<svg/g) ?? []).length).toBe(2);
    const conditions = r.charts.find((c) => c.id === 'plan-conditions')!.svg!;
    for (const run of plan.runs) {
      expect(conditions).toContain(`>${run.id}<`);
      expect(r.html).toContain(run.reason.slice(0, 30));
      expect(r.markdown).toContain(`| ${run.id} |`);
    }
    expect(r.html).not.toMatch(/https?:\/\/(?!www\.w3\.org)/);
    expect(r.markdown).toContain("## Expected precision of 'base'");
  }, 60_000);
});
