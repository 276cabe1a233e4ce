/**
 * Derived quantities of a fit: the pre-exponential factor of every Arrhenius pair and the
 * corresponding factor of every van 't Hoff pair, with delta-method standard errors.
 *
 * With k(T) = k_ref exp(-E/R (1/T - 1/T_ref)), the classical form k = A exp(-E/(R T)) has
 * A = k_ref exp(E/(R T_ref)), so ln A = ln k_ref + E/(R T_ref) is linear in (ln k_ref, E) and
 * var(ln A) = var(ln k) + 2 cov(ln k, E)/(R T_ref) + var(E)/(R T_ref)^2 is exact for the linearised
 * covariance. The same holds for K = K0 exp(-dH/(R T)) with K0 = K_ref exp(dH/(R T_ref)).
 * Intervals are built on ln A (normal or t quantile as for the parameters) and mapped back.
 */
import type { FitResult } from '../estimation/fit-types.js';
import { normalQuantile, studentTQuantile } from '../estimation/distributions.js';
import type { RateLawSpec } from '../kinetics/spec.js';
import { GAS_CONSTANT } from '../core/constants.js';

export interface DerivedQuantity {
  /** e.g. 'A(k1)'. */
  name: string;
  /** How it is computed, in words. */
  definition: string;
  unit: string;
  value: number;
  /** Delta-method standard error of the value; null when the covariance is unavailable. */
  stdError: number | null;
  ci: { level: number; linear: [number, number] | null };
}

function pairs(rates: readonly RateLawSpec[]): Array<{ kind: 'arrhenius' | 'vant-hoff'; constant: string; energy: string }> {
  const out: Array<{ kind: 'arrhenius' | 'vant-hoff'; constant: string; energy: string }> = [];
  const seen = new Set<string>();
  const add = (kind: 'arrhenius' | 'vant-hoff', constant: string, energy?: string) => {
    if (!energy || seen.has(constant)) return;
    seen.add(constant);
    out.push({ kind, constant, energy });
  };
  for (const r of rates) {
    if (r.form === 'expression') continue;
    add('arrhenius', r.rateConstant.k, r.rateConstant.activationEnergy);
    if ('equilibriumConstant' in r && r.equilibriumConstant) add('vant-hoff', r.equilibriumConstant.K, r.equilibriumConstant.enthalpy);
    if (r.form === 'lhhw') for (const a of Object.values(r.adsorption)) add('vant-hoff', a.K, a.enthalpy);
  }
  return out;
}

/** Pre-exponential factors of a fit whose rate laws are `rates`, about reference temperature Tref (K). */
export function derivedQuantities(fit: FitResult, rates: readonly RateLawSpec[], Tref: number): DerivedQuantity[] {
  const byName = new Map(fit.parameters.map((p) => [p.name, p]));
  const covNames = fit.covariance.names;
  const cov = fit.covariance.internal;
  const idx = (n: string) => covNames.indexOf(n);
  const level = fit.parameters[0]?.ci.level ?? 0.95;
  const q =
    fit.statistics.covarianceBasis === 'known-sigma' || fit.statistics.dof <= 0
      ? normalQuantile(0.5 + level / 2)
      : studentTQuantile(0.5 + level / 2, fit.statistics.dof);
  const out: DerivedQuantity[] = [];
  for (const pr of pairs(rates)) {
    const k = byName.get(pr.constant);
    const e = byName.get(pr.energy);
    if (!k || !e || !(k.value > 0)) continue;
    const c = 1 / (GAS_CONSTANT * Tref);
    const lnA = Math.log(k.value) + e.value * c;
    // Gradient of ln A with respect to the estimation-space coordinates of k and E.
    const ik = idx(k.name);
    const ie = idx(e.name);
    let varLn: number | null = null;
    if (cov) {
      const gk = k.transform === 'log' ? 1 : 1 / k.value;
      const ge = e.transform === 'log' ? e.value * c : c;
      const vkk = ik >= 0 ? cov[ik][ik] : 0;
      const vee = ie >= 0 ? cov[ie][ie] : 0;
      const vke = ik >= 0 && ie >= 0 ? cov[ik][ie] : 0;
      varLn = gk * gk * vkk + 2 * gk * ge * vke + ge * ge * vee;
    }
    const value = Math.exp(lnA);
    const sdLn = varLn !== null && varLn >= 0 ? Math.sqrt(varLn) : null;
    out.push({
      name: pr.kind === 'arrhenius' ? `A(${k.name})` : `${k.name}_0`,
      definition:
        pr.kind === 'arrhenius'
          ? `${k.name} exp(${e.name}/(R T_ref)), the pre-exponential factor of ${k.name} = A exp(-${e.name}/(R T))`
          : `${k.name} exp(${e.name}/(R T_ref)), the factor of ${k.name} = ${k.name}_0 exp(-${e.name}/(R T))`,
      unit: k.unit,
      value,
      stdError: sdLn !== null ? value * sdLn : null,
      ci: { level, linear: sdLn !== null ? [Math.exp(lnA - q * sdLn), Math.exp(lnA + q * sdLn)] : null },
    });
  }
  return out;
}
