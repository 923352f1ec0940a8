/**
 * Point coordinates, quadrature weights and boundary bands of the three layouts.
 *
 * @module
 */
import type { Domain } from "../../reference-solver/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { caseGrid, isStretchedCase } from "../../cases/mod.ts";
import { gridPointsOf } from "../../grid/mod.ts";

/** Points of a layout with their weights and boundary band. */
export interface LayoutPoints {
  x: Float64Array;
  y: Float64Array;
  weights: Float64Array;
  boundaryBand: Uint8Array;
}

/**
 * The points of a vertex or cell grid (x fastest) with trapezoid (vertex) or midpoint (cell)
 * weights and the boundary band (the boundary row of nodes or cells and one layer in).
 *
 * @param layout "vertex": (nx+1)(ny+1) nodes; "cell": nx·ny centres
 * @param domain the rectangle
 * @param nx intervals or cells along x
 * @param ny intervals or cells along y
 * @returns coordinates, weights (summing to the area) and band
 *
 * @example
 * ```ts
 * import { gridPoints } from "./geometry.ts";
 * const p = gridPoints("cell", { x0: 0, x1: 1, y0: 0, y1: 1 }, 2, 2);
 * p.x; // Float64Array [0.25, 0.75, 0.25, 0.75]
 * ```
 */
export function gridPoints(
  layout: "vertex" | "cell",
  domain: Domain,
  nx: number,
  ny: number,
): LayoutPoints {
  const hx = (domain.x1 - domain.x0) / nx;
  const hy = (domain.y1 - domain.y0) / ny;
  const vertex = layout === "vertex";
  const mx = vertex ? nx + 1 : nx;
  const my = vertex ? ny + 1 : ny;
  const shift = vertex ? 0 : 0.5;
  const n = mx * my;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const weights = new Float64Array(n);
  const band = new Uint8Array(n);
  for (let j = 0; j < my; j++) {
    const yj = domain.y0 + (j + shift) * hy;
    const wy = vertex && (j === 0 || j === ny) ? 0.5 : 1;
    const bandJ = j <= 1 || j >= my - 2;
    for (let i = 0; i < mx; i++) {
      const k = j * mx + i;
      x[k] = domain.x0 + (i + shift) * hx;
      y[k] = yj;
      const wx = vertex && (i === 0 || i === nx) ? 0.5 : 1;
      weights[k] = wx * wy * hx * hy;
      band[k] = bandJ || i <= 1 || i >= mx - 2 ? 1 : 0;
    }
  }
  return { x, y, weights, boundaryBand: band };
}

/**
 * Weights and boundary band for a solver's own points: the given weights or area/N each, and the
 * points within two representative spacings sqrt(area/N) of the boundary.
 *
 * @param domain the rectangle
 * @param x point abscissae
 * @param y point ordinates
 * @param weights the solver's quadrature weights, if it sent any
 * @returns coordinates (the same arrays), weights and band
 *
 * @example
 * ```ts
 * import { freePoints } from "./geometry.ts";
 * const p = freePoints({ x0: 0, x1: 1, y0: 0, y1: 1 }, new Float64Array([0.5]), new Float64Array([0.5]));
 * p.weights; // Float64Array [1]
 * ```
 */
export function freePoints(
  domain: Domain,
  x: Float64Array,
  y: Float64Array,
  weights?: Float64Array,
): LayoutPoints {
  const n = x.length;
  const area = (domain.x1 - domain.x0) * (domain.y1 - domain.y0);
  const h = Math.sqrt(area / n);
  const band = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const distance = Math.min(
      x[k] - domain.x0,
      domain.x1 - x[k],
      y[k] - domain.y0,
      domain.y1 - y[k],
    );
    band[k] = distance <= 2 * h ? 1 : 0;
  }
  return { x, y, weights: weights ?? new Float64Array(n).fill(area / n), boundaryBand: band };
}

/**
 * The points of a case's grid on a layout: the mapped grid's points and control volumes for a
 * stretched family (`grid/`), {@link gridPoints} otherwise.
 *
 * @param kase the case (its domain and stretched family)
 * @param layout vertex or cell
 * @param nx intervals or cells along x
 * @param ny intervals or cells along y
 * @returns coordinates, control volumes (summing to the area) and band
 */
export function casePoints(
  kase: Pick<CompiledCase, "domain" | "mappings">,
  layout: "vertex" | "cell",
  nx: number,
  ny: number,
): LayoutPoints {
  return isStretchedCase(kase)
    ? gridPointsOf(caseGrid(kase, nx, ny, layout))
    : gridPoints(layout, kase.domain, nx, ny);
}
