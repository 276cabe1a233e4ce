/**
 * The one test the document loaders share: is a parsed JSON value an object with named fields
 * (not null, not a list)? Plain type test; no external reference.
 */

/** A JSON object as parsed, before its fields are checked. */
export type Obj = Record<string, unknown>;

/** True for an object with named fields (not null, not an array). */
export function isObj(v: unknown): v is Obj {
  return !!v && typeof v === 'object' && !Array.isArray(v);
}
