/**
 * Unit atoms: each named unit as a factor to SI base units times a dimension vector.
 *
 * Sources of the conversion factors:
 *   - NIST Special Publication 811 (2008 edition), "Guide for the Use of the International System
 *     of Units", Appendix B.8 (factors for units listed alphabetically) and B.9 (by kind of quantity).
 *   - The International System of Units (SI Brochure), 9th edition (2019), BIPM, Table 8 (non-SI
 *     units accepted for use with the SI: minute, hour, litre) and section 3 (SI prefixes).
 * "exact" marks factors that are exact by definition (SI prefixes, the litre, the minute and hour,
 * the standard atmosphere, the bar, the thermochemical calorie, the poise, the international inch
 * and avoirdupois pound behind the psi, the torr as 1/760 atm, the conventional mmHg).
 */
import { CELSIUS_ZERO, STANDARD_ATMOSPHERE, STANDARD_GRAVITY } from '../core/constants.js';

/** Dimension exponents in the order [kg, m, s, mol, K]. */
export type Dims = readonly [number, number, number, number, number];

export const DIM_NAMES = ['kg', 'm', 's', 'mol', 'K'] as const;

export interface UnitAtom {
  /** Multiply a value in this unit by `factor` to get SI base units. */
  factor: number;
  dims: Dims;
  /** True when the factor is exact by definition (see header). */
  exact: boolean;
  /** Where the factor comes from. */
  source: string;
}

const NIST = 'NIST SP 811 (2008) App. B';
const SI = 'SI Brochure 9th ed.';

const D = {
  none: [0, 0, 0, 0, 0],
  mass: [1, 0, 0, 0, 0],
  length: [0, 1, 0, 0, 0],
  time: [0, 0, 1, 0, 0],
  amount: [0, 0, 0, 1, 0],
  temp: [0, 0, 0, 0, 1],
  volume: [0, 3, 0, 0, 0],
  pressure: [1, -1, -2, 0, 0],
  energy: [1, 2, -2, 0, 0],
  conc: [0, -3, 0, 1, 0],
  viscosity: [1, -1, -1, 0, 0],
} as const satisfies Record<string, Dims>;

function atom(factor: number, dims: Dims, exact: boolean, source: string): UnitAtom {
  return { factor, dims, exact, source };
}

/** Pound (avoirdupois) in kilograms, exact by definition (NIST SP 811 B.8: 4.535 924 E-01 kg). */
const POUND = 0.45359237;
/** Pound-force in newtons: one pound x 9.80665 m/s2 (both exact by definition), NIST SP 811 B.8. */
const LBF = POUND * STANDARD_GRAVITY;
/** Inch in metres, exact (NIST SP 811 B.8: 2.54 E-02 m). */
const INCH = 0.0254;

/**
 * Named unit atoms. Symbols with an SI prefix are listed explicitly rather than generated, so that
 * 'min' can never be read as milli-inch and 'ms' means millisecond only.
 */
