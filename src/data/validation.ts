/**
 * Checks across rows and the validation report: duplicate run ids, reactant outlet above inlet
 * (more than `noiseSigmas` sigma), element balance of runs with every outlet flow measured,
 * replicate groups and the pooled pure-error estimate
 *   s^2 = sum_groups sum_i (y_i - ybar_g)^2 / sum_groups (n_g - 1)
 * (the pure-error sum of squares of the lack-of-fit test; common practice in regression analysis).
 * A Ledger counts rows per source so that rowsIn = rowsUsed + rowsRejected always holds.
 */
import { sumNthPowerDeviations } from 'simple-statistics';
import { RateloomError } from '../core/errors.js';
import type { MappedObservation, MappedRun, RowLocation } from './mapping.js';
import { describeRules, type CheckSettings, type PureError, type Rejection, type ReplicateGroup, type SourceLayout, type SourceSummary, type ValidationReport } from './report.js';
import { checkArgs, is } from '../core/args.js';

/** Row bookkeeping for every source of a study. */
export class Ledger {
  private readonly sources = new Map<string, { layout: SourceLayout; rowsIn: number; rejected: Set<number> }>();
  readonly rejections: Rejection[] = [];
  /** Last file asked about in isRejected and its set of rejected lines (a lookup cache). */
  private lastFile: string | undefined;
  private lastRejected: Set<number> | undefined;

  addSource(file: string, layout: SourceLayout, rowsIn: number): void {
    this.sources.set(file, { layout, rowsIn, rejected: new Set() });
    this.lastFile = undefined;
    this.lastRejected = undefined;
  }

  /** Record problems; each names a row that is then counted as rejected. */
  reject(...problems: Rejection[]): void {
    for (const p of problems) {
      this.rejections.push(p);
      this.sources.get(p.file)?.rejected.add(p.line);
    }
  }

  isRejected(loc: RowLocation): boolean {
    if (loc.file !== this.lastFile) {
      this.lastFile = loc.file;
      this.lastRejected = this.sources.get(loc.file)?.rejected;
    }
    return this.lastRejected !== undefined && this.lastRejected.has(loc.line);
  }

  summaries(): SourceSummary[] {
    return [...this.sources.entries()].map(([file, s]) => ({
      file,
      layout: s.layout,
      rowsIn: s.rowsIn,
      rowsUsed: s.rowsIn - s.rejected.size,
      rowsRejected: s.rejected.size,
    }));
  }
}

/** Relative equality within tol (both zero, or |a - b| <= tol * max(|a|, |b|)); undefined equals undefined only. */
function close(a: number | undefined, b: number | undefined, tol: number): boolean {
  if (a === undefined || b === undefined) return a === b;
  return Math.abs(a - b) <= tol * Math.max(Math.abs(a), Math.abs(b));
}

function closeVec(a: Float64Array | undefined, b: Float64Array | undefined, tol: number): boolean {
  if (!a || !b) return a === b;
  for (let i = 0; i < a.length; i++) if (!close(a[i], b[i], tol)) return false;
  return true;
}

/**
 * Lab runs of a flow reactor whose feed is zero for every species are rejected (out-of-range):
 * nothing flows in, so nothing can be measured at the outlet.
 */
export function rejectZeroFeeds(runs: readonly MappedRun[], kind: string, ledger: Ledger): void {
  if (kind === 'batch' || kind === 'semibatch') return;
  for (const r of runs) {
    if (!r.feed || r.feed.some((f) => f !== 0)) continue;
    ledger.reject({ file: r.location.file, line: r.location.line, reason: 'out-of-range', message: `the feed is zero for every species: a ${kind} run needs a feed` });
  }
}

/** Same conditions within a relative tolerance (temperature, pressure, size, feed, group, ...). */
export function sameConditions(a: MappedRun, b: MappedRun, tol: number): boolean {
  return (
    a.group === b.group &&
    close(a.temperature, b.temperature, tol) &&
    close(a.pressure, b.pressure, tol) &&
    close(a.size, b.size, tol) &&
    close(a.catalystMass, b.catalystMass, tol) &&
    close(a.volumetricFlow, b.volumetricFlow, tol) &&
    close(a.initialVolume, b.initialVolume, tol) &&
    closeVec(a.feed, b.feed, tol) &&
    closeVec(a.initialConcentrations, b.initialConcentrations, tol)
  );
}

