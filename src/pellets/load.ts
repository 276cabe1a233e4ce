/**
 * Reading a pellet description (study `reactor.pellet`, case `pellet`) into SI, with its checks:
 * shape and size, porosity strictly inside (0, 1), a way to get the effective diffusivity, and
 * (given the tube) a pellet smaller than the tube. Quantities are written "3 mm" or
 * { "value": 3, "unit": "mm" }. Bad input throws a RateloomError naming the field.
 */
import { RateloomError, closestName, type FieldPath } from '../core/errors.js';
import { toSI, type Quantity } from '../units/index.js';
import type { MolecularDiffusivity, PelletShape, PelletSpec } from './types.js';
import { checkArgs, is } from '../core/args.js';

type Obj = Record<string, unknown>;

const FIELDS = [
  'shape', 'diameter', 'length', 'innerDiameter', 'porosity', 'tortuosity', 'poreDiameter',
  'effectiveDiffusivity', 'molecularDiffusivity', 'thermalConductivity', 'density', 'fluid',
] as const;
const FLUID_FIELDS = ['viscosity', 'thermalConductivity', 'heatCapacity'] as const;
const SHAPES: readonly PelletShape[] = ['sphere', 'cylinder', 'slab', 'ring'];

/** Units src/units does not list, with their factors to SI. */
const LOCAL_UNITS: Record<string, Record<string, number>> = {
  diffusivity: { 'm2/s': 1, 'cm2/s': 1e-4, 'mm2/s': 1e-6 },
  conductivity: { 'W/(m K)': 1, 'W/m/K': 1, 'mW/(m K)': 1e-3 },
  heatCapacity: { 'J/(kg K)': 1, 'J/kg/K': 1, 'kJ/(kg K)': 1e3, 'kJ/kg/K': 1e3 },
};

/** Fluid properties near the pellet, for the external transfer correlations (SI). */
export interface PelletFluid {
  /** Dynamic viscosity, Pa s. */
  viscosity?: number;
  /** Thermal conductivity of the fluid, W/(m K). */
  thermalConductivity?: number;
  /** Heat capacity of the fluid per kg, J/(kg K). */
  heatCapacity?: number;
}

/** A pellet read from a file: the description plus optional fluid properties. */
export interface LoadedPellet {
  pellet: PelletSpec;
  fluid: PelletFluid;
}

function err(code: 'E_TYPE' | 'E_VALUE' | 'E_MISSING_FIELD' | 'E_UNKNOWN_FIELD' | 'E_UNIT', problem: string, path: FieldPath, fix?: string): RateloomError {
  return new RateloomError(code, problem, { path, ...(fix ? { fix } : {}) });
}

function checkFields(o: Obj, allowed: readonly string[], path: FieldPath): void {
  for (const k of Object.keys(o)) {
    if (allowed.includes(k)) continue;
    const near = closestName(k, allowed);
    throw err('E_UNKNOWN_FIELD', `unknown field '${k}'`, [...path, k], near ? `Did you mean '${near}'?` : `Allowed fields: ${allowed.join(', ')}.`);
  }
}

/** A quantity as value and unit text. */
function split(raw: unknown, path: FieldPath): { value: number; unit: string } {
  if (typeof raw === 'string') {
    const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.+?)\s*$/.exec(raw);
    if (m) return { value: Number(m[1]), unit: m[2] };
  } else if (raw && typeof raw === 'object' && !Array.isArray(raw)) {
    const o = raw as Obj;
    if (typeof o.value === 'number' && Number.isFinite(o.value) && typeof o.unit === 'string') return { value: o.value, unit: o.unit.trim() };
  }
  throw err('E_TYPE', 'expected a quantity with a unit', path, 'Write it as "3 mm" or { "value": 3, "unit": "mm" }.');
}

/** A quantity in SI: through src/units, or the local table for the kinds it does not list. */
export function pelletQuantity(raw: unknown, kind: Quantity | keyof typeof LOCAL_UNITS, path: FieldPath): number {
  const { value, unit } = split(raw, path);
  const table = LOCAL_UNITS[kind];
  if (table) {
    const f = table[unit];
    if (f === undefined) throw err('E_UNIT', `unit '${unit}' is not a supported ${kind} unit`, [...path, 'unit'], `Use one of: ${Object.keys(table).join(', ')}.`);
    return value * f;
  }
  return toSI(value, kind as Quantity, unit, { path: [...path, 'unit'] });
}