export const ATOMS: Readonly<Record<string, UnitAtom>> = {
  // dimensionless
  '1': atom(1, D.none, true, SI),
  '%': atom(0.01, D.none, true, SI),
  ppm: atom(1e-6, D.none, true, SI),
  // mass: SI base unit kilogram; prefixes exact (SI Brochure section 3)
  kg: atom(1, D.mass, true, SI),
  g: atom(1e-3, D.mass, true, SI),
  mg: atom(1e-6, D.mass, true, SI),
  ug: atom(1e-9, D.mass, true, SI),
  t: atom(1e3, D.mass, true, `${SI} Table 8 (tonne)`),
  lb: atom(POUND, D.mass, true, `${NIST} (pound (avoirdupois) 4.535 924 E-01 kg)`),
  // length
  m: atom(1, D.length, true, SI),
  cm: atom(1e-2, D.length, true, SI),
  mm: atom(1e-3, D.length, true, SI),
  um: atom(1e-6, D.length, true, SI),
  dm: atom(1e-1, D.length, true, SI),
  in: atom(INCH, D.length, true, `${NIST} (inch 2.54 E-02 m)`),
  // time: minute 60 s and hour 3600 s exact (SI Brochure Table 8)
  s: atom(1, D.time, true, SI),
  ms: atom(1e-3, D.time, true, SI),
  min: atom(60, D.time, true, `${SI} Table 8`),
  h: atom(3600, D.time, true, `${SI} Table 8`),
  d: atom(86400, D.time, true, `${SI} Table 8`),
  // amount of substance
  mol: atom(1, D.amount, true, SI),
  kmol: atom(1e3, D.amount, true, SI),
  mmol: atom(1e-3, D.amount, true, SI),
  umol: atom(1e-6, D.amount, true, SI),
  // temperature (as a factor: kelvin only; degC and degF are handled as affine units)
  K: atom(1, D.temp, true, SI),
  // volume: litre = 1 dm3 exact (SI Brochure Table 8)
  L: atom(1e-3, D.volume, true, `${SI} Table 8`),
  mL: atom(1e-6, D.volume, true, `${SI} Table 8`),
  uL: atom(1e-9, D.volume, true, `${SI} Table 8`),
  // concentration: M = mol/L
  M: atom(1e3, D.conc, true, `${SI} Table 8 (litre)`),
  mM: atom(1, D.conc, true, `${SI} Table 8 (litre)`),
  // pressure
  Pa: atom(1, D.pressure, true, SI),
  kPa: atom(1e3, D.pressure, true, SI),
  MPa: atom(1e6, D.pressure, true, SI),
  mPa: atom(1e-3, D.pressure, true, SI),
  bar: atom(1e5, D.pressure, true, `${NIST} (bar 1.0 E+05 Pa, exact)`),
  mbar: atom(1e2, D.pressure, true, `${NIST} (millibar 1.0 E+02 Pa, exact)`),
  atm: atom(STANDARD_ATMOSPHERE, D.pressure, true, `${NIST} (standard atmosphere 1.013 25 E+05 Pa, exact)`),
  psi: atom(LBF / (INCH * INCH), D.pressure, true, `${NIST} (psi 6.894 757 E+03 Pa; exact via lbf and inch)`),
  torr: atom(STANDARD_ATMOSPHERE / 760, D.pressure, true, `${NIST} (torr 1.333 224 E+02 Pa; 1/760 atm exact)`),
  mmHg: atom(133.322387415, D.pressure, true, `${NIST} (conventional mmHg 1.333 224 E+02 Pa)`),
  // energy: thermochemical calorie 4.184 J exact (NIST SP 811 B.8, calorie_th)
  J: atom(1, D.energy, true, SI),
  kJ: atom(1e3, D.energy, true, SI),
  MJ: atom(1e6, D.energy, true, SI),
  cal: atom(4.184, D.energy, true, `${NIST} (calorie_th 4.184 J, exact)`),
  kcal: atom(4184, D.energy, true, `${NIST} (kilocalorie_th 4.184 E+03 J, exact)`),
  // viscosity: poise = 0.1 Pa s exact (NIST SP 811 B.8)
  P: atom(0.1, D.viscosity, true, `${NIST} (poise 1.0 E-01 Pa s, exact)`),
  cP: atom(1e-3, D.viscosity, true, `${NIST} (centipoise 1.0 E-03 Pa s, exact)`),
};

/** Alternative spellings mapped to an atom name (after whitespace is removed). */
export const ALIASES: Readonly<Record<string, string>> = {
  l: 'L',
  ml: 'mL',
  µL: 'uL',
  µl: 'uL',
  µm: 'um',
  µmol: 'umol',
  µg: 'ug',
  sec: 's',
  hr: 'h',
  Torr: 'torr',
  psia: 'psi',
  mmhg: 'mmHg',
  cp: 'cP',
  kelvin: 'K',
  fraction: '1',
  '-': '1',
};

/** Affine temperature units: K = (x + offset) * factor. Celsius and Fahrenheit per NIST SP 811 B.8 (exact). */
export const AFFINE_TEMPERATURE: Readonly<Record<string, { factor: number; offset: number }>> = {
  K: { factor: 1, offset: 0 },
  degC: { factor: 1, offset: CELSIUS_ZERO },
  degF: { factor: 5 / 9, offset: 459.67 },
};

export const TEMPERATURE_ALIASES: Readonly<Record<string, string>> = {
  '°C': 'degC',
  C: 'degC',
  oC: 'degC',
  degc: 'degC',
  '°F': 'degF',
  F: 'degF',
  degf: 'degF',
  k: 'K',
};

export { D as DIMS };
