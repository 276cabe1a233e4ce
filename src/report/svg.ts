/**
 * Headless SVG rendering: vega-lite's `compile` turns a vega-lite spec into a vega spec, and a
 * vega `View` with renderer 'none' draws it to an SVG string (`view.toSVG()`). This runs in plain
 * Node: no browser, no canvas package (text widths are estimated by vega), no network. The view
 * gets a loader that refuses every load, so a spec can never fetch a URL.
 */
import * as vega from 'vega';
import { compile, type TopLevelSpec } from 'vega-lite';
import type { ChartSpec, RenderedChart } from './types.js';
import { InternalError } from '../core/errors.js';

/** A vega loader that refuses any URL or file: reports are drawn from inline data only. */
function offlineLoader(): vega.Loader {
  const base = vega.loader();
  const refuse = async (uri: string): Promise<never> => {
    throw new InternalError(`report charts load no external resources (refused '${uri}')`);
  };
  return { ...base, load: refuse, sanitize: refuse, http: refuse, file: refuse } as unknown as vega.Loader;
}

/** Compile a vega-lite spec to a vega spec (throws on an invalid spec). */
export function compileToVega(spec: TopLevelSpec): vega.Spec {
  return compile(spec).spec;
}

/**
 * Remove namespace declarations that the inline SVG does not use. Inside HTML the SVG element
 * needs no namespace at all, but the default xmlns is kept so the string is also a valid .svg file;
 * xmlns:xlink is dropped when nothing uses the xlink prefix.
 */
function tidySvg(svg: string): string {
  if (!/\sxlink:/.test(svg.replace(/xmlns:xlink="[^"]*"/, ''))) {
    svg = svg.replace(/\s+xmlns:xlink="[^"]*"/, '');
  }
  return svg;
}

/** A vega logger that collects warnings and errors instead of printing them (src/ does no console I/O). */
function collectingLogger(messages: string[]): vega.LoggerInterface {
  let level = vega.Warn;
  const push = (prefix: string) => (...args: readonly unknown[]) => {
    messages.push(`${prefix}${args.map(String).join(' ')}`);
    return logger;
  };
  const logger = {
    level(l?: number) {
      if (l === undefined) return level;
      level = l;
      return logger;
    },
    error: push('error: '),
    warn: push(''),
    info: () => logger,
    debug: () => logger,
  } as unknown as vega.LoggerInterface;
  return logger;
}

/**
 * Render a vega-lite spec to an SVG string, headless. `messages` collects vega's warnings; an error
 * logged by vega while drawing (for example a refused data load) makes the call throw.
 */
export async function renderSvg(spec: TopLevelSpec, messages: string[] = []): Promise<string> {
  const vegaSpec = compile(spec, { logger: collectingLogger(messages) as never }).spec;
  const runtime = vega.parse(vegaSpec);
  const view = new vega.View(runtime, { renderer: 'none', loader: offlineLoader(), logger: collectingLogger(messages) });
  try {
    const before = messages.length;
    const svg = await view.toSVG();
    // vega logs data-load and dataflow failures and draws an empty chart: treat them as failures
    const errors = messages.slice(before).filter((m) => m.startsWith('error: ') || m.startsWith('Loading failed'));
    if (errors.length) throw new InternalError(errors.map((m) => m.replace(/^error: /, '')).join('; '));
    return tidySvg(svg);
  } finally {
    view.finalize();
  }
}

/**
 * Give every id inside an SVG a prefix (and rewrite its local references), so several charts
 * inlined into one HTML document do not share clip-path or gradient ids such as 'clip1'.
 */
export function scopeSvgIds(svg: string, prefix: string): string {
  const ids = new Set([...svg.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1]));
  if (ids.size === 0) return svg;
  const p = prefix.replace(/[^A-Za-z0-9_-]/g, '-');
  return svg
    .replace(/\sid="([^"]+)"/g, (_m, id: string) => ` id="${p}-${id}"`)
    .replace(/url\(#([^)]+)\)/g, (m, id: string) => (ids.has(id) ? `url(#${p}-${id})` : m))
    .replace(/href="#([^"]+)"/g, (m, id: string) => (ids.has(id) ? `href="#${p}-${id}"` : m));
}

/**
 * Render charts one by one. Ids inside each SVG are prefixed with the chart id. A chart that cannot be drawn is returned with `error` set (and no svg)
 * so the document can say so instead of failing as a whole or hiding the gap.
 */
export async function renderCharts(charts: ChartSpec[]): Promise<RenderedChart[]> {
  const out: RenderedChart[] = [];
  for (const c of charts) {
    const base = { id: c.id, title: c.title, ...(c.caption ? { caption: c.caption } : {}) };
    const messages: string[] = [];
    try {
      const svg = scopeSvgIds(await renderSvg(c.spec, messages), c.id);
      out.push({ ...base, svg, ...(messages.length ? { messages } : {}) });
    } catch (e) {
      out.push({ ...base, error: (e as Error).message, ...(messages.length ? { messages } : {}) });
    }
  }
  return out;
}
