import { describe, expect, it } from 'vitest';
import { ROUND_OFF_NOTE, ROUND_OFF_TOLERANCE, shownAmounts } from '../../src/reactors/round-off';

describe('round-off negatives are shown as zero within the stated tolerance', () => {
  it('clamps values above -tol x scale, keeps and counts larger negatives', () => {
    // scale 2 mol/s: the limit is -2e-9 mol/s.
    const r = shownAmounts([1, -1e-17, -1.9e-9, -3e-9], [10, -1e-16, -1e-8, -2e-8], 2);
    expect(r.amounts).toEqual([1, 0, 0, -3e-9]);
    expect(r.concentrations).toEqual([10, 0, 0, -2e-8]);
    expect(r.clamped).toBe(2);
    expect(r.negative).toBe(1);
    expect(Object.is(r.amounts[1], -0)).toBe(false);
    expect(ROUND_OFF_NOTE).toContain(String(ROUND_OFF_TOLERANCE));
  });
});
