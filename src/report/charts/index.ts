/**
 * All charts of a fit report and of a sizing report, in document order.
 */
import type { ChartSpec, FitReportData, SizingReportData } from '../types';
import { correlationCharts } from './correlation';
import { driftCharts } from './drift';
import { likelihoodCharts } from './likelihood';
import { parityCharts } from './parity';
import { productionCharts } from './production';
import { pelletCharts } from './pellets';
import { thermalCharts } from './thermal';
import { profileCharts } from './profiles';
import { residualCharts } from './residuals';
import { rivalCharts } from './rivals';
import { sensitivityCharts } from './sensitivity';
import { sizeDistributionCharts } from './size-distribution';

export { correlationCharts, driftCharts, likelihoodCharts, parityCharts, pelletCharts, productionCharts, profileCharts, residualCharts, rivalCharts, sensitivityCharts, sizeDistributionCharts };
export { binSamples } from './size-distribution';

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
