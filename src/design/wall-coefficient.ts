/**
 * Bed-side wall heat-transfer coefficient of a packed tube cooled through its wall, from a named
 * published correlation, for when the case gives no overall coefficient U.
 *
 * Correlation 'leva-cooling' (M. Leva, M. Weintraub, M. Grummer, L. Clark, "Cooling of gases
 * through packed tubes", Ind. Eng. Chem. 40 (1948) 747-752; coefficients from memory):
 *   h_w D_t / k_g = 3.50 Re_p^0.7 exp(-4.6 D_p / D_t),   Re_p = D_p G / mu
 * Validity range used here (from memory of the paper's data): 250 <= Re_p <= 3000 and
 * 0.05 <= D_p/D_t <= 0.3. Outside it the value is still returned, with a warning.
 * U is then taken equal to h_w: the wall and coolant-side resistances are neglected, which makes
 * U an upper estimate (the real tube removes less heat); the result says so.
 */
import type { Warning } from '../core/outcome.js';

export interface WallCoefficient {
  /** Bed-side coefficient used as U, W/(m2 K). */
  value: number;
  correlation: string;
  /** Particle Reynolds number and D_p/D_t, with the validity range. */
  reynolds: number;
  diameterRatio: number;
  validity: { reynolds: [number, number]; diameterRatio: [number, number]; inside: boolean };
  warnings: Warning[];
}

export const LEVA_COOLING = {
  name: 'Leva et al., Ind. Eng. Chem. 40 (1948) 747 (cooling of gases through packed tubes): h_w D_t/k = 3.50 Re_p^0.7 exp(-4.6 D_p/D_t)',
  reynolds: [250, 3000] as [number, number],
  diameterRatio: [0.05, 0.3] as [number, number],
};

/**
 * h_w from the Leva cooling correlation.
 * @param G superficial mass flux, kg/(m2 s); @param mu gas viscosity, Pa s; @param k gas conductivity, W/(m K)
 * @param Dp particle diameter, m; @param Dt tube inner diameter, m
 */
export function levaCooling(G: number, mu: number, k: number, Dp: number, Dt: number): WallCoefficient {
  const Re = (Dp * G) / mu;
  const ratio = Dp / Dt;
  const value = ((k / Dt) * 3.5 * Re ** 0.7) * Math.exp(-4.6 * ratio);
  const inside = Re >= LEVA_COOLING.reynolds[0] && Re <= LEVA_COOLING.reynolds[1] && ratio >= LEVA_COOLING.diameterRatio[0] && ratio <= LEVA_COOLING.diameterRatio[1];
  const warnings: Warning[] = [{
    code: 'W_WALL_U',
    message: 'U taken as the bed-side wall coefficient alone (wall and coolant-side resistances neglected): an upper estimate of the heat removal',
    path: ['heat', 'wallCorrelation'],
  }];
  if (!inside) {
    warnings.push({
      code: 'W_WALL_RANGE',
      message: `the wall correlation is used outside its range (Re_p = ${Re.toPrecision(4)}, valid ${LEVA_COOLING.reynolds.join('-')}; D_p/D_t = ${ratio.toPrecision(3)}, valid ${LEVA_COOLING.diameterRatio.join('-')})`,
      path: ['heat', 'wallCorrelation'],
    });
  }
  return { value, correlation: LEVA_COOLING.name, reynolds: Re, diameterRatio: ratio, validity: { reynolds: LEVA_COOLING.reynolds, diameterRatio: LEVA_COOLING.diameterRatio, inside }, warnings };
}
