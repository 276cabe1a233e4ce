/**
 * A catalyst pellet, all SI: its shape and size, pore structure, diffusivities and thermal
 * conductivity. The same description serves the lab pellet of a study (transport diagnostics of
 * the runs) and the plant pellet of a production case (effectiveness factor along the bed).
 */

/** Pellet shapes. A ring, and a cylinder with a given length, are modelled as an equivalent sphere. */
export type PelletShape = 'sphere' | 'cylinder' | 'slab' | 'ring';

/** How the molecular diffusivity of the fluid is known. */
export type MolecularDiffusivity =
  /** One value for every species, m2/s. */
  | number
  /** Per species, m2/s. */
  | Record<string, number>
  /** Estimated for a gas by Fuller's correlation, each species in the named carrier species. */
  | { estimate: 'fuller'; carrier: string };

export interface PelletSpec {
  shape: PelletShape;
  /**
   * Size, m: diameter of a sphere or cylinder, outer diameter of a ring, full thickness of a slab
   * (both faces open).
   */
  diameter: number;
  /** Length of a cylinder or ring, m; default: none (a cylinder is then infinitely long). */
  length?: number;
  /** Inner diameter of a ring, m (required for a ring). */
  innerDiameter?: number;
  /** Pellet porosity epsilon_p, dimensionless, strictly between 0 and 1. */
  porosity: number;
  /** Pore tortuosity tau, dimensionless (>= 1); needed when De comes from the molecular diffusivity. */
  tortuosity?: number;
  /** Mean pore diameter, m; when given, Knudsen diffusion is added in series (Bosanquet). */
  poreDiameter?: number;
  /** Effective diffusivity De in the pellet, m2/s: one value or per species; wins over the rest. */
  effectiveDiffusivity?: number | Record<string, number>;
  /** Molecular diffusivity of the fluid, m2/s, or a Fuller estimate. */
  molecularDiffusivity?: MolecularDiffusivity;
  /** Effective thermal conductivity of the pellet, W/(m K); needed for temperature checks. */
  thermalConductivity?: number;
  /** Pellet (particle) density, kg/m3: converts a rate per kg catalyst into one per m3 of pellet. */
  density: number;
}

/** The pellet as the reaction-diffusion problem sees it (see geometry.ts). */
export interface PelletGeometry {
  /** Shape exponent a of the Laplacian: 1 slab, 2 infinite cylinder, 3 sphere (and equivalents). */
  a: 1 | 2 | 3;
  /** Diffusion length of the model, m: half-thickness of a slab, radius otherwise. */
  R: number;
  /** Volume-to-external-surface ratio Vp/Sp of the real pellet, m. */
  volumeToSurface: number;
  /** Diameter used by packed-bed correlations (Ergun, transfer): 6 Vp/Sp, m. */
  equivalentDiameter: number;
  /** How the shape was modelled, for reports. */
  rule: string;
}