function positiveQ(o: Obj, key: string, kind: Parameters<typeof pelletQuantity>[1], path: FieldPath): number | undefined {
  if (o[key] === undefined) return undefined;
  const v = pelletQuantity(o[key], kind, [...path, key]);
  if (!(v > 0)) throw err('E_VALUE', `${key} must be positive`, [...path, key]);
  return v;
}

/** One value or a per-species object of diffusivities. */
function diffusivities(raw: unknown, species: readonly string[], path: FieldPath): number | Record<string, number> {
  if (raw && typeof raw === 'object' && !Array.isArray(raw) && !('value' in (raw as Obj))) {
    const out: Record<string, number> = {};
    for (const [name, v] of Object.entries(raw as Obj)) {
      if (!species.includes(name)) {
        throw new RateloomError('E_UNKNOWN_SPECIES', `species '${name}' is not in the kinetics`, { path: [...path, name], fix: `Use one of: ${species.join(', ')}.` });
      }
      const d = pelletQuantity(v, 'diffusivity', [...path, name]);
      if (!(d > 0)) throw err('E_VALUE', `the diffusivity of '${name}' must be positive`, [...path, name]);
      out[name] = d;
    }
    return out;
  }
  const d = pelletQuantity(raw, 'diffusivity', path);
  if (!(d > 0)) throw err('E_VALUE', 'the diffusivity must be positive', path);
  return d;
}

function molecular(raw: unknown, species: readonly string[], path: FieldPath): MolecularDiffusivity {
  if (raw && typeof raw === 'object' && (raw as Obj).estimate !== undefined) {
    const o = raw as Obj;
    checkFields(o, ['estimate', 'carrier'], path);
    if (o.estimate !== 'fuller') throw err('E_VALUE', `unknown estimate '${String(o.estimate)}'`, [...path, 'estimate'], 'Use "fuller" (gases).');
    if (typeof o.carrier !== 'string' || !species.includes(o.carrier)) {
      throw err('E_VALUE', 'the carrier must be a species of the kinetics', [...path, 'carrier'], `Name the main gas, one of: ${species.join(', ')}.`);
    }
    return { estimate: 'fuller', carrier: o.carrier };
  }
  return diffusivities(raw, species, path);
}

function shapeOf(o: Obj, path: FieldPath): PelletShape {
  const s = o.shape;
  if (typeof s !== 'string' || !SHAPES.includes(s as PelletShape)) {
    throw err(s === undefined ? 'E_MISSING_FIELD' : 'E_VALUE', `pellet shape ${s === undefined ? 'is missing' : `'${String(s)}' is unknown`}`, [...path, 'shape'], `Use one of: ${SHAPES.join(', ')}.`);
  }
  return s as PelletShape;
}

function porosityOf(o: Obj, path: FieldPath): number {
  const p = o.porosity;
  if (p === undefined) throw err('E_MISSING_FIELD', 'the pellet porosity is missing', [...path, 'porosity'], 'Add "porosity", for example 0.4.');
  if (typeof p !== 'number' || !(p > 0 && p < 1)) {
    throw err('E_VALUE', `pellet porosity ${String(p)} lies outside (0, 1)`, [...path, 'porosity'], 'Give the pore volume fraction of the pellet, strictly between 0 and 1 (typically 0.3-0.6).');
  }
  return p;
}

function tortuosityOf(o: Obj, path: FieldPath): number | undefined {
  const t = o.tortuosity;
  if (t === undefined) return undefined;
  if (typeof t !== 'number' || !(t >= 1 && t <= 20)) throw err('E_VALUE', `tortuosity ${String(t)} lies outside [1, 20]`, [...path, 'tortuosity'], 'Give the tortuosity factor, typically 2-6.');
  return t;
}

/** The size fields of a pellet, checked against its shape. */
function sizeOf(o: Obj, shape: PelletShape, path: FieldPath): Pick<PelletSpec, 'diameter' | 'length' | 'innerDiameter'> {
  const diameter = positiveQ(o, 'diameter', 'length', path);
  if (diameter === undefined) throw err('E_MISSING_FIELD', 'the pellet diameter is missing', [...path, 'diameter'], 'Add "diameter" (the thickness for a slab), for example "3 mm".');
  const length = positiveQ(o, 'length', 'length', path);
  const innerDiameter = positiveQ(o, 'innerDiameter', 'length', path);
  if (shape === 'ring' && innerDiameter === undefined) throw err('E_MISSING_FIELD', 'a ring needs its inner diameter', [...path, 'innerDiameter']);
  if (innerDiameter !== undefined && !(innerDiameter < diameter)) throw err('E_VALUE', 'the inner diameter is not smaller than the outer diameter', [...path, 'innerDiameter']);
  if (shape === 'ring' && length === undefined) throw err('E_MISSING_FIELD', 'a ring needs its length', [...path, 'length']);
  return { diameter, ...(length !== undefined ? { length } : {}), ...(innerDiameter !== undefined ? { innerDiameter } : {}) };
}

