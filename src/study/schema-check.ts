/**
 * A small JSON Schema (draft 2020-12 subset) checker driven by schema/study.schema.json, so the
 * file editors use and the loader's checks are one and the same. Supported keywords: type, enum,
 * const, properties, required, additionalProperties (false or a schema), items, minItems, minimum,
 * exclusiveMinimum, exclusiveMaximum, pattern, oneOf, $ref (local '#/$defs/...'); description is
 * ignored. oneOf picks the branch whose `const` discriminator matches (for example 'form' or
 * 'layout'); otherwise the branch with the fewest problems, so messages stay specific.
 * The first problem found is thrown as a RateloomError with the field path; an unknown field
 * names the closest valid name.
 */
import { InternalError, RateloomError, closestName, type FieldPath } from '../core/errors.js';

export interface JsonSchema {
  $ref?: string;
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  additionalProperties?: boolean | JsonSchema;
  items?: JsonSchema;
  minItems?: number;
  minimum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  pattern?: string;
  oneOf?: JsonSchema[];
  description?: string;
  $defs?: Record<string, JsonSchema>;
}

interface Problem {
  error: RateloomError;
}

function typeOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'array';
  if (typeof v === 'number') return Number.isInteger(v) ? 'integer' : 'number';
  return typeof v;
}

function typeMatches(v: unknown, t: string): boolean {
  const actual = typeOf(v);
  if (t === 'number') return actual === 'number' || actual === 'integer';
  return actual === t;
}

class Checker {
  constructor(private readonly root: JsonSchema) {}

  resolve(s: JsonSchema): JsonSchema {
    let cur = s;
    for (let guard = 0; cur.$ref && guard < 32; guard++) {
      const m = /^#\/\$defs\/(.+)$/.exec(cur.$ref);
      const target = m ? this.root.$defs?.[m[1]] : undefined;
      if (!target) throw new InternalError(`schema reference '${cur.$ref}' cannot be resolved`);
      // Sibling keywords beside $ref (description) carry no constraints here.
      cur = target;
    }
    return cur;
  }

  check(value: unknown, schema: JsonSchema, path: FieldPath, out: Problem[], limit = 1): void {
    if (out.length >= limit) return;
    const s = this.resolve(schema);
    const push = (error: RateloomError) => out.push({ error });
    if (s.oneOf) {
      this.oneOf(value, s.oneOf, path, out, limit);
      return;
    }
    if (s.const !== undefined && value !== s.const) {
      push(new RateloomError('E_VALUE', `must be ${JSON.stringify(s.const)}, got ${JSON.stringify(value)}`, { path }));
      return;
    }
    if (s.enum && !s.enum.includes(value)) {
      const near = typeof value === 'string' ? closestName(value, s.enum.filter((e): e is string => typeof e === 'string')) : undefined;
      push(
        new RateloomError('E_VALUE', `${JSON.stringify(value)} is not one of ${s.enum.map((e) => JSON.stringify(e)).join(', ')}${near ? ` (closest: '${near}')` : ''}`, {
          path,
          fix: `Use one of: ${s.enum.join(', ')}.`,
          ...(near ? { details: { closest: near } } : {}),
        }),
      );
      return;
    }
    if (s.type) {
      const types = Array.isArray(s.type) ? s.type : [s.type];
      if (!types.some((t) => typeMatches(value, t))) {
        push(new RateloomError('E_TYPE', `expected ${types.join(' or ')}, got ${typeOf(value)}`, { path, fix: `Give a value of type ${types.join(' or ')}.` }));
        return;
      }
    }
    if (typeof value === 'number') {
      if (!Number.isFinite(value)) push(new RateloomError('E_VALUE', 'must be a finite number', { path }));
      else if (s.minimum !== undefined && value < s.minimum) push(new RateloomError('E_VALUE', `must be at least ${s.minimum}, got ${value}`, { path }));
      else if (s.exclusiveMinimum !== undefined && value <= s.exclusiveMinimum) push(new RateloomError('E_VALUE', `must be greater than ${s.exclusiveMinimum}, got ${value}`, { path }));
      else if (s.exclusiveMaximum !== undefined && value >= s.exclusiveMaximum) push(new RateloomError('E_VALUE', `must be less than ${s.exclusiveMaximum}, got ${value}`, { path }));
      return;
    }
    if (typeof value === 'string') {
      if (s.pattern && !new RegExp(s.pattern).test(value)) {
        push(new RateloomError('E_VALUE', `'${value}' does not match ${s.pattern}`, { path, fix: s.description ?? ERROR_PATTERN_FIX }));
      }
      return;
    }
    if (Array.isArray(value)) {
      if (s.minItems !== undefined && value.length < s.minItems) {
        push(new RateloomError('E_VALUE', `needs at least ${s.minItems} entr${s.minItems === 1 ? 'y' : 'ies'}`, { path }));
        return;
      }
      if (s.items) value.forEach((v, i) => this.check(v, s.items as JsonSchema, [...path, i], out, limit));
      return;
    }
    if (value !== null && typeof value === 'object') this.object(value as Record<string, unknown>, s, path, out, limit);
  }

