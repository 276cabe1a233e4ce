/**
 * What a lab CSV (or one CSV per run) says about the study behind it: the layout (wide per-run,
 * stacked with a species column, one file per run), the species and which side each is given on,
 * the reactor kind and phase the columns suggest, and the units of every column (from the header,
 * from a comment line such as '# flows in mmol/min', else SI with a note to edit). A file in which
 * nothing needed is recognised is refused with a list of what was found and what is missing.
 */
import { RateloomError } from '../core/errors.js';
import { readCsv, type CsvTable } from '../data/csv.js';
import type { Phase, ReactorKind } from '../reactors/types.js';
import { siUnit, type Quantity } from '../units/index.js';
import { ROLE_QUANTITY, recogniseColumn, unitHints, type AmountKind, type ColumnRole, type RecognisedColumn } from './header.js';

/** One CSV file handed to the skeleton: its path as the study will name it, and its text. */
export interface SkeletonFile {
  file: string;
  text: string;
}

export type SkeletonLayout = 'per-run' | 'stacked' | 'run-file';

/** A column with the unit the study will use and where that unit came from. */
export interface UnitedColumn extends RecognisedColumn {
  unit: string;
  unitFrom: 'header' | 'comment' | 'default';
}

/** One file as read. */
export interface ReadFile {
  file: string;
  table: CsvTable;
  columns: UnitedColumn[];
  unrecognised: string[];
}

export interface Inference {
  layout: SkeletonLayout;
  files: ReadFile[];
  species: string[];
  /** Species given on the inlet side with some value above zero. */
  fed: Set<string>;
  /** Species with a measured outlet column (or rows). */
  measured: Set<string>;
  reactor: { kind: ReactorKind; phase: Phase; inferred: boolean; why: string };
  /** Distinct temperatures in the data (for deciding whether an activation energy can be fitted). */
  temperatures: number;
}

const AMOUNT_QUANTITY: Record<AmountKind, Quantity> = { 'molar-flow': 'molar-flow', concentration: 'concentration', fraction: 'dimensionless' };

function quantityOf(c: RecognisedColumn): Quantity | undefined {
  return c.role === 'amount' && c.amount ? AMOUNT_QUANTITY[c.amount.kind] : ROLE_QUANTITY[c.role];
}

/** Comment lines ('# ...') of a CSV text, without the '#'. */
function commentLines(text: string): string[] {
  return text.split(/\r?\n/).filter((l) => l.trimStart().startsWith('#')).map((l) => l.trimStart().slice(1).trim());
}

/** Read one file and recognise its columns, giving each its unit. */
export function readSkeletonFile(f: SkeletonFile): ReadFile {
  const table = readCsv(f.text, f.file);
  const hints = unitHints(commentLines(f.text));
  const columns: UnitedColumn[] = [];
  const unrecognised: string[] = [];
  for (const h of table.header) {
    const c = recogniseColumn(h);
    if (!c) {
      unrecognised.push(h);
      continue;
    }
    const q = quantityOf(c);
    if (c.unit !== undefined) columns.push({ ...c, unit: c.unit, unitFrom: 'header' });
    else if (q && hints.has(q)) columns.push({ ...c, unit: hints.get(q) as string, unitFrom: 'comment' });
    else columns.push({ ...c, unit: q === 'dimensionless' ? '1' : q ? siUnit(q) : '', unitFrom: q ? 'default' : 'header' });
  }
  return { file: f.file, table, columns, unrecognised };
}

const has = (f: ReadFile, role: ColumnRole) => f.columns.some((c) => c.role === role);

/** Refuse a file set where the essentials are missing, listing what was found and what is missing. */
function requireEssentials(files: ReadFile[], layout: SkeletonLayout): void {
  const missing: string[] = [];
  const first = files[0];
  if (!has(first, 'temperature')) missing.push("a temperature column (for example 'T [degC]' or 'T_K')");
  if (layout === 'per-run' && !has(first, 'run')) missing.push("a run id column ('run'), or one file per run with a time column");
  if (!first.columns.some((c) => c.role === 'amount')) missing.push("amounts per species (for example 'F_A,in (mol/min)', 'F_A,out (mol/min)', 'C_A [mol/L]'), or a species column with 'C_in'/'C_out'");
  if (layout === 'stacked' && !first.columns.some((c) => c.role === 'amount' && c.amount?.side === 'out')) missing.push("a measured outlet column ('F_out' or 'C_out')");
  if (!missing.length) return;
  const found = first.columns.map((c) => `'${c.header}' (${c.role === 'amount' ? `${c.amount?.kind}${c.amount?.species ? ` of ${c.amount.species}` : ''}, ${c.amount?.side}` : c.role})`);
  throw new RateloomError('E_COLUMNS', `${first.file}: cannot make a study from this header. Found: ${found.length ? found.join(', ') : 'nothing recognisable'}${first.unrecognised.length ? `; not recognised: ${first.unrecognised.map((h) => `'${h}'`).join(', ')}` : ''}. Missing: ${missing.join('; ')}. Nothing was written`, {
    location: { file: first.file, line: first.table.headerLine },
    details: { found: first.columns.map((c) => ({ header: c.header, role: c.role, ...(c.amount ? { amount: c.amount } : {}) })), unrecognised: first.unrecognised, missing },
  });
}