/** The fluid block of a pellet (all optional). */
function fluidOf(raw: unknown, path: FieldPath): PelletFluid {
  if (raw === undefined) return {};
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) throw err('E_TYPE', 'fluid must be an object', path);
  const o = raw as Obj;
  checkFields(o, FLUID_FIELDS, path);
  const out: PelletFluid = {};
  const mu = positiveQ(o, 'viscosity', 'viscosity', path);
  const k = positiveQ(o, 'thermalConductivity', 'conductivity', path);
  const cp = positiveQ(o, 'heatCapacity', 'heatCapacity', path);
  if (mu !== undefined) out.viscosity = mu;
  if (k !== undefined) out.thermalConductivity = k;
  if (cp !== undefined) out.heatCapacity = cp;
  return out;
}

/**
 * Read and check a pellet. `tubeDiameter` (m), when known, must exceed the pellet size.
 * @param species the kinetics' species (per-species diffusivities, Fuller carrier)
 * @param extra further field names the caller reads itself
 */
export function loadPellet(raw: unknown, species: readonly string[], path: FieldPath, tubeDiameter?: number, extra: readonly string[] = []): LoadedPellet {
  checkArgs('loadPellet', [raw, species, path], [{ name: 'raw', check: is.json }, { name: 'species', check: is.stringList }, { name: 'path', check: is.list(is.key) }]);
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) throw err('E_TYPE', 'the pellet must be an object', path);
  const o = raw as Obj;
  checkFields(o, [...FIELDS, ...extra], path);
  const shape = shapeOf(o, path);
  const size = sizeOf(o, shape, path);
  const density = positiveQ(o, 'density', 'density', path);
  if (density === undefined) throw err('E_MISSING_FIELD', 'the pellet density is missing', [...path, 'density'], 'Add "density" (mass of one pellet over its volume), for example "1300 kg/m3".');
  const pellet: PelletSpec = { shape, ...size, porosity: porosityOf(o, path), density };
  const tau = tortuosityOf(o, path);
  if (tau !== undefined) pellet.tortuosity = tau;
  const dp = positiveQ(o, 'poreDiameter', 'length', path);
  if (dp !== undefined) pellet.poreDiameter = dp;
  const lam = positiveQ(o, 'thermalConductivity', 'conductivity', path);
  if (lam !== undefined) pellet.thermalConductivity = lam;
  if (o.effectiveDiffusivity !== undefined) pellet.effectiveDiffusivity = diffusivities(o.effectiveDiffusivity, species, [...path, 'effectiveDiffusivity']);
  if (o.molecularDiffusivity !== undefined) pellet.molecularDiffusivity = molecular(o.molecularDiffusivity, species, [...path, 'molecularDiffusivity']);
  checkDiffusivityRoute(pellet, path);
  if (tubeDiameter !== undefined && !(pellet.diameter < tubeDiameter)) {
    throw err('E_VALUE', `the pellet (${pellet.diameter * 1000} mm) is not smaller than the tube (${tubeDiameter * 1000} mm)`, [...path, 'diameter'], 'Give the pellet size in the right unit, or a wider tube; a tube several pellet diameters wide is usual (common practice).');
  }
  return { pellet, fluid: fluidOf(o.fluid, [...path, 'fluid']) };
}

/** The effective diffusivity must be given, or follow from a molecular one and the tortuosity. */
function checkDiffusivityRoute(p: PelletSpec, path: FieldPath): void {
  if (p.effectiveDiffusivity !== undefined) return;
  if (p.molecularDiffusivity === undefined) {
    throw err('E_MISSING_FIELD', 'no diffusivity is given for the pellet', [...path, 'effectiveDiffusivity'],
      'Give "effectiveDiffusivity" (m2/s), or "molecularDiffusivity" (a value or { "estimate": "fuller", "carrier": "N2" }) with "tortuosity".');
  }
  if (p.tortuosity === undefined) {
    throw err('E_MISSING_FIELD', 'the tortuosity is needed to turn the molecular diffusivity into an effective one', [...path, 'tortuosity'], 'Add "tortuosity" (typically 2-6), or give "effectiveDiffusivity".');
  }
}
