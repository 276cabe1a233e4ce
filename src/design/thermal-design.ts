/**
 * One tube of a cooled multitubular packed bed, built from the case for a tube count N: the
 * ThermalTubeSpec of reactors/thermal with the feed, the Ergun alpha and the coolant split over the
 * N tubes, U given or from the wall correlation, and the reaction enthalpies resolved.
 *
 * Per tube: F0/N; alpha_t(N) of reactors/ergun.ts for the per-tube mass flux (tubes.ts bundleAlpha);
 * Ua per kg of catalyst = 4 U / (D rho_b) (exchange area 4/D per m3 of tube); coolant m_c Cp_c / N.
 * Reaction enthalpies: the stated value at heat.referenceTemperature; where none is stated and the
 * reaction is reversible with a fitted van 't Hoff enthalpy, that enthalpy (taken at the kinetics'
 * reference temperature and moved to heat.referenceTemperature with the dCp correction); a stated
 * value outside the fitted enthalpy's 95 % interval is kept and warned about.
 */
import { RateloomError } from '../core/errors.js';
import type { Warning } from '../core/outcome.js';
import type { CompiledKinetics } from '../kinetics/compiled.js';
import { ReactionEnthalpy } from '../reactors/thermal/enthalpy.js';
import { cpIntegral } from '../reactors/thermal/heat-capacity.js';
import { checkThermalSpec } from '../reactors/thermal/thermal-inputs.js';
import type { ThermalTubeSpec } from '../reactors/thermal/tube-balances.js';
import type { DesignCase } from './case.js';
import type { FittedKinetics } from './handoff.js';
import type { ThermalCase } from './heat-case.js';
import type { DesignSystem } from './system.js';
import { bundleAlpha } from './tubes.js';
import { levaCooling, type WallCoefficient } from './wall-coefficient.js';
import type { ThermalPelletFactor } from './heat-pellet.js';

/** Where each reaction enthalpy came from. */
export interface EnthalpySource {
  reaction: string;
  /** J/mol at referenceTemperature. */
  value: number;
  referenceTemperature: number;
  source: 'stated' | 'fitted van \'t Hoff';
  /** The fitted enthalpy's 95 % interval, J/mol, when there is one. */
  fittedInterval?: [number, number];
}

/** Reaction enthalpies at thermal.referenceTemperature, with their sources and warnings. */
export function resolveEnthalpies(kinetics: CompiledKinetics, handoff: FittedKinetics, kase: DesignCase, th: ThermalCase): { values: Float64Array; sources: EnthalpySource[]; warnings: Warning[] } {
  const nR = kinetics.reactionIds.length;
  const nS = kinetics.speciesNames.length;
  const values = new Float64Array(nR);
  const sources: EnthalpySource[] = [];
  const warnings: Warning[] = [];
  const stated = kase.heat?.reactionEnthalpy ?? {};
  kinetics.reactionIds.forEach((id, i) => {
    const fitted = fittedVantHoff(handoff, id);
    const s = stated[id];
    if (s !== undefined) {
      values[i] = s;
      sources.push({ reaction: id, value: s, referenceTemperature: th.referenceTemperature, source: 'stated', ...(fitted?.ci ? { fittedInterval: fitted.ci } : {}) });
      if (fitted?.ci && (s < fitted.ci[0] || s > fitted.ci[1])) {
        warnings.push({
          code: 'W_ENTHALPY',
          message: `the stated enthalpy of '${id}' (${(s / 1000).toPrecision(4)} kJ/mol) lies outside the 95 % interval of the fitted van 't Hoff enthalpy [${(fitted.ci[0] / 1000).toPrecision(4)}, ${(fitted.ci[1] / 1000).toPrecision(4)}] kJ/mol; the stated value is used`,
          path: ['heat', 'reactionEnthalpy', id],
        });
      }
      return;
    }
    if (!fitted) {
      throw new RateloomError('E_MISSING_FIELD', `reaction '${id}' has no reaction enthalpy`, {
        path: ['heat', 'reactionEnthalpy', id],
        fix: `Add "${id}": "-45 kJ/mol" to heat.reactionEnthalpy (the energy balance needs every reaction's enthalpy).`,
      });
    }
    let v = fitted.value;
    for (let j = 0; j < nS; j++) {
      const h = th.heatCapacities[j];
      const c = kinetics.stoich[i * nS + j];
      if (h && c !== 0) v -= c * cpIntegral(h, th.referenceTemperature, handoff.referenceTemperature);
    }
    values[i] = v;
    sources.push({ reaction: id, value: v, referenceTemperature: th.referenceTemperature, source: 'fitted van \'t Hoff', ...(fitted.ci ? { fittedInterval: fitted.ci } : {}) });
  });
  return { values, sources, warnings };
}