  private object(obj: Record<string, unknown>, s: JsonSchema, path: FieldPath, out: Problem[], limit: number): void {
    const props = s.properties ?? {};
    for (const key of Object.keys(obj)) {
      if (out.length >= limit) return;
      if (key in props) continue;
      if (s.additionalProperties === false) {
        const near = closestName(key, Object.keys(props));
        out.push({
          error: new RateloomError('E_UNKNOWN_FIELD', `unknown field '${key}'${near ? ` (did you mean '${near}'?)` : ''}`, {
            path: [...path, key],
            fix: near ? `Rename '${key}' to '${near}'.` : `Remove '${key}'; allowed here: ${Object.keys(props).join(', ')}.`,
            details: { field: key, ...(near ? { closest: near } : {}), allowed: Object.keys(props) },
          }),
        });
        return;
      }
      if (s.additionalProperties && typeof s.additionalProperties === 'object') {
        this.check(obj[key], s.additionalProperties, [...path, key], out, limit);
      }
    }
    for (const req of s.required ?? []) {
      if (out.length >= limit) return;
      if (!(req in obj)) {
        out.push({ error: new RateloomError('E_MISSING_FIELD', `required field '${req}' is missing`, { path: [...path, req], fix: props[req]?.description ? `Add '${req}': ${props[req].description}` : `Add '${req}'.` }) });
        return;
      }
    }
    for (const [key, sub] of Object.entries(props)) {
      if (out.length >= limit) return;
      if (key in obj) this.check(obj[key], sub, [...path, key], out, limit);
    }
  }

  private oneOf(value: unknown, branches: JsonSchema[], path: FieldPath, out: Problem[], limit: number): void {
    const resolved = branches.map((b) => this.resolve(b));
    // Discriminator: a property whose schema is a const in every object branch.
    if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
      const obj = value as Record<string, unknown>;
      const first = resolved[0]?.properties ?? {};
      for (const key of Object.keys(first)) {
        const consts = resolved.map((b) => (b.properties?.[key] ? this.resolve(b.properties[key]).const : undefined));
        if (consts.some((c) => c === undefined)) continue;
        if (!(key in obj)) {
          out.push({ error: new RateloomError('E_MISSING_FIELD', `required field '${key}' is missing (one of ${consts.map((c) => JSON.stringify(c)).join(', ')})`, { path: [...path, key] }) });
          return;
        }
        const i = consts.indexOf(obj[key]);
        if (i < 0) {
          const near = typeof obj[key] === 'string' ? closestName(obj[key] as string, consts as string[]) : undefined;
          out.push({
            error: new RateloomError('E_VALUE', `${JSON.stringify(obj[key])} is not one of ${consts.map((c) => JSON.stringify(c)).join(', ')}${near ? ` (closest: '${near}')` : ''}`, {
              path: [...path, key],
              ...(near ? { details: { closest: near } } : {}),
            }),
          });
          return;
        }
        this.check(value, resolved[i], path, out, limit);
        return;
      }
    }
    let best: Problem[] | undefined;
    for (const b of resolved) {
      const trial: Problem[] = [];
      this.check(value, b, path, trial, 50);
      if (trial.length === 0) return;
      if (!best || trial.length < best.length) best = trial;
    }
    if (best) out.push(...best.slice(0, Math.max(0, limit - out.length)));
  }
}

const ERROR_PATTERN_FIX = 'Correct the value so it matches the expected pattern.';

/** Check `value` against `schema` (whose $defs resolve references); throws the first problem found. */
export function checkSchema(value: unknown, schema: JsonSchema): void {
  const out: Problem[] = [];
  new Checker(schema).check(value, schema, [], out, 1);
  if (out.length) throw out[0].error;
}
