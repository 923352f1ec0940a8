import type { NormSet, Region } from "../result/types.ts";
import { errorNorms } from "./error_norms.ts";
import { vertexWeights } from "./vertex_weights.ts";

/** Default width of the boundary band in node layers: the boundary nodes plus one layer. */
export const DEFAULT_BAND = 2;

/** A vertex-centred grid: nx × ny intervals on a rectangle, nodes x-fastest. */
export interface VertexGrid {
  nx: number;
  ny: number;
  hx: number;
  hy: number;
}

/**
 * Marks the nodes of the boundary band of a vertex grid: node (i, j) is in the band when
 * min(i, nx − i, j, ny − j) < band, i.e. the boundary nodes and the next band − 1 layers.
 *
 * The band is a fixed NUMBER of node layers, not a fixed fraction of the domain: a boundary
 * treatment with a first-order local error then shows as a lower observed order in the band, while
 * a band of fixed width would grow in nodes under refinement and dilute the defect.
 *
 * @param grid nx and ny (intervals).
 * @param band Number of node layers (≥ 1).
 * @returns 1 in the band, 0 in the interior, length (nx + 1)(ny + 1).
 * @throws {RangeError} when the band is not a positive integer or leaves no interior node.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { boundaryBandMask } from "./region_norms.ts";
 * const m = boundaryBandMask({ nx: 4, ny: 4 }, 2);
 * assert.ok(m[2 * 5 + 2] === 0 && m[1 * 5 + 2] === 1);
 * ```
 */
export function boundaryBandMask(
  grid: { nx: number; ny: number },
  band = DEFAULT_BAND,
): Uint8Array {
  const { nx, ny } = grid;
  if (!(Number.isInteger(band) && band >= 1)) {
    throw new RangeError(
      `Cannot mark the boundary band: band must be a positive integer, got ${band}`,
    );
  }
  if (nx < 2 * band || ny < 2 * band) {
    throw new RangeError(
      `Cannot split a ${nx}×${ny} grid into a ${band}-node boundary band and an interior: ` +
        `use at least ${2 * band} intervals per direction or a narrower band`,
    );
  }
  const mask = new Uint8Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      if (Math.min(i, nx - i, j, ny - j) < band) mask[j * (nx + 1) + i] = 1;
    }
  }
  return mask;
}

/**
 * Error norms of a vertex-grid solution per region: all nodes, the interior (nodes at least `band`
 * layers from the boundary) and the boundary band (see {@link boundaryBandMask}), with trapezoid
 * weights ({@link vertexWeights}) and {@link errorNorms}. All nodes and the interior divide by the
 * domain's area (the interior tends to the whole domain); the band divides by its own area, so
 * its L2 and L1 norms are mean errors over the band and keep the band's true order.
 *
 * @param values Computed nodal values, length (nx + 1)(ny + 1), x-fastest.
 * @param exact Exact nodal values, same layout.
 * @param grid The grid.
 * @param options `band`: node layers in the boundary band (default {@link DEFAULT_BAND} = 2).
 * @returns Norms for "all", "interior" and "boundary".
 * @throws {RangeError} when lengths do not match the grid or the band leaves no interior.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { vertexRegionNorms } from "./region_norms.ts";
 * const nx = 4, ny = 4, n = 25;
 * const exact = new Float64Array(n);
 * const values = new Float64Array(n);
 * values[0] = 1e-3; // an error at a corner shows in the band, not the interior
 * const r = vertexRegionNorms(values, exact, { nx, ny, hx: 0.25, hy: 0.25 });
 * assert.ok(r.boundary.max === 1e-3 && r.interior.max === 0);
 * ```
 */
export function vertexRegionNorms(
  values: ArrayLike<number>,
  exact: ArrayLike<number>,
  grid: VertexGrid,
  options: { band?: number } = {},
): Record<Region, NormSet> {
  const n = (grid.nx + 1) * (grid.ny + 1);
  if (values.length !== n || exact.length !== n) {
    throw new RangeError(
      `Cannot compute error norms on a ${grid.nx}×${grid.ny} grid: expected ${n} nodal values, ` +
        `got ${values.length} computed and ${exact.length} exact`,
    );
  }
  const weights = vertexWeights(grid.nx, grid.ny, grid.hx, grid.hy);
  const band = boundaryBandMask(grid, options.band ?? DEFAULT_BAND);
  const interior = band.map((b) => 1 - b);
  const area = grid.nx * grid.hx * grid.ny * grid.hy;
  return {
    all: errorNorms(values, exact, { weights, measure: area }),
    interior: errorNorms(values, exact, { weights, mask: interior, measure: area }),
    boundary: errorNorms(values, exact, { weights, mask: band }),
  };
}

/**
 * Marks points of an arbitrary point set (an external solver's own points) that lie within
 * `width` of the edges of the rectangle [x0, x1] × [y0, y1]. Choose width ≈ (band − ½)·h for the
 * solver's typical spacing h to match the vertex-grid band of `band` layers.
 *
 * @returns 1 in the band, 0 elsewhere.
 * @throws {RangeError} when x and y differ in length or width is negative.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { pointsInBand } from "./region_norms.ts";
 * const m = pointsInBand([0.01, 0.5], [0.5, 0.5], { x0: 0, x1: 1, y0: 0, y1: 1 }, 0.1);
 * assert.ok(m[0] === 1 && m[1] === 0);
 * ```
 */
export function pointsInBand(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  domain: { x0: number; x1: number; y0: number; y1: number },
  width: number,
): Uint8Array {
  if (x.length !== y.length) {
    throw new RangeError(
      `Cannot mark boundary points: x has ${x.length} entries but y has ${y.length}`,
    );
  }
  if (!(width >= 0)) {
    throw new RangeError(`Cannot mark boundary points: width must be ≥ 0, got ${width}`);
  }
  const mask = new Uint8Array(x.length);
  for (let k = 0; k < x.length; k++) {
    const d = Math.min(x[k] - domain.x0, domain.x1 - x[k], y[k] - domain.y0, domain.y1 - y[k]);
    if (d <= width) mask[k] = 1;
  }
  return mask;
}

/**
 * Error norms per region on an arbitrary point set (external solvers that reply on their own
 * points), with optional quadrature weights (default equal, e.g. pass cell areas) and a
 * boundary-band mask (e.g. from {@link pointsInBand}). As on vertex grids, all points and the
 * interior divide by the total weight, the band by its own. For the norm over all points alone
 * use {@link errorNorms}.
 *
 * @throws {RangeError} on mismatched lengths, or when the band or the interior is empty.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { pointRegionNorms } from "./region_norms.ts";
 * const r = pointRegionNorms([1, 2], [1, 2.5], { band: new Uint8Array([0, 1]) });
 * assert.ok(r.boundary.max === 0.5 && r.interior.max === 0);
 * ```
 */
export function pointRegionNorms(
  values: ArrayLike<number>,
  exact: ArrayLike<number>,
  options: { band: ArrayLike<number>; weights?: ArrayLike<number> },
): Record<Region, NormSet> {
  const weights = options.weights;
  let total = values.length;
  if (weights) {
    total = 0;
    for (let k = 0; k < weights.length; k++) total += weights[k];
  }
  const band = options.band;
  const interior = Uint8Array.from({ length: band.length }, (_, k) => (band[k] ? 0 : 1));
  return {
    all: errorNorms(values, exact, { weights }),
    interior: errorNorms(values, exact, { weights, mask: interior, measure: total }),
    boundary: errorNorms(values, exact, { weights, mask: band }),
  };
}
