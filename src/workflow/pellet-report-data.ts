/**
 * From the pellet parts of a sizing result and of a study's transport diagnostics to the report
 * view models (report/types.ts): reshaping and unit changes only (mm, kPa).
 */
import type { PelletSizing } from '../design/pellet-sizing.js';
import type { LabTransport } from './lab-transport.js';
import type { PelletReportData, TransportReportData } from '../report/types.js';

export function pelletReportData(p: PelletSizing, nominalSize: number | null): PelletReportData {
  return {
    method: p.method,
    shape: p.shape,
    diameterMm: p.diameter * 1000,
    equivalentDiameterMm: p.equivalentDiameter * 1000,
    effectiveDiffusivity: Object.entries(p.effectiveDiffusivity).map(([species, value]) => ({ species, value })),
    profile: {
      keySpecies: p.profile.keySpecies,
      series: Object.entries(p.profile.eta).map(([reaction, eta]) => ({
        reaction,
        points: eta.map((e, i) => ({ size: p.profile.size[i], conversion: p.profile.conversion[i], eta: e })),
      })),
    },
    nominalSize,
    intrinsicSize: p.intrinsicSize,
    pelletSolves: p.pelletSolves,
    film: p.film
      ? {
          correlations: [p.film.massCorrelation, ...(p.film.heatCorrelation ? [p.film.heatCorrelation] : [])],
          reynolds: p.film.reynolds,
          rows: Object.keys(p.film.internal).map((reaction) => ({ reaction, internal: p.film!.internal[reaction], overall: p.film!.overall[reaction] })),
        }
      : null,
    tradeOff: {
      tubeCount: p.tradeOff.tubeCount,
      allowedKPa: p.tradeOff.allowedPressureDrop !== null ? p.tradeOff.allowedPressureDrop / 1000 : null,
      rows: p.tradeOff.rows.map((r) => ({
        diameterMm: r.diameter * 1000,
        catalystMass: r.catalystMass,
        pressureDropKPa: r.pressureDrop !== null ? r.pressureDrop / 1000 : null,
        etaInlet: r.etaInlet,
        status: r.status,
      })),
    },
  };
}

export function transportReportData(t: LabTransport): TransportReportData {
  return {
    rateSource: t.rateSource,
    keyReactant: t.keyReactant,
    reaction: t.reaction,
    rows: t.rows.map((r) => ({
      runId: r.runId, observedRate: r.observedRate, weiszPrater: r.weiszPrater, mearsMass: r.mearsMass,
      mearsHeat: r.mearsHeat, praterRise: r.praterRise, intrinsic: r.intrinsic, failed: r.failed,
    })),
    limits: t.limits,
    correlations: t.correlations,
    note: t.note,
    skipped: t.skipped.length,
  };
}