/**
 * Merge rows with the same run id: equal conditions add measurements to the first run; different
 * conditions reject the later row. Returns the unique runs in order of first appearance.
 */
export function mergeDuplicateRuns(runs: readonly MappedRun[], ledger: Ledger, tol: number): MappedRun[] {
  const byId = new Map<string, MappedRun>();
  for (const r of runs) {
    const first = byId.get(r.id);
    if (!first) byId.set(r.id, r);
    else if (!sameConditions(first, r, tol)) {
      ledger.reject({
        file: r.location.file,
        line: r.location.line,
        reason: 'duplicate-run',
        message: `run id '${r.id}' was already used at ${first.location.file}:${first.location.line} with different conditions`,
      });
    }
  }
  return [...byId.values()];
}

export interface InletCheckContext {
  kind: string;
  phase: 'gas' | 'liquid';
  /** Per species: net reactant (consumed by some reaction, produced by none, not inert). */
  reactant: readonly boolean[];
  /** Standard deviation of an observation when known (sigma column or fixed error model), SI. */
  sigmaOf: (o: MappedObservation) => number | undefined;
  settings: CheckSettings;
}

/**
 * Outlet above inlet: a reactant's outlet flow (flow reactors), liquid outlet concentration or
 * batch concentration above its inlet (initial) value by more than noiseSigmas sigma, or a
 * conversion below -noiseSigmas sigma. Returns the rejection or undefined.
 */
export function checkAboveInlet(o: MappedObservation, run: MappedRun, ctx: InletCheckContext): Rejection | undefined {
  const k = ctx.settings.noiseSigmas;
  const j = o.speciesIndex;
  if (j === undefined || !ctx.reactant[j]) return undefined;
  const flowReactor = ctx.kind !== 'batch' && ctx.kind !== 'semibatch';
  let inlet: number | undefined;
  if (o.response === 'conversion') {
    const s = ctx.sigmaOf(o) ?? ctx.settings.fallbackRelativeNoise;
    if (o.value < -k * s) {
      return { ...loc(o), reason: 'above-inlet', message: `conversion of ${o.species} is ${fmt(o.value)}, more than ${k} sigma (sigma ${fmt(s)}) below zero: the outlet exceeds the inlet` };
    }
    return undefined;
  }
  if (o.response === 'outlet-flow' && flowReactor) inlet = run.feed?.[j];
  else if (o.response === 'outlet-concentration') {
    if (flowReactor && ctx.phase === 'liquid' && run.feed && run.volumetricFlow) inlet = run.feed[j] / run.volumetricFlow;
    else if (ctx.kind === 'batch') inlet = run.initialConcentrations?.[j];
  }
  if (inlet === undefined) return undefined;
  const s = ctx.sigmaOf(o) ?? ctx.settings.fallbackRelativeNoise * inlet;
  if (o.value > inlet + k * s) {
    return {
      ...loc(o),
      reason: 'above-inlet',
      message: `outlet ${o.response === 'outlet-flow' ? 'flow' : 'concentration'} of reactant ${o.species} (${fmt(o.value)} ${o.unit}) is more than ${k} sigma (sigma ${fmt(s)} ${o.unit}) above its inlet ${fmt(inlet)} ${o.unit}`,
    };
  }
  return undefined;
}

export interface ElementData {
  elements: readonly string[];
  /** nE x nS row-major atom counts. */
  elementMatrix: Float64Array;
  hasFormula: readonly boolean[];
  /** Declared inert species: an unmeasured inert leaves as it came in. */
  inert: readonly boolean[];
}

/**
 * Element balance of one per-run row: needs every species with a formula and every species' outlet
 * flow measured at the outlet (or its liquid outlet concentration with the volumetric flow); an
 * unmeasured inert species is taken to leave as it came in.
 * Rejects when |out_e - in_e| > tolerance * in_e for any element e with in_e > 0.
 */
/** Outlet flows of the row being balanced (reused between calls; the checks are synchronous). */
let balanceScratch = new Float64Array(8);

