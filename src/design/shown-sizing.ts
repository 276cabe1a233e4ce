/**
 * A sizing in the user's units, SI beside (docs/display-units.md): the size and its percentiles,
 * the outlet amounts and the pressures. Each is shown in the case's `displayUnits` for its kind,
 * else in the unit the case wrote (the feed flow's unit for outlet flows, the pressure's for
 * pressures, the temperature's for temperatures), else SI. The result's own numbers stay SI.
 */
import { RateloomError } from '../core/errors.js';
import { checkDisplayUnits, displayConversion, displayUnitFor, shownDifference, shownQuantity, shownValue, unitDims, type DisplayConversion, type DisplayUnits, type ShownQuantity } from '../units/index.js';
import type { SizingResult } from './size.js';

/** What a case wrote about units, for display. */
export interface CaseDisplaySpec {
  /** The case's checked displayUnits; empty when it gives none. */
  units: DisplayUnits;
  /** Units the case wrote for its temperature, pressure and feed flow. */
  temperatureUnit?: string;
  pressureUnit?: string;
  flowUnit?: string;
}

/** The unit part of a case quantity ("225 degC" or {"value": 225, "unit": "degC"}); undefined otherwise. */
function writtenUnit(raw: unknown): string | undefined {
  if (typeof raw === 'string') return /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*(.+?)\s*$/.exec(raw)?.[1];
  if (raw && typeof raw === 'object' && typeof (raw as { unit?: unknown }).unit === 'string') return (raw as { unit: string }).unit;
  return undefined;
}

/** The first flow the feed wrote (its total flow, else the first species flow). */
function feedFlowUnit(feed: unknown): string | undefined {
  if (!feed || typeof feed !== 'object') return undefined;
  const f = feed as Record<string, unknown>;
  const flows = f.flows && typeof f.flows === 'object' ? Object.values(f.flows as Record<string, unknown>) : [];
  return writtenUnit(f.totalFlow) ?? flows.map(writtenUnit).find((u) => u !== undefined);
}

/** The display part of a case file (top level): checked displayUnits and the written units. */
export function caseDisplaySpec(top: Record<string, unknown>): CaseDisplaySpec {
  const units = checkDisplayUnits(top.displayUnits, ['displayUnits']);
  const t = writtenUnit(top.temperature);
  const p = writtenUnit(top.pressure);
  const f = feedFlowUnit(top.feed);
  return { units, ...(t ? { temperatureUnit: t } : {}), ...(p && !/g$|\(g\)$/.test(p.trim()) ? { pressureUnit: p } : {}), ...(f ? { flowUnit: f } : {}) };
}

function conversion(siUnit: string, written: string | undefined, units: DisplayUnits): DisplayConversion {
  const dims = unitDims(siUnit);
  if (!dims) return { unit: siUnit, factor: 1, shift: 0 };
  try {
    return displayConversion(displayUnitFor(dims, written, units));
  } catch (e) {
    if (e instanceof RateloomError) throw e;
    return { unit: siUnit, factor: 1, shift: 0 };
  }
}

/** A sizing's headline numbers in the user's units, SI beside. */
export interface ShownSizing {
  displayUnits: DisplayUnits;
  size?: ShownQuantity & { quantity: string };
  /** Monte Carlo percentiles of the size, in the size's shown unit. */
  percentiles?: { level: number; value: number; valueSI: number }[];
  outlet?: { unit: string; unitSI: string; amounts: Record<string, { value: number; valueSI: number }> };
  pressure?: { unit: string; unitSI: 'Pa'; inlet: number; outlet: number; drop: number; inletSI: number; outletSI: number; dropSI: number };
  hotSpot?: ShownQuantity;
}

/** The sizing's size, percentiles, outlet and pressures shown in the case's units. */
export function shownSizing(r: SizingResult, d: CaseDisplaySpec | undefined): ShownSizing {
  const units = d?.units ?? {};
  const out: ShownSizing = { displayUnits: units };
  if (r.size) {
    const c = conversion(r.size.unit, undefined, units);
    out.size = { ...shownQuantity(c, r.size.value, r.size.unit), value: shownValue(c, r.size.value), quantity: r.size.quantity };
    if (r.uncertainty) out.percentiles = r.uncertainty.percentiles.map((p) => ({ level: p.level, value: shownValue(c, p.value) as number, valueSI: p.value }));
  }
  if (r.outlet) {
    const c = conversion(r.outlet.amountUnit, r.outlet.amountUnit === 'mol/s' ? d?.flowUnit : undefined, units);
    out.outlet = { unit: c.unit, unitSI: r.outlet.amountUnit, amounts: Object.fromEntries(Object.entries(r.outlet.amounts).map(([s, v]) => [s, { value: shownValue(c, v) as number, valueSI: v }])) };
  }
  if (r.pressure) {
    const c = conversion('Pa', d?.pressureUnit, units);
    const p = r.pressure;
    out.pressure = { unit: c.unit, unitSI: 'Pa', inlet: shownValue(c, p.inlet) as number, outlet: shownValue(c, p.outlet) as number, drop: shownDifference(c, p.drop) as number, inletSI: p.inlet, outletSI: p.outlet, dropSI: p.drop };
  }
  const hot = r.thermal?.hotSpot.temperature;
  if (hot !== undefined) out.hotSpot = shownQuantity(conversion('K', d?.temperatureUnit, units), hot, 'K');
  return out;
}
