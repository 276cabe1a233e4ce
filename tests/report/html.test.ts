import { describe, expect, it } from 'vitest';
import { renderFitReport, renderSizingReport } from '../../src/report';
import { renderFitHtml } from '../../src/report/html';
import type { FitReportData } from '../../src/report/types';
import { sampleFitReportData, sampleSizingReportData } from './fixtures/sample-data';

/** HTML with every inline SVG's default namespace attribute removed (the one allowed URL). */
function withoutSvgNamespace(html: string): string {
  return html.replace(/<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/g, '<svg');
}

/** All table cells as { attrs, inner }. */
function cells(html: string): { attrs: string; inner: string }[] {
  return [...html.matchAll(/<td([^>]*)>([\s\S]*?)<\/td>/g)].map((m) => ({ attrs: m[1], inner: m[2] }));
}

const text = (s: string) => s.replace(/<[^>]+>/g, '').trim();

function checkNumberCells(html: string): void {
  const all = cells(html);
  expect(all.length).toBeGreaterThan(10);
  for (const c of all) {
    if (c.attrs.includes('class="num"')) {
      expect(c.inner, `cell '${text(c.inner)}' has a unit`).toMatch(/<span class="unit"[^>]*>[^<\s]+[^<]*<\/span>$/);
    } else {
      // a cell that is not marked as a number must not start with a bare number
      expect(text(c.inner), `cell '${text(c.inner)}' is a number without unit`).not.toMatch(/^[−-]?\d/);
    }
  }
}

