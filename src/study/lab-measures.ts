/**
 * Measured lab responses of one run from its analyser fractions: the fraction itself, the ratio
 * to the internal standard, conversion, selectivity and yield (definitions in
 * src/data/lab-arithmetic.ts), each with its standard deviation propagated from the error model
 * of the fractions by the delta method (first order, independent fraction errors):
 *   sigma_h^2 = sum_i (dh/dy_i)^2 sigma_i^2,   sigma_i^2 = absolute^2 + (relative y_i)^2.
 * Derivatives by central differences on the fractions (h is a ratio of a few fractions).
 * Each measure also keeps its error loadings l_i = (dh/dy_i) sigma_i, so that two responses of the
 * same run that share a fraction (ratios to one standard) have covariance l_a . l_b; the fit
 * whitens them (src/workflow/fit-data.ts).
 */
import { conversionFromStandard, flowFromStandard, selectivity, yieldOf } from '../data/lab-arithmetic.js';
import type { LabConfig, LabPair } from './lab-config.js';
import type { LabFitKind, LabTerms } from './lab-types.js';
import { sigmaFromModel } from './types.js';

/** One measured lab response of a run. */
export interface LabMeasure {
  kind: LabFitKind;
  /** Species measured (product for selectivity and yield). */
  species: number;
  /** Column of its main fraction, for locations. */
  column: string;
  value: number;
  sigma?: number;
  /** Error loadings (dh/dy_i) sigma_i per species index (0 where unmeasured); sigma = their norm. */
  loadings?: number[];
  terms?: LabTerms;
}

type Fn = (y: Float64Array) => number;

/** Delta-method loadings of h(y) over the measured fractions; undefined for an unweighted error model. */
function propagate(h: Fn, y: Float64Array, cfg: LabConfig): number[] | undefined {
  if (cfg.errorModel.kind === 'unweighted') return undefined;
  const loadings = new Array<number>(y.length).fill(0);
  const z = Float64Array.from(y);
  for (const { j } of cfg.columns) {
    if (!Number.isFinite(y[j])) continue;
    const s = sigmaFromModel(cfg.errorModel, y[j]) ?? 0;
    if (!(s > 0)) continue;
    const d = 1e-6 * Math.max(Math.abs(y[j]), 1e-6);
    z[j] = y[j] + d;
    const up = h(z);
    z[j] = y[j] - d;
    const dn = h(z);
    z[j] = y[j];
    loadings[j] = ((up - dn) / (2 * d)) * s;
  }
  return loadings;
}

function measure(kind: LabFitKind, species: number, column: string, h: Fn, y: Float64Array, cfg: LabConfig, terms?: LabTerms): LabMeasure {
  const loadings = propagate(h, y, cfg);
  const sigma = loadings ? Math.hypot(...loadings) : undefined;
  return { kind, species, column, value: h(y), ...(sigma !== undefined && loadings ? { sigma, loadings } : {}), ...(terms ? { terms } : {}) };
}

function pairFns(p: LabPair, s: number, feed: Float64Array): { sel: Fn; yld: Fn } {
  const flow = (y: Float64Array, j: number) => flowFromStandard(y[j], y[s], feed[s]);
  return {
    sel: (y) => selectivity(flow(y, p.product), feed[p.product], flow(y, p.reactant), feed[p.reactant], p.factor),
    yld: (y) => yieldOf(flow(y, p.product), feed[p.product], feed[p.reactant], p.factor),
  };
}

/** The measured responses of one run that the configuration fits (fractions y in mol/mol, NaN = not measured). */
export function labMeasures(cfg: LabConfig, y: Float64Array, feed: Float64Array): LabMeasure[] {
  const out: LabMeasure[] = [];
  const s = cfg.standard;
  const col = (j: number) => cfg.columns.find((c) => c.j === j)?.column ?? '';
  for (const kind of cfg.fit) {
    if (kind === 'outlet-fraction') {
      for (const { j, column } of cfg.columns) if (Number.isFinite(y[j])) out.push(measure(kind, j, column, (z) => z[j], y, cfg, { removed: cfg.removed }));
    } else if (kind === 'fraction-ratio' && s !== undefined) {
      for (const { j, column } of cfg.columns) if (j !== s && Number.isFinite(y[j])) out.push(measure(kind, j, column, (z) => z[j] / z[s], y, cfg, { standard: s }));
    } else if (kind === 'conversion' && s !== undefined) {
      for (const a of cfg.conversion) if (Number.isFinite(y[a]) && feed[a] > 0) out.push(measure(kind, a, col(a), (z) => conversionFromStandard(z[a], z[s], feed[a], feed[s]), y, cfg));
    } else if ((kind === 'selectivity' || kind === 'yield') && s !== undefined) {
      for (const p of cfg.pairs) {
        if (!Number.isFinite(y[p.product]) || !Number.isFinite(y[p.reactant]) || !(feed[p.reactant] > 0)) continue;
        const { sel, yld } = pairFns(p, s, feed);
        const h = kind === 'selectivity' ? sel : yld;
        if (Number.isFinite(h(y))) out.push(measure(kind, p.product, col(p.product), h, y, cfg, { reactant: p.reactant, factor: p.factor }));
      }
    }
  }
  return out;
}
