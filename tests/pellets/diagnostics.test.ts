/**
 * Transport diagnostics of lab runs: Weisz-Prater, Mears (mass and heat), Prater and Anderson
 * numbers against a worked example computed here from the published formulas, and the study path
 * (check and fit) on the invented demo study given a lab pellet.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { runDiagnostics, diagnosticsWarnings } from '../../src/pellets/diagnostics';
import { loadStudy } from '../../src/study/load';
import { checkLabTransport } from '../../src/workflow/lab-transport';
import { fitStudy } from '../../src/workflow/fit-study';
import { massTransfer, rangeWarning, MASS_TRANSFER } from '../../src/pellets/external';

describe('worked example (invented numbers, published formulas)', () => {
  // Sphere d = 3 mm (R = 1.5e-3 m), rho_p = 1200 kg/m3, rho_b = 720 kg/m3, r_obs = 0.05 mol/(kg s),
  // C_s = C_b = 20 mol/m3, De = 2e-6 m2/s, k_c = 0.1 m/s, n = 1, dH = -90 kJ/mol, E = 80 kJ/mol,
  // h = 500 W/(m2 K), T = 500 K, lambda_e = 0.4 W/(m K).
  const d = runDiagnostics(
    { runId: 'w1', observedRate: 0.05, bulkConcentration: 20, temperature: 500, effectiveDiffusivity: 2e-6, kc: 0.1, h: 500 },
    { radius: 1.5e-3, pelletDensity: 1200, bulkDensity: 720, order: 1, enthalpy: -90000, activationEnergy: 80000, conductivity: 0.4 },
  );
  it('Weisz-Prater (Weisz & Prater 1954): r rho_p R^2 / (De Cs)', () => {
    // 0.05 * 1200 = 60; * (1.5e-3)^2 = 60 * 2.25e-6 = 1.35e-4; / (2e-6 * 20 = 4e-5) = 3.375
    expect(d.weiszPrater).toBeCloseTo(3.375, 12);
  });
  it('Mears external mass (Mears 1971): r rho_b R n / (kc Cb)', () => {
    // 0.05 * 720 * 1.5e-3 * 1 = 0.054; / (0.1 * 20 = 2) = 0.027
    expect(d.mearsMass!).toBeCloseTo(0.027, 12);
  });
  it('Mears external heat (Mears 1971): |dH| r rho_b R E / (h T^2 R_g)', () => {
    // 90000 * 0.05 * 720 * 1.5e-3 * 80000 = 3.888e8; 500 * 500^2 * 8.314462618 = 1.03930783e9
    expect(d.mearsHeat!).toBeCloseTo(3.888e8 / 1.0393078272e9, 9);
  });
  it('Prater (1958) rise and Anderson (1963) criterion', () => {
    // dT_max = De |dH| Cs / lambda = 2e-6 * 90000 * 20 / 0.4 = 9 K
    expect(d.praterRise!).toBeCloseTo(9, 12);
    // |dH| r rho_p R^2 / (lambda T) = 90000 * 0.05 * 1200 * 2.25e-6 / (0.4 * 500) = 12.15 / 200 = 0.06075
    expect(d.anderson!.value).toBeCloseTo(0.06075, 12);
    // limit 0.75 R_g T / E = 0.75 * 8.314462618 * 500 / 80000 = 0.0389740435
    expect(d.anderson!.limit).toBeCloseTo(0.0389740435, 9);
  });
  it('names the failed criteria and warns with the run and the effect on E', () => {
    expect(d.intrinsic).toBe(false);
    expect(d.failed).toEqual(['Weisz-Prater', 'Mears (heat)', 'Anderson (internal heat)']);
    const w = diagnosticsWarnings([d]);
    expect(w[0].message).toContain('w1 (Weisz-Prater');
    expect(w[0].message).toContain('activation energy');
  });
  it('a film correlation outside its Reynolds range warns with the range', () => {
    const mt = massTransfer({ particleDiameter: 1e-4, massFlux: 0.1, density: 1, viscosity: 2e-5 }, 2e-5);
    expect(mt.Re).toBeCloseTo(0.5, 12);
    const w = rangeWarning(MASS_TRANSFER, mt.Re, 'lab film');
    expect(w[0].message).toContain('3 < Re < 10000');
    // Sh = 2 + 1.1 Sc^(1/3) Re^0.6 (Wakao & Funazkri 1978) with Sc = 2e-5 / (1 * 2e-5) = 1
    expect(mt.Sh).toBeCloseTo(2 + 1.1 * 0.5 ** 0.6, 12);
  });
});

describe('the demo study with a lab pellet', () => {
  const studyPath = resolve('datasets-demo/pbr/pbr.study.json');
  const raw = JSON.parse(readFileSync(studyPath, 'utf8'));
  const withPellet = (diameter: string) => ({
    ...raw,
    reactor: { ...raw.reactor, bulkDensity: { value: 700, unit: 'kg/m3' } },
    transport: {
      pellet: {
        shape: 'sphere', diameter, porosity: 0.4, tortuosity: 4, density: '1200 kg/m3', thermalConductivity: '0.3 W/(m K)',
        molecularDiffusivity: { estimate: 'fuller', carrier: 'N2' }, fluid: { viscosity: '2e-5 Pa s', thermalConductivity: '0.04 W/(m K)', heatCapacity: '1500 J/(kg K)' },
      },
      tubeDiameter: '20 mm',
      reactionEnthalpy: { hyd: '-45 kJ/mol' },
    },
  });
  const load = (o: unknown) => loadStudy(JSON.stringify(o), studyPath, (p) => readFileSync(resolve(dirname(studyPath), p), 'utf8')).study;

  it('check: crushed catalyst passes, big pellets are named', () => {
    const small = checkLabTransport(load(withPellet('0.2 mm')))!;
    expect(small.rows.length).toBeGreaterThan(10);
    expect(small.rows.every((r) => r.intrinsic)).toBe(true);
    const big = checkLabTransport(load(withPellet('12 mm')))!;
    expect(big.rows.some((r) => !r.intrinsic)).toBe(true);
    expect(big.warnings.some((w) => w.code === 'transport-limited-runs')).toBe(true);
    // Weisz-Prater grows with R^2: 60 times the diameter, 3600 times the number
    expect(big.rows[0].weiszPrater / small.rows[0].weiszPrater).toBeCloseTo(3600, 6);
  });

  it('bad input names the field', () => {
    const bad = withPellet('3 mm');
    bad.transport.pellet.porosity = 0;
    expect(() => load(bad)).toThrow(/porosity/);
    const big = withPellet('25 mm');
    expect(() => load(big)).toThrow(/transport\.pellet\.diameter/);
  });

  it('fit: diagnostics with the fitted inlet rates, warnings in the fit', () => {
    const sf = fitStudy(load(withPellet('12 mm')), { profile: false });
    expect(sf.transport!.rateSource).toBe('fitted rate at the inlet');
    expect(sf.transport!.rows.some((r) => !r.intrinsic)).toBe(true);
    expect(sf.fit.warnings.some((w) => w.code === 'transport-limited-runs')).toBe(true);
  });
});
