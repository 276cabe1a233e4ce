/**
 * Transport diagnostics of one lab run: did the run measure intrinsic kinetics?
 *
 *   Weisz-Prater        C_WP = r_obs rho_p R^2 / (De C_s)                      (warn above 0.3)
 *   Mears, mass         M_m = r_obs rho_b R n / (k_c C_b)                      (warn above 0.15)
 *   Mears, heat         M_h = |dH| r_obs rho_b R E / (h T_b^2 R_g)             (warn above 0.15)
 *   Prater              dT_max = De |dH| C_s / lambda_e  (centre minus surface, complete conversion)
 *   Anderson, internal  A = |dH| r_obs rho_p R^2 / (lambda_e T_s)  against 0.75 T_s R_g / E
 *
 * r_obs is the observed rate of the key reactant per kg catalyst, R the pellet radius (3 Vp/Sp for
 * other shapes), n the reaction order. Sources: P.B. Weisz, C.D. Prater, "Interpretation of
 * measurements in experimental catalysis", Adv. Catal. 6 (1954) 143-196; D.E. Mears, "Tests for
 * transport limitations in experimental catalytic reactors", Ind. Eng. Chem. Process Des. Dev. 10
 * (1971) 541-547 (both criteria, bound 0.15 for a 5 % deviation of the rate); C.D. Prater, "The
 * temperature produced by heat of reaction in the interior of porous particles", Chem. Eng. Sci.
 * 8 (1958) 284-286; J.B. Anderson, "A criterion for isothermal behaviour of a catalyst pellet",
 * Chem. Eng. Sci. 18 (1963) 147-148. The Weisz-Prater bound 0.3 is common practice (for a
 * first-order sphere it keeps eta above 0.97).
 */
import type { Warning } from '../core/outcome.js';
import { GAS_CONSTANT } from '../core/constants.js';

export const WEISZ_PRATER_LIMIT = 0.3;
export const MEARS_LIMIT = 0.15;
export const ANDERSON_FACTOR = 0.75;

/** One run's numbers, SI. */
export interface RunTransportInput {
  runId: string;
  /** Observed consumption rate of the key reactant, mol/(kg catalyst s). */
  observedRate: number;
  /** Key reactant concentration in the bulk fluid (taken as the surface value), mol/m3. */
  bulkConcentration: number;
  /** Temperature, K. */
  temperature: number;
  /** Effective diffusivity of the key reactant, m2/s. */
  effectiveDiffusivity: number;
  /** Mass-transfer coefficient, m/s (absent: the Mears mass number is not computed). */
  kc?: number;
  /** Heat-transfer coefficient, W/(m2 K) (absent: the Mears heat number is not computed). */
  h?: number;
}

/** Properties shared by the runs, SI. */
export interface TransportContext {
  /** Pellet radius, m (3 Vp/Sp for non-spherical pellets). */
  radius: number;
  /** Pellet density, kg/m3. */
  pelletDensity: number;
  /** Bed bulk density, kg/m3 (Mears numbers). */
  bulkDensity?: number;
  /** Reaction order with respect to the key reactant (Mears mass). */
  order: number;
  /** Reaction enthalpy, J/mol (heat checks). */
  enthalpy?: number;
  /** Activation energy, J/mol (heat checks). */
  activationEnergy?: number;
  /** Effective pellet conductivity, W/(m K) (internal heat checks). */
  conductivity?: number;
}

export interface RunDiagnostics {
  runId: string;
  observedRate: number;
  weiszPrater: number;
  /** Mears number for external mass transfer (null: not computable from the inputs). */
  mearsMass: number | null;
  mearsHeat: number | null;
  /** Largest internal temperature rise (Prater), K (null without conductivity and enthalpy). */
  praterRise: number | null;
  /** Anderson's number and its bound 0.75 R T / E (null when not computable). */
  anderson: { value: number; limit: number } | null;
  /** True when every computed criterion holds. */
  intrinsic: boolean;
  /** Which criteria failed. */
  failed: string[];
}

const fin = (x: number): number | null => (Number.isFinite(x) ? x : null);

/** The diagnostics of one run. */
export function runDiagnostics(run: RunTransportInput, ctx: TransportContext): RunDiagnostics {
  const { radius: R, pelletDensity: rhoP, bulkDensity: rhoB, enthalpy, activationEnergy: E, conductivity: lam } = ctx;
  const r = Math.abs(run.observedRate);
  const Cs = run.bulkConcentration;
  const T = run.temperature;
  const wp = (r * rhoP * R * R) / (run.effectiveDiffusivity * Cs);
  const mm = run.kc !== undefined && rhoB !== undefined ? (r * rhoB * R * ctx.order) / (run.kc * Cs) : NaN;
  const dH = enthalpy !== undefined ? Math.abs(enthalpy) : NaN;
  const mh = run.h !== undefined && rhoB !== undefined && E !== undefined ? (dH * r * rhoB * R * E) / (run.h * T * T * GAS_CONSTANT) : NaN;
  const rise = lam !== undefined ? (run.effectiveDiffusivity * dH * Cs) / lam : NaN;
  const and = lam !== undefined && E !== undefined ? (dH * r * rhoP * R * R) / (lam * T) : NaN;
  const andLimit = E !== undefined ? (ANDERSON_FACTOR * T * GAS_CONSTANT) / E : NaN;
  const failed: string[] = [];
  if (wp > WEISZ_PRATER_LIMIT) failed.push('Weisz-Prater');
  if (mm > MEARS_LIMIT) failed.push('Mears (mass)');
  if (mh > MEARS_LIMIT) failed.push('Mears (heat)');
  if (and > andLimit) failed.push('Anderson (internal heat)');
  return {
    runId: run.runId,
    observedRate: run.observedRate,
    weiszPrater: wp,
    mearsMass: fin(mm),
    mearsHeat: fin(mh),
    praterRise: fin(rise),
    anderson: Number.isFinite(and) && Number.isFinite(andLimit) ? { value: and, limit: andLimit } : null,
    intrinsic: failed.length === 0,
    failed,
  };
}

/** What a transport limitation does to fitted parameters (for reports and warnings). */
export const ACTIVATION_ENERGY_NOTE =
  'Where pore diffusion limits the rate, the apparent activation energy is about half the true one and the apparent order ' +
  '(n+1)/2 (Weisz and Prater 1954); where film transfer limits it, the apparent activation energy falls towards that of ' +
  'diffusion (a few kJ/mol). A fit to such runs therefore underestimates E and the temperature sensitivity of the plant reactor.';

/** Warnings naming the runs where the kinetics may not be intrinsic. */
export function diagnosticsWarnings(rows: readonly RunDiagnostics[]): Warning[] {
  const bad = rows.filter((r) => !r.intrinsic);
  if (bad.length === 0) return [];
  const names = bad.slice(0, 12).map((r) => `${r.runId} (${r.failed.join(', ')})`).join('; ');
  return [{
    code: 'transport-limited-runs',
    message: `${bad.length} of ${rows.length} runs may not have measured intrinsic kinetics: ${names}${bad.length > 12 ? '; ...' : ''}. ${ACTIVATION_ENERGY_NOTE}`,
  }];
}
