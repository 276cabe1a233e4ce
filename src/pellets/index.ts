/**
 * Public surface of the pellet module: pellet description and checks, diffusivities, closed-form
 * and generalized effectiveness factors, the numerical pellet solver, film correlations, overall
 * effectiveness, the eta table and the lab-run transport diagnostics.
 */
export type { PelletSpec, PelletShape, PelletGeometry, MolecularDiffusivity } from './types.js';
export { pelletGeometry } from './geometry.js';
export { loadPellet, type LoadedPellet, type PelletFluid } from './load.js';
export { fullerDiffusivity, diffusionVolume } from './fuller.js';
export { effectiveDiffusivities, molecularDiffusivities, knudsenDiffusivity, type DiffusingSpecies } from './diffusivity.js';
export { etaFirstOrder, etaSlabFirstOrder, etaCylinderFirstOrder, etaSphereFirstOrder, normalizedModulus, type ShapeExponent } from './analytic.js';
export { besselI0, besselI1, besselRatioI1I0 } from './bessel.js';
export { generalizedModulus, type GeneralizedInput, type GeneralizedResult } from './generalized.js';
export { PelletSolver, PELLET_STATUS, type PelletProblem, type PelletSolution, type PelletSolveOptions, type PelletStatus } from './pellet-bvp.js';
export { massTransfer, heatTransfer, rangeWarning, MASS_TRANSFER, HEAT_TRANSFER, type BedFlow, type CorrelationInfo } from './external.js';
export { EffectivenessEvaluator, type PelletModel, type EffectivenessResult } from './effectiveness.js';
export { EtaTable } from './eta-table.js';
export { runDiagnostics, diagnosticsWarnings, ACTIVATION_ENERGY_NOTE, WEISZ_PRATER_LIMIT, MEARS_LIMIT, type RunDiagnostics, type RunTransportInput, type TransportContext } from './diagnostics.js';
