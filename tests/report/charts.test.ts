import { describe, expect, it } from 'vitest';
import { compile } from 'vega-lite';
import {
  correlationCharts,
  fitCharts,
  parityCharts,
  residualCharts,
  rivalCharts,
  sizingCharts,
  binSamples,
} from '../../src/report/charts';
import { OKABE_ITO } from '../../src/report/theme';
import type { ChartSpec, RunObservationData } from '../../src/report/types';
import { sampleFitReportData, sampleSizingReportData } from './fixtures/sample-data';

/** Compile with a logger that records vega-lite warnings; returns the vega spec and the warnings. */
function compileChecked(c: ChartSpec): { vg: Record<string, unknown>; warnings: string[] } {
  const warnings: string[] = [];
  const logger = {
    level: () => logger,
    warn: (...a: unknown[]) => (warnings.push(a.map(String).join(' ')), logger),
    info: () => logger,
    debug: () => logger,
    error: (...a: unknown[]) => (warnings.push(a.map(String).join(' ')), logger),
  };
  const vg = compile(c.spec, { logger: logger as never }).spec as unknown as Record<string, unknown>;
  return { vg, warnings };
}

/** Every axis title in a compiled vega spec (searched recursively through nested marks). */
function axisTitles(node: unknown, out: string[] = []): string[] {
  if (Array.isArray(node)) node.forEach((n) => axisTitles(n, out));
  else if (node && typeof node === 'object') {
    const o = node as Record<string, unknown>;
    if (Array.isArray(o.axes)) {
      for (const a of o.axes as Record<string, unknown>[]) {
        if (typeof a.title === 'string') out.push(a.title);
        else if (Array.isArray(a.title)) out.push(a.title.join(' '));
      }
    }
    for (const v of Object.values(o)) if (typeof v === 'object') axisTitles(v, out);
  }
  return out;
}

const fitAll = Object.values(fitCharts(sampleFitReportData())).flat();
const sizingAll = Object.values(sizingCharts(sampleSizingReportData())).flat();

describe('chart builders', () => {
  it('build every chart kind for the sample data', () => {
    const ids = [...fitAll, ...sizingAll].map((c) => c.id);
    for (const prefix of ['parity-', 'residuals-T', 'residuals-P', 'residuals-spacetime', 'residuals-feedratio', 'residuals-pred-', 'profile-', 'correlation', 'likelihood-', 'rival-models', 'production-profile', 'size-distribution', 'sensitivity']) {
      expect(ids.some((id) => id.startsWith(prefix)), prefix).toBe(true);
    }
    expect(new Set(ids).size).toBe(ids.length);
  });

  it.each([...fitAll, ...sizingAll].map((c) => [c.id, c] as const))('%s compiles with vega-lite without warnings and has units on every axis', (_id, c) => {
    const { vg, warnings } = compileChecked(c);
    expect(warnings).toEqual([]);
    const titles = axisTitles(vg);
    // the heat map's axes are parameter names without a title; its quantity is in the legend
    if (c.id === 'correlation') expect(JSON.stringify(vg)).toContain('"title":"r (1)"');
    else expect(titles.length).toBeGreaterThan(0);
    for (const t of titles) expect(t, `axis title '${t}'`).toMatch(/\([^()]*(\([^()]*\)[^()]*)*\)$/);
  });

  it('never put a URL or $schema into a spec', () => {
    for (const c of [...fitAll, ...sizingAll]) {
      const json = JSON.stringify(c.spec);
      expect(json).not.toMatch(/https?:\/\//);
      expect(json).not.toContain('$schema');
    }
  });

  it('uses the Okabe-Ito palette as the category range', () => {
    const c = fitAll[0];
    expect((c.spec as { config: { range: { category: string[] } } }).config.range.category).toEqual([...OKABE_ITO]);
  });

  it('parity charts share one domain on both axes and include the y = x line', () => {
    const [p] = parityCharts(sampleFitReportData().runs);
    const layers = (p.spec as unknown as { layer: { encoding: { x: { scale: unknown }; y: { scale: unknown } }; data: { values: { v?: number }[] } }[] }).layer;
    expect(layers[0].encoding.x.scale).toEqual(layers[0].encoding.y.scale);
    const line = layers[0].data.values.map((d) => d.v);
    const pts = (layers[1].data.values as unknown as { measured: number; predicted: number }[]).flatMap((d) => [d.measured, d.predicted]);
    expect(line[0]).toBeLessThanOrEqual(Math.min(...pts));
    expect(line[1]).toBeGreaterThanOrEqual(Math.max(...pts));
  });

  it('drop non-finite values and say so in the caption', () => {
    const runs = sampleFitReportData().runs.slice(0, 3);
    const bad: RunObservationData[] = structuredClone(runs);
    bad[0].responses[0].predicted = NaN;
    const [p] = parityCharts(bad);
    expect(p.caption).toContain('1 point not shown');
    expect(JSON.stringify(p.spec)).not.toContain('null,"predicted"');
  });

  it('fall back to raw residuals per response, in response units, when studentized residuals are missing', () => {
    const runs = structuredClone(sampleFitReportData().runs);
    runs[0].responses[1].studentized = null;
    const charts = residualCharts(runs);
    const fc = charts.filter((c) => c.id.endsWith('F_C-out'));
    expect(fc.length).toBe(5); // T, P, W/F_A0, H2/A, predicted
    const titles = axisTitles(compileChecked(fc[0]).vg);
    expect(titles).toContain('Residual F_C out (mol/s)');
  });

  it('colour many temperatures on a continuous scale', () => {
    const base = sampleFitReportData().runs[0];
    const runs: RunObservationData[] = Array.from({ length: 12 }, (_, i) => ({
      ...structuredClone(base),
      runId: `T${i}`,
      conditions: { ...base.conditions, temperature: 500 + 5 * i },
    }));
    const [p] = parityCharts(runs);
    const json = JSON.stringify(p.spec);
    expect(json).toContain('"scheme":"viridis"');
    expect(compileChecked(p).warnings).toEqual([]);
  });

  it('return no chart for missing optional data', () => {
    expect(correlationCharts(null)).toEqual([]);
    expect(rivalCharts([])).toEqual([]);
    const d = sampleSizingReportData();
    const groups = sizingCharts({ ...d, productionProfile: null, sizeDistribution: null, sensitivity: [] });
    expect(Object.values(groups).flat()).toEqual([]);
  });

  it('bin samples so that every finite sample is counted once', () => {
    const samples = [1, 2, 2, 3, 4, 5, 5, 5, NaN, 9];
    const bins = binSamples(samples);
    expect(bins.reduce((s, b) => s + b.count, 0)).toBe(9);
    expect(bins[0].start).toBe(1);
    expect(bins[bins.length - 1].end).toBeCloseTo(9, 12);
    expect(binSamples([3, 3, 3])).toHaveLength(1);
  });
});
