/**
 * The solver's own point set for `--reply-points`: the cell centres of the vertex grid, each
 * valued by the average of the four nodes around it, with midpoint weights hx·hy.
 *
 * Why this is a fair test of a solver on its own points: the points are not the grid the request
 * was sampled on, so gridproof must measure the error at the coordinates the reply names. The
 * accuracy is derived by Taylor expansion about the centre c: the four-node average of a smooth u
 * is u(c) + (hx²·u_xx + hy²·u_yy)/8 + O(h⁴), and averaging an O(h²) nodal discretization error
 * keeps it O(h²), so the reply is second-order accurate at the centres. The weights make
 * Σ hx·hy·(cell average) equal to the trapezoid rule on the node values (each interior node is
 * shared by four cells, each side node by two, each corner by one) — the integral over the domain
 * is the same number as the vertex solution's.
 *
 * @module
 */

/** Points, quadrature weights and values of a reply on the solver's own points. */
export interface CellPoints {
  x: Float64Array;
  y: Float64Array;
  weights: Float64Array;
  values: Float64Array;
}

/**
 * Averages a vertex-grid solution to the cell centres.
 *
 * @param nodes values at the (nx + 1)(ny + 1) nodes, x fastest
 * @param grid the rectangle and the intervals nx, ny
 * @returns nx·ny centres (x fastest) with weights hx·hy (summing to the area) and averaged values
 *
 * @example
 * ```ts
 * import { cellPoints } from "./cell_points.ts";
 * const p = cellPoints(new Float64Array([0, 1, 2, 3]), { x0: 0, x1: 1, y0: 0, y1: 1, nx: 1, ny: 1 });
 * p.values; // Float64Array [1.5]
 * ```
 */
export function cellPoints(
  nodes: Float64Array,
  grid: { x0: number; x1: number; y0: number; y1: number; nx: number; ny: number },
): CellPoints {
  const { nx, ny } = grid;
  if (nodes.length !== (nx + 1) * (ny + 1)) {
    throw new RangeError(
      `cellPoints: ${nodes.length} node values for a ${nx}×${ny} grid; expected ${
        (nx + 1) * (ny + 1)
      } ((nx + 1)·(ny + 1), x fastest)`,
    );
  }
  const hx = (grid.x1 - grid.x0) / nx;
  const hy = (grid.y1 - grid.y0) / ny;
  const n = nx * ny;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const weights = new Float64Array(n).fill(hx * hy);
  const values = new Float64Array(n);
  const row = nx + 1;
  for (let j = 0; j < ny; j++) {
    const yc = grid.y0 + (j + 0.5) * hy;
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const sw = j * row + i;
      x[k] = grid.x0 + (i + 0.5) * hx;
      y[k] = yc;
      values[k] = 0.25 * (nodes[sw] + nodes[sw + 1] + nodes[sw + row] + nodes[sw + row + 1]);
    }
  }
  return { x, y, weights, values };
}
