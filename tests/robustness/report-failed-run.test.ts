/**
 * Reports of a fit whose model cannot be evaluated at the estimate (every run fails: log of a
 * concentration that is zero in the feed): the HTML and Markdown reports are written, show the
 * measured values with the predictions as not computed, and never throw.
 */
import { describe, expect, it } from 'vitest';
import { fitStudy } from '../../src/workflow/fit-study';
import { fitReportData } from '../../src/workflow/fit-report-data';
import { renderFitReport } from '../../src/report';
import { baseStudy, load } from '../data/helpers';

describe('report of runs the model cannot evaluate', () => {
  it('shows the runs as not computed instead of crashing', async () => {
    const s = baseStudy();
    s.reactions[0].rate = { form: 'expression', basis: 'mass', expression: 'k1*exp(-E1/R*(1/T-1/T_ref))*C_A*log(C_B)' };
    const { study } = load(s);
    const sf = fitStudy(study, { profile: false });
    expect(sf.fit.status).toBe('model-failure');
    const data = fitReportData(study, sf);
    const responses = data.runs.flatMap((r) => r.responses);
    expect(responses.length).toBeGreaterThan(0);
    expect(responses.every((r) => r.predicted === null && r.residual === null && Number.isFinite(r.measured))).toBe(true);
    const out = await renderFitReport(data);
    expect(out.html).toContain('R1');
    expect(out.markdown.length).toBeGreaterThan(100);
  }, 60_000);
});
