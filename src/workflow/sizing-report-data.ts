/**
 * From a sizing result (design/size.ts) to the sizing report's view model (report/types.ts).
 * Only reshapes numbers; the cautions are passed through unchanged, always.
 */
import type { ShownSizing } from '../design/shown-sizing.js';
import { displayConversion, shownValue } from '../units/index.js';
import type { SizingResult } from '../design/size.js';
import type { SizingReportData } from '../report/types.js';
import { VERSION } from '../version.js';
import { pelletReportData } from './pellet-report-data.js';
import { checkArgs, is } from '../core/args.js';

function targetText(r: SizingResult): SizingReportData['target'] {
  const t = r.target;
  if (t.kind === 'conversion') return { description: `conversion of ${t.species}`, value: t.value, unit: '1' };
  if (t.kind === 'production') return { description: `production of ${t.species}`, value: t.value, unit: r.reactor.kind === 'batch' ? 'mol/m3' : 'mol/s' };
  return { description: 'rating of a given size', value: t.value, unit: r.size?.unit ?? (r.reactor.kind === 'packed-bed' ? 'kg' : r.reactor.kind === 'batch' ? 's' : 'm3') };
}

const percentile = (r: SizingResult, level: number): number =>
  r.uncertainty?.percentiles.find((p) => Math.abs(p.level - level) < 1e-9)?.value ?? NaN;

/**
 * The sizing report's view model. With `shown` (design/shown-sizing.ts) the size, its percentiles
 * and the outlet amounts are in the case's units; otherwise SI.
 */
export function sizingReportData(r: SizingResult, shown?: ShownSizing): SizingReportData {
  checkArgs('sizingReportData', [r, shown], [{ name: 'r', check: is.sizingResult }, { name: 'shown', check: is.optional(is.object) }]);
  const u = r.uncertainty;
  const cs = shown?.size ? displayConversion(shown.size.unit) : undefined;
  const sz = (x: number | null) => (cs ? shownValue(cs, x) : x);
  const co = shown?.outlet ? displayConversion(shown.outlet.unit) : undefined;
  const out = (x: number | null) => (co ? shownValue(co, x) : x);
  const sizeQuantity = r.size?.quantity ?? (u?.quantity === 'conversion' ? 'conversion' : 'size');
  const rating = r.target.kind === 'size';
  return {
    title: `Reactor sizing: ${r.case}`,
    caseName: r.case,
    generatedBy: `rateloom ${VERSION}`,
    // The badge follows the sizing's verdict: sized, and from a trustworthy hand-off.
    status: r.verdict.trustworthy ? r.status : r.verdict.status,
    success: r.verdict.trustworthy,
    message: r.verdict.trustworthy ? r.message : r.verdict.message,
    target: targetText(r),
    size: {
      label: rating ? `conversion of the key species` : sizeQuantity,
      unit: rating ? '1' : (shown?.size?.unit ?? r.size?.unit ?? '1'),
      median: u ? (rating ? u.median : (sz(u.median) as number)) : NaN,
      p90: rating ? percentile(r, 0.9) : (sz(percentile(r, 0.9)) as number),
      p95: rating ? percentile(r, 0.95) : (sz(percentile(r, 0.95)) as number),
      nominal: rating ? (r.outlet?.conversion?.value ?? null) : sz(r.size?.value ?? null),
    },
    reactor: `${r.reactor.kind.replace('-', ' ')}, ${r.reactor.phase} phase, ${r.thermal ? `${r.thermal.mode} energy balance (one-dimensional pseudo-homogeneous)` : 'isothermal'}`,
    outlet: r.outlet
      ? Object.entries(r.outlet.amounts).map(([species, value]) => ({
          species,
          value: out(value) as number,
          unit: shown?.outlet?.unit ?? r.outlet!.amountUnit,
          ...(r.outlet!.lo && r.outlet!.hi ? { lo: out(r.outlet!.lo[species] ?? null), hi: out(r.outlet!.hi[species] ?? null) } : {}),
        }))
      : [],
    pressureDrop: r.pressure ? { value: r.pressure.drop, fractionOfInlet: r.pressure.drop / r.pressure.inlet } : null,
    tubes: r.tubes
      ? {
          count: r.tubes.count,
          diameter: r.tubes.innerDiameter,
          length: r.tubes.length,
          sizePerTube: r.tubes.catalystPerTube,
          designLevel: r.tubes.install?.level ?? r.tubes.designedFor.level,
          installCatalyst: r.tubes.install?.catalystMass ?? null,
          installLength: r.tubes.install?.length ?? null,
          installPressureDrop: r.tubes.install?.pressureDrop.pa ?? null,
        }
      : null,
    productionProfile: u?.band
      ? {
          coordinate: { label: `size / nominal size`, unit: '1' },
          quantity: { label: `X_${u.band.key}`, unit: '1' },
          bandLevel: 0.9,
          series: [
            {
              name: `conversion of ${u.band.key}`,
              points: u.band.x.map((x, i) => ({ x, median: u.band!.median[i], lo: u.band!.p5[i], hi: u.band!.p95[i] })),
            },
          ],
        }
      : null,
    sizeDistribution: u ? { histogram: u.histogram } : null,
    sensitivityMeasure: `change of ln(${u?.quantity ?? 'size'}) for +1 standard error of the parameter (0.01 = 1 %)`,
    sensitivityUnit: '1',
    sensitivity: u ? u.sensitivities.map((s) => ({ parameter: s.name, effect: s.perStdError })) : [],
    draws: u ? { total: u.draws, failed: u.failed.count } : null,
    warnings: r.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.path ? { path: w.path } : {}) })),
    cautions: r.cautions,
    pellet: r.pellet ? pelletReportData(r.pellet, r.size?.value ?? null) : null,
    thermal: thermalData(r),
  };
}

