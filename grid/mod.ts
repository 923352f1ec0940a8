/**
 * The grid value type of gridproof and the stretched families: a rectangle, per-axis grid lines
 * and a layout ({@link Grid}); per-axis mappings from a uniform parameter (tanh clustering,
 * geometric progression, an expression) that make a family refine under one fixed map; points,
 * control volumes and the representative spacing of a grid. A leaf: imports nothing.
 *
 * @example
 * ```ts
 * import { gridPointsOf, makeGrid } from "./mod.ts";
 * const g = makeGrid({ x0: 0, x1: 1, y0: 0, y1: 1 }, "cell", { x: 8, y: 8 }, {
 *   y: { kind: "tanh", strength: 2, toward: "start" },
 * });
 * const volume = gridPointsOf(g).weights.reduce((s, w) => s + w, 0); // 1 (the area)
 * ```
 *
 * @module
 */
export { AXES, type Axis, type Box, type Grid, type GridLayout } from "./types.ts";
export { axisLines, type AxisMapping, mappingFault, unitMap } from "./mapping.ts";
export {
  axisPoints,
  axisRange,
  axisVolumes,
  cellCounts,
  type GridPoints,
  gridPointsOf,
  makeGrid,
  representativeSpacing,
  stretchRatio,
} from "./grid.ts";
