/**
 * The grid of a compiled case for a count and a layout: its stretched family's map when it has
 * one, uniform otherwise.
 *
 * @module
 */
import { type Grid, type GridLayout, makeGrid } from "../grid/mod.ts";
import type { CompiledCase } from "./types.ts";

/**
 * The nx × ny grid of a case on a layout (lines: vertex nodes or cell faces).
 *
 * @param compiled the case
 * @param nx intervals or cells along x
 * @param ny intervals or cells along y
 * @param layout vertex or cell
 * @returns the grid, uniform unless the case has a stretched family
 *
 * @example
 * ```ts ignore
 * import { caseGrid } from "./grid_of.ts";
 * caseGrid(myCase, 16, 16, "cell").lines.x.length; // 17
 * ```
 */
export function caseGrid(
  compiled: Pick<CompiledCase, "domain" | "mappings">,
  nx: number,
  ny: number,
  layout: GridLayout,
): Grid {
  return makeGrid(compiled.domain, layout, { x: nx, y: ny }, compiled.mappings ?? {});
}

/** true when the case's grids are stretched (a map other than uniform on some axis). */
export function isStretchedCase(compiled: Pick<CompiledCase, "mappings">): boolean {
  return Object.values(compiled.mappings ?? {}).some((m) => m.kind !== "uniform");
}
