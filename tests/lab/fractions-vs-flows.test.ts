/**
 * Fractions fitted directly (ratios to the internal standard) against the same data converted to
 * flows by hand first: with small measurement errors both give the same estimates (the truth of
 * the invented campaign, datasets-demo/truth.json, is recovered by both).
 */
import { describe, expect, it } from 'vitest';
import { readTruth } from '../../datasets-demo/generate';
import { gcCampaignCsv } from '../../datasets-demo/generate-gc';
import { compoundToSI } from '../../src/units';
import { fitStudy } from '../../src/workflow/fit-study';
import { GC_STUDY, gcRaw, handFlowStudy, loadGc, withHandFlows } from './hand-flows';

describe('fractions fitted directly vs hand-converted flows', () => {
  it('agree when the errors are small', () => {
    const truth = { ...readTruth().gc, noise: { absolute: 1e-7, relative: 1e-5 } };
    const csv = withHandFlows(gcCampaignCsv(GC_STUDY, gcRaw(), truth, 7));
    const direct = fitStudy(loadGc(gcRaw(), csv), { profile: false });
    const hand = fitStudy(loadGc(handFlowStudy(0.005), csv), { profile: false }); // 0.5 %, the analyser spec
    expect(direct.fit.success).toBe(true);
    expect(hand.fit.success).toBe(true);
    for (const [name, t] of Object.entries(truth.parameters)) {
      const a = direct.fit.parameters.find((p) => p.name === name)!.value;
      const b = hand.fit.parameters.find((p) => p.name === name)!.value;
      expect(Math.abs(a - b) / Math.abs(b), name).toBeLessThan(1e-3);
      expect(Math.abs(a - compoundToSI(t.value, t.unit).value) / Math.abs(a), name).toBeLessThan(2e-3);
    }
  });
});
