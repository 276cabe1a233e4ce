/**
 * Molar heat capacity of one species and its integral, constant or in the Shomate form.
 *
 * Method: the Shomate equation as published in the NIST Chemistry WebBook (M.W. Chase Jr.,
 * NIST-JANAF Thermochemical Tables, 4th ed., J. Phys. Chem. Ref. Data Monograph 9, 1998):
 *   Cp(T) = A + B t + C t^2 + D t^3 + E / t^2,   t = T / 1000 K,   Cp in J/(mol K)
 *   integral of Cp dT from T1 to T2 = 1000 [A t + B t^2/2 + C t^3/3 + D t^4/4 - E/t]_{t1}^{t2}  (J/mol)
 * A constant heat capacity is the form with only A (integral Cp (T2 - T1)).
 */

/** A species heat capacity: constant, or Shomate coefficients (NIST WebBook units, J/(mol K)). */
export type HeatCapacity =
  | { form: 'constant'; /** J/(mol K). */ cp: number }
  | { form: 'shomate'; A: number; B: number; C: number; D: number; E: number; /** Validity range, K (informative). */ range?: [number, number] };

/** Cp(T), J/(mol K). */
export function cpAt(h: HeatCapacity, T: number): number {
  if (h.form === 'constant') return h.cp;
  const t = T / 1000;
  return h.A + t * (h.B + t * (h.C + t * h.D)) + h.E / (t * t);
}

/** Antiderivative of the Shomate Cp in t (times 1000 gives J/mol). */
function shomateH(h: Extract<HeatCapacity, { form: 'shomate' }>, t: number): number {
  return t * (h.A + t * (h.B / 2 + t * (h.C / 3 + (t * h.D) / 4))) - h.E / t;
}

/** Integral of Cp dT from T1 to T2, J/mol. */
export function cpIntegral(h: HeatCapacity, T1: number, T2: number): number {
  if (h.form === 'constant') return h.cp * (T2 - T1);
  return 1000 * (shomateH(h, T2 / 1000) - shomateH(h, T1 / 1000));
}
