/**
 * The `data` entries of a study skeleton, one per file, in the layout the files were found in:
 * per-run (one row per run, one column per species and side), stacked (a species column) or
 * run-file (one file per batch run). Every unit that was not in the header becomes a to-do entry.
 */
import { RateloomError, type FieldPath } from '../core/errors.js';
import type { ReactorKind } from '../reactors/types.js';
import type { Inference, ReadFile, UnitedColumn } from './infer.js';

/** Something the skeleton could not infer: where it sits in the study and what to do. */
export interface SkeletonTodo {
  path: FieldPath;
  what: string;
}

type Field = { column: string; unit: string };

const field = (c: UnitedColumn): Field => ({ column: c.header, unit: c.unit });

/** To-do entries for units that came from a comment or a default, and notes on unused columns. */
function unitNotes(f: ReadFile, at: (c: UnitedColumn) => FieldPath | undefined, todo: SkeletonTodo[]): void {
  const fromComment = new Map<string, { path: FieldPath; headers: string[] }>();
  for (const c of f.columns) {
    const path = at(c);
    if (!path) continue;
    if (c.unitFrom === 'default') todo.push({ path, what: `no unit in the header '${c.header}' of ${f.file}: '${c.unit}' was written; give the unit of the column` });
    else if (c.unitFrom === 'comment') {
      const seen = fromComment.get(c.unit) ?? { path, headers: [] };
      seen.headers.push(c.header);
      fromComment.set(c.unit, seen);
    }
  }
  for (const [unit, { path, headers }] of fromComment) todo.push({ path, what: `unit '${unit}' of ${headers.map((h) => `'${h}'`).join(', ')} taken from a comment line of ${f.file} (the header names none); check it` });
}

const CONDITIONS = ['temperature', 'pressure', 'catalystMass', 'volume', 'time', 'volumetricFlow'] as const;

/** Condition fields present in a file (size fields the reactor kind does not use are left out). */
function conditions(f: ReadFile, kind: ReactorKind): Record<string, Field> {
  const out: Record<string, Field> = {};
  for (const role of CONDITIONS) {
    const c = f.columns.find((x) => x.role === role);
    if (!c) continue;
    if (role === 'time' && kind !== 'batch' && kind !== 'semibatch') continue;
    if (role === 'volume' && kind === 'packed-bed') continue;
    out[role] = field(c);
  }
  return out;
}

/** Feed and measured fields of a wide per-run file. */
function wideAmounts(f: ReadFile, kind: ReactorKind, i: number, todo: SkeletonTodo[]): Record<string, unknown> {
  const batch = kind === 'batch' || kind === 'semibatch';
  const out: Record<string, Record<string, Field>> = {};
  const measured: Record<string, unknown>[] = [];
  for (const c of f.columns) {
    const a = c.amount;
    if (!a?.species) continue;
    if (a.side === 'in') {
      const key = a.kind === 'molar-flow' ? 'feed' : a.kind === 'fraction' ? 'feedFractions' : batch ? 'initialConcentrations' : 'inletConcentrations';
      out[key] ??= {};
      out[key][a.species] = field(c);
    } else if (a.kind === 'fraction') {
      todo.push({ path: ['data', i], what: `outlet mole fraction column '${c.header}' is not used: analyser fractions go in a 'labData' section (docs/lab-data.md)` });
    } else measured.push({ response: a.kind === 'molar-flow' ? 'outlet-flow' : 'outlet-concentration', species: a.species, column: c.header, unit: c.unit });
  }
  return { ...out, ...(measured.length ? { measured } : {}) };
}

