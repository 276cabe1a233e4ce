/**
 * Helpers shared by the chart builders: a top-level wrapper that applies the rateloom look, a
 * filter that drops non-finite values (and says how many it dropped), and padded numeric domains.
 * Builders never emit a `$schema` URL: reports must not reference anything on the network.
 */
import type { TopLevelSpec } from 'vega-lite';
import { CHART_CONFIG, CHART_HEIGHT, CHART_WIDTH } from '../theme.js';

/** Size options accepted by every builder. */
export interface ChartSize {
  /** Plot width in px; default 380. */
  width?: number;
  /** Plot height in px; default 260. */
  height?: number;
}

/** Wrap a unit or layer spec body into a top-level spec with the shared config and size. */
export function topLevel(body: Record<string, unknown>, size: ChartSize = {}): TopLevelSpec {
  return {
    width: size.width ?? CHART_WIDTH,
    height: size.height ?? CHART_HEIGHT,
    config: CHART_CONFIG,
    ...body,
  } as TopLevelSpec;
}

/** Keep rows whose listed fields are finite numbers; report how many were dropped. */
export function keepFinite<T extends object>(rows: T[], fields: (keyof T)[]): { rows: T[]; dropped: number } {
  const kept = rows.filter((r) => fields.every((f) => Number.isFinite(r[f] as unknown as number)));
  return { rows: kept, dropped: rows.length - kept.length };
}

/** Caption note for dropped points, or undefined when none were dropped. */
export function droppedNote(dropped: number): string | undefined {
  return dropped > 0 ? `${dropped} point${dropped === 1 ? '' : 's'} not shown (value not finite).` : undefined;
}

/** Join caption parts, skipping empty ones. */
export function caption(...parts: (string | undefined)[]): string | undefined {
  const s = parts.filter((p) => p && p.length > 0).join(' ');
  return s === '' ? undefined : s;
}

/** [min, max] of finite values padded by `pad` of the span (a degenerate span gets ±|v|·pad or ±1). */
export function paddedDomain(values: number[], pad = 0.05): [number, number] {
  const v = values.filter(Number.isFinite);
  if (v.length === 0) return [0, 1];
  let lo = Math.min(...v);
  let hi = Math.max(...v);
  if (hi === lo) {
    const d = lo === 0 ? 1 : Math.abs(lo) * pad;
    return [lo - d, hi + d];
  }
  const d = (hi - lo) * pad;
  lo -= d;
  hi += d;
  return [lo, hi];
}

