/**
 * Semenov-type runaway criterion for a well-mixed vessel (batch, semibatch or stirred tank) with a
 * jacket at Ta: N.N. Semenov, "Zur Theorie des Verbrennungsprozesses", Z. Phys. 48 (1928) 571-582,
 * in the Frank-Kamenetskii exponential approximation. With Qg(T) the heat generated at the initial
 * (batch) or feed (stirred tank) composition and Qr = UA (T - Ta), the vessel stays below runaway
 * while
 *   psi = Qg(Ta) (d ln Qg / dT)|Ta / UA  <  1/e,
 * which for an Arrhenius rate is the familiar psi = Qg(Ta) E / (R Ta^2 UA). The critical coolant
 * temperature is where psi(Ta) = 1/e (Brent's method on a bracket stepped upward from Ta); the margin
 * is the critical temperature minus the design Ta. Consumption of reactant is ignored, so the
 * criterion is conservative for fast, low-order reactions (common practice).
 */
import { brent } from '../../numerics/roots.js';

/** 1/e: the critical Semenov number. */
export const SEMENOV_CRITICAL = Math.exp(-1);

export interface SemenovResult {
  criterion: string;
  /** Semenov number at the design coolant temperature (dimensionless). */
  psi: number;
  /** 1/e. */
  critical: number;
  safe: boolean;
  /** Coolant temperature at which psi = 1/e, K (null when not found within 1000 K above Ta). */
  criticalCoolantTemperature: number | null;
  /** criticalCoolantTemperature - Ta, K. */
  margin: number | null;
}

/** psi at coolant temperature Ta for heat generation qg(T) (W) and UA (W/K). */
export function semenovNumber(qg: (T: number) => number, Ta: number, UA: number): number {
  const h = 1e-4 * Ta;
  const up = qg(Ta + h);
  const dn = qg(Ta - h);
  const q = qg(Ta);
  if (!(q > 0) || !(up > 0) || !(dn > 0)) return 0;
  const dlnq = (Math.log(up) - Math.log(dn)) / (2 * h);
  return (q * dlnq) / UA;
}

/** The Semenov criterion at Ta with its critical coolant temperature and margin. */
export function semenovCriterion(qg: (T: number) => number, Ta: number, UA: number): SemenovResult {
  const psi = semenovNumber(qg, Ta, UA);
  const g = (t: number): number => semenovNumber(qg, t, UA) - SEMENOV_CRITICAL;
  let crit: number | null = null;
  if (g(Ta) >= 0) {
    crit = Ta;
  } else {
    let lo = Ta;
    for (let step = 5; lo < Ta + 1000; step *= 1.5) {
      const hi = lo + step;
      if (g(hi) >= 0) {
        const r = brent(g, lo, hi, { xtol: 1e-6 });
        crit = r.success ? r.x : null;
        break;
      }
      lo = hi;
    }
  }
  return {
    criterion: 'Semenov (Z. Phys. 48 (1928) 571), Frank-Kamenetskii approximation: psi = Qg(Ta) dlnQg/dT / UA < 1/e',
    psi, critical: SEMENOV_CRITICAL, safe: psi < SEMENOV_CRITICAL,
    criticalCoolantTemperature: crit,
    margin: crit === null ? null : crit - Ta,
  };
}
