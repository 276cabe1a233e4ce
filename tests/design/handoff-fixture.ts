/** Build small, invented fitted-kinetics hand-off documents for design tests. */
import type { RateLawSpec } from '../../src/kinetics/spec';
import type { FittedKinetics, HandoffParameter } from '../../src/design/handoff';

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
  return {
    format: 'rateloom.fitted-kinetics',
    formatVersion: 1,
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
    labReactor: { kind: 'packed-bed', phase: 'gas' },
    coverage,
  };
}
