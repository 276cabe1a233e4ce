/**
 * The plant pellet of a production case (`"pellet"` in the case file): the pellet description
 * (src/pellets/load.ts) plus how the sizing uses it.
 *
 *   "pellet": { "shape": "cylinder", "diameter": "5 mm", "length": "5 mm", "porosity": 0.45,
 *               "tortuosity": 3.5, "molecularDiffusivity": { "estimate": "fuller", "carrier": "N2" },
 *               "density": "1400 kg/m3", "method": "numerical", "tradeOff": ["3 mm", "5 mm", "8 mm"] }
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import { loadPellet, pelletQuantity, type LoadedPellet } from '../pellets/load.js';

export interface CasePellet extends LoadedPellet {
  /** 'numerical' (pellet solved by collocation along the bed; default) or 'generalized' (Bischoff's modulus). */
  method: 'numerical' | 'generalized';
  /** Solve the pellet's energy balance too (needs thermalConductivity and heat.reactionEnthalpy); default false. */
  nonIsothermal: boolean;
  /** Pellet diameters (m) of the trade-off table; default 0.5, 0.75, 1, 1.5 and 2 times the plant pellet. */
  tradeOff: number[];
  /** Conversion step of the effectiveness-factor table along the bed; default 0.05. */
  etaStep: number;
}

const EXTRA = ['method', 'nonIsothermal', 'tradeOff', 'etaStep'] as const;

/** Read the case's pellet; `tubeDiameter` (m) when the case has tubes. */
export function loadCasePellet(raw: unknown, species: readonly string[], tubeDiameter?: number): CasePellet {
  const path: FieldPath = ['pellet'];
  const loaded = loadPellet(raw, species, path, tubeDiameter, EXTRA);
  const o = raw as Record<string, unknown>;
  const method = o.method ?? 'numerical';
  if (method !== 'numerical' && method !== 'generalized') {
    throw new RateloomError('E_VALUE', `pellet method '${String(method)}' is unknown`, { path: [...path, 'method'], fix: 'Use "numerical" or "generalized".' });
  }
  if (o.nonIsothermal !== undefined && typeof o.nonIsothermal !== 'boolean') {
    throw new RateloomError('E_TYPE', 'nonIsothermal must be true or false', { path: [...path, 'nonIsothermal'] });
  }
  const d = loaded.pellet.diameter;
  let tradeOff = [0.5, 0.75, 1, 1.5, 2].map((f) => f * d);
  if (o.tradeOff !== undefined) {
    if (!Array.isArray(o.tradeOff) || o.tradeOff.length === 0) {
      throw new RateloomError('E_TYPE', 'tradeOff must be a non-empty list of pellet diameters', { path: [...path, 'tradeOff'], fix: 'Write for example ["3 mm", "5 mm", "8 mm"].' });
    }
    tradeOff = o.tradeOff.map((q, i) => {
      const v = pelletQuantity(q, 'length', [...path, 'tradeOff', i]);
      if (!(v > 0) || (tubeDiameter !== undefined && !(v < tubeDiameter))) {
        throw new RateloomError('E_VALUE', 'a trade-off diameter must be positive and smaller than the tube', { path: [...path, 'tradeOff', i] });
      }
      return v;
    });
  }
  let etaStep = 0.05;
  if (o.etaStep !== undefined) {
    if (typeof o.etaStep !== 'number' || !(o.etaStep >= 1e-4 && o.etaStep <= 0.2)) {
      throw new RateloomError('E_VALUE', 'etaStep must be a number in [0.0001, 0.2]', { path: [...path, 'etaStep'] });
    }
    etaStep = o.etaStep;
  }
  return { ...loaded, method, nonIsothermal: o.nonIsothermal === true, tradeOff, etaStep };
}
