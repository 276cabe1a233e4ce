/**
 * The lab's limits for planned runs (schema/limits.schema.json): the range of each run condition
 * the planner may vary, named as in the study's per-run column mapping, and the conditions the lab
 * cannot reach. Read once, checked against the study (the condition must be a CSV column of its
 * per-run source) and against physics (positive absolute temperature, non-negative amounts,
 * fractions at most 1), and converted to SI.
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import type { FieldSpec, PerRunSourceSpec } from '../data/spec.js';
import { checkSchema, type JsonSchema } from '../study/schema-check.js';
import type { Study } from '../study/types.js';
import { unitFor, type Quantity } from '../units/index.js';
import schemaJson from '../../schema/limits.schema.json' with { type: 'json' };
import { checkArgs, is } from '../core/args.js';

/** The limits-file schema as an object (the same file editors use). */
export const LIMITS_SCHEMA = schemaJson as unknown as JsonSchema;

export type ScalarField = 'temperature' | 'pressure' | 'catalystMass' | 'volume' | 'time' | 'volumetricFlow' | 'totalFeed' | 'initialVolume';
export type SpeciesField = 'feed' | 'feedFractions' | 'inletConcentrations' | 'initialConcentrations';

/** The quantity (for units) of each column-mapping field. */
export const FIELD_QUANTITY: Record<ScalarField | SpeciesField, Quantity> = {
  temperature: 'temperature',
  pressure: 'pressure',
  catalystMass: 'mass',
  volume: 'volume',
  time: 'time',
  volumetricFlow: 'volumetric-flow',
  totalFeed: 'molar-flow',
  initialVolume: 'volume',
  feed: 'molar-flow',
  feedFractions: 'dimensionless',
  inletConcentrations: 'concentration',
  initialConcentrations: 'concentration',
};

const SPECIES_FIELDS: readonly SpeciesField[] = ['feed', 'feedFractions', 'inletConcentrations', 'initialConcentrations'];

/** One run condition the planner varies. */
export interface Factor {
  /** 'temperature', or 'feed.H2O' for a per-species field. */
  key: string;
  field: ScalarField | SpeciesField;
  species?: string;
  /** Range in SI. */
  min: number;
  max: number;
  /** The unit the limits were written in (shown back to the user). */
  unit: string;
  /** Grid levels of the candidate set. */
  levels: number;
}

export interface LabLimits {
  factors: Factor[];
  /** Smallest scaled distance between planned runs (0..sqrt(factors)); default 0.05. */
  minSpacing: number;
  /** Highest predicted conversion of the key reactant (fraction); default none. */
  maxConversion?: number;
  /** Lowest predicted conversion (fraction); default none. */
  minConversion?: number;
  /** Smallest total outlet molar flow, mol/s; default none. */
  minOutletFlow?: number;
}

interface RawRange {
  min: number;
  max: number;
  unit: string;
  levels?: number;
}

interface RawLimits {
  factors: Partial<Record<ScalarField, RawRange>> & Partial<Record<SpeciesField, Record<string, RawRange>>>;
  levels?: number;
  minSpacing?: number;
  maxConversion?: number;
  minConversion?: number;
  minOutletFlow?: { value: number; unit: string };
}

/** The first per-run source of a study (the planner writes runs in its layout). */
export function perRunSource(study: Study): PerRunSourceSpec {
  const src = (study.sources ?? []).find((s) => s.layout === 'per-run') as PerRunSourceSpec | undefined;
  if (!src) {
    throw new RateloomError('E_DATA', 'planning needs the study\'s per-run column mapping, and this study has none', {
      path: ['data'],
      fix: 'Load the study from its file (loadStudy) so its per-run data source is known.',
    });
  }
  return src;
}

function bad(message: string, path: FieldPath, file: string, fix?: string): RateloomError {
  return new RateloomError('E_VALUE', message, { path, location: { file }, ...(fix ? { fix } : {}) });
}

/** The column-mapping entry of a field in the study's per-run source, or undefined. */
function studyField(src: PerRunSourceSpec, field: ScalarField | SpeciesField, species?: string): FieldSpec | undefined {
  const cols = src.columns as unknown as Record<string, FieldSpec | Record<string, FieldSpec> | undefined>;
  const entry = cols[field];
  if (!entry) return undefined;
  return species !== undefined ? (entry as Record<string, FieldSpec>)[species] : (entry as FieldSpec);
}

