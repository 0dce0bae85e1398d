/**
 * The product's own colours and type. Colour never carries meaning alone: phases also differ by
 * row and label, failures by hatching, a glyph and the word FAIL, corners by marker shape.
 */

export const INK = '#1d2433';
export const MUTED = '#5c6677';
export const FAINT = '#98a1ae';
export const GRID = '#e3e6eb';
export const PAPER = '#ffffff';
export const PANEL = '#f7f8fa';
/** Shading of the dead zone between two phases. */
export const DEAD_ZONE = '#e6e9ee';
export const FAIL = '#b8322a';
export const FAIL_TINT = '#f6dcd8';

/** First and second phase (and everything derived from them), then neutral signals. */
export const PHASE = ['#1f5fa8', '#c46a05'] as const;
export const PHASE_TINT = ['#d6e3f3', '#f6e2c8'] as const;
export const CLOCK = '#3d4452';
export const INTERNAL = '#7d8695';

/** Process corners in the margin chart: a colour and a marker shape each. */
export const CORNER_COLOURS = ['#1d2433', '#1f5fa8', '#c46a05', '#13866f', '#9b3f8f', '#6b7280'] as const;
export const CORNER_SHAPES = ['circle', 'square', 'triangle', 'diamond', 'nabla', 'cross'] as const;
export type MarkerShape = (typeof CORNER_SHAPES)[number];

export const FONT = "'DejaVu Sans', 'Bitstream Vera Sans', Verdana, Arial, sans-serif";
export const MONO = "'DejaVu Sans Mono', 'Bitstream Vera Sans Mono', Consolas, monospace";

/** Type sizes, px at the diagram's natural width. */
export const SIZE = { title: 20, subtitle: 13, label: 13, annotation: 12, tick: 11, small: 11 } as const;

/** Glyphs that carry a verdict without colour. */
export const GLYPH = { pass: '\u2713', fail: '\u2715', unknown: '?' } as const;
