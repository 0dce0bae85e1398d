/**
 * Bounds on what phasegap reads, so a hostile or mistaken file cannot exhaust memory or time.
 * Each bound is far above any real generator: a design has tens of gates and a few corners, a
 * process card a few kB, a delay-table file about 1.3 MB and 116,000 values (45 corners, fine grid).
 */

/** Largest design file or process card read, bytes, by format (YAML parses about 1 MB/s). */
export const MAX_DESIGN_BYTES = { yaml: 1 << 20, json: 16 << 20 } as const;
/** Largest delay-table file read, bytes, by format. */
/** Largest SPICE model file a deck may include, in bytes. */
export const MAX_MODEL_BYTES = 16 << 20;
export const MAX_TABLE_BYTES = { yaml: 4 << 20, json: 64 << 20 } as const;

/** Deepest nesting of mappings and lists (a table file nests 10 deep). */
export const MAX_DEPTH = 32;
/** Most keys in one mapping. */
export const MAX_MAPPING_KEYS = 10_000;
/** Most items in one list. */
export const MAX_LIST_ITEMS = 100_000;
/** Most values (scalars, lists and mappings, each alias use counted again) in one file. */
export const MAX_VALUES = 2_000_000;
/** Most YAML anchors and most YAML aliases in one file. */
export const MAX_ANCHORS = 1_000;
export const MAX_ALIASES = 1_000;
/** Most nodes one alias may expand to, in the yaml package's alias-count measure. */
export const MAX_ALIAS_COUNT = 1_000;

/** Values per corner axis (process, vdd, temperature, duty) and corners in all. */
export const MAX_AXIS_VALUES = 1_000;
export const MAX_CORNERS = 10_000;
/** Gates in a free-form netlist, switches in a design, entries in each constraint list. */
export const MAX_GATES = 5_000;
export const MAX_SWITCHES = 1_000;
export const MAX_CONSTRAINTS = 10_000;
/** Corners in a delay-table file, points on each table axis. */
export const MAX_TABLE_CORNERS = 10_000;
export const MAX_TABLE_AXIS = 256;

/** Largest list index `--set` accepts (it may also append one past a list's end). */
export const MAX_SET_INDEX = MAX_LIST_ITEMS;

/**
 * Names refused as keys and as values: the members every JavaScript object inherits. A corner,
 * net, switch or check with such a name would be confused with the built-in member wherever data
 * is kept or looked up by name.
 */
export const RESERVED_KEYS: ReadonlySet<string> = new Set([...Object.getOwnPropertyNames(Object.prototype), 'prototype']);
