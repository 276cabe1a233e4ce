/**
 * Measured rates at the measured composition, and rates derived from the mole balance of a
 * stirred tank, checked against hand calculations written out beside each assertion.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { isRateloomError } from '../../src/core/errors';
import { loadStudy } from '../../src/study';
import { fitStudy } from '../../src/workflow/fit-study';
import { StudyModel } from '../../src/workflow/study-model';
import { summarizeStudy } from '../../src/study/summary';
import { formatCheck } from '../../cli/check';

const PATH = join(import.meta.dirname, 'virtual.study.json');
const R = 8.314462618; // J/(mol K), exact (SI Brochure 9th ed.)
function load(study: unknown, csv: string) {
  return loadStudy(JSON.stringify(study), PATH, () => csv);
}

/** Liquid stirred tank A -> B, r = k C_A; feed and outlet flows of A with their sigmas. */
function cstrStudy(extra: Record<string, unknown> = {}) {
  return {
    species: [{ name: 'A' }, { name: 'B' }],
    reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
    reactor: { kind: 'stirred-tank', phase: 'liquid' },
    referenceTemperature: 300,
    data: [
      {
        file: 'cstr.csv',
        layout: 'per-run',
        columns: {
          run: 'run',
          temperature: { value: 300, unit: 'K' },
          volume: { column: 'V_L', unit: 'L' },
          volumetricFlow: { column: 'v0', unit: 'L/min' },
          feed: { A: { column: 'FA0', unit: 'mmol/min' }, B: { value: 0, unit: 'mmol/min' } },
          rateComposition: { basis: 'outlet-flow', species: { A: { column: 'FA', unit: 'mmol/min' }, B: { column: 'FB', unit: 'mmol/min' } } },
          balanceRates: [{ species: 'A', outletColumn: 'FA', unit: 'mmol/min', outletSigmaColumn: 'sFA', feedSigmaColumn: 'sFA0' }],
          ...extra,
        },
      },
    ],
    parameters: [{ name: 'k', value: 1, unit: '1/min', lower: 1e-6, upper: 1e3 }],
  };
}
// k = 0.75 1/min. Run C1: V = 2 L, v0 = 1 L/min, tau = 2 min, F_A = F_A0/(1 + k tau) = 10/2.5 = 4.
// Run C2: V = 1 L, tau = 1 min, F_A = 10/1.75 = 5.714285714...
const CSV = 'run,V_L,v0,FA0,FA,FB,sFA,sFA0\nC1,2,1,10,4,6,0.3,0.4\nC2,1,1,10,5.714285714285714,4.285714285714286,0.3,0.4\n';

describe('stirred tank: rate from the mole balance', () => {
  it('r = (F_A0 - F_A)/V with sigma from the flow sigmas, as computed by hand', () => {
    const { study, report } = load(cstrStudy(), CSV);
    const o = study.observations[0];
    expect(o.response).toBe('rate');
    expect(o.unit).toBe('mol/(m3 s)');
    // Hand calculation, run C1: (10 - 4) mmol/min / 2 L = 3 mmol/(L min) = 3 mol/m3 / 60 s = 0.05 mol/(m3 s).
    expect(o.value).toBeCloseTo(0.05, 14);
    // sigma = sqrt(0.3^2 + 0.4^2) mmol/min / 2 L = 0.5 / 2 = 0.25 mmol/(L min) = 0.25/60 mol/(m3 s).
    expect(o.sigma).toBeCloseTo(0.25 / 60, 14);
    // Composition at the outlet: C_A = F_A / v0 = 4 mmol/min / (1 L/min) = 4 mmol/L = 4 mol/m3.
    expect(study.runs[0].rateConcentrations![0]).toBeCloseTo(4, 12);
    expect(study.rateNotes!.join('\n')).toMatch(/mole balance r = \(F0 - F\)\/W \(or \/V\), F from column FA, sigma propagated from sFA and sFA0/);
    const text = formatCheck(summarizeStudy(study, report), report);
    expect(text).toContain('rates: cstr.csv: measured rates evaluated at the measured composition: outlet-flow columns FA, FB (C_j = F_j/v0');
  });

  it('a fit of the derived rates at the outlet composition returns k = r/C_A = 0.75 1/min', () => {
    const { study } = load(cstrStudy(), CSV);
    const sf = fitStudy(study, { profile: false });
    expect(sf.fit.success).toBe(true);
    // Hand calculation: r/C_A = 0.05 mol/(m3 s) / 4 mol/m3 = 0.0125 1/s = 0.75 1/min.
    expect(sf.fit.parameters[0].value).toBeCloseTo(0.0125, 9);
    expect(sf.model.counters.solves).toBe(0);
  });

  it('a blank run (zero volume) has no derived rate but is accepted', () => {
    const { study, report } = load(cstrStudy(), `${CSV}C0,0,1,10,10,0,0.3,0.4\n`);
    expect(report.rowsRejected).toBe(0);
    expect(study.observations.filter((o) => o.runId === 'C0')).toHaveLength(0);
  });
});