export function checkElementBalance(run: MappedRun, rowObs: readonly MappedObservation[], chem: ElementData, ctx: Pick<InletCheckContext, 'kind' | 'phase' | 'settings'>): Rejection | undefined {
  const nS = chem.hasFormula.length;
  const nE = chem.elements.length;
  if (nE === 0 || !run.feed || ctx.kind === 'batch' || ctx.kind === 'semibatch') return undefined;
  for (let j = 0; j < nS; j++) if (!chem.hasFormula[j]) return undefined;
  if (balanceScratch.length < nS) balanceScratch = new Float64Array(nS);
  const out = balanceScratch;
  out.fill(NaN, 0, nS);
  for (const o of rowObs) {
    if (o.speciesIndex === undefined || o.position !== undefined) continue;
    if (o.response === 'outlet-flow') out[o.speciesIndex] = o.value;
    else if (o.response === 'outlet-concentration' && ctx.phase === 'liquid' && run.volumetricFlow !== undefined && Number.isNaN(out[o.speciesIndex])) {
      out[o.speciesIndex] = o.value * run.volumetricFlow;
    }
  }
  for (let j = 0; j < nS; j++) if (Number.isNaN(out[j]) && chem.inert[j]) out[j] = run.feed[j];
  for (let j = 0; j < nS; j++) if (Number.isNaN(out[j])) return undefined;
  const tol = ctx.settings.elementBalanceTolerance;
  for (let e = 0; e < nE; e++) {
    let fin = 0;
    let fout = 0;
    for (let j = 0; j < nS; j++) {
      fin += chem.elementMatrix[e * nS + j] * run.feed[j];
      fout += chem.elementMatrix[e * nS + j] * out[j];
    }
    if (fin > 0 && Math.abs(fout - fin) > tol * fin) {
      return {
        file: run.location.file,
        line: run.location.line,
        reason: 'element-balance',
        message: `element ${chem.elements[e]} is off by ${fmt((100 * (fout - fin)) / fin)}% (in ${fmt(fin)} mol/s, out ${fmt(fout)} mol/s; limit ${tol * 100}% of the inlet element flow)`,
      };
    }
  }
  return undefined;
}

/** Scalar keys used to narrow the replicate search before the full comparison. */
const KEYS: ((r: MappedRun) => number)[] = [
  (r) => r.temperature,
  (r) => r.size ?? 0,
  (r) => r.pressure ?? 0,
  (r) => (r.feed ? r.feed.reduce((a, b) => a + b, 0) : 0),
  (r) => (r.initialConcentrations ? r.initialConcentrations.reduce((a, b) => a + b, 0) : 0),
];

/**
 * Stable sort of order[lo, hi) by key (ascending), merge sort with insertion sort below 16
 * elements; `tmp` is scratch of at least hi - lo. For keys without NaN this is exactly the order
 * Array.prototype.sort (stable) gives with the comparator key[a] - key[b]; with a NaN key the
 * range goes through Array.prototype.sort itself so the result stays the same as before.
 */
function sortRange(order: Int32Array, lo: number, hi: number, key: Float64Array, tmp: Int32Array, anyNaN: boolean): void {
  if (anyNaN) {
    const sorted = Array.from(order.subarray(lo, hi)).sort((a, b) => key[a] - key[b]);
    order.set(sorted, lo);
    return;
  }
  if (hi - lo <= 16) {
    for (let i = lo + 1; i < hi; i++) {
      const v = order[i];
      const kv = key[v];
      let j = i - 1;
      while (j >= lo && key[order[j]] > kv) {
        order[j + 1] = order[j];
        j--;
      }
      order[j + 1] = v;
    }
    return;
  }
  const mid = (lo + hi) >>> 1;
  sortRange(order, lo, mid, key, tmp, false);
  sortRange(order, mid, hi, key, tmp, false);
  if (key[order[mid - 1]] <= key[order[mid]]) return; // already in order
  // Merge: left half to tmp, then take the smaller head (left on ties: stable).
  const n = mid - lo;
  for (let i = 0; i < n; i++) tmp[i] = order[lo + i];
  let i = 0;
  let j = mid;
  let o = lo;
  while (i < n && j < hi) order[o++] = key[order[j]] < key[tmp[i]] ? order[j++] : tmp[i++];
  while (i < n) order[o++] = tmp[i++];
}

