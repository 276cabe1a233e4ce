/**
 * Whether the study's reference temperature means anything: only Arrhenius terms (an activation
 * energy), van 't Hoff terms (an enthalpy) and custom expressions that name T_ref depend on it.
 * When none does, messages say nothing about a reference temperature.
 */
import type { RateLawSpec } from '../kinetics/spec.js';
import type { Study } from './types.js';

function lawUsesTref(r: RateLawSpec): boolean {
  if (r.form === 'expression') return /\bT_ref\b/.test(r.expression);
  if (r.rateConstant.activationEnergy) return true;
  if ('equilibriumConstant' in r && r.equilibriumConstant?.enthalpy) return true;
  if (r.form === 'lhhw') return Object.values(r.adsorption).some((a) => a.enthalpy !== undefined);
  return false;
}

/** True when some rate law of the study (or of a candidate) depends on the reference temperature. */
export function referenceTemperatureMatters(study: Pick<Study, 'reactions' | 'candidates'>): boolean {
  const sets = [study.reactions, ...study.candidates.map((c) => c.reactions)];
  return sets.some((rs) => rs.some((r) => lawUsesTref(r.rate as RateLawSpec)));
}
