/** The energy-balance section of the sizing report: profiles, hot-spot distribution, runaway chart. */
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/design/case';
import { kineticsFromHandoff } from '../../src/design/kinetics';
import { sizeReactor } from '../../src/design/size';
import { sizingCharts } from '../../src/report/charts';
import { renderSizingReport } from '../../src/report';
import { sizingReportData } from '../../src/workflow/sizing-report-data';
import { tubeBundleCase, tubeBundleHandoff } from '../design/handoff-fixture';

const h = tubeBundleHandoff();
const dk = kineticsFromHandoff(h);
const raw = tubeBundleCase('cooled report', '480 K', {
  feed: { totalFlow: '50 mol/s', moleFractions: { A: 0.05, B: 0.05, N2: 0.9 } },
  heat: {
    mode: 'co-current', reactionEnthalpy: { r1: '-90 kJ/mol' }, referenceTemperature: '480 K',
    heatCapacities: { A: '40 J/(mol K)', B: '35 J/(mol K)', C: '80 J/(mol K)', N2: '29.1 J/(mol K)' },
    overallCoefficient: '150 W/(m2 K)', coolant: { temperature: '478 K', flow: '30 kg/s', heatCapacity: '2.2 kJ/(kg K)' }, maxTemperature: '540 K',
  },
});
const r = sizeReactor({ handoff: h, kinetics: dk.kinetics, kase: loadCase(raw, ['A', 'B', 'C', 'N2'], ['r1']), molarMasses: dk.molarMasses, options: { draws: 100 } });

describe('energy-balance report', () => {
  const data = sizingReportData(r);
  it('carries the thermal view model and the energy-balance cautions', () => {
    expect(data.thermal!.profile.z.length).toBe(101);
    expect(data.reactor).toMatch(/energy balance/);
    expect(data.cautions.join(' ')).toMatch(/pseudo-homogeneous/);
  });
  it('draws the profiles, the hot-spot distribution and the runaway chart with the critical value', async () => {
    const ids = sizingCharts(data).thermal.map((c) => c.id);
    expect(ids).toEqual(['thermal-profile', 'thermal-hot-spot-distribution', 'thermal-runaway']);
    const html = (await renderSizingReport(data)).html;
    expect(html).toContain('Energy balance');
    expect(html).toContain('Critical coolant temperature');
  });
  it('the Markdown summary has the energy-balance table with the same numbers as the JSON', async () => {
    const mdText = (await renderSizingReport(data)).markdown;
    expect(mdText).toContain('## Energy balance');
    expect(mdText).toContain(`Binding constraint | ${r.thermal!.design.binding}`);
    expect(mdText).toMatch(/Hot spot \(nominal; percentiles over the draws\) \| [0-9.]+ K \(P50 [0-9.]+ K, P90 [0-9.]+ K, P95 [0-9.]+ K\)/);
    expect(mdText).toMatch(/Runaway margin/);
    expect(mdText).toContain(`${r.thermal!.design.count} tubes`);
  });
});
