/**
 * A sizing shown in the case's units, SI beside: the case's displayUnits win, else the units the
 * case wrote (feed flow, pressure), else SI; bad displayUnits are typed errors naming the field.
 * Expected factors by hand from the unit definitions (tonne = 1e3 kg, hour = 3600 s, bar = 1e5 Pa;
 * SI Brochure 9th ed. Table 8, NIST SP 811 B.8).
 */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor } from '../../src/design/size';
import { shownSizing } from '../../src/design/shown-sizing';
import { formatSizing } from '../../cli/size';
import { sizingReportData } from '../../src/workflow/sizing-report-data';
import { tubeBundleCase, tubeBundleHandoff } from './handoff-fixture';

const h = tubeBundleHandoff();
const dk = kineticsFromHandoff(h);
const SPECIES = ['A', 'B', 'C', 'N2'];
const size = (extra: Record<string, unknown>) => {
  const kase = loadCase(tubeBundleCase('shown', '470 K', { uncertainty: { draws: 50, seed: 3 }, ...extra }), SPECIES, ['r1']);
  return { kase, r: sizeReactor({ handoff: h, kinetics: dk.kinetics, kase, molarMasses: dk.molarMasses, options: { profileDraws: 0 } }) };
};

describe('sizing in the case units', () => {
  it('without displayUnits: outlet flows in the feed flow unit, pressures in the case pressure unit', () => {
    const { kase, r } = size({ feed: { totalFlow: '180 kmol/h', moleFractions: { A: 0.4, B: 0.4, N2: 0.2 } } });
    const s = shownSizing(r, kase.display);
    expect(s.outlet!.unit).toBe('kmol/h');
    expect(s.outlet!.amounts.A.value).toBeCloseTo((s.outlet!.amounts.A.valueSI * 3600) / 1e3, 9);
    expect(s.pressure!.unit).toBe('bar');
    expect(s.pressure!.inlet).toBeCloseTo(5, 12);
    expect(s.size!.unit).toBe('kg');
    expect(formatSizing(r, s)).toContain('Pressure: inlet 5 bar');
  });
  it('displayUnits: size in t, flows in mol/s, pressure in kPa, with SI beside', () => {
    const { kase, r } = size({ displayUnits: { mass: 't', molarFlow: 'mol/s', pressure: 'kPa' } });
    const s = shownSizing(r, kase.display);
    expect(s.size!.unit).toBe('t');
    expect(s.size!.value! * 1e3).toBeCloseTo(r.size!.value, 9);
    expect(s.size!.valueSI).toBe(r.size!.value);
    expect(s.percentiles!.length).toBe(r.uncertainty!.percentiles.length);
    s.percentiles!.forEach((p) => expect(p.value * 1e3).toBeCloseTo(p.valueSI, 9));
    expect(s.pressure!.unit).toBe('kPa');
    expect(s.pressure!.inlet).toBeCloseTo(500, 9);
    expect(formatSizing(r, s)).toMatch(/Catalyst mass \(nominal fit\): [\d.e+-]+ t \([\d.e+-]+ kg\)/);
    const report = sizingReportData(r, s);
    expect(report.size.unit).toBe('t');
    expect(report.size.nominal! * 1e3).toBeCloseTo(r.size!.value, 9);
    expect(report.outlet[0].unit).toBe('mol/s');
  });
  it('bad displayUnits in a case: E_UNKNOWN_FIELD and E_UNIT with the field path', () => {
    const bad = (d: unknown) => () => loadCase(tubeBundleCase('x', '470 K', { displayUnits: d }), SPECIES, ['r1']);
    expect(bad({ masss: 't' })).toThrow(expect.objectContaining({ code: 'E_UNKNOWN_FIELD', path: ['displayUnits', 'masss'] }));
    expect(bad({ mass: 'bar' })).toThrow(expect.objectContaining({ code: 'E_UNIT', path: ['displayUnits', 'mass'] }));
  });
});
