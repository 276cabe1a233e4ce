/**
 * Modified Bessel functions of the first kind I0 and I1 for real x >= 0 (the cylinder's
 * effectiveness factor needs their ratio).
 *
 * Method: the ascending power series I_nu(x) = sum_k (x/2)^(2k+nu) / (k! (k+nu)!)
 * (Abramowitz & Stegun, Handbook of Mathematical Functions, 1964, eq. 9.6.10) up to x = 30, where
 * every term is positive and the sum converges to rounding; above it the asymptotic expansion
 * I_nu(x) ~ e^x / sqrt(2 pi x) (1 - (mu-1)/(8x) + (mu-1)(mu-9)/(2! (8x)^2) - ...), mu = 4 nu^2
 * (A&S eq. 9.7.1), summed while its terms shrink. The exponentially scaled values e^(-x) I_nu(x)
 * are returned as well so that the ratio I1/I0 stays finite for any x.
 */

const SERIES_LIMIT = 30;

/** e^(-x) I_nu(x) for nu = 0 or 1 by the ascending series (x <= SERIES_LIMIT). */
function scaledSeries(nu: 0 | 1, x: number): number {
  const q = (x * x) / 4;
  let term = nu === 0 ? 1 : x / 2;
  let sum = term;
  for (let k = 1; k < 500; k++) {
    term *= q / (k * (k + nu));
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return sum * Math.exp(-x);
}

/** e^(-x) I_nu(x) for nu = 0 or 1 by the asymptotic expansion (x > SERIES_LIMIT). */
function scaledAsymptotic(nu: 0 | 1, x: number): number {
  const mu = 4 * nu * nu;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 60; k++) {
    const next = (-term * (mu - (2 * k - 1) * (2 * k - 1))) / (k * 8 * x);
    if (Math.abs(next) >= Math.abs(term)) break;
    term = next;
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum)) break;
  }
  return sum / Math.sqrt(2 * Math.PI * x);
}

/** e^(-x) I_nu(x), nu = 0 or 1, x >= 0. */
export function besselIScaled(nu: 0 | 1, x: number): number {
  if (!(x >= 0)) return NaN;
  return x <= SERIES_LIMIT ? scaledSeries(nu, x) : scaledAsymptotic(nu, x);
}

/** I0(x), x >= 0 (Infinity beyond the double range). */
export function besselI0(x: number): number {
  return besselIScaled(0, x) * Math.exp(x);
}

/** I1(x), x >= 0 (Infinity beyond the double range). */
export function besselI1(x: number): number {
  return besselIScaled(1, x) * Math.exp(x);
}

/** I1(x) / I0(x) for x >= 0, finite for every x. */
export function besselRatioI1I0(x: number): number {
  if (x === 0) return 0;
  return besselIScaled(1, x) / besselIScaled(0, x);
}
