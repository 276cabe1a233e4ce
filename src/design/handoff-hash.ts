/**
 * Content hash of a fitted-kinetics hand-off: SHA-256 (FIPS 180-4) of a canonical JSON text of the
 * document without its `contentHash` field (object keys sorted, non-finite numbers as null, as the
 * hand-off is written). `rateloom fit` records it; `rateloom size` recomputes it, so a hand-off
 * changed after it was written (edited by hand, truncated, merged) is noticed, whatever its
 * layout or key order.
 */
import { createHash } from 'node:crypto';

/** Canonical JSON: keys sorted at every level, non-finite numbers as null, typed arrays as arrays. */
export function canonicalJson(v: unknown): string {
  if (v === null || v === undefined) return 'null';
  if (typeof v === 'number') return Number.isFinite(v) ? JSON.stringify(v) : 'null';
  if (typeof v === 'string' || typeof v === 'boolean') return JSON.stringify(v);
  if (Array.isArray(v) || ArrayBuffer.isView(v)) return `[${Array.from(v as ArrayLike<unknown>, canonicalJson).join(',')}]`;
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    const keys = Object.keys(o).filter((k) => o[k] !== undefined).sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`).join(',')}}`;
  }
  return 'null';
}

/** 'sha256:<hex>' of the document without its contentHash field. */
export function handoffHash(doc: object): string {
  const { contentHash: _ignored, ...rest } = doc as Record<string, unknown>;
  return `sha256:${createHash('sha256').update(canonicalJson(rest)).digest('hex')}`;
}