describe('fit report HTML', async () => {
  const data = sampleFitReportData();
  const report = await renderFitReport(data);

  it('is one self-contained document: no scripts, no external URLs, no links to load', () => {
    expect(report.html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(withoutSvgNamespace(report.html)).not.toMatch(/https?:\/\//);
    expect(report.html).not.toMatch(/<script|<link|<img|<iframe|@import/i);
    // only local references (clip paths, gradients) inside the SVGs
    expect(report.html).not.toMatch(/url\((?!#)/);
    expect(report.html).toContain("default-src 'none'");
    expect(report.html).toContain('@media print');
    expect(report.warnings).toEqual([]);
  });

  it('keeps ids unique across the inlined SVGs and every local reference resolves', () => {
    const ids = [...report.html.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(ids.length);
    const refs = [...report.html.matchAll(/url\(#([^)]+)\)/g)].map((m) => m[1]);
    expect(refs.length).toBeGreaterThan(0);
    for (const r of refs) expect(ids).toContain(r);
  });

  it('inlines one SVG per chart', () => {
    expect((report.html.match(/<svg /g) ?? []).length).toBe(report.charts.length);
    expect(report.charts.length).toBeGreaterThanOrEqual(15);
  });

  it('puts a unit in every number cell', () => {
    checkNumberCells(report.html);
  });

  it('shows both interval kinds with units, an open profile side, and the fixed parameter', () => {
    expect(report.html).toContain('95 % linear CI');
    expect(report.html).toContain('95 % profile CI');
    expect(report.html).toContain('2.22×10⁻³ … 2.6×10⁻³<span class="unit">mol/(kg s)</span>');
    expect(report.html).toContain('0.391 … open');
    expect(report.html).toMatch(/T_ref<\/code><\/th><td class="num">550<span class="unit">K<\/span>/);
  });

  it('shows statistics, rival models, status and warnings', () => {
    for (const s of ['AICc', 'BIC', 'Lack of fit p value', 'Akaike weight', 'Langmuir–Hinshelwood, A adsorbed', 'Trustworthy', 'W_CORRELATED', 'no evidence of lack of fit']) {
      expect(report.html).toContain(s);
    }
  });

  it('shows the starting values rateloom estimated, with units, and leaves the table out without them', () => {
    expect(report.html).toContain('<h3>Starting values estimated by rateloom</h3>');
    expect(report.html).toMatch(/<code>k_ref<\/code><\/th><td class="num">2\.1×10⁻³<span class="unit">mol\/\(kg s\)<\/span><\/td><td>differential rate analysis<\/td>/);
    expect(report.html).toMatch(/<code>E<\/code><\/th><td class="num">79000<span class="unit">J\/mol<\/span><\/td>/);
    expect(report.html).toContain('<td class="num">1<span class="unit" title="dimensionless">1</span></td><td>documented default</td>');
    expect(report.html).toContain('The differential method used 9 rate points.');
    expect(report.html).toContain('<li>points up to 40% conversion were used: too few below 15%</li>');
    const none = renderFitHtml({ ...data, startValues: null }, { parity: [], residuals: [], profiles: [], correlation: [], likelihood: [], rivals: [] });
    expect(none).not.toContain('Starting values estimated by rateloom');
  });

  it('escapes all text', () => {
    expect(report.html).toContain('pilot-hydrogenation-2031 &lt;lab B&gt; &amp; &quot;bench 3&quot;');
    expect(report.html).not.toContain('<lab B>');
    const evil: FitReportData = {
      ...data,
      title: '<script>alert(1)</script>',
      message: '<img src=x onerror=alert(1)>',
      warnings: [{ code: '<b>', message: '"><svg onload=alert(1)>' }],
      parameters: [{ ...data.parameters[0], name: '<i>k</i>', unit: '<u>', flags: ['<em>x</em>'] }],
      kinetics: ['r < k & K > 0'],
      startValues: { rows: [{ parameter: '<i>k0</i>', value: 1, unit: '<u>', method: '<b>m</b>', how: 'a < b & c' }], notes: ['<script>n</script>'] },
    };
    const html = renderFitHtml(evil, { parity: [], residuals: [], profiles: [], correlation: [], likelihood: [], rivals: [] });
    expect(html).not.toMatch(/<script|<img|<i>|<u>|<b>|<em>|<svg onload/);
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('r &lt; k &amp; K &gt; 0');
    expect(html).toContain('<code>&lt;i&gt;k0&lt;/i&gt;</code>');
    expect(html).toContain('<td>a &lt; b &amp; c</td>');
    expect(html).toContain('<li>&lt;script&gt;n&lt;/script&gt;</li>');
  });

  it('marks an untrustworthy fit and missing values', async () => {
    const bad = sampleFitReportData();
    bad.success = false;
    bad.status = 'max-iterations';
    bad.parameters[0].stdError = null;
    bad.parameters[0].profileCI = null;
    bad.correlation = null;
    bad.statistics.lackOfFit = null;
    const r = await renderFitReport(bad);
    expect(r.html).toContain('Not trustworthy');
    expect(r.html).toContain('<td class="na">not computed</td>');
    expect(r.html).toContain('No correlation matrix was computed');
    expect(r.html).toContain('not tested (no replicates)');
    expect(r.html).not.toMatch(/NaN|undefined|null/);
  });

  it('says so in the document and in warnings when a chart cannot be drawn', async () => {
    const d = sampleFitReportData();
    d.likelihoodProfiles = [{ parameter: 'k_ref', unit: '1', estimate: 1, points: [], threshold: NaN }];
    const r = await renderFitReport(d);
    // an empty profile still renders (rule at the estimate) and states the missing threshold
    expect(r.html).toContain('Threshold not computed.');
  });

  it('rejects a view-model that lacks required parts', async () => {
    const d = sampleFitReportData() as unknown as Record<string, unknown>;
    delete d.runs;
    await expect(renderFitReport(d as unknown as FitReportData)).rejects.toThrow(/runs must be an array/);
  });
});

describe('sizing report HTML', async () => {
  const data = sampleSizingReportData();
  const report = await renderSizingReport(data);

  it('is self-contained, puts a unit in every number cell and has every chart', () => {
    expect(withoutSvgNamespace(report.html)).not.toMatch(/https?:\/\//);
    expect(report.html).not.toMatch(/<script/i);
    checkNumberCells(report.html);
    expect(report.charts.map((c) => c.id)).toEqual(['production-profile', 'size-distribution', 'sensitivity']);
    expect(report.charts.every((c) => c.svg)).toBe(true);
  });

  it('shows the cautions prominently, before the results', () => {
    const caution = report.html.indexOf('Read before using this size');
    expect(caution).toBeGreaterThan(0);
    expect(caution).toBeLessThan(report.html.indexOf('class="cards"'));
    for (const c of data.cautions) expect(report.html).toContain(c.replace(/&/g, '&amp;'));
  });

  it('shows the caution box even when none were passed', async () => {
    const r = await renderSizingReport({ ...data, cautions: [] });
    expect(r.html).toContain('No cautions were passed with this case.');
  });

  it('shows size percentiles, pressure drop in kPa, tubes and failed draws', () => {
    const fmt = (x: number) => String(Math.round(x));
    expect(report.html).toContain(`${fmt(data.size.p95)}<span class="unit">kg</span>`);
    expect(report.html).toContain('41.2<span class="unit">kPa</span>');
    expect(report.html).toContain('412<span class="unit">tubes</span>');
    expect(report.html).toContain('3 of 800 draws failed');
  });

  it('shows the catalyst to install at the design percentile with units, and only the nominal layout without it', async () => {
    const row = (label: string, cell: string) => `<tr><th scope="row">${label}</th><td class="num">${cell}</td></tr>`;
    expect(report.html).toContain(row('Tube length (nominal catalyst)', '6<span class="unit">m</span>'));
    expect(report.html).toContain(row('Tube count designed for percentile', '95<span class="unit">%</span>'));
    expect(report.html).toContain(row('Catalyst to install (P95)', '2150<span class="unit">kg</span>'));
    expect(report.html).toContain(row('Tube length to install (P95)', '7.02<span class="unit">m</span>'));
    expect(report.html).toContain(row('Pressure drop of the installed bed (P95, nominal kinetics)', '48.3<span class="unit">kPa</span>'));
    const { designLevel: _l, installCatalyst: _c, installLength: _n, installPressureDrop: _p, ...nominal } = data.tubes!;
    const r = await renderSizingReport({ ...data, tubes: nominal });
    expect(r.html).toContain(row('Tube length', '6<span class="unit">m</span>'));
    expect(r.html).not.toMatch(/to install|designed for percentile|installed bed/);
    checkNumberCells(r.html);
  });
});
