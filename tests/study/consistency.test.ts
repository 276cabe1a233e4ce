/**
 * Consistency of study constants with the runs (src/study/consistency.ts): the Ergun superficial
 * mass flux and inlet density against each run's feed and inlet state, and a gas batch's initial
 * pressure against its initial concentrations. Expected numbers are worked by hand beside each check.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadStudy } from '../../src/study';
import { consistencyWarnings } from '../../src/study/consistency';
import { summarizeStudy } from '../../src/study/summary';
import { formatCheck } from '../../cli/check';

const PATH = join(import.meta.dirname, 'virtual.study.json');
const R = 8.314462618; // J/(mol K), exact (SI Brochure 9th ed.)
const load = (s: unknown, csv: string) => loadStudy(JSON.stringify(s), PATH, () => csv);

function bed(G: number, rho0: number) {
  return {
    species: [{ name: 'CO', formula: 'CO' }, { name: 'H2', formula: 'H2' }, { name: 'CH3OH', formula: 'CH4O' }],
    reactions: [{ id: 'r1', equation: 'CO + 2 H2 -> CH3OH', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k' } } }],
    reactor: {
      kind: 'packed-bed', phase: 'gas',
      pressureDrop: { ergun: { particleDiameter: { value: 3, unit: 'mm' }, voidFraction: 0.4, superficialMassFlux: { value: G, unit: 'kg/(m2 s)' }, viscosity: { value: 2e-5, unit: 'Pa s' }, inletDensity: { value: rho0, unit: 'kg/m3' }, crossSection: { value: 10, unit: 'cm2' }, catalystDensity: { value: 2000, unit: 'kg/m3' } } },
    },
    referenceTemperature: 500,
    data: [{ file: 'b.csv', layout: 'per-run', columns: { run: 'run', temperature: { value: 500, unit: 'K' }, pressure: { column: 'P', unit: 'bar' }, catalystMass: { value: 10, unit: 'g' }, feed: { CO: { column: 'FCO', unit: 'mol/s' }, H2: { column: 'FH2', unit: 'mol/s' } }, measured: [{ response: 'conversion', species: 'CO', column: 'X', unit: '1' }] } }],
    parameters: [{ name: 'k', value: 1e-6, unit: '1' }],
  };
}

describe('Ergun inputs against each run', () => {
  // Feed 0.01 mol/s CO (28.010 g/mol) + 0.02 mol/s H2 (2.016 g/mol) = 0.3205 g/s over 10 cm2 = 1e-3 m2:
  // G = 0.3205 kg/(m2 s). Mean molar mass 0.3205 g/s / 0.03 mol/s = 10.68 g/mol; at 50 bar and
  // 500 K, rho0 = 5e6 * 0.01068 / (R 500) = 12.85 kg/m3. (Molar masses: IUPAC standard atomic weights.)
  const csv = 'run,P,FCO,FH2,X\nA,50,0.01,0.02,0.1\nB,50,0.04,0.08,0.1\n';

  it('is silent when G and rho0 match the run', () => {
    const { study } = load(bed(0.3205, 12.85), csv.split('\n').slice(0, 2).join('\n') + '\n');
    expect(consistencyWarnings(study)).toEqual([]);
  });

  it('warns with both numbers and units when a run has four times the flow', () => {
    const { study, report } = load(bed(0.3205, 12.85), csv);
    const w = consistencyWarnings(study);
    expect(w).toHaveLength(1);
    expect(w[0]).toMatch(/^run B: the Ergun superficial mass flux is 0\.3205 kg\/\(m2 s\), but the run's feed gives 1\.282 kg\/\(m2 s\)/);
    expect(formatCheck(summarizeStudy(study, report), report)).toContain('Warnings (study constants against the runs):');
  });

  it('warns when the Ergun inlet density disagrees with the run pressure', () => {
    const { study } = load(bed(0.3205, 25), csv.split('\n').slice(0, 2).join('\n') + '\n');
    const w = consistencyWarnings(study);
    const rho = (5e6 * (0.3205 / 0.03 / 1000)) / (R * 500);
    expect(w[0]).toContain(`the Ergun inlet density is 25.00 kg/m3, but the run's inlet (5.000e+6 Pa, 500.0 K, mean molar mass 10.68 g/mol) gives ${rho.toPrecision(4)} kg/m3`);
  });
});

describe('gas batch: initial pressure against initial concentrations', () => {
  const batch = {
    species: [{ name: 'A' }, { name: 'B' }],
    reactions: [{ id: 'r1', equation: 'A -> 2 B', rate: { form: 'power-law', rateConstant: { k: 'k' } } }],
    reactor: { kind: 'batch', phase: 'gas' },
    referenceTemperature: 400,
    data: [{ file: 'g.csv', layout: 'per-run', columns: { run: 'run', temperature: { value: 400, unit: 'K' }, pressure: { column: 'P', unit: 'kPa' }, time: { value: 60, unit: 's' }, initialConcentrations: { A: { column: 'CA', unit: 'mol/m3' }, B: { value: 0, unit: 'mol/m3' } }, measured: [{ response: 'outlet-pressure', column: 'Pend', unit: 'kPa' }] } }],
    parameters: [{ name: 'k', value: 1e-3, unit: '1/s' }],
  };
  it('warns with both pressures when they differ by more than 2 %', () => {
    // 30 mol/m3 at 400 K: P = 30 R 400 = 99 774 Pa; run G2 states 150 kPa.
    const { study } = load(batch, 'run,P,CA,Pend\nG1,99.77,30,110\nG2,150,30,160\n');
    const w = consistencyWarnings(study);
    expect(w).toEqual([`run G2: the initial pressure is 1.500e+5 Pa, but the initial concentrations (30.00 mol/m3 in all) at 400.0 K give ${(30 * R * 400).toPrecision(4)} Pa (ideal gas)`]);
  });
});