/** The fitted van 't Hoff enthalpy of a reaction's equilibrium constant, with its interval. */
function fittedVantHoff(h: FittedKinetics, id: string): { value: number; ci?: [number, number] } | undefined {
  const rx = h.reactions.find((r) => r.id === id);
  const rate = rx?.rate as { equilibriumConstant?: { enthalpy?: string } } | undefined;
  const name = rate?.equilibriumConstant?.enthalpy;
  const p = name ? h.parameters.find((q) => q.name === name) : undefined;
  if (!p) return undefined;
  const ci = p.ci?.profile ?? p.ci?.linear ?? (p.stdError !== null ? [p.value - 1.96 * p.stdError, p.value + 1.96 * p.stdError] as [number, number] : undefined);
  return { value: p.value, ...(ci ? { ci } : {}) };
}

/** The per-tube thermal spec and the U it used. */
export interface TubeThermal {
  spec: ThermalTubeSpec;
  U: number;
  uSource: string;
  wall?: WallCoefficient;
  /** Superficial mass flux of the tube, kg/(m2 s). */
  G: number;
  /** The pellet factor attached to the spec (case with a pellet). */
  pellet?: ThermalPelletFactor;
}

/** Build the spec of one tube of N (see the file header). */
export function tubeThermalSpec(
  sys: DesignSystem, kinetics: CompiledKinetics, th: ThermalCase, dH: Float64Array,
  molarMasses: ArrayLike<number>, N: number, coolantT = th.coolant.temperature,
): TubeThermal {
  const k = sys.kase;
  const t = k.tubes!;
  const ba = bundleAlpha(sys, molarMasses, N);
  let U = th.overallCoefficient ?? 0;
  let uSource = 'given (heat.overallCoefficient)';
  let wall: WallCoefficient | undefined;
  if (th.overallCoefficient === undefined && th.wallCorrelation) {
    wall = levaCooling(ba.G, t.viscosity, th.wallCorrelation.gasConductivity, t.particleDiameter, t.innerDiameter);
    U = wall.value;
    uSource = `bed-side wall coefficient, ${wall.correlation}`;
  }
  const weights = Float64Array.from(kinetics.basis, (b) => (b === 'mass' ? 1 : 1 / t.bulkDensity));
  const spec: ThermalTubeSpec = {
    kind: 'packed-bed', gas: true, mode: th.mode, T0: k.temperature, P0: k.pressure!,
    F0: Float64Array.from(k.feed, (f) => f / N), alpha: ba.alphaPerTube, weights,
    enthalpy: new ReactionEnthalpy(kinetics.stoich, dH, th.referenceTemperature, th.heatCapacities),
    cp: th.heatCapacities,
    Ua: th.mode === 'adiabatic' ? 0 : (4 * U) / (t.innerDiameter * t.bulkDensity),
    coolantTemperature: th.mode === 'adiabatic' ? NaN : coolantT,
    coolantFlowCapacity: ((th.coolant.flow ?? NaN) * (th.coolant.heatCapacity ?? NaN)) / N,
  };
  checkThermalSpec(spec, k.species);
  return { spec, U, uSource, G: ba.G, ...(wall ? { wall } : {}) };
}
