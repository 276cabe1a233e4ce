/** Build small, invented fitted-kinetics hand-off documents for design tests. */
import type { RateLawSpec } from '../../src/kinetics/spec';
import type { FittedKinetics, HandoffParameter } from '../../src/design/handoff';
import { handoffHash } from '../../src/design/handoff-hash';

/**
 * Record a trustworthy verdict, a positive-definite covariance status and the content hash on an
 * invented hand-off (as \`rateloom fit\` does for a trustworthy fit); call again after changing it.
 */
export function seal(h: FittedKinetics): FittedKinetics {
  h.verdict = { trustworthy: true, status: 'converged', message: 'invented test hand-off', reasons: [] };
  h.covarianceStatus = 'positive-definite';
  h.contentHash = handoffHash(h);
  return h;
}

export function param(name: string, value: number, transform: 'log' | 'none', unit = '1', sd: number | null = null): HandoffParameter {
  return { name, unit, value, stdError: sd, fixed: false, transform, internalValue: transform === 'log' ? Math.log(value) : value };
}

export function handoff(
  species: string[],
  reactions: { id: string; equation: string; rate?: RateLawSpec }[],
  parameters: HandoffParameter[],
  cov: { names: string[]; matrix: number[][] },
  coverage: FittedKinetics['coverage'],
  Tref: number,
): FittedKinetics {
  return seal({
    format: 'rateloom.fitted-kinetics',
    formatVersion: 2,
    tool: { name: 'rateloom', version: '0.1.0' },
    study: 'invented test study',
    model: 'base',
    species: species.map((name) => ({ name })),
    reactions: reactions.map((r) => ({ id: r.id, equation: r.equation, rate: r.rate ?? { form: 'power-law', rateConstant: { k: parameters[0].name } } })),
    referenceTemperature: Tref,
    parameters,
    covariance: { space: 'internal', ...cov },
    statistics: { n: 30, p: parameters.length, dof: 30 - parameters.length, residualStdDev: 0.01, covarianceBasis: 'test' },
    fitStatus: 'converged',
    verdict: { trustworthy: true, status: 'converged', message: '', reasons: [] },
    covarianceStatus: 'positive-definite',
    contentHash: '',
    labReactor: { kind: 'packed-bed', phase: 'gas' },
    coverage,
  });
}

/**
 * The invented tube-bundle scenario shared by the design and report tests: gas A + B -> C per kg
 * catalyst with Arrhenius, 5% standard error on ln k (so the required catalyst mass spreads by
 * about 5%), molar masses for the Ergun pressure drop.
 */
export function tubeBundleHandoff(coverage: FittedKinetics['coverage'] = { temperature: { min: 460, max: 500, unit: 'K' } }): FittedKinetics {
  const h = handoff(
    ['A', 'B', 'C', 'N2'],
    [{ id: 'r1', equation: 'A + B -> C', rate: { form: 'power-law', basis: 'mass', rateConstant: { k: 'k', activationEnergy: 'E' } } }],
    [param('k', 1e-4, 'log', 'm6/(kg mol s)'), param('E', 80000, 'none', 'J/mol')],
    { names: ['k', 'E'], matrix: [[0.0025, 0], [0, 4e6]] },
    coverage,
    480,
  );
  h.species = [
    { name: 'A', molarMass: 0.028 },
    { name: 'B', molarMass: 0.032 },
    { name: 'C', molarMass: 0.06 },
    { name: 'N2', formula: 'N2' },
  ];
  return seal(h);
}

/** Production case file (raw JSON) of the tube-bundle scenario; `extra` adds or replaces fields. */
export function tubeBundleCase(name: string, temperature: string, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    name,
    reactor: { kind: 'packed-bed', phase: 'gas' },
    feed: { totalFlow: '50 mol/s', moleFractions: { A: 0.4, B: 0.4, N2: 0.2 } },
    temperature,
    pressure: '5 bar',
    target: { conversion: 0.7, species: 'A' },
    tubes: {
      innerDiameter: '25 mm',
      particleDiameter: '3 mm',
      voidFraction: 0.4,
      bulkDensity: '800 kg/m3',
      particleDensity: '1333 kg/m3',
      viscosity: '2.5e-5 Pa s',
      allowedPressureDrop: '0.5 bar',
    },
    ...extra,
  };
}
