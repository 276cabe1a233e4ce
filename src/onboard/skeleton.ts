/**
 * A study skeleton from lab CSV files: species, a reaction line and a power-law rate per reaction
 * (from the caller, else clearly marked placeholders), the lab reactor, the data mapping with units
 * and open ('auto') start values, written so that it loads as written. Everything the skeleton
 * could not infer is listed in the study's `todo` and returned with the line of the file to edit.
 * The text is checked by loading it (rateloom's own loader) before it is returned.
 */
import { dirname, resolve } from 'node:path';
import { RateloomError, formatPath, isRateloomError, type FieldPath } from '../core/errors.js';
import { parseEquation } from '../chemistry/equation.js';
import { parseFormula } from '../chemistry/formula.js';
import type { Phase, ReactorKind } from '../reactors/types.js';
import { loadStudy } from '../study/load.js';
import { locatePath } from '../study/locate.js';
import { inferStudy, type Inference, type SkeletonFile } from './infer.js';
import { equilibriumConstantUnit, rateConstantUnit, type UserUnits } from './rate-units.js';
import { skeletonSources, type SkeletonTodo } from './sources.js';
import { checkArgs, is } from '../core/args.js';

/** Choices the caller makes instead of the skeleton's guesses. */
export interface SkeletonOptions {
  /** Path the study will be written to; data paths are relative to its folder. */
  studyPath: string;
  /** Lab reactor kind. Default: inferred from the columns (listed to check). */
  reactor?: ReactorKind;
  /** Phase. Default: gas when a pressure and molar flows are given, else liquid. */
  phase?: Phase;
  /** Reaction equations ('A + B -> C', 'A <=> B'). Default: one guessed from the fed and formed species (a placeholder). */
  reactions?: string[];
  /** Power-law orders per reaction, 'A^1 B^0.5' (or 'A:1, B:0.5'). Default: order 1 in the first reactant (a placeholder). */
  rates?: string[];
}

/** A to-do entry with the 1-based line of the study text where it applies. */
export interface LocatedTodo extends SkeletonTodo {
  line?: number;
}

export interface StudySkeleton {
  /** The study file's text (JSON, 2-space indent, ending with a newline). */
  text: string;
  layout: Inference['layout'];
  reactor: Inference['reactor'];
  species: string[];
  /** What the skeleton could not infer, with where to edit it. */
  todo: LocatedTodo[];
  /** Per file: every recognised column with its role and unit, and the unrecognised ones. */
  columns: { file: string; recognised: { header: string; role: string; unit: string; unitFrom: string }[]; unrecognised: string[] }[];
  /** Runs and observations the loader read from the files through the skeleton. */
  runs: number;
  observations: number;
}

/** Element symbols a species name may be read as a formula from (common in reaction engineering; 'B' or 'Ac' are more often labels). */
const FORMULA_ELEMENTS = new Set(['C', 'H', 'O', 'N', 'S', 'Cl', 'F', 'Br', 'I', 'P', 'Ar', 'He', 'Ne', 'Kr', 'Xe']);
const INERT_NAMES = /^(N2|Ar|He|inert|Inert|I)$/;

/** The formula a species name spells, when it is a plausible one (two characters or more, common elements). */
function formulaFromName(name: string): string | undefined {
  if (name.length < 2) return undefined;
  try {
    const f = parseFormula(name);
    return Object.keys(f.counts).every((e) => FORMULA_ELEMENTS.has(e)) ? name : undefined;
  } catch {
    return undefined;
  }
}

/** Reaction equations: the caller's, else a guess (fed, non-inert species -> formed species). */
function equations(inf: Inference, opts: SkeletonOptions, inert: Set<string>, todo: SkeletonTodo[]): string[] {
  if (opts.reactions?.length) return opts.reactions;
  const reactants = inf.species.filter((s) => inf.fed.has(s) && !inert.has(s));
  const products = inf.species.filter((s) => !inf.fed.has(s) && !inert.has(s));
  const eq = reactants.length && products.length ? `${reactants.join(' + ')} -> ${products.join(' + ')}` : `${inf.species[0]} -> ${inf.species[1]}`;
  todo.push({ path: ['reactions', 0, 'equation'], what: `PLACEHOLDER reaction '${eq}' guessed from the fed and formed species: write the real equation(s) (or pass --reaction)` });
  return [eq];
}

