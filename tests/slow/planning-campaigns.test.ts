/**
 * Simulation study of the run planner on the demo packed bed (campaign-job.ts has the campaign):
 * over 50 simulated campaigns, 8 runs planned Ds-optimal for the activation energy E1 must narrow
 * its interval more than 8 runs drawn at random within the same limits in at least 80 % of the
 * campaigns, and 8 runs planned to tell the water-inhibited (Langmuir-Hinshelwood) form from the
 * power law (Box-Hill) must give the true form an Akaike (AICc) weight above 0.95 more often than
 * 8 random runs. The truth is known (datasets-demo/truth.json; the water adsorption constant
 * KW = 2e-4 m3/mol is invented for this study), so the check is against the simulation's own
 * ground truth, not against rateloom's estimates. The campaigns run on the worker pool.
 */
import { describe, expect, it } from 'vitest';
import { runJobs } from '../../src/parallel/pool';
import type { CampaignContext, CampaignResult } from './campaign-job';

const CAMPAIGNS = 50;
const CONTEXT: CampaignContext = { seed: 20261205, levels: 4, kw: 2e-4 };

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

describe('planned runs against random runs on the demo packed bed (50 simulated campaigns)', () => {
  it('planned runs narrow the E1 interval more in >= 80 % of campaigns and pick the true rate law more often', async () => {
    const t0 = Date.now();
    const moduleUrl = new URL('./campaign-job.ts', import.meta.url).href;
    const outcomes = await runJobs<CampaignContext, number, CampaignResult>(moduleUrl, CONTEXT, Array.from({ length: CAMPAIGNS }, (_, i) => i), { workers: 2 });
    const failed = outcomes.filter((o) => !o.ok);
    expect(failed.map((o) => (o.ok ? '' : o.message))).toEqual([]);
    const r = outcomes.map((o) => (o as { ok: true; value: CampaignResult }).value);
    const narrower = r.filter((x) => x.widthPlanned < x.widthRandom).length;
    const pickedPlanned = r.filter((x) => x.weightPlanned > 0.95).length;
    const pickedRandom = r.filter((x) => x.weightRandom > 0.95).length;
    const pickedFirst = r.filter((x) => x.weightFirst > 0.95).length;
    const seconds = (Date.now() - t0) / 1000;
    console.log(
      [
        `planning simulation study: ${CAMPAIGNS} campaigns in ${seconds.toFixed(0)} s (2 workers)`,
        `  E1 95 % interval width, median: planned ${(median(r.map((x) => x.widthPlanned)) / 1000).toFixed(2)} kJ/mol, random ${(median(r.map((x) => x.widthRandom)) / 1000).toFixed(2)} kJ/mol; planned narrower in ${narrower}/${CAMPAIGNS} (${((100 * narrower) / CAMPAIGNS).toFixed(0)} %)`,
        `  true rate law with AICc weight > 0.95: planned ${pickedPlanned}/${CAMPAIGNS}, random ${pickedRandom}/${CAMPAIGNS}, first campaign alone ${pickedFirst}/${CAMPAIGNS}`,
        `  median weight of the true rate law: planned ${median(r.map((x) => x.weightPlanned)).toFixed(3)}, random ${median(r.map((x) => x.weightRandom)).toFixed(3)}`,
      ].join('\n'),
    );
    expect(narrower / CAMPAIGNS).toBeGreaterThanOrEqual(0.8);
    expect(pickedPlanned).toBeGreaterThan(pickedRandom);
  });
});
