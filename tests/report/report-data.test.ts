/**
 * The view-model builders (src/workflow/*-report-data.ts) carry the new report fields from real
 * results: the catalyst to install of a tube bundle designed for a percentile, and the starting
 * values rateloom estimated for a study that left them open. Invented scenarios only.
 */
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor } from '../../src/design/size';
import { renderFitMarkdown, renderSizingMarkdown } from '../../src/report/markdown';
import { loadStudy } from '../../src/study';
import { fitReportData } from '../../src/workflow/fit-report-data';
import { fitStudy } from '../../src/workflow/fit-study';
import { sizingReportData } from '../../src/workflow/sizing-report-data';
import { tubeBundleCase, tubeBundleHandoff } from '../design/handoff-fixture';

// The shared invented tube-bundle scenario (tests/design/handoff-fixture.ts) at 470 K.
const h = tubeBundleHandoff();
const dk = kineticsFromHandoff(h);
const kase = (draws: number) => loadCase(tubeBundleCase('tube bundle report', '470 K', { uncertainty: { draws, seed: 3 } }), ['A', 'B', 'C', 'N2'], ['r1']);

describe('sizingReportData: tube bundle', () => {
  it('passes the design percentile and the catalyst to install, and nothing for them without draws', () => {
    const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: kase(200), molarMasses: dk.molarMasses, options: { profileDraws: 0 } });
    const inst = r.tubes!.install!;
    const t = sizingReportData(r).tubes!;
    expect(t).toMatchObject({
      count: r.tubes!.count,
      length: r.tubes!.length,
      designLevel: 0.95,
      installCatalyst: inst.catalystMass,
      installLength: inst.length,
      installPressureDrop: inst.pressureDrop.pa,
    });
    expect(t.installLength!).toBeGreaterThanOrEqual(t.length);
    expect(renderSizingMarkdown(sizingReportData(r))).toMatch(/\| Catalyst to install \(P95\) \| [\d.]+ kg \|/);

    const r0 = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: kase(0), molarMasses: dk.molarMasses, options: { draws: 0 } });
    const t0 = sizingReportData(r0).tubes!;
    expect(t0).toMatchObject({ designLevel: null, installCatalyst: null, installLength: null, installPressureDrop: null });
    expect(renderSizingMarkdown(sizingReportData(r0))).not.toContain('to install');
  });
});

describe('fitReportData: starting values', () => {
  const FIX = resolve(__dirname, '../data/fixtures');
  const AUTO = join(FIX, 'auto/study.json');
  const read = (p: string) => readFileSync(p, 'utf8');

  it('lists the estimated starts with unit and how; none when the study gave every value', () => {
    const study = loadStudy(read(AUTO), AUTO, (p) => read(resolve(dirname(AUTO), p))).study;
    const sf = fitStudy(study, { profile: false });
    const sv = fitReportData(study, sf).startValues!;
    // shown in the units the study wrote for k1 and E1 (docs/display-units.md); the estimates themselves are SI
    const written: Record<string, [string, number]> = { k1: ['m^3/(s mol)', 1], E1: ['kJ/mol', 1e3] };
    expect(sv.rows.map((r) => [r.parameter, r.unit, r.method])).toEqual(
      sf.startValues!.estimated.map((e) => [e.name, written[e.name][0], e.method === 'differential' ? 'differential rate analysis' : 'documented default']),
    );
    sv.rows.forEach((r, i) => expect(r.value * written[r.parameter][1]).toBeCloseTo(sf.startValues!.estimated[i].value, 6));
    expect(sv.rows.every((r) => r.how.length > 0)).toBe(true);
    expect(sv.points).toBe(sf.startValues!.points);
    expect(renderFitMarkdown(fitReportData(study, sf))).toContain('## Starting values estimated by rateloom');

    expect(fitReportData(study, { ...sf, startValues: undefined }).startValues).toBeNull();
  });
});
