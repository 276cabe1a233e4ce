import { describe, expect, it } from 'vitest';
import { renderFitMarkdown, renderSizingMarkdown } from '../../src/report/markdown';
import { sampleFitReportData, sampleSizingReportData } from './fixtures/sample-data';

/** Body rows of all Markdown tables, split into cells. */
function tableRows(md: string): string[][] {
  return md
    .split('\n')
    .filter((l) => l.startsWith('| ') && !/^\| -{3}/.test(l))
    .map((l) => l.slice(2, -2).split(/(?<!\\)\|/).map((c) => c.trim()));
}

describe('Markdown summaries', () => {
  it('fit summary has parameter, statistics, rival and correlation tables with units', () => {
    const md = renderFitMarkdown(sampleFitReportData());
    for (const h of ['## Parameters', '## Statistics', '## Rival models', '## Parameter correlation']) expect(md).toContain(h);
    expect(md).toContain('| k\\_ref | 2.412×10⁻³ mol/(kg s) | 9.1×10⁻⁵ mol/(kg s) |');
    expect(md).toContain('0.391 … open 1');
    // every numeric cell is followed by a unit (a dimensionless one reads '1', never a bare dash)
    for (const row of tableRows(md)) {
      for (const cell of row.slice(1)) {
        expect(cell).not.toMatch(/\s[–-]$/);
        if (/\s1$/.test(cell)) continue;
        if (/^[−-]?\d[\d.×⁰¹²³⁴⁵⁶⁷⁸⁹⁻…\s]*$/.test(cell)) throw new Error(`number without unit in Markdown cell '${cell}'`);
      }
    }
    expect(md).not.toMatch(/NaN|undefined/);
  });

  it('fit summary lists the starting values rateloom estimated, with units, only when there are some', () => {
    const md = renderFitMarkdown(sampleFitReportData());
    expect(md).toContain('## Starting values estimated by rateloom');
    expect(md).toContain('| k\\_ref | 2.1×10⁻³ mol/(kg s) | differential rate analysis | ln r regression over 9 low-conversion points |');
    expect(md).toContain('| E | 79000 J/mol | differential rate analysis |');
    expect(md).toContain('| n\\_H2 | 1 1 | documented default |');
    expect(md).toContain('The differential method used 9 rate points.');
    expect(md).toContain('- points up to 40% conversion were used: too few below 15%');
    expect(md.indexOf('## Starting values')).toBeGreaterThan(md.indexOf('## Parameters'));
    expect(renderFitMarkdown({ ...sampleFitReportData(), startValues: undefined })).not.toContain('Starting values');
  });

  it('escapes table-breaking characters', () => {
    const d = sampleFitReportData();
    d.parameters[0].name = 'k|1';
    d.studyName = 'a <b> *c*';
    const md = renderFitMarkdown(d);
    expect(md).toContain('k\\|1');
    expect(md).toContain('a \\<b\\> \\*c\\*');
    // still the same number of cells in the parameter row
    const row = tableRows(md).find((r) => r[0] === 'k\\|1')!;
    expect(row).toHaveLength(6);
  });

  it('sizing summary puts the cautions right after the status', () => {
    const d = sampleSizingReportData();
    const md = renderSizingMarkdown(d);
    const caution = md.indexOf('Read before using this size');
    expect(caution).toBeGreaterThan(md.indexOf('## Summary'));
    expect(caution).toBeLessThan(md.indexOf('## Size'));
    expect(md).toContain('| Pressure drop | 41.2 kPa |');
    expect(md).toContain('| n\\_H2 | 1.2 % |');
    expect(md).toContain('| Tube length (nominal catalyst) | 6 m |');
    expect(md).toContain('| Tube count designed for percentile | 95 % |');
    expect(md).toContain('| Catalyst to install (P95) | 2150 kg |');
    expect(md).toContain('| Tube length to install (P95) | 7.02 m |');
    expect(md).toContain('| Pressure drop of the installed bed (P95, nominal kinetics) | 48.3 kPa |');
    const nominal = renderSizingMarkdown({ ...d, tubes: { count: 412, diameter: 0.0254, length: 6 } });
    expect(nominal).toContain('| Tube length | 6 m |');
    expect(nominal).not.toMatch(/to install|installed bed/);
  });
});
