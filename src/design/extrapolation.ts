/**
 * Extrapolation warnings: the production case's temperature, pressure, feed mole fractions and
 * target conversion compared with the ranges the fitted data covered (hand-off `coverage`).
 * Outside a range -> a warning naming the quantity, its value, the range, the unit and by how much.
 */
import type { Warning } from '../core/outcome.js';
import type { FittedKinetics, Range } from './handoff.js';
import type { DesignCase } from './case.js';
import { fmt } from './sizer.js';

function check(what: string, value: number, r: Range, path: (string | number)[], scale = 1, unit = r.unit): Warning | undefined {
  const lo = r.min * scale;
  const hi = r.max * scale;
  const v = value * scale;
  if (v >= lo - 1e-12 * Math.abs(lo) && v <= hi + 1e-12 * Math.abs(hi)) return undefined;
  const by = v < lo ? lo - v : v - hi;
  const side = v < lo ? 'below' : 'above';
  const u = unit === '1' || unit === '' ? '' : ` ${unit}`;
  return {
    code: 'W_EXTRAPOLATION',
    message: `${what} ${fmt(v, 5)}${u} lies ${side} the fitted data range [${fmt(lo, 5)}, ${fmt(hi, 5)}]${u} by ${fmt(by, 4)}${u}; the size is an extrapolation of the kinetics`,
    path,
  };
}

/**
 * Compare the case with the hand-off coverage. Pressures are reported in bar, mole fractions and
 * conversions as fractions.
 * @param conversion the design conversion of the coverage's key species (when known)
 */
export function extrapolationWarnings(h: FittedKinetics, kase: DesignCase, conversion?: number): Warning[] {
  const out: (Warning | undefined)[] = [];
  const c = h.coverage;
  out.push(check('temperature', kase.temperature, c.temperature, ['temperature']));
  if (c.pressure && kase.pressure !== undefined) out.push(check('pressure', kase.pressure, c.pressure, ['pressure'], 1e-5, 'bar'));
  if (c.feedMoleFraction && kase.reactor.kind !== 'batch') {
    let FT = 0;
    for (let j = 0; j < kase.feed.length; j++) FT += kase.feed[j];
    for (const [s, r] of Object.entries(c.feedMoleFraction)) {
      const j = kase.species.indexOf(s);
      if (j < 0) continue;
      out.push(check(`feed mole fraction of ${s}`, kase.feed[j] / FT, r, ['feed', s], 1, r.unit || '1'));
    }
  }
  if (c.conversion && conversion !== undefined && Number.isFinite(conversion)) {
    out.push(check(`conversion of ${c.conversion.species}`, conversion, c.conversion, ['target'], 1, c.conversion.unit || '1'));
  }
  return out.filter((w): w is Warning => w !== undefined);
}