/** Check one range against the study's mapping and physics; return it in SI. */
function readRange(r: RawRange, field: ScalarField | SpeciesField, species: string | undefined, src: PerRunSourceSpec, levels: number, file: string): Factor {
  const key = species !== undefined ? `${field}.${species}` : field;
  const path = ['factors', field, ...(species !== undefined ? [species] : [])];
  const mapped = studyField(src, field, species);
  if (!mapped) throw bad(`the study's data have no '${key}' column to plan`, path, file, `Vary only conditions the study's per-run source maps to a CSV column (${Object.keys(src.columns).filter((k) => k !== 'run' && k !== 'measured' && k !== 'group').join(', ')}).`);
  if (mapped.column === undefined) throw bad(`the study gives '${key}' as one constant value, so the planned runs cannot vary it`, path, file, 'Leave it out of the limits, or make it a CSV column in the study.');
  const conv = unitFor(FIELD_QUANTITY[field], r.unit, { path: [...path, 'unit'], location: { file } });
  const min = conv.toSI(r.min);
  const max = conv.toSI(r.max);
  if (!(min < max)) throw bad(`'${key}': min (${r.min} ${r.unit}) must be below max (${r.max} ${r.unit})`, path, file, 'Give a range, or leave the condition out to hold it at the study\'s usual value.');
  if (field === 'temperature' && !(min > 0)) throw bad(`'${key}': ${r.min} ${r.unit} is at or below absolute zero`, [...path, 'min'], file);
  if (min < 0) throw bad(`'${key}': a negative ${field} (${r.min} ${r.unit}) is not physical`, [...path, 'min'], file);
  if (field === 'feedFractions' && max > 1 + 1e-12) throw bad(`'${key}': a mole fraction above 1 (${r.max} ${r.unit})`, [...path, 'max'], file);
  if (field === 'pressure' && !(min > 0)) throw bad(`'${key}': the pressure must be above zero`, [...path, 'min'], file);
  return { key, field, ...(species !== undefined ? { species } : {}), min, max, unit: r.unit, levels: r.levels ?? levels };
}

function readConstraints(raw: RawLimits, factors: Factor[], file: string): LabLimits {
  const limits: LabLimits = { factors, minSpacing: raw.minSpacing ?? 0.05 };
  if (limits.minSpacing > Math.sqrt(factors.length)) throw bad(`minSpacing ${limits.minSpacing} exceeds the diagonal of the scaled condition space (${Math.sqrt(factors.length).toFixed(3)})`, ['minSpacing'], file);
  for (const key of ['maxConversion', 'minConversion'] as const) {
    const v = raw[key];
    if (v !== undefined && !(v >= 0 && v <= 1)) throw bad(`${key} is a fraction between 0 and 1, not ${v}`, [key], file, 'Give the conversion as a fraction, for example 0.6 for 60 %.');
  }
  if (raw.maxConversion !== undefined) limits.maxConversion = raw.maxConversion;
  if (raw.minConversion !== undefined) limits.minConversion = raw.minConversion;
  if (limits.maxConversion !== undefined && limits.minConversion !== undefined && !(limits.minConversion < limits.maxConversion)) {
    throw bad('minConversion must be below maxConversion', ['minConversion'], file);
  }
  if (raw.minOutletFlow) {
    const v = unitFor('molar-flow', raw.minOutletFlow.unit, { path: ['minOutletFlow', 'unit'], location: { file } }).toSI(raw.minOutletFlow.value);
    if (v < 0) throw bad('minOutletFlow must not be negative', ['minOutletFlow', 'value'], file);
    limits.minOutletFlow = v;
  }
  return limits;
}

/** Read and check a limits document (parsed JSON) for a study. Bad input throws RateloomError. */
export function parseLimits(doc: unknown, study: Study, file = 'limits'): LabLimits {
  checkArgs('parseLimits', [doc, study, file], [{ name: 'doc', check: is.json }, { name: 'study', check: is.study }, { name: 'file', check: is.text }]);
  checkSchema(doc, LIMITS_SCHEMA);
  const raw = doc as RawLimits;
  const src = perRunSource(study);
  const levels = raw.levels ?? 6;
  const factors: Factor[] = [];
  for (const [field, r] of Object.entries(raw.factors) as [ScalarField | SpeciesField, RawRange | Record<string, RawRange>][]) {
    if (SPECIES_FIELDS.includes(field as SpeciesField)) {
      for (const [sp, rr] of Object.entries(r as Record<string, RawRange>)) {
        if (!study.chemistry.speciesNames.includes(sp)) throw new RateloomError('E_UNKNOWN_SPECIES', `limits name species '${sp}', which the study does not declare`, { path: ['factors', field, sp], location: { file } });
        factors.push(readRange(rr, field, sp, src, levels, file));
      }
    } else factors.push(readRange(r as RawRange, field, undefined, src, levels, file));
  }
  if (!factors.length) throw bad('the limits vary no run condition', ['factors'], file, 'Give at least one factor with min, max and unit.');
  return readConstraints(raw, factors, file);
}
