/**
 * Typed input errors. rateloom throws only for bad input; numerical trouble is reported as a
 * `status` on a result (see outcome.ts). Every error carries a stable `code`, a `path` to the
 * offending field (JSON-pointer-like segments), an optional file location, and a `fix` that tells
 * the user what to change. The default fix text for each code lives in this one module.
 */

/** Stable error codes with the default advice shown when the thrower gives none. */
export const ERROR_CODES = {
  E_USAGE: 'Check the command line; run the command with --help for an example.',
  E_FILE: 'Check that the file exists and is readable.',
  E_EXISTS: 'Choose another output path or pass --force to overwrite.',
  E_JSON: 'Fix the JSON syntax at the position given.',
  E_SCHEMA: 'Correct the field so it matches the study-file schema (schema/study.schema.json).',
  E_UNKNOWN_FIELD: 'Remove the field or correct its spelling.',
  E_MISSING_FIELD: 'Add the required field.',
  E_TYPE: 'Give the field a value of the expected type.',
  E_VALUE: 'Give the field a value inside its allowed range.',
  E_UNIT: 'Use one of the supported units for this quantity.',
  E_FORMULA: 'Write the formula as element symbols with counts, for example C2H6O.',
  E_EQUATION: "Write the reaction as 'A + 2 B <=> C' (reversible) or 'A -> B' (irreversible).",
  E_UNBALANCED: 'Correct the stoichiometric coefficients or the species formulas.',
  E_UNKNOWN_SPECIES: 'Declare the species in the species list or correct its name.',
  E_UNKNOWN_PARAMETER: 'Declare the parameter in the parameters list or correct its name.',
  E_ORDER: 'Use a non-negative order for a species whose concentration can reach zero.',
  E_EXPRESSION: 'Correct the rate expression; only arithmetic, ^, and whitelisted functions are allowed.',
  E_CSV: 'Correct the CSV cell or row named in the message.',
  E_DATA: 'Correct or remove the data named in the message.',
  E_CASE: 'Correct the production case file.',
  E_HANDOFF_UNTRUSTED: 'Fit again until the verdict is trustworthy and size the hand-off it writes, unchanged; or pass --accept-untrustworthy to size it anyway.',
  E_COLUMNS: 'Name the columns as lab exports usually do (run, T [degC], P [bar], W [g], F_A,in (mol/min), C_A [mol/L], ...), or write the study file by hand (schema/study.schema.json).',
  E_INTERNAL: 'This is a rateloom bug; please report it with the input that caused it.',
} as const;

export type ErrorCode = keyof typeof ERROR_CODES;

/** Where in a file the bad input sits (all 1-based). */
export interface ErrorLocation {
  file?: string;
  line?: number;
  column?: number | string;
}

export type FieldPath = ReadonlyArray<string | number>;

export interface RateloomErrorInit {
  /** Path to the offending field, for example ['reactions', 0, 'rate', 'orders', 'A']. */
  path?: FieldPath;
  /** What the user should change; defaults to the advice of the code. */
  fix?: string;
  location?: ErrorLocation;
  /** Machine-readable extras (for example the closest valid name). */
  details?: Record<string, unknown>;
}

/** Format a field path as a readable string: reactions[0].rate.orders.A */
export function formatPath(path: FieldPath): string {
  let s = '';
  for (const seg of path) {
    if (typeof seg === 'number') s += `[${seg}]`;
    else s += s === '' ? seg : `.${seg}`;
  }
  return s;
}

function formatLocation(loc?: ErrorLocation): string {
  if (!loc) return '';
  const parts: string[] = [];
  if (loc.file) parts.push(loc.file);
  if (loc.line !== undefined) parts.push(`line ${loc.line}`);
  if (loc.column !== undefined) parts.push(`column ${loc.column}`);
  return parts.join(', ');
}

/** The one error class rateloom throws for bad input. */
export class RateloomError extends Error {
  readonly code: ErrorCode;
  readonly path: FieldPath;
  readonly fix: string;
  readonly location?: ErrorLocation;
  readonly details?: Record<string, unknown>;
  /** The problem alone, without location or fix. */
  readonly problem: string;

  constructor(code: ErrorCode, problem: string, init: RateloomErrorInit = {}) {
    const path = init.path ?? [];
    const fix = init.fix ?? ERROR_CODES[code];
    const where = [formatLocation(init.location), path.length ? formatPath(path) : '']
      .filter(Boolean)
      .join(': ');
    super(`${where ? where + ': ' : ''}${problem}. Fix: ${fix}`);
    this.name = 'RateloomError';
    this.code = code;
    this.path = path;
    this.fix = fix;
    this.problem = problem;
    if (init.location) this.location = init.location;
    if (init.details) this.details = init.details;
  }

  /** A plain object for --json output. */
  toJSON(): Record<string, unknown> {
    return {
      code: this.code,
      message: this.message,
      problem: this.problem,
      fix: this.fix,
      path: formatPath(this.path),
      ...(this.location ? { location: this.location } : {}),
      ...(this.details ? { details: this.details } : {}),
    };
  }
}

/**
 * A broken invariant inside rateloom (a bug, never bad input): thrown where the code's own
 * assumptions fail. It carries the stable code E_INTERNAL so the commands report it like any other
 * error (exit 2, with the advice to report the bug); user input errors stay RateloomError.
 */
export class InternalError extends Error {
  readonly code = 'E_INTERNAL' as const;

  constructor(problem: string) {
    super(`internal: ${problem}`);
    this.name = 'InternalError';
  }
}

export function isRateloomError(e: unknown): e is RateloomError {
  return e instanceof RateloomError;
}

/** Edit distance, used to suggest the closest valid name for a misspelt field or species. */
export function levenshtein(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  let prev = new Array<number>(n + 1);
  let cur = new Array<number>(n + 1);
  for (let j = 0; j <= n; j++) prev[j] = j;
  for (let i = 1; i <= m; i++) {
    cur[0] = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
    }
    [prev, cur] = [cur, prev];
  }
  return prev[n];
}

/** The closest candidate to `name` (case-insensitive), or undefined when nothing is close. */
export function closestName(name: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  const lower = name.toLowerCase();
  for (const c of candidates) {
    const d = levenshtein(lower, c.toLowerCase());
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  if (best === undefined) return undefined;
  return bestD <= Math.max(2, Math.floor(name.length / 3)) ? best : undefined;
}
