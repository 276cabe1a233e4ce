/**
 * Test helper: compiled kinetics through the real pipeline (buildChemistry + compileKinetics).
 */
import { buildChemistry } from '../../src/chemistry/mechanism';
import type { SpeciesSpec } from '../../src/chemistry/spec';
import { compileKinetics, type CompiledKineticsInfo } from '../../src/kinetics/compile';
import type { RateLawSpec } from '../../src/kinetics/spec';

export interface TestReaction {
  equation: string;
  rate: RateLawSpec;
}

/** Compile species (names or specs) and reactions; parameters in the given order. */
export function compile(
  species: (string | SpeciesSpec)[],
  reactions: TestReaction[],
  parameterNames: string[],
  referenceTemperature = 298.15,
): CompiledKineticsInfo {
  const specs = species.map((s) => (typeof s === 'string' ? { name: s } : s));
  const chemistry = buildChemistry(
    specs,
    reactions.map((r, i) => ({ id: `r${i + 1}`, equation: r.equation })),
  );
  return compileKinetics({ chemistry, rates: reactions.map((r) => r.rate), parameterNames, referenceTemperature });
}

/** Power law r = k prod C^order (orders default to the reactant coefficients). */
export const pl = (k: string, basis: 'volume' | 'mass' = 'volume', orders?: Record<string, number>): RateLawSpec => ({
  form: 'power-law', basis, rateConstant: { k }, ...(orders ? { orders } : {}),
});

/** Reversible power law r = k (prod C_reac - prod C_prod / K). */
export const rpl = (k: string, K: string, basis: 'volume' | 'mass' = 'volume'): RateLawSpec => ({
  form: 'reversible-power-law', basis, rateConstant: { k }, equilibriumConstant: { K },
});
