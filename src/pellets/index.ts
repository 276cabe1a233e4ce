/**
 * Public surface of the pellet module: pellet description and checks, diffusivities, closed-form
 * and generalized effectiveness factors, the numerical pellet solver, film correlations, overall
 * effectiveness, the eta table and the lab-run transport diagnostics.
 */
export type { PelletSpec, PelletShape, PelletGeometry, MolecularDiffusivity } from './types';
export { pelletGeometry } from './geometry';
export { loadPellet, type LoadedPellet, type PelletFluid } from './load';
export { fullerDiffusivity, diffusionVolume } from './fuller';
export { effectiveDiffusivities, molecularDiffusivities, knudsenDiffusivity, type DiffusingSpecies } from './diffusivity';
export { etaFirstOrder, etaSlabFirstOrder, etaCylinderFirstOrder, etaSphereFirstOrder, normalizedModulus, type ShapeExponent } from './analytic';
export { besselI0, besselI1, besselRatioI1I0 } from './bessel';
export { generalizedModulus, type GeneralizedInput, type GeneralizedResult } from './generalized';
export { PelletSolver, PELLET_STATUS, type PelletProblem, type PelletSolution, type PelletSolveOptions, type PelletStatus } from './pellet-bvp';
export { massTransfer, heatTransfer, rangeWarning, MASS_TRANSFER, HEAT_TRANSFER, type BedFlow, type CorrelationInfo } from './external';
export { EffectivenessEvaluator, type PelletModel, type EffectivenessResult } from './effectiveness';
export { EtaTable } from './eta-table';
export { runDiagnostics, diagnosticsWarnings, ACTIVATION_ENERGY_NOTE, WEISZ_PRATER_LIMIT, MEARS_LIMIT, type RunDiagnostics, type RunTransportInput, type TransportContext } from './diagnostics';