/** Gas differential bed with rates measured at a composition given in several ways. */
function gasStudy(rateComposition: unknown, extraCols: Record<string, unknown> = {}) {
  return {
    species: [{ name: 'A' }, { name: 'B' }, { name: 'N2', inert: true }],
    reactions: [{ id: 'r1', equation: 'A -> B', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k' } } }],
    reactor: { kind: 'packed-bed', phase: 'gas' },
    referenceTemperature: 500,
    data: [{ file: 'g.csv', layout: 'per-run', columns: { run: 'run', temperature: { column: 'T', unit: 'K' }, rateComposition, measured: [{ response: 'rate', species: 'A', column: 'r', unit: 'mol/(kg s)' }], ...extraCols } }],
    parameters: [{ name: 'k', value: 1e-3, unit: 'm3/(kg s)' }],
  };
}

describe('rate composition columns', () => {
  it('mole fractions with a total-pressure column: C = y P/(R T)', () => {
    const s = gasStudy({ basis: 'mole-fraction', species: { A: { column: 'yA', unit: '%' }, N2: { column: 'yN', unit: '%' } }, totalPressure: { column: 'P', unit: 'bar' } });
    const { study } = load(s, 'run,T,yA,yN,P,r\nG1,500,20,80,2,0.1\n');
    // Hand calculation: 0.20 * 2e5 Pa / (8.314462618 * 500) = 9.6217... mol/m3.
    expect(study.runs[0].rateConcentrations![0]).toBeCloseTo((0.2 * 2e5) / (R * 500), 10);
  });

  it('outlet flows of a gas: C = (F_j/F_T) P/(R T) at the run pressure', () => {
    const s = gasStudy({ basis: 'outlet-flow', species: { A: { column: 'FA', unit: 'mol/s' }, B: { column: 'FB', unit: 'mol/s' }, N2: { column: 'FN', unit: 'mol/s' } } }, { pressure: { column: 'P', unit: 'kPa' } });
    const { study } = load(s, 'run,T,P,FA,FB,FN,r\nG1,400,300,1,1,2,0.1\n');
    const C = study.runs[0].rateConcentrations!;
    // Hand calculation: C_T = 3e5/(R 400) = 90.21 mol/m3; fractions 1/4, 1/4, 1/2.
    const CT = 3e5 / (R * 400);
    expect([...C]).toEqual([CT / 4, CT / 4, CT / 2].map((x) => expect.closeTo(x, 10)));
  });

  it('the model predicts the rate at the measured composition, not at a feed', () => {
    const s = gasStudy({ basis: 'concentration', species: { A: { column: 'CA', unit: 'mol/m3' } } });
    const { study } = load(s, 'run,T,CA,r\nG1,500,7,0.1\n');
    const model = new StudyModel(study);
    const pred = new Float64Array(1);
    model.predict(Float64Array.of(Math.log(1e-3)), pred);
    // r = k C_A = 1e-3 m3/(kg s) * 7 mol/m3 = 7e-3 mol/(kg s).
    expect(pred[0]).toBeCloseTo(7e-3, 15);
  });

  it('refuses partial pressures for a liquid and a composition without rates', () => {
    const liquid = gasStudy({ basis: 'partial-pressure', species: { A: { column: 'pA', unit: 'kPa' } } });
    (liquid.reactor as { phase: string }).phase = 'liquid';
    const codes: string[] = [];
    for (const [s, csv] of [
      [liquid, 'run,T,pA,r\nG1,500,7,0.1\n'],
      [{ ...gasStudy({ basis: 'concentration', species: { A: { column: 'CA', unit: 'mol/m3' } } }) }, 'run,T,CA,r\nG1,500,7,0.1\n'],
    ] as const) {
      if (s !== liquid) (s.data[0].columns as Record<string, unknown>).measured = [{ response: 'conversion', species: 'A', column: 'r', unit: '1' }];
      try {
        load(s, csv);
      } catch (e) {
        if (isRateloomError(e)) codes.push(e.code);
      }
    }
    expect(codes).toEqual(['E_VALUE', 'E_VALUE']);
  });
});
