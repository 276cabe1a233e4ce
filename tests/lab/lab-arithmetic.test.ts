/**
 * Internal-standard arithmetic, dry-basis conversion, conversion, selectivity, yield and carbon
 * closure against a worked example computed by hand below (mole balance bookkeeping of a gas
 * analyser: common practice). Then the same row read through a study's labData section.
 *
 * Worked example (flows in mmol/min). Feed: C2H6 10, O2 10, N2 80.
 *   C2H6 + 0.5 O2 -> C2H4 + H2O     extent 3.0
 *   C2H4 + 3 O2   -> 2 CO2 + 2 H2O  extent 0.5
 * Outlet: C2H6 10 - 3 = 7; O2 10 - 1.5 - 1.5 = 7; C2H4 3 - 0.5 = 2.5; CO2 2 * 0.5 = 1;
 *         H2O 3 + 1 = 4; N2 80. Wet total 101.5; dry total (water condensed) 97.5.
 * Dry fractions: C2H6 7/97.5 = 0.0717949, O2 0.0717949, C2H4 2.5/97.5 = 0.0256410,
 *                CO2 1/97.5 = 0.0102564, N2 80/97.5 = 0.8205128.
 * Wet fractions: H2O 4/101.5 = 0.0394089; dry = wet / (1 - 0.0394089), e.g. C2H6 (7/101.5)/(97.5/101.5).
 * Standard: F_C2H6 = F_N2,0 y_C2H6 / y_N2 = 80 * 0.0717949 / 0.8205128 = 7.000.
 * Conversion: X = 1 - (y_C2H6 / y_N2)(F_N2,0 / F_C2H6,0) = 1 - (7/80)(80/10) = 0.3.
 * Selectivity to C2H4 (factor 1): (2.5 - 0) / (10 - 7) = 0.83333; yield 2.5/10 = 0.25 = S X.
 * Selectivity to CO2 (factor |nu_C2H6| / nu_CO2 = 1/2 over the two steps): 0.5 * 1 / 3 = 0.16667.
 * Carbon: in 2 * 10 = 20; out 2*7 + 2*2.5 + 1*1 = 20; closure 100 %.
 */
import { describe, expect, it } from 'vitest';
import { conversionFromStandard, elementClosure, flowFromStandard, fractionsFromFlows, selectivity, wetToDry, yieldOf } from '../../src/data/lab-arithmetic';
import { RUNS_HEADER, labStudy, loadLab } from './lab-fixture';

const dry = { C2H6: 7 / 97.5, O2: 7 / 97.5, C2H4: 2.5 / 97.5, CO2: 1 / 97.5, N2: 80 / 97.5 };
const row = (id: string, y: Record<string, number | string> = dry) => `${id},800,1.0,10,10,80,${y.C2H6},${y.O2},${y.C2H4},${y.CO2},${y.N2}`;

describe('lab arithmetic: worked example computed by hand (common practice)', () => {
  it('dry basis from wet fractions and from flows', () => {
    const wet = [7, 7, 2.5, 1, 4, 80].map((F) => F / 101.5);
    const removed = [false, false, false, false, true, false];
    const d = wetToDry(wet, removed);
    expect(d[0]).toBeCloseTo(0.0717949, 7); // 7/97.5 (hand)
    expect(d[5]).toBeCloseTo(0.8205128, 7); // 80/97.5 (hand)
    expect(d[4]).toBe(0);
    const f = fractionsFromFlows([7, 7, 2.5, 1, 4, 80], removed);
    expect(f[2]).toBeCloseTo(0.025641, 6); // 2.5/97.5 (hand)
  });
  it('flows, conversion, selectivity, yield and carbon closure from the standard', () => {
    expect(flowFromStandard(dry.C2H6, dry.N2, 80)).toBeCloseTo(7, 12); // 80 * (7/97.5)/(80/97.5) (hand)
    expect(conversionFromStandard(dry.C2H6, dry.N2, 10, 80)).toBeCloseTo(0.3, 12); // 1 - (7/80)(80/10) (hand)
    expect(selectivity(2.5, 0, 7, 10, 1)).toBeCloseTo(0.833333, 6); // 2.5/3 (hand)
    expect(yieldOf(2.5, 0, 10, 1)).toBeCloseTo(0.25, 12); // 2.5/10 (hand)
    expect(selectivity(1, 0, 7, 10, 0.5)).toBeCloseTo(0.166667, 6); // 0.5 * 1/3 (hand)
    expect(elementClosure([2, 0, 2, 1, 0, 0], [10, 10, 0, 0, 0, 80], [7, 7, 2.5, 1, 4, 80])).toBeCloseTo(1, 12); // 20/20 (hand)
  });
  it('the same row through a study: check shows the derived flows and closure', () => {
    const { study } = loadLab(labStudy(), { 'runs.csv': `${RUNS_HEADER}\n${row('R1')}\n` });
    const d = study.lab!.derived[0];
    expect(d.flows!.C2H6).toBeCloseTo((7 * 1e-3) / 60, 12); // 7 mmol/min in mol/s (hand)
    expect(d.flows!.C2H4).toBeCloseTo((2.5 * 1e-3) / 60, 12);
    expect(d.conversion!.C2H6).toBeCloseTo(0.3, 10);
    expect(d.selectivity!['C2H4/C2H6']).toBeCloseTo(2.5 / 3, 10);
    expect(d.yield!['C2H4/C2H6']).toBeCloseTo(0.25, 10);
    expect(d.selectivity!['CO2/C2H6']).toBeCloseTo(1 / 6, 10);
    expect(d.closure!.C).toBeCloseTo(1, 10);
    expect(study.lab!.warnings).toEqual([]);
    // Default fit: ratios to the standard, one per measured species but the standard.
    const ratios = study.observations.filter((o) => o.response === 'fraction-ratio');
    expect(ratios.map((o) => o.species)).toEqual(['C2H6', 'O2', 'C2H4', 'CO2']);
    expect(ratios[0].value).toBeCloseTo(7 / 80, 12);
    // sigma of a ratio: R sqrt((s_i/y_i)^2 + (s_s/y_s)^2), s = sqrt(0.0002^2 + (0.01 y)^2).
    const s = (y: number) => Math.hypot(0.0002, 0.01 * y);
    expect(ratios[0].sigma!).toBeCloseTo((7 / 80) * Math.hypot(s(dry.C2H6) / dry.C2H6, s(dry.N2) / dry.N2), 8);
  });
  it('a carbon balance outside the tolerance is warned and the run kept', () => {
    const y = { ...dry, CO2: 3 / 97.5 };
    const { study } = loadLab(labStudy({}, { sumTolerance: 0.05 }), { 'runs.csv': `${RUNS_HEADER}\n${row('R1', y)}\n${row('R2')}\n` });
    expect(study.lab!.derived[0].outside).toEqual(['C']);
    expect(study.lab!.warnings[0]).toMatch(/runs\.csv:2: run 'R1' closes the C balance at 110\.0 %/);
    expect(study.runs.map((r) => r.id)).toEqual(['R1', 'R2']);
  });
});

