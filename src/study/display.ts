/**
 * Which unit each number of a study is shown in (docs/display-units.md): a parameter in the unit
 * of its start value, a measured response in the unit of its CSV column, a run condition in the
 * unit of its column, the reference temperature as the study wrote it; the study's `displayUnits`
 * overrides by kind of quantity and rebuilds composite units (src/units/display.ts). The values
 * themselves stay SI; these are the conversions the edges apply.
 */
import { displayConversion, displayUnitFor, unitDims, type DisplayConversion, type DisplayUnits } from '../units/index.js';
import type { AnySourceSpec } from '../data/spec.js';
import type { Observation, Study } from './types.js';

/** The units a study wrote, kept for display (filled by the loader). */
export interface StudyDisplaySpec {
  /** The study's checked `displayUnits`; empty when it gives none. */
  units: DisplayUnits;
  /** Unit of each parameter's start value as written, by base name (candidates included). */
  parameterUnits: Record<string, string>;
  /** Unit the reference temperature was written in (absent: a number in K, or taken from the data). */
  referenceTemperatureUnit?: string;
}

/** A run condition that has a column unit. */
export type ConditionKind = 'temperature' | 'pressure' | 'size';

/** The conversion to show an SI value of unit `siUnit`, given the unit the user wrote (if any). */
export function conversionFor(siUnit: string, written: string | undefined, units: DisplayUnits): DisplayConversion {
  const dims = unitDims(siUnit);
  if (!dims) return { unit: siUnit, factor: 1, shift: 0 };
  try {
    return displayConversion(displayUnitFor(dims, written, units));
  } catch {
    return { unit: siUnit, factor: 1, shift: 0 };
  }
}

/** The base parameter a shown name refers to: 'k1@G2' -> 'k1', 'A(k1)' -> 'k1'. */
export function baseParameterName(name: string): string {
  const m = /^[A-Za-z]+\((.+)\)$/.exec(name);
  return (m ? m[1] : name).split('@')[0];
}

function sameFile(location: string, source: string): boolean {
  const norm = (s: string) => s.replace(/\\/g, '/').replace(/^\.\//, '');
  const a = norm(location);
  const b = norm(source);
  return a === b || a.endsWith(`/${b}`);
}

/** Column header -> unit of one source: every {column, unit} field, and header-only fields of a source with one unit. */
function columnUnits(src: AnySourceSpec): Map<string, string> {
  const out = new Map<string, string>();
  const shared = 'unit' in src && typeof src.unit === 'string' ? src.unit : undefined;
  const walk = (v: unknown, key: string): void => {
    if (typeof v === 'string') {
      if (shared !== undefined && !['run', 'species', 'group', 'time', 'position'].includes(key) && !out.has(v)) out.set(v, shared);
      return;
    }
    if (typeof v !== 'object' || v === null) return;
    const o = v as Record<string, unknown>;
    if (typeof o.column === 'string' && typeof o.unit === 'string') out.set(o.column, o.unit);
    for (const [k, x] of Object.entries(o)) if (k !== 'column' && k !== 'unit') walk(x, k);
  };
  walk(src.columns, '');
  return out;
}

const CONDITION_FIELDS: Record<ConditionKind, readonly string[]> = { temperature: ['temperature'], pressure: ['pressure'], size: ['catalystMass', 'volume', 'time'] };

function conditionUnit(src: AnySourceSpec | undefined, kind: ConditionKind): string | undefined {
  const cols = src?.columns as Record<string, { unit?: string; gauge?: boolean } | string | undefined> | undefined;
  for (const f of CONDITION_FIELDS[kind]) {
    const c = cols?.[f];
    if (typeof c === 'object' && typeof c.unit === 'string' && !c.gauge) return c.unit;
  }
  return undefined;
}

/** The display conversions of one study. */
export interface StudyDisplay {
  readonly units: DisplayUnits;
  /** A parameter (or a derived quantity named after one, 'A(k1)') whose SI unit is `siUnit`. */
  parameter(name: string, siUnit: string): DisplayConversion;
  /** A measured response, in the unit of its column. */
  observation(o: Pick<Observation, 'unit' | 'location'>): DisplayConversion;
  /** A condition of run `runIndex`, in the unit of its column (else `fallback`, else SI). */
  condition(kind: ConditionKind, runIndex: number, siUnit: string, fallback?: string): DisplayConversion;
  /** The reference temperature (SI K). */
  referenceTemperature(): DisplayConversion;
  /** Any other value: SI unit, and the unit the user wrote for it if known. */
  other(siUnit: string, written?: string): DisplayConversion;
}

/** The source a location's file came from, or the only source. */
function sourceOf(study: Pick<Study, 'sources'>, file: string | undefined): AnySourceSpec | undefined {
  const sources = study.sources ?? [];
  return (file !== undefined ? sources.find((s) => sameFile(file, s.file)) : undefined) ?? (sources.length === 1 ? sources[0] : undefined);
}

/** The display conversions of a loaded study. */
export function studyDisplay(study: Pick<Study, 'display' | 'sources' | 'runs'>): StudyDisplay {
  const units = study.display?.units ?? {};
  const written = study.display?.parameterUnits ?? {};
  const columnCache = new Map<AnySourceSpec, Map<string, string>>();
  const columns = (src: AnySourceSpec) => columnCache.get(src) ?? columnCache.set(src, columnUnits(src)).get(src)!;
  return {
    units,
    parameter: (name, siUnit) => conversionFor(siUnit, written[baseParameterName(name)] ?? written[name.replace(/_0$/, '')], units),
    observation: (o) => {
      const src = sourceOf(study, o.location.file);
      const col = o.location.column;
      const w = src && col !== undefined ? columns(src).get(col) : undefined;
      return conversionFor(o.unit, w, units);
    },
    condition: (kind, runIndex, siUnit, fallback) => conversionFor(siUnit, conditionUnit(sourceOf(study, study.runs[runIndex]?.location.file), kind) ?? fallback, units),
    referenceTemperature: () => conversionFor('K', study.display?.referenceTemperatureUnit, units),
    other: (siUnit, w) => conversionFor(siUnit, w, units),
  };
}
