/**
 * The rateloom chart look: a shared vega-lite `config` and colour palettes.
 *
 * Categorical colours: the eight-colour palette of Okabe & Ito, "Color Universal Design (CUD):
 * how to make figures and presentations that are friendly to colorblind people" (2008), reordered
 * so the first colours have the most contrast on white (yellow last, black kept for reference
 * lines). Diverging colours for the correlation heat map: Paul Tol's "BuRd" scheme from
 * "Colour Schemes", SRON technical note SRON/EPS/TN/09-002 (issue 3.2, 2021), which stays
 * readable for colour-blind readers and in greyscale print.
 *
 * Fonts are a system stack (no web fonts: the report loads nothing); sizes are chosen to stay
 * readable when a 2-column grid of charts is printed on A4.
 */
import type { Config } from 'vega-lite';

/** Okabe & Ito (2008) colours, contrast-first order. */
export const OKABE_ITO = [
  '#0072B2', // blue
  '#D55E00', // vermillion
  '#009E73', // bluish green
  '#CC79A7', // reddish purple
  '#E69F00', // orange
  '#56B4E9', // sky blue
  '#000000', // black
  '#F0E442', // yellow (weak on white, last)
] as const;

/** Paul Tol's BuRd diverging scheme (2021), blue (-1) to red (+1). */
export const TOL_BURD = ['#2166AC', '#4393C3', '#92C5DE', '#D1E5F0', '#F7F7F7', '#FDDBC7', '#F4A582', '#D6604D', '#B2182B'] as const;

/** Ink colours for text, reference lines and grid. */
export const INK = { text: '#1f2328', muted: '#57606a', rule: '#444444', grid: '#e3e6ea', band: '#0072B2' } as const;

/** Font stack used in charts and in the HTML document. */
export const FONT_STACK = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, 'Liberation Sans', sans-serif";

/** Default chart size in px (one cell of the 2-column grid). */
export const CHART_WIDTH = 380;
export const CHART_HEIGHT = 260;

/** The shared vega-lite configuration. */
export const CHART_CONFIG: Config = {
  font: FONT_STACK,
  background: '#ffffff',
  padding: 8,
  view: { stroke: '#c9ced4', strokeWidth: 1 },
  range: { category: [...OKABE_ITO], diverging: [...TOL_BURD] },
  axis: {
    labelFontSize: 11,
    titleFontSize: 12,
    titleFontWeight: 600,
    labelColor: INK.muted,
    titleColor: INK.text,
    gridColor: INK.grid,
    domainColor: '#8c959f',
    tickColor: '#8c959f',
    titlePadding: 8,
    labelFlush: false,
  },
  legend: { labelFontSize: 11, titleFontSize: 11, titleFontWeight: 600, titleColor: INK.text, labelColor: INK.text, symbolSize: 70 },
  title: { fontSize: 13, fontWeight: 600, color: INK.text, anchor: 'start', offset: 8 },
  point: { size: 46, filled: true, opacity: 0.85 },
  line: { strokeWidth: 2 },
  bar: { cornerRadiusEnd: 2 },
  text: { fontSize: 11 },
};

/** Point shapes paired with the palette so series also differ without colour (print in grey). */
export const SHAPES = ['circle', 'square', 'triangle-up', 'diamond', 'cross', 'triangle-down', 'wedge', 'stroke'] as const;
