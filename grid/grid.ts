/**
 * Making a {@link Grid} from per-axis mappings, and reading its points and control volumes.
 *
 * Control volumes: on a vertex grid node i of an axis owns half of each neighbouring interval,
 * wx[i] = ((x[i] − x[i−1])[i > 0] + (x[i+1] − x[i])[i < n]) / 2 (the trapezoid weights); on a cell
 * grid cell i owns its width x[i+1] − x[i] (the midpoint rule). The volume of a point is the
 * product over the axes, so the volumes sum to the box's volume on either layout.
 *
 * @module
 */
import { axisLines, type AxisMapping } from "./mapping.ts";
import { AXES, type Axis, type Box, type Grid, type GridLayout } from "./types.ts";

/**
 * The grid with `counts[axis]` cells along each axis of `box`, its lines from the mappings
 * (uniform where a mapping is absent or uniform).
 *
 * @param box the rectangle
 * @param layout vertex or cell
 * @param counts cells (intervals) per axis
 * @param mappings per-axis mappings; default uniform
 * @returns the grid
 *
 * @example
 * ```ts
 * import { makeGrid } from "./grid.ts";
 * const g = makeGrid({ x0: 0, x1: 1, y0: 0, y1: 2 }, "cell", { x: 4, y: 8 });
 * if (!g.uniform || g.lines.y[8] !== 2) throw new Error("uniform grid");
 * ```
 */
export function makeGrid(
  box: Box,
  layout: GridLayout,
  counts: Record<Axis, number>,
  mappings: Partial<Record<Axis, AxisMapping>> = {},
): Grid {
  const lines = {} as Record<Axis, Float64Array>;
  let uniform = true;
  for (const axis of AXES) {
    const mapping = mappings[axis] ?? { kind: "uniform" };
    if (mapping.kind !== "uniform") uniform = false;
    const [start, end] = axisRange(box, axis);
    lines[axis] = mapping.kind === "uniform"
      ? uniformLines(start, end, counts[axis])
      : axisLines(mapping, start, end, counts[axis]);
  }
  return { box: { ...box }, layout, lines, uniform };
}

/** The first and last coordinate of an axis of the box. */
export function axisRange(box: Box, axis: Axis): [number, number] {
  return axis === "x" ? [box.x0, box.x1] : [box.y0, box.y1];
}

/** start + i·(end − start)/n, the uniform lines as the rest of gridproof computes them. */
function uniformLines(start: number, end: number, n: number): Float64Array {
  const h = (end - start) / n;
  const out = Float64Array.from({ length: n + 1 }, (_, i) => start + i * h);
  out[n] = end;
  return out;
}

/** Cells along each axis. */
export function cellCounts(grid: Grid): Record<Axis, number> {
  return { x: grid.lines.x.length - 1, y: grid.lines.y.length - 1 };
}

/** The coordinates of the points of one axis: the lines (vertex) or their midpoints (cell). */
export function axisPoints(grid: Grid, axis: Axis): Float64Array {
  const lines = grid.lines[axis];
  if (grid.layout === "vertex") return lines;
  const out = new Float64Array(lines.length - 1);
  for (let i = 0; i < out.length; i++) out[i] = (lines[i] + lines[i + 1]) / 2;
  return out;
}

/** The control-volume widths of the points of one axis (see the module doc). */
export function axisVolumes(grid: Grid, axis: Axis): Float64Array {
  const lines = grid.lines[axis];
  const n = lines.length - 1;
  if (grid.layout === "cell") {
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) out[i] = lines[i + 1] - lines[i];
    return out;
  }
  const out = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const half = (lines[i + 1] - lines[i]) / 2;
    out[i] += half, out[i + 1] += half;
  }
  return out;
}

/** Points of a grid (x fastest) with their control volumes and boundary band. */
export interface GridPoints {
  x: Float64Array;
  y: Float64Array;
  /** The control volume of each point; they sum to the box's area. */
  weights: Float64Array;
  /** 1 for points in the boundary row of nodes or cells or one layer in. */
  boundaryBand: Uint8Array;
}

/**
 * The points of a grid, x fastest, with their control volumes (module doc) and boundary band.
 *
 * @param grid the grid
 * @returns coordinates, volumes and band
 *
 * @example
 * ```ts
 * import { gridPointsOf, makeGrid } from "./grid.ts";
 * const g = makeGrid({ x0: 0, x1: 1, y0: 0, y1: 1 }, "vertex", { x: 2, y: 2 });
 * if (gridPointsOf(g).weights[4] !== 0.25) throw new Error("trapezoid weights");
 * ```
 */
export function gridPointsOf(grid: Grid): GridPoints {
  const px = axisPoints(grid, "x"), py = axisPoints(grid, "y");
  const vx = axisVolumes(grid, "x"), vy = axisVolumes(grid, "y");
  const mx = px.length, my = py.length;
  const n = mx * my;
  const x = new Float64Array(n), y = new Float64Array(n), weights = new Float64Array(n);
  const band = new Uint8Array(n);
  for (let j = 0, k = 0; j < my; j++) {
    const bandJ = j <= 1 || j >= my - 2;
    for (let i = 0; i < mx; i++, k++) {
      x[k] = px[i];
      y[k] = py[j];
      weights[k] = vx[i] * vy[j];
      band[k] = bandJ || i <= 1 || i >= mx - 2 ? 1 : 0;
    }
  }
  return { x, y, weights, boundaryBand: band };
}

/**
 * The representative spacing h = (volume / N)^(1/d) of a grid with N cells in d dimensions
 * (Celik et al. 2008, J. Fluids Eng. 130, 078001, eq. 1): the same for a stretched and a uniform
 * grid of the same count, as the refinement ratio of a family under one fixed map is the ratio
 * of the counts.
 *
 * @param grid the grid
 * @returns h
 */
export function representativeSpacing(grid: Grid): number {
  let volume = 1, cells = 1;
  for (const axis of AXES) {
    const [start, end] = axisRange(grid.box, axis);
    volume *= end - start;
    cells *= grid.lines[axis].length - 1;
  }
  return Math.pow(volume / cells, 1 / AXES.length);
}

/** The ratio of the largest to the smallest cell width over the axes (1 for a uniform grid). */
export function stretchRatio(grid: Grid): number {
  let ratio = 1;
  for (const axis of AXES) {
    const lines = grid.lines[axis];
    let small = Infinity, large = 0;
    for (let i = 0; i + 1 < lines.length; i++) {
      const w = lines[i + 1] - lines[i];
      small = Math.min(small, w), large = Math.max(large, w);
    }
    ratio = Math.max(ratio, large / small);
  }
  return ratio;
}