/** Orders from 'A^1 B^0.5', 'A:1, B:0.5' or 'A*B^0.5' (order 1 when none is written). */
export function parseOrders(text: string, path: FieldPath): Record<string, number> {
  checkArgs('parseOrders', [text, path], [{ name: 'text', check: is.text }, { name: 'path', check: is.list(is.key) }]);
  const orders: Record<string, number> = {};
  for (const tok of text.split(/[\s,*]+/).filter((t) => t !== '')) {
    const m = /^(?:C_)?([A-Za-z][A-Za-z0-9_]*)(?:[:^]([-+]?\d*\.?\d+))?$/.exec(tok);
    if (!m) throw new RateloomError('E_USAGE', `cannot read the order '${tok}' in '${text}'`, { path, fix: "Write the orders as 'A^1 B^0.5' (species and order)." });
    orders[m[1]] = m[2] !== undefined ? Number(m[2]) : 1;
  }
  return orders;
}

/** The units the rate constants are written in, from the user's columns. */
function userUnits(inf: Inference): UserUnits {
  const cols = inf.files.flatMap((f) => f.columns);
  const unitOf = (pred: (c: (typeof cols)[number]) => boolean) => cols.find(pred)?.unit ?? '';
  const conc = unitOf((c) => c.amount?.kind === 'concentration');
  const mass = unitOf((c) => c.role === 'catalystMass');
  const flow = unitOf((c) => c.amount?.kind === 'molar-flow') || unitOf((c) => c.role === 'volumetricFlow') || unitOf((c) => c.role === 'time');
  const time = /\/\s*h$|^h$/.test(flow) ? 'h' : /min$/.test(flow) ? 'min' : 's';
  return { volume: /L$/.test(conc) ? 'L' : 'm3', mass: mass === 'g' || mass === 'mg' ? mass : 'kg', time };
}

/** Reactions with power-law rates and their parameters. */
function reactionsAndParameters(inf: Inference, opts: SkeletonOptions, eqs: string[], todo: SkeletonTodo[]) {
  const basis = inf.reactor.kind === 'packed-bed' ? 'mass' : 'volume';
  const units = userUnits(inf);
  const withE = inf.temperatures > 1;
  if (!withE) todo.push({ path: ['parameters'], what: 'one temperature in the data: no activation energy is fitted (add one when runs at other temperatures come)' });
  const reactions: Record<string, unknown>[] = [];
  const parameters: Record<string, unknown>[] = [];
  eqs.forEach((eq, i) => {
    const parsed = parseEquation(eq, undefined, ['reactions', i, 'equation']);
    const given = opts.rates?.[i];
    const orders = given !== undefined ? parseOrders(given, ['reactions', i, 'rate', 'orders']) : undefined;
    if (given === undefined) todo.push({ path: ['reactions', i, 'rate'], what: `PLACEHOLDER rate law: power law with the stoichiometric coefficients as orders (elementary); write the orders of your rate law as "orders": {"A": 1, "B": 0.5} (or pass --rate), and the unit of k${i + 1} to match` });
    const n = orders ? Object.values(orders).reduce((a, b) => a + b, 0) : parsed.reactants.reduce((a, t) => a + t.coefficient, 0);
    const id = `r${i + 1}`;
    const rate: Record<string, unknown> = { form: parsed.reversible ? 'reversible-power-law' : 'power-law', basis, rateConstant: { k: `k${i + 1}`, ...(withE ? { activationEnergy: `E${i + 1}` } : {}) } };
    if (parsed.reversible) rate.equilibriumConstant = { K: `K${i + 1}` };
    if (orders) rate.orders = orders;
    reactions.push({ id, equation: eq, rate });
    parameters.push({ name: `k${i + 1}`, value: 'auto', unit: rateConstantUnit(n, basis, units), description: `rate constant of ${id} at the reference temperature (start estimated from the data)` });
    if (withE) parameters.push({ name: `E${i + 1}`, value: 'auto', unit: 'kJ/mol', lower: 0, upper: 400, description: `activation energy of ${id}` });
    if (parsed.reversible) {
      const delta = parsed.products.reduce((a, t) => a + t.coefficient, 0) - parsed.reactants.reduce((a, t) => a + t.coefficient, 0);
      parameters.push({ name: `K${i + 1}`, value: 'auto', unit: equilibriumConstantUnit(delta, units), lower: 1e-8, upper: 1e8, description: `equilibrium constant of ${id} (concentration basis), taken independent of temperature` });
    }
  });
  return { reactions, parameters };
}

/** Species entries: every species of the data and the equations, formulas where the name spells one. */
function speciesEntries(inf: Inference, eqs: string[], inert: Set<string>, todo: SkeletonTodo[]): Record<string, unknown>[] {
  const names = [...inf.species];
  for (const eq of eqs) for (const t of [...parseEquation(eq).reactants, ...parseEquation(eq).products]) if (!names.includes(t.species)) names.push(t.species);
  const inEquations = new Set(eqs.flatMap((eq) => [...parseEquation(eq).reactants, ...parseEquation(eq).products].map((t) => t.species)));
  const out = names.map((name) => {
    const formula = formulaFromName(name);
    return { name, ...(formula ? { formula } : {}), ...(inert.has(name) || !inEquations.has(name) ? { inert: true } : {}) };
  });
  const without = out.filter((s) => !('formula' in s)).map((s) => s.name);
  if (without.length) todo.push({ path: ['species'], what: `no formula for ${without.join(', ')}: add "formula" to check element balances` });
  return out;
}

