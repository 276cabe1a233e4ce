/**
 * The influence warning is readable: the count, the five most extreme observations by name, and
 * a table (command text and Markdown report) of those five, not a list of every run. The demo
 * packed bed with seven planted outliers (outlet ether flow raised by 0.005 mmol/min, 20 to 50 of
 * its standard deviations, small enough to pass the element-balance check) must name only those
 * among the top five and count all seven.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { loadStudy } from '../../src/study';
import { fitStudy } from '../../src/workflow/fit-study';
import { fitReportData } from '../../src/workflow/fit-report-data';
import { renderFitMarkdown } from '../../src/report/markdown';
import { formatFit } from '../../cli/fit';

const PLANTED = ['P3', 'P5', 'P12', 'P20', 'P27', 'P33', 'P40'];

function studyWithOutliers() {
  const path = resolve(import.meta.dirname, '../../datasets-demo/pbr/pbr.study.json');
  const csv = readFileSync(resolve(dirname(path), 'runs.csv'), 'utf8')
    .split('\n')
    .map((line) => {
      const cells = line.split(',');
      if (!PLANTED.includes(cells[0])) return line;
      cells[10] = (Number(cells[10]) + 0.005).toFixed(5); // F_DEE, +0.005 mmol/min: 20 to 50 sigma, within the element balance
      return cells.join(',');
    })
    .join('\n');
  return loadStudy(readFileSync(path, 'utf8'), path, (a) => (a.endsWith('runs.csv') ? csv : readFileSync(a, 'utf8'))).study;
}

describe('influential observations as a table', () => {
  const study = studyWithOutliers();
  const sf = fitStudy(study, { profile: false });
  const count = sf.fit.influential.length;

  it('the planted outliers are found', () => {
    expect(count).toBeGreaterThanOrEqual(PLANTED.length);
    const runs = new Set(sf.fit.influential.map((o) => study.observations[o.index].runId));
    for (const r of PLANTED) expect(runs.has(r)).toBe(true);
  });

  it('the warning gives the count and names five, not all', () => {
    const w = sf.fit.warnings.find((x) => x.code === 'influential-observations')!;
    expect(w.message.startsWith(`${count} influential observation(s)`)).toBe(true);
    expect(w.message.match(/run P\d+ /g)!.length).toBe(5);
  });

  it('the command text prints the count and a five-row table', () => {
    const text = formatFit(study, sf);
    const start = text.indexOf(`Influential observations: ${count}; the 5 with the largest |studentized residual|:`);
    expect(start).toBeGreaterThanOrEqual(0);
    const lines = text.slice(start).split('\n');
    expect(lines[1]).toMatch(/^run\s+response\s+CSV line\s+studentized residual/);
    const rows = lines.slice(2).filter((l) => /^P\d+\s/.test(l));
    expect(rows.length).toBe(5);
    for (const r of rows) expect(PLANTED).toContain(r.split(/\s+/)[0]);
  });

  it('the Markdown report has the same table under a heading with the count', () => {
    const md = renderFitMarkdown(fitReportData(study, sf));
    const at = md.indexOf(`## Influential observations (${count})`);
    expect(at).toBeGreaterThanOrEqual(0);
    const rows = md.slice(at).split('\n').filter((l) => /^\| P\d+ \|/.test(l));
    expect(rows.length).toBe(5);
  });
});