/**
 * Split order[lo, hi) into chains of runs whose key k differs by at most tol (relative) between
 * sorted neighbours, then recurse on the next key within each chain. Any two runs within tol in
 * every key end up in the same leaf, so comparing pairs only inside leaves finds every replicate
 * pair. `keys[k][i]` is KEYS[k] of run i, computed once; ranges are sorted in place.
 */
function leaves(keys: readonly Float64Array[], nan: readonly boolean[], order: Int32Array, tmp: Int32Array, lo: number, hi: number, k: number, tol: number, out: number[][]): void {
  if (hi - lo < 2) return;
  if (k === keys.length) {
    out.push(Array.from(order.subarray(lo, hi)));
    return;
  }
  const key = keys[k];
  sortRange(order, lo, hi, key, tmp, nan[k]);
  let start = lo;
  for (let i = lo + 1; i < hi; i++) {
    const a = key[order[i - 1]];
    const b = key[order[i]];
    if (!(Math.abs(b - a) <= tol * Math.max(Math.abs(a), Math.abs(b)))) {
      leaves(keys, nan, order, tmp, start, i, k + 1, tol, out);
      start = i;
    }
  }
  leaves(keys, nan, order, tmp, start, hi, k + 1, tol, out);
}

/** Equal numbers as the former string key saw them: 0 equals -0, NaN equals NaN. */
function sameNumber(a: number | undefined, b: number | undefined): boolean {
  return a === b || (a !== a && b !== b);
}

function sameVector(a: Float64Array | undefined, b: Float64Array | undefined): boolean {
  if (!a || !b) return a === b;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!sameNumber(a[i], b[i])) return false;
  return true;
}

/** Exactly the same conditions (group, temperature, pressure, sizes, flows, feed, initial concentrations). */
function exactlySame(a: MappedRun, b: MappedRun): boolean {
  return (
    a.group === b.group &&
    sameNumber(a.temperature, b.temperature) &&
    sameNumber(a.pressure, b.pressure) &&
    sameNumber(a.size, b.size) &&
    sameNumber(a.catalystMass, b.catalystMass) &&
    sameNumber(a.volumetricFlow, b.volumetricFlow) &&
    sameNumber(a.initialVolume, b.initialVolume) &&
    sameVector(a.feed, b.feed) &&
    sameVector(a.initialConcentrations, b.initialConcentrations)
  );
}

const hashWord = new Float64Array(1);
const hashHalves = new Uint32Array(hashWord.buffer);

/** Mix one number into hash h (0 and -0 alike, every NaN alike; undefined as NaN). */
function mixNumber(h: number, x: number | undefined): number {
  hashWord[0] = x === undefined || x !== x ? Number.NaN : x + 0;
  h = Math.imul(h ^ hashHalves[0], 0x85ebca6b);
  return Math.imul(h ^ hashHalves[1], 0xc2b2ae35);
}

/**
 * A 32-bit hash of the conditions that differ most between runs (temperature, size, pressure, the
 * feed): runs with equal conditions (exactlySame) get equal hashes.
 */
function conditionHash(r: MappedRun): number {
  let h = mixNumber(mixNumber(mixNumber(17, r.temperature), r.size), r.pressure);
  const feed = r.feed;
  if (feed) for (let i = 0; i < feed.length; i++) h = mixNumber(h, feed[i]);
  return h;
}

/**
 * One run per distinct exact condition of a leaf; the others are joined to it at once (equal
 * conditions are replicates under any tolerance). The pairwise tolerance comparison then runs
 * over the distinct conditions only, so a leaf of n repeated runs costs O(n) (hashing) instead of
 * O(n^2). Small leaves skip the hashing. Runs are bucketed by a numeric hash of their conditions
 * and compared exactly within a bucket (no key string per run).
 */