/** The study object and its to-do list. */
function buildStudy(inf: Inference, opts: SkeletonOptions): { study: Record<string, unknown>; todo: SkeletonTodo[] } {
  const todo: SkeletonTodo[] = [];
  const inert = new Set(inf.species.filter((s) => inf.fed.has(s) && (!inf.measured.has(s) || INERT_NAMES.test(s)) && !opts.reactions?.some((eq) => eq.includes(s))));
  const eqs = equations(inf, opts, inert, todo);
  const species = speciesEntries(inf, eqs, inert, todo);
  const { reactions, parameters } = reactionsAndParameters(inf, opts, eqs, todo);
  if (inf.reactor.inferred) todo.push({ path: ['reactor', 'kind'], what: `reactor '${inf.reactor.kind}' (${inf.reactor.phase}) inferred from ${inf.reactor.why}; check it (or pass --reactor)` });
  const data = skeletonSources(inf, todo);
  todo.push({ path: ['errorModels'], what: 'no error model: every response is weighted equally and sigma is estimated from the residuals; give your instruments\' precision here for a chi-square check' });
  const files = inf.files.map((f) => f.file).join(', ');
  const study: Record<string, unknown> = {
    $schema: 'https://rateloom.dev/schema/study.schema.json',
    title: `Study from ${files}`,
    description: `Skeleton written by 'rateloom new' from ${files}. Edit the entries listed under 'todo', then delete them.`,
    todo: [] as string[],
    species,
    reactions,
    reactor: { kind: inf.reactor.kind, phase: inf.reactor.phase },
    data,
    parameters,
    errorModels: {},
  };
  study.todo = todo.map((t) => `${formatPath(t.path)}: ${t.what}`);
  return { study, todo };
}

/** Load the text with rateloom's loader; the files are served from memory. */
function loadsAsWritten(text: string, files: readonly SkeletonFile[], studyPath: string) {
  const byAbs = new Map(files.map((f) => [resolve(dirname(studyPath), f.file), f.text]));
  return loadStudy(text, studyPath, (abs) => {
    const t = byAbs.get(resolve(abs));
    if (t === undefined) throw new RateloomError('E_FILE', `data file '${abs}' is not among the files given`);
    return t;
  });
}

/**
 * Make a study skeleton from lab CSV files. Throws RateloomError E_COLUMNS (with what was found
 * and what is missing) when the files cannot make a study; nothing is written by this function.
 */
export function studySkeleton(files: readonly SkeletonFile[], opts: SkeletonOptions): StudySkeleton {
  const inf = inferStudy(files, { ...(opts.reactor ? { kind: opts.reactor } : {}), ...(opts.phase ? { phase: opts.phase } : {}) });
  const { study, todo } = buildStudy(inf, opts);
  let text = `${JSON.stringify(study, null, 2)}\n`;
  let loaded;
  try {
    loaded = loadsAsWritten(text, files, opts.studyPath);
  } catch (e) {
    if (!isRateloomError(e) || e.code !== 'E_UNBALANCED') throw e;
    // Formulas read from names do not balance the equation: leave them out, and say so.
    for (const s of study.species as Record<string, unknown>[]) delete s.formula;
    todo.push({ path: ['species'], what: 'formulas read from the species names do not balance the reaction; they were left out' });
    study.todo = todo.map((t) => `${formatPath(t.path)}: ${t.what}`);
    text = `${JSON.stringify(study, null, 2)}\n`;
    loaded = loadsAsWritten(text, files, opts.studyPath);
  }
  const located = todo.map((t) => ({ ...t, ...(locatePath(text, t.path) ? { line: locatePath(text, t.path)?.line } : {}) }));
  return {
    text,
    layout: inf.layout,
    reactor: inf.reactor,
    species: (study.species as { name: string }[]).map((s) => s.name),
    todo: located,
    columns: inf.files.map((f) => ({ file: f.file, recognised: f.columns.map((c) => ({ header: c.header, role: c.role === 'amount' ? `${c.amount?.kind}${c.amount?.species ? ` of ${c.amount.species}` : ''} (${c.amount?.side})` : c.role, unit: c.unit, unitFrom: c.unitFrom })), unrecognised: f.unrecognised })),
    runs: loaded.study.runs.length,
    observations: loaded.study.observations.length,
  };
}
