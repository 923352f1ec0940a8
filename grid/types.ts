/**
 * The one grid value type: a rectangle, per-axis grid lines and a layout. Every axis is described
 * the same way (its lines: node coordinates of a vertex grid, face coordinates of a cell grid; both
 * are the same nx + 1 numbers), so a third axis is one more key in {@link AXES}, in {@link Box} and
 * in {@link Grid.lines}, and every function that loops over `AXES` follows.
 *
 * @module
 */

/** The axes, in storage order (the first varies fastest). A third axis appends "z". */
export const AXES = ["x", "y"] as const;

/** One axis name. */
export type Axis = (typeof AXES)[number];

/** The rectangle: [x0, x1] × [y0, y1] (the same shape as the reference solver's `Domain`). */
export interface Box {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** Where the unknowns sit: at the crossings of the lines (vertex) or in the cells between (cell). */
export type GridLayout = "vertex" | "cell";

/**
 * A structured grid: per axis, the n + 1 grid lines from the box's start to its end, strictly
 * increasing (a vertex grid's nodes, a cell grid's faces). Cell centres are the midpoints of
 * neighbouring faces. `uniform` is true when the lines are equally spaced (made by the uniform
 * map), so callers can keep the uniform fast paths and protocol messages without coordinates.
 */
export interface Grid {
  box: Box;
  layout: GridLayout;
  lines: Record<Axis, Float64Array>;
  uniform: boolean;
}