function exactRepresentatives(leaf: readonly number[], runs: readonly MappedRun[], union: (a: number, b: number) => void): readonly number[] {
  if (leaf.length <= 32) return leaf;
  const buckets = new Map<number, number | number[]>();
  const reps: number[] = [];
  for (const i of leaf) {
    const h = conditionHash(runs[i]);
    const found = buckets.get(h);
    const list = found === undefined ? undefined : typeof found === 'number' ? [found] : found;
    const first = list?.find((k) => exactlySame(runs[k], runs[i]));
    if (first !== undefined) union(first, i);
    else {
      reps.push(i);
      if (!list) buckets.set(h, i);
      else {
        list.push(i);
        if (typeof found === 'number') buckets.set(h, list);
      }
    }
  }
  return reps;
}

/** Replicate groups: runs with equal conditions within the relative tolerance (two or more runs each). */
export function findReplicates(runs: readonly MappedRun[], tol: number): ReplicateGroup[] {
  const parent = runs.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  const groups: number[][] = [];
  const n = runs.length;
  const nan: boolean[] = [];
  const keys = KEYS.map((key) => {
    const v = new Float64Array(n);
    let anyNaN = false;
    for (let i = 0; i < n; i++) if (Number.isNaN((v[i] = key(runs[i])))) anyNaN = true;
    nan.push(anyNaN);
    return v;
  });
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  leaves(keys, nan, order, new Int32Array(n), 0, n, 0, tol, groups);
  const union = (a: number, b: number): void => {
    parent[find(b)] = find(a);
  };
  for (const leaf of groups) {
    const reps = exactRepresentatives(leaf, runs, union);
    for (let a = 0; a < reps.length; a++) {
      for (let b = a + 1; b < reps.length; b++) {
        if (sameConditions(runs[reps[a]], runs[reps[b]], tol)) union(reps[a], reps[b]);
      }
    }
  }
  // Groups in order of their first run; single runs are no group (no list made for them).
  const size = new Int32Array(runs.length);
  const rootOf = new Int32Array(runs.length);
  for (let i = 0; i < runs.length; i++) size[(rootOf[i] = find(i))]++;
  const byRoot = new Map<number, string[]>();
  for (let i = 0; i < runs.length; i++) {
    const root = rootOf[i];
    if (size[root] < 2) continue;
    const g = byRoot.get(root);
    if (g) g.push(runs[i].id);
    else byRoot.set(root, [runs[i].id]);
  }
  const out: ReplicateGroup[] = [];
  for (const ids of byRoot.values()) if (ids.length > 1) out.push({ id: `rep${out.length + 1}`, runIds: ids });
  return out;
}

/** Index of the observation's (response, species) in `keys` ('response|species'), added when new. */
function responseIndex(index: Map<string, Map<string, number>>, keys: string[], o: MappedObservation): number {
  const sp = o.species ?? '';
  let bySpecies = index.get(o.response);
  if (!bySpecies) {
    bySpecies = new Map();
    index.set(o.response, bySpecies);
  }
  let ri = bySpecies.get(sp);
  if (ri === undefined) {
    ri = keys.length;
    keys.push(`${o.response}|${sp}`);
    bySpecies.set(sp, ri);
  }
  return ri;
}

/**
 * Pooled pure error per response (and species): observations of the same response at the same
 * position in runs of one replicate group (or repeated rows of one run) are replicates.
 */