/** A per-run source for a wide file. */
function perRunSource(f: ReadFile, kind: ReactorKind, i: number, todo: SkeletonTodo[]): Record<string, unknown> {
  const run = f.columns.find((c) => c.role === 'run') as UnitedColumn;
  const columns: Record<string, unknown> = { run: run.header, ...conditions(f, kind), ...wideAmounts(f, kind, i, todo) };
  unitNotes(f, (c) => {
    const key = c.role === 'amount' ? undefined : c.role;
    if (key && columns[key]) return ['data', i, 'columns', key, 'unit'];
    const m = (columns.measured as { column: string }[] | undefined)?.findIndex((x) => x.column === c.header) ?? -1;
    if (m >= 0) return ['data', i, 'columns', 'measured', m, 'unit'];
    for (const k of ['feed', 'feedFractions', 'inletConcentrations', 'initialConcentrations']) {
      const sp = c.amount?.species;
      if (sp && (columns[k] as Record<string, Field> | undefined)?.[sp]?.column === c.header) return ['data', i, 'columns', k, sp, 'unit'];
    }
    return undefined;
  }, todo);
  return { file: f.file, layout: 'per-run', columns };
}

/** A stacked source: conditions, the species column and the inlet/outlet amount columns. */
function stackedSource(f: ReadFile, kind: ReactorKind, i: number, todo: SkeletonTodo[]): Record<string, unknown> {
  const pick = (pred: (c: UnitedColumn) => boolean) => f.columns.find(pred);
  const inlet = pick((c) => c.role === 'amount' && c.amount?.side === 'in' && !c.amount.species);
  const outlet = pick((c) => c.role === 'amount' && c.amount?.side === 'out' && !c.amount.species) as UnitedColumn;
  const cond = conditions(f, kind);
  const columns = {
    run: (pick((c) => c.role === 'run') as UnitedColumn).header,
    species: (pick((c) => c.role === 'species') as UnitedColumn).header,
    ...cond,
    ...(inlet ? { inlet: field(inlet) } : {}),
    outlet: field(outlet),
  };
  unitNotes(f, (c) => (c === inlet ? ['data', i, 'columns', 'inlet', 'unit'] : c === outlet ? ['data', i, 'columns', 'outlet', 'unit'] : c.role in cond ? ['data', i, 'columns', c.role, 'unit'] : undefined), todo);
  return { file: f.file, layout: 'stacked', columns };
}

/** A run-file source: time, temperature and one concentration column per species. */
function runFileSource(f: ReadFile, i: number, todo: SkeletonTodo[]): Record<string, unknown> {
  const amounts = f.columns.filter((c) => c.amount?.species);
  if (amounts.some((c) => c.amount?.kind !== 'concentration')) {
    throw new RateloomError('E_COLUMNS', `${f.file}: one file per run is read for batch samples of concentrations; '${amounts.find((c) => c.amount?.kind !== 'concentration')?.header}' is not a concentration; nothing was written`, { location: { file: f.file, line: f.table.headerLine } });
  }
  const time = f.columns.find((c) => c.role === 'time');
  if (!time) throw new RateloomError('E_COLUMNS', `${f.file}: one file per run needs a time column (for example 't [min]'); nothing was written`, { location: { file: f.file, line: f.table.headerLine } });
  const T = f.columns.find((c) => c.role === 'temperature') as UnitedColumn;
  const species: Record<string, string> = {};
  for (const c of amounts) species[c.amount?.species as string] = c.header;
  unitNotes(f, (c) => (c === time ? ['data', i, 'columns', 'time', 'unit'] : c === T ? ['data', i, 'columns', 'temperature', 'unit'] : c === amounts[0] ? ['data', i, 'unit'] : undefined), todo);
  return { file: f.file, layout: 'run-file', unit: amounts[0].unit, columns: { time: field(time), temperature: field(T), species } };
}

/** The data entries of the skeleton, with notes on columns that are recognised but not used. */
export function skeletonSources(inf: Inference, todo: SkeletonTodo[]): Record<string, unknown>[] {
  const kind = inf.reactor.kind;
  return inf.files.map((f, i) => {
    for (const h of f.unrecognised) todo.push({ path: ['data', i], what: `column '${h}' of ${f.file} was not recognised and is not used` });
    const rep = f.columns.find((c) => c.role === 'replicate');
    if (rep) todo.push({ path: ['data', i], what: `replicate marks in '${rep.header}' are not needed: runs with equal conditions are found as replicates by 'check'` });
    if (inf.layout === 'stacked') return stackedSource(f, kind, i, todo);
    if (inf.layout === 'run-file') return runFileSource(f, i, todo);
    return perRunSource(f, kind, i, todo);
  });
}
