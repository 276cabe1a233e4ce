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
    expect(md).toContain('0.391 … open –');
    // every numeric cell is followed by a unit (a dimensionless one reads '–')
    for (const row of tableRows(md)) {
      for (const cell of row.slice(1)) {
        if (/^[−-]?\d[\d.×⁰¹²³⁴⁵⁶⁷⁸⁹⁻…\s]*$/.test(cell)) throw new Error(`number without unit in Markdown cell '${cell}'`);
      }
    }
    expect(md).not.toMatch(/NaN|undefined/);
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
  });
});