export function pureErrors(observations: readonly MappedObservation[], groups: readonly ReplicateGroup[]): PureError[] {
  const groupOf = new Map<string, string>();
  for (const g of groups) for (const id of g.runIds) groupOf.set(id, g.id);
  // A cell is (group or 'run:<id>', response, species, position). Species names hold no '|'
  // (schema pattern), so these keys match the former flat key `${group}|${response}|${species}|${position}`
  // exactly; cells are pooled in their order of first use (which fixes the order of the sums).
  // A cell seen once is only the index of its observation (no object per cell); a second value
  // makes it a Cell, remembering that index as its order of first use.
  type Cell = { key: string; o: MappedObservation; order: number; values: number[] };
  type Slot = number | Cell | undefined;
  const repeated: Cell[] = [];
  const respIndex = new Map<string, Map<string, number>>(); // response -> species -> index
  const respKeys: string[] = [];
  // Cells (no position) by response index, of each replicate group and of each run in none (two
  // maps: no 'run:<id>' string is made per run).
  const outletOfGroup = new Map<string, Slot[]>();
  const outletOfRun = new Map<string, Slot[]>();
  const profile = new Map<string, Slot>(); // `${group}|${respKey}|${position}` -> cell
  // Neighbouring observations usually share a run: its group and cells are looked up once.
  let lastRun: string | undefined;
  let group: string | undefined;
  let slots: Slot[] = [];
  for (let k = 0; k < observations.length; k++) {
    const o = observations[k];
    if (o.runId !== lastRun) {
      lastRun = o.runId;
      group = groupOf.get(o.runId);
      const outlet = group === undefined ? outletOfRun : outletOfGroup;
      const found = outlet.get(group ?? o.runId);
      if (found) slots = found;
      else outlet.set(group ?? o.runId, (slots = []));
    }
    const ri = responseIndex(respIndex, respKeys, o);
    let profileKey = '';
    let c: Slot;
    if (o.position === undefined) c = slots[ri];
    else {
      profileKey = `${group ?? `run:${o.runId}`}|${respKeys[ri]}|${o.position.toPrecision(9)}`;
      c = profile.get(profileKey);
    }
    if (c === undefined) {
      if (o.position !== undefined) profile.set(profileKey, k);
      else {
        while (slots.length < ri) slots.push(undefined);
        slots[ri] = k;
      }
    } else if (typeof c === 'number') {
      const cell: Cell = { key: respKeys[ri], o: observations[c], order: c, values: [observations[c].value, o.value] };
      repeated.push(cell);
      if (o.position === undefined) slots[ri] = cell;
      else profile.set(profileKey, cell);
    } else c.values.push(o.value);
  }
  repeated.sort((a, b) => a.order - b.order);
  const pooled = new Map<string, PureError>();
  for (const c of repeated) {
    // sum of squared deviations from the replicate mean (simple-statistics; compensated mean)
    const ss = sumNthPowerDeviations(c.values, 2);
    const p = pooled.get(c.key) ?? { response: c.o.response, ...(c.o.species !== undefined ? { species: c.o.species } : {}), unit: c.o.unit, sumSquares: 0, dof: 0, sigma: 0 };
    p.sumSquares += ss;
    p.dof += c.values.length - 1;
    pooled.set(c.key, p);
  }
  return [...pooled.values()].map((p) => ({ ...p, sigma: Math.sqrt(p.sumSquares / p.dof) }));
}

/** Assemble the report; rejections sorted by file and line. */
export function buildReport(ledger: Ledger, replicateGroups: ReplicateGroup[], pureError: PureError[], settings: CheckSettings): ValidationReport {
  const sources = ledger.summaries();
  const rejections = [...ledger.rejections].sort((a, b) => (a.file === b.file ? a.line - b.line : a.file < b.file ? -1 : 1));
  return {
    sources,
    rowsIn: sources.reduce((a, s) => a + s.rowsIn, 0),
    rowsUsed: sources.reduce((a, s) => a + s.rowsUsed, 0),
    rowsRejected: sources.reduce((a, s) => a + s.rowsRejected, 0),
    rejections,
    rules: describeRules(settings),
    replicateGroups,
    pureError,
    settings,
  };
}

/** Format one rejection as 'file:line:column: reason: message'. */
export function formatRejection(r: Rejection): string {
  checkArgs('formatRejection', [r], [{ name: 'r', check: is.object }]);
  return `${r.file}:${r.line}${r.column !== undefined ? `:${r.column}` : ''}: ${r.reason}: ${r.message}`;
}

/** Strict mode: any rejected row is an error listing all of them. */
export function assertNoRejections(report: ValidationReport): void {
  if (report.rowsRejected === 0) return;
  const list = report.rejections.map(formatRejection);
  throw new RateloomError('E_DATA', `${report.rowsRejected} data row(s) rejected in strict mode:\n  ${list.join('\n  ')}`, {
    location: { file: report.rejections[0].file, line: report.rejections[0].line, ...(report.rejections[0].column ? { column: report.rejections[0].column } : {}) },
    fix: 'Correct or remove the rows listed, or run without --strict to skip them.',
    details: { rejections: report.rejections },
  });
}

function loc(o: MappedObservation): Pick<Rejection, 'file' | 'line' | 'column'> {
  return { file: o.location.file, line: o.location.line, ...(o.location.column !== undefined ? { column: o.location.column } : {}) };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