/** The order-statistic 95 % interval of the lowest percentile of a draw summary, [lower, upper], or null. */
function lowestInterval(d: { percentiles: { level: number }[]; intervals: ({ lower: number; upper: number } | null)[] }): [number, number] | null {
  let i = 0;
  d.percentiles.forEach((p, k) => (p.level < d.percentiles[i].level ? (i = k) : 0));
  const iv = d.intervals[i];
  return iv ? [iv.lower, iv.upper] : null;
}

/** The energy-balance part of the report, or null for an isothermal sizing. */
function thermalData(r: SizingResult): SizingReportData['thermal'] {
  const t = r.thermal;
  if (!t) return null;
  return {
    mode: t.mode,
    binding: t.design.binding,
    met: t.design.met,
    hotSpot: { value: t.hotSpot.temperature, position: t.hotSpot.position.length, limit: t.hotSpot.limit },
    profile: { z: t.profile.z, T: t.profile.T, Ta: t.profile.Ta },
    ...(t.draws ? { hotSpotPercentiles: t.draws.hotSpot.percentiles, hotSpotHistogram: t.draws.hotSpot.histogram } : {}),
    ...(t.runaway ? { runaway: { criterion: t.runaway.criterion, coolant: t.runaway.scan.coolant, hotSpot: t.runaway.scan.hotSpot, critical: t.runaway.criticalCoolantTemperature, design: t.runaway.coolantTemperature } } : {}),
    ...(t.pellet ? { pellet: {
      rows: Object.entries(t.pellet.profile.eta).map(([reaction, e]) => ({ reaction, inlet: e[0], outlet: e[e.length - 1] })),
      film: t.pellet.film ? `${t.pellet.film.massCorrelation}${t.pellet.film.heatCorrelation ? `; ${t.pellet.film.heatCorrelation}` : ''} (${t.pellet.film.basis})` : null,
    } } : {}),
    design: {
      count: t.design.count, diameter: t.design.innerDiameter, length: t.design.length, maxLength: t.design.maxTubeLength,
      pressureDrop: t.design.pressureDrop.pa, allowedPressureDrop: t.design.allowedPressureDrop, U: t.heatTransfer.U, uSource: t.heatTransfer.source,
    },
    outletTemperature: { value: t.outletTemperature.value, ...(t.outletTemperature.percentiles ? { percentiles: t.outletTemperature.percentiles } : {}) },
    ...(t.runaway ? { runawayMargin: { value: t.runaway.margin, ...(t.draws ? { percentiles: t.draws.runawayMargin.percentiles, draws: t.draws.runawayMargin.succeeded, of: t.draws.hotSpot.draws, interval: lowestInterval(t.draws.runawayMargin) } : {}) } } : {}),
  };
}
