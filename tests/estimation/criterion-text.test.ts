/**
 * One source of truth for information-criterion differences: every printed AICc difference equals
 * the difference of the AICc values printed beside it (the command's comparison table, the verdict
 * sentence, the Markdown report). The check is arithmetic on the printed text itself, so it fails
 * whenever a difference is rounded differently from the values (as '3.36e+4' beside 33648.8 was).
 */
import { describe, expect, it } from 'vitest';
import { criterionDeltaText, criterionText } from '../../src/core/criterion';
import { compareStudy } from '../../src/workflow/compare-study';
import { fitReportData } from '../../src/workflow/fit-report-data';
import { renderFitMarkdown } from '../../src/report/markdown';
import { formatComparison } from '../../cli/compare';
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { loadStudy } from '../../src/study';

describe('printed criterion differences', () => {
  it('a difference is the difference of the printed values (the magnitudes of the reported case)', () => {
    expect(criterionText(-1234.56)).toBe('-1234.6');
    expect(criterionText(32414.24)).toBe('32414.2');
    expect(criterionDeltaText(32414.24, -1234.56)).toBe('33648.8');
    expect(criterionDeltaText(null, 1)).toBe('n/a');
  });
  it('holds for any pair of values (seeded random pairs across magnitudes)', () => {
    let s = 12345;
    const rnd = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    for (let i = 0; i < 2000; i++) {
      const best = (rnd() - 0.5) * 10 ** (1 + 5 * rnd());
      const x = best + rnd() * 10 ** (5 * rnd());
      const d = Number(criterionDeltaText(x, best));
      expect(d).toBeCloseTo(Number(criterionText(x)) - Number(criterionText(best)), 9);
    }
  });
});

describe('the comparison as printed', () => {
  // the demo packed bed: three rate-law sets, one of them (irreversible) some 33,600 AICc units behind
  const path = resolve(import.meta.dirname, '../../datasets-demo/pbr/pbr.study.json');
  const study = loadStudy(readFileSync(path, 'utf8'), path, (a) => readFileSync(resolve(dirname(path), a), 'utf8')).study;
  const { fits, comparison } = compareStudy(study, { profile: false });
  const best = comparison.ranking[0];

  it('command table: delta column = AICc column minus the best AICc', () => {
    const lines = formatComparison(comparison).split('\n');
    const rows = lines.slice(1, 1 + comparison.ranking.length).map((l) => l.trim().split(/\s{2,}/));
    expect(rows.length).toBe(3);
    const bestAicc = Number(rows[0][5]);
    for (const r of rows) expect(Number(r[6])).toBeCloseTo(Number(r[5]) - bestAicc, 9);
  });

  it('verdict sentence: each stated difference equals the two AICc values stated beside it', () => {
    const stated = [...comparison.verdict.matchAll(/AICc (-?[\d.]+), ([\d.]+) above \S+'s (-?[\d.]+)/g)];
    for (const m of stated) expect(Number(m[2])).toBeCloseTo(Number(m[1]) - Number(m[3]), 9);
    const weaker = comparison.ranking.filter((r) => r.converged && !comparison.indistinguishable.includes(r.name));
    expect(stated.length).toBe(weaker.length);
    expect(stated.length).toBeGreaterThan(0);
  });

  it('Markdown report: the ΔAICc column = the AICc column minus the smallest', () => {
    const bestFit = fits.find((f) => f.variant === best.name)!;
    const md = renderFitMarkdown(fitReportData(study, bestFit, comparison));
    const section = md.slice(md.indexOf('## Rival models'));
    const rows = section.split('\n').filter((l) => l.startsWith('| ') && !l.startsWith('| Model') && !/^\| -/.test(l)).slice(0, comparison.ranking.length);
    const cells = rows.map((l) => l.split('|').map((c) => c.trim()));
    const aicc = cells.map((c) => Number(c[4].replace(/ 1$/, '')));
    const delta = cells.map((c) => Number(c[5].replace(/ 1$/, '')));
    const min = Math.min(...aicc);
    aicc.forEach((a, i) => expect(delta[i]).toBeCloseTo(a - min, 9));
  });
});
