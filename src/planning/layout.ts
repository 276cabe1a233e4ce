/**
 * Runs written in a study's own per-run CSV layout: the same headers and units as the study's
 * column mapping, run conditions filled, measured columns empty (the lab fills them). Also the
 * reverse direction for held conditions: the SI value of a mapped field in an existing run.
 */
import type { FieldSpec, PerRunSourceSpec } from '../data/spec.js';
import type { StudyRun } from '../study/types.js';
import { unitFor } from '../units/index.js';
import { FIELD_QUANTITY, type ScalarField, type SpeciesField } from './limits.js';

/** One input column of the layout. */
export interface LayoutColumn {
  header: string;
  /** 'temperature' or 'feed.H2O'. */
  key: string;
  field: ScalarField | SpeciesField;
  species?: string;
  spec: FieldSpec;
}

const SCALARS: readonly ScalarField[] = ['temperature', 'pressure', 'catalystMass', 'volume', 'time', 'volumetricFlow', 'totalFeed', 'initialVolume'];
const PER_SPECIES: readonly SpeciesField[] = ['feed', 'feedFractions', 'inletConcentrations', 'initialConcentrations'];

/** The input columns of a per-run source (fields given as CSV columns, not constants), in mapping order. */
export function inputColumns(src: PerRunSourceSpec): LayoutColumn[] {
  const cols = src.columns as unknown as Record<string, unknown>;
  const out: LayoutColumn[] = [];
  for (const field of SCALARS) {
    const f = cols[field] as FieldSpec | undefined;
    if (f?.column !== undefined) out.push({ header: f.column, key: field, field, spec: f });
  }
  for (const field of PER_SPECIES) {
    const m = cols[field] as Record<string, FieldSpec> | undefined;
    for (const [species, f] of Object.entries(m ?? {})) {
      if (f.column !== undefined) out.push({ header: f.column, key: `${field}.${species}`, field, species, spec: f });
    }
  }
  return out;
}

/** Headers of the measured columns (and their sigma columns), left empty in a plan. */
export function measuredHeaders(src: PerRunSourceSpec): string[] {
  const out: string[] = [];
  for (const m of src.columns.measured ?? []) {
    out.push(m.column);
    if (m.sigmaColumn !== undefined) out.push(m.sigmaColumn);
  }
  return out;
}

function ambientOf(src: PerRunSourceSpec): number | undefined {
  return src.ambientPressure ? unitFor('pressure', src.ambientPressure.unit).toSI(src.ambientPressure.value) : undefined;
}

/** The value of a column in its own unit from SI. */
export function toColumnUnit(col: LayoutColumn, si: number, src: PerRunSourceSpec): number {
  const ambient = ambientOf(src);
  const conv = unitFor(FIELD_QUANTITY[col.field], col.spec.unit, { gauge: col.spec.gauge === true, ...(ambient !== undefined ? { ambientPressure: ambient } : {}) });
  return conv.fromSI(si);
}

/** A number as a CSV cell: 6 significant digits, no exponent for ordinary magnitudes. */
export function cell(x: number): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-4 && a < 1e9) return String(Number(x.toPrecision(6)));
  return x.toExponential(5);
}

/** The SI value of a mapped field in an existing run (for conditions the plan holds). */
export function fieldValueSI(run: StudyRun, col: LayoutColumn, speciesNames: readonly string[]): number | undefined {
  const j = col.species !== undefined ? speciesNames.indexOf(col.species) : -1;
  const feedTotal = run.feed ? run.feed.reduce((s, v) => s + v, 0) : 0;
  switch (col.field) {
    case 'temperature':
      return run.temperature;
    case 'pressure':
      return run.pressure;
    case 'catalystMass':
      return run.catalystMass ?? run.size;
    case 'volume':
    case 'time':
      return run.size;
    case 'volumetricFlow':
      return run.volumetricFlow;
    case 'initialVolume':
      return run.initialVolume;
    case 'totalFeed':
      return run.feed ? feedTotal : undefined;
    case 'feed':
      return run.feed?.[j];
    case 'feedFractions':
      return run.feed && feedTotal > 0 ? run.feed[j] / feedTotal : undefined;
    case 'inletConcentrations':
      return run.feed && run.volumetricFlow ? run.feed[j] / run.volumetricFlow : undefined;
    case 'initialConcentrations':
      return run.initialConcentrations?.[j];
  }
}

/** A planned row: run id, optional group, and SI values by column key. */
export interface PlannedRow {
  id: string;
  group?: string;
  values: ReadonlyMap<string, number>;
}

/** CSV text of rows in the source's layout (header line first; measured cells empty). */
export function rowsCsv(src: PerRunSourceSpec, rows: readonly PlannedRow[], comment?: string): string {
  const inputs = inputColumns(src);
  const measured = measuredHeaders(src);
  const header = [src.columns.run, ...(src.columns.group !== undefined ? [src.columns.group] : []), ...inputs.map((c) => c.header), ...measured];
  const lines = comment ? comment.split('\n').map((l) => `# ${l}`) : [];
  lines.push(header.join(','));
  for (const r of rows) {
    const cells = [r.id, ...(src.columns.group !== undefined ? [r.group ?? ''] : [])];
    for (const c of inputs) cells.push(cell(toColumnUnit(c, r.values.get(c.key) as number, src)));
    for (let k = 0; k < measured.length; k++) cells.push('');
    lines.push(cells.join(','));
  }
  return lines.join('\n') + '\n';
}
