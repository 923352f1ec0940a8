/**
 * How many values each array of a {@link SampledProblem} holds on a layout.
 *
 * @module
 */
import type { GridLayout } from "../grid/mod.ts";
import type { SampledProblem, Side } from "./types.ts";

/**
 * Number of points of a layout: (nx + 1)(ny + 1) nodes (vertex) or nx·ny centres (cell).
 *
 * @param layout the layout
 * @param nx intervals (cells) along x
 * @param ny intervals (cells) along y
 * @returns the length of every point array
 *
 * @example
 * ```ts
 * import { pointCount } from "./counts.ts";
 * pointCount("cell", 4, 2); // 8
 * ```
 */
export function pointCount(layout: GridLayout, nx: number, ny: number): number {
  return layout === "cell" ? nx * ny : (nx + 1) * (ny + 1);
}

/**
 * Number of nodes of a vertex grid: (nx + 1)(ny + 1).
 *
 * @param p the grid's interval counts
 * @returns the node count
 *
 * @example
 * ```ts
 * import { nodeCount } from "./counts.ts";
 * nodeCount({ nx: 2, ny: 2 }); // 9
 * ```
 */
export function nodeCount(p: { nx: number; ny: number }): number {
  return (p.nx + 1) * (p.ny + 1);
}

/**
 * Number of values of a side's boundary arrays: the side's nodes (vertex) or boundary faces
 * (cell).
 *
 * @param layout the layout
 * @param side the side
 * @param nx intervals (cells) along x
 * @param ny intervals (cells) along y
 * @returns ny (+ 1 on the vertex layout) on west and east, nx (+ 1) on south and north
 *
 * @example
 * ```ts
 * import { sideCount } from "./counts.ts";
 * sideCount("vertex", "west", 4, 2); // 3
 * ```
 */
export function sideCount(layout: GridLayout, side: Side, nx: number, ny: number): number {
  const along = side === "west" || side === "east" ? ny : nx;
  return layout === "cell" ? along : along + 1;
}

/**
 * Number of values of each conductivity array of a layout (see `Conductivity`): `x` for
 * `alongX`, `y` for `alongY`.
 *
 * @param layout the layout
 * @param nx intervals (cells) along x
 * @param ny intervals (cells) along y
 * @returns the two counts
 *
 * @example
 * ```ts
 * import { faceCounts } from "./counts.ts";
 * faceCounts("vertex", 4, 2); // { x: 12, y: 10 }
 * ```
 */
export function faceCounts(
  layout: GridLayout,
  nx: number,
  ny: number,
): { x: number; y: number } {
  return layout === "cell"
    ? { x: (nx + 1) * ny, y: nx * (ny + 1) }
    : { x: nx * (ny + 1), y: (nx + 1) * ny };
}

/**
 * The point count of a problem's own layout.
 *
 * @param p the problem
 * @returns {@link pointCount} of its layout (vertex when absent)
 */
export function problemPointCount(p: Pick<SampledProblem, "layout" | "nx" | "ny">): number {
  return pointCount(p.layout ?? "vertex", p.nx, p.ny);
}
