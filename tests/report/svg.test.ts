import { describe, expect, it } from 'vitest';
import type { TopLevelSpec } from 'vega-lite';
import { fitCharts, sizingCharts } from '../../src/report/charts';
import { renderCharts, renderSvg } from '../../src/report/svg';
import { sampleFitReportData, sampleSizingReportData } from './fixtures/sample-data';

/** Number of drawn data marks: paths inside vega's role-mark groups of the data mark types. */
function dataMarks(svg: string): number {
  let n = 0;
  const re = /<g class="mark-(symbol|rect|line|area|rule|text) role-mark[^"]*"[^>]*>([\s\S]*?)<\/g>/g;
  for (const m of svg.matchAll(re)) n += (m[2].match(/<(path|line|text)\b/g) ?? []).length;
  return n;
}

describe('headless SVG rendering', () => {
  it('renders every fit and sizing chart with marks, and without canvas or network', async () => {
    const charts = [...Object.values(fitCharts(sampleFitReportData())).flat(), ...Object.values(sizingCharts(sampleSizingReportData())).flat()];
    const rendered = await renderCharts(charts);
    expect(rendered).toHaveLength(charts.length);
    for (const r of rendered) {
      expect(r.error, r.id).toBeUndefined();
      expect(r.messages, r.id).toBeUndefined();
      expect(r.svg!.startsWith('<svg'), r.id).toBe(true);
      expect(dataMarks(r.svg!), `${r.id} has data marks`).toBeGreaterThan(0);
      // the only URL left is the SVG namespace
      expect(r.svg!.match(/https?:\/\/[^"]*/g) ?? []).toEqual(['http://www.w3.org/2000/svg']);
    }
  });

  it('draws one symbol per observation in a parity chart', async () => {
    const data = sampleFitReportData();
    const [parity] = fitCharts(data).parity;
    const svg = await renderSvg(parity.spec);
    const symbols = /<g class="mark-symbol role-mark[^"]*"[^>]*>([\s\S]*?)<\/g>/.exec(svg)![1].match(/<path\b/g)!.length;
    expect(symbols).toBe(data.runs.length);
  });

  it('refuses to load data from a URL', async () => {
    const spec = { data: { url: 'https://example.invalid/data.json' }, mark: 'point', encoding: { x: { field: 'a', type: 'quantitative' } } } as TopLevelSpec;
    const [r] = await renderCharts([{ id: 'x', title: 'x', spec }]);
    expect(r.svg).toBeUndefined();
    expect(r.error ?? (r.messages ?? []).join(' ')).toMatch(/refused/);
  });

  it('reports an invalid spec as a chart error instead of throwing', async () => {
    const spec = { mark: 'no-such-mark', data: { values: [] } } as unknown as TopLevelSpec;
    const [r] = await renderCharts([{ id: 'bad', title: 'bad', spec }]);
    expect(r.svg).toBeUndefined();
    expect(r.error).toBeTruthy();
  });
});