describe('lab data: bad input names the row', () => {
  const files = (line: string) => ({ 'runs.csv': `${RUNS_HEADER}\n${row('R1')}\n${line}\n` });
  const err = (f: () => unknown) => {
    try {
      f();
    } catch (e) {
      return e as { code: string; message: string };
    }
    throw new Error('no error');
  };
  it('fractions summing above 1 beyond the tolerance', () => {
    const e = err(() => loadLab(labStudy(), files(row('R2', { ...dry, O2: 0.2 }))));
    expect(e.code).toBe('E_DATA');
    expect(e.message).toMatch(/runs\.csv, line 3.*run 'R2' sum to 1\.128/);
  });
  it('the standard missing from a run', () => {
    const e = err(() => loadLab(labStudy(), files(row('R2', { ...dry, N2: '' }))));
    expect(e.message).toMatch(/runs\.csv, line 3.*internal standard 'N2' has no fraction in run 'R2'/);
  });
  it('a zero standard fraction', () => {
    const e = err(() => loadLab(labStudy(), files(row('R2', { ...dry, N2: 0 }))));
    expect(e.message).toMatch(/runs\.csv, line 3.*'N2' has fraction 0 in run 'R2'/);
  });
  it('a dry basis that removes a reactant', () => {
    const e = err(() => loadLab(labStudy({}, { removed: ['H2O', 'O2'], fractions: { C2H6: 'y_C2H6', N2: 'y_N2' } }), files(row('R2'))));
    expect(e.code).toBe('E_VALUE');
    expect(e.message).toMatch(/removes 'O2', a reactant/);
  });
  it('a lab row naming a run that no per-run source defines', () => {
    const labFile = `run,y_C2H6,y_O2,y_C2H4,y_CO2,y_N2\nR1,${dry.C2H6},${dry.O2},${dry.C2H4},${dry.CO2},${dry.N2}\nR9,${dry.C2H6},${dry.O2},${dry.C2H4},${dry.CO2},${dry.N2}\n`;
    const e = err(() => loadLab(labStudy({}, { file: 'gc.csv' }), { 'runs.csv': `${RUNS_HEADER}\n${row('R1')}\n`, 'gc.csv': labFile }));
    expect(e.code).toBe('E_DATA');
    expect(e.message).toMatch(/gc\.csv, line 3.*names run 'R9', which no per-run source defines \(did you mean 'R1'\?\)/);
  });
  it('the lab row of a run rejected by the per-run source is listed as skipped, not dropped silently', () => {
    // R2's feed cell cannot be read: the per-run source rejects the row, so its fractions are not fitted.
    const bad = row('R2').replace(',10,10,80,', ',ten,10,80,');
    const { study, report } = loadLab(labStudy(), { 'runs.csv': `${RUNS_HEADER}\n${row('R1')}\n${bad}\n` });
    expect(report.rowsRejected).toBe(1);
    expect(study.runs.map((r) => r.id)).toEqual(['R1']);
    expect(study.lab!.skipped).toEqual([{ runId: 'R2', line: 3 }]);
    expect(study.observations.every((o) => o.runId === 'R1')).toBe(true);
  });
});
