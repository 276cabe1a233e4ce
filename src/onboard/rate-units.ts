/**
 * Units of a power-law rate constant built from the user's own units. For a rate per unit of
 * catalyst mass (or of volume) in mol/(mass time) with concentrations in mol/volume and total order
 * n, k = r / prod C^a has the unit volume^n mol^(1-n) / (mass time) (volume basis: volume^(n-1)
 * mol^(1-n) / time). Exponents are collected per base unit, then written numerator over
 * denominator: `L/(g min)`, `L^2/(g min mol)`, `m^4.5/(kg s mol^0.5)`.
 */

/** The units the user's files speak in. */
export interface UserUnits {
  /** 'L' or 'm3' (the volume of the concentration unit). */
  volume: 'L' | 'm3';
  /** 'g', 'kg' or 'mg'. */
  mass: 'g' | 'kg' | 'mg';
  /** 's', 'min' or 'h'. */
  time: 's' | 'min' | 'h';
}

function power(base: string, e: number): string {
  const x = Math.abs(e);
  if (base === 'm3') return `m^${fmt(3 * x)}`;
  return x === 1 ? base : `${base}^${fmt(x)}`;
}

function fmt(x: number): string {
  return String(Number(x.toFixed(6)));
}

/** Write exponents per base unit as 'num/(den)'. */
export function writeUnit(exponents: ReadonlyArray<[string, number]>): string {
  const num = exponents.filter(([, e]) => e > 1e-12).map(([b, e]) => power(b, e));
  const den = exponents.filter(([, e]) => e < -1e-12).map(([b, e]) => power(b, e));
  const top = num.length ? num.join(' ') : '1';
  if (!den.length) return top;
  return `${top}/${den.length > 1 ? `(${den.join(' ')})` : den[0]}`;
}

/** Unit of a power-law rate constant of total order `n` on the given basis. */
export function rateConstantUnit(n: number, basis: 'mass' | 'volume', u: UserUnits): string {
  const volumeExp = basis === 'mass' ? n : n - 1;
  return writeUnit([
    [u.volume, volumeExp],
    ['mol', 1 - n],
    [u.mass, basis === 'mass' ? -1 : 0],
    [u.time, -1],
  ]);
}

/** Unit of a concentration-basis equilibrium constant K = prod C_products^b / prod C_reactants^a (delta = sum b - sum a). */
export function equilibriumConstantUnit(delta: number, u: UserUnits): string {
  return writeUnit([
    ['mol', delta],
    [u.volume, -delta],
  ]);
}
