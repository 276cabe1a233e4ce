/**
 * All charts of a fit report and of a sizing report, in document order.
 */
import type { ChartSpec, FitReportData, SizingReportData } from '../types.js';
import { correlationCharts } from './correlation.js';
import { driftCharts } from './drift.js';
import { likelihoodCharts } from './likelihood.js';
import { parityCharts } from './parity.js';
import { productionCharts } from './production.js';
import { pelletCharts } from './pellets.js';
import { thermalCharts } from './thermal.js';
import { profileCharts } from './profiles.js';
import { residualCharts } from './residuals.js';
import { rivalCharts } from './rivals.js';
import { sensitivityCharts } from './sensitivity.js';
import { sizeDistributionCharts } from './size-distribution.js';

export { correlationCharts, driftCharts, likelihoodCharts, parityCharts, pelletCharts, productionCharts, profileCharts, residualCharts, rivalCharts, sensitivityCharts, sizeDistributionCharts };
export { binSamples } from './size-distribution.js';

/** Charts of a fit report grouped by section. */
export interface FitChartGroups {
  parity: ChartSpec[];
  residuals: ChartSpec[];
  profiles: ChartSpec[];
  correlation: ChartSpec[];
  likelihood: ChartSpec[];
  rivals: ChartSpec[];
  drift: ChartSpec[];
}

/** Build every fit chart. */
export function fitCharts(data: FitReportData): FitChartGroups {
  return {
    parity: parityCharts(data.runs),
    residuals: residualCharts(data.runs),
    profiles: profileCharts(data.profiles ?? [], data.runs),
    correlation: correlationCharts(data.correlation),
    likelihood: likelihoodCharts(data.likelihoodProfiles),
    rivals: rivalCharts(data.rivalModels),
    drift: driftCharts(data.lab),
  };
}

/** Charts of a sizing report grouped by section. */
export interface SizingChartGroups {
  production: ChartSpec[];
  distribution: ChartSpec[];
  sensitivity: ChartSpec[];
  pellet: ChartSpec[];
  thermal: ChartSpec[];
}

/** Build every sizing chart. */
export function sizingCharts(data: SizingReportData): SizingChartGroups {
  return {
    production: productionCharts(data.productionProfile),
    distribution: sizeDistributionCharts(data),
    sensitivity: sensitivityCharts(data),
    pellet: pelletCharts(data.pellet),
    thermal: thermalCharts(data.thermal),
  };
}