/** Numbers of a column over the rows (unreadable cells skipped). */
export function columnNumbers(f: ReadFile, header: string): number[] {
  const k = f.table.header.indexOf(header);
  const out: number[] = [];
  for (const r of f.table.rows) {
    const x = Number((r.cells[k] ?? '').trim());
    if ((r.cells[k] ?? '').trim() !== '' && Number.isFinite(x)) out.push(x);
  }
  return out;
}

/** Species, which are fed and which measured, for a wide or run-file layout. */
function wideSpecies(files: ReadFile[], layout: SkeletonLayout): Pick<Inference, 'species' | 'fed' | 'measured'> {
  const species: string[] = [];
  const fed = new Set<string>();
  const measured = new Set<string>();
  for (const f of files) {
    const rows = layout === 'run-file' ? [f.table.rows[0]] : f.table.rows; // run-file: the first (time-0) row is the feed
    for (const c of f.columns) {
      const sp = c.amount?.species;
      if (!sp) continue;
      if (!species.includes(sp)) species.push(sp);
      const k = f.table.header.indexOf(c.header);
      if (layout === 'run-file') {
        if (rows.some((r) => Number(r?.cells[k]) > 0)) fed.add(sp);
        measured.add(sp);
      } else if (c.amount?.side === 'in') {
        if (rows.some((r) => Number(r.cells[k]) > 0)) fed.add(sp);
      } else measured.add(sp);
    }
  }
  return { species, fed, measured };
}

/** Species of a stacked file from its species column; fed = a positive inlet cell, measured = an outlet cell. */
function stackedSpecies(f: ReadFile): Pick<Inference, 'species' | 'fed' | 'measured'> {
  const col = (pred: (c: UnitedColumn) => boolean) => f.table.header.indexOf(f.columns.find(pred)?.header ?? '\u0000');
  const ks = col((c) => c.role === 'species');
  const kin = col((c) => c.role === 'amount' && c.amount?.side === 'in');
  const kout = col((c) => c.role === 'amount' && c.amount?.side === 'out');
  const species: string[] = [];
  const fed = new Set<string>();
  const measured = new Set<string>();
  for (const r of f.table.rows) {
    const sp = (r.cells[ks] ?? '').trim();
    if (!/^[A-Za-z][A-Za-z0-9_]*$/.test(sp)) continue;
    if (!species.includes(sp)) species.push(sp);
    if (kin >= 0 && Number(r.cells[kin]) > 0) fed.add(sp);
    if (kout >= 0 && (r.cells[kout] ?? '').trim() !== '') measured.add(sp);
  }
  return { species, fed, measured };
}

/** Reactor kind and phase from the columns (or the caller's choice). */
function guessReactor(f: ReadFile, layout: SkeletonLayout, given: { kind?: ReactorKind; phase?: Phase }): Inference['reactor'] {
  const kinds = new Set(f.columns.map((c) => c.amount?.kind));
  const gasLike = has(f, 'pressure') && (kinds.has('molar-flow') || kinds.has('fraction'));
  const phase: Phase = given.phase ?? (gasLike ? 'gas' : kinds.has('concentration') ? 'liquid' : has(f, 'pressure') ? 'gas' : 'liquid');
  let kind: ReactorKind;
  let why: string;
  if (has(f, 'catalystMass')) [kind, why] = ['packed-bed', 'a catalyst mass column'];
  else if (layout === 'run-file' || (has(f, 'time') && !has(f, 'volumetricFlow') && !kinds.has('molar-flow'))) [kind, why] = ['batch', 'samples over time without a flow'];
  else if (phase === 'liquid') [kind, why] = ['stirred-tank', 'a volume and a liquid flow (a plug-flow tube is the other choice)'];
  else [kind, why] = ['plug-flow', 'a volume and a gas flow (a stirred tank is the other choice)'];
  if (given.kind) return { kind: given.kind, phase, inferred: false, why: 'given with --reactor' };
  return { kind, phase, inferred: true, why };
}

/** Read the files and infer the layout, species, reactor and units. */
export function inferStudy(input: readonly SkeletonFile[], given: { kind?: ReactorKind; phase?: Phase } = {}): Inference {
  if (!input.length) throw new RateloomError('E_USAGE', 'no CSV file given');
  const files = input.map(readSkeletonFile);
  const first = files[0];
  const layout: SkeletonLayout = has(first, 'species') ? 'stacked' : files.length > 1 || (!has(first, 'run') && has(first, 'time')) ? 'run-file' : 'per-run';
  requireEssentials(files, layout);
  const sp = layout === 'stacked' ? stackedSpecies(first) : wideSpecies(files, layout);
  if (sp.species.length < 2) {
    throw new RateloomError('E_COLUMNS', `${first.file}: found ${sp.species.length ? `only the species ${sp.species.join(', ')}` : 'no species'}; a reaction needs at least two; nothing was written`, { location: { file: first.file, line: first.table.headerLine } });
  }
  const temps = new Set<number>();
  for (const f of files) {
    const T = f.columns.find((c) => c.role === 'temperature');
    if (T) for (const x of columnNumbers(f, T.header)) temps.add(x);
  }
  return { layout, files, ...sp, reactor: guessReactor(first, layout, given), temperatures: temps.size };
}
