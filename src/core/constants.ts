/**
 * Physical constants, each written once with its source. Every other file imports from here.
 *
 * Sources:
 * - CODATA 2018: E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, "CODATA recommended values
 *   of the fundamental physical constants: 2018", Rev. Mod. Phys. 93, 025010 (2021).
 * - SI Brochure, 9th edition (BIPM 2019), for the defining constants and the Celsius scale.
 * - NIST SP 811 (2008), Appendix B.8, for the standard atmosphere and standard gravity.
 */

/**
 * Molar gas constant R = N_A k_B, J/(mol K). CODATA 2018: 8.314 462 618... J/(mol K), exact (the
 * product of the defining constants N_A = 6.022 140 76e23 /mol and k_B = 1.380 649e-23 J/K),
 * written to the ten significant digits CODATA lists.
 */
export const GAS_CONSTANT = 8.314462618;

/** Standard atmosphere, Pa. Exact by definition (NIST SP 811 B.8: 1.013 25 E+05 Pa; CODATA 2018). */
export const STANDARD_ATMOSPHERE = 101325;

/** Celsius zero on the kelvin scale, K: T/K = t/degC + 273.15, exact (SI Brochure 9th ed., 2.3.1). */
export const CELSIUS_ZERO = 273.15;

/** Standard acceleration of gravity g_n, m/s2. Exact by definition (NIST SP 811 B.8; CODATA 2018). */
export const STANDARD_GRAVITY = 9.80665;
