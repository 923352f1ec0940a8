/**
 * Trapezoid-rule quadrature weights of a vertex-centred grid: nx × ny intervals of size hx × hy,
 * nodes (i, j), 0 ≤ i ≤ nx, 0 ≤ j ≤ ny, stored x-fastest at index j·(nx + 1) + i (the layout of
 * the reference solver).
 *
 * Formula: w_ij = hx·hy·c_i·c_j with c = ½ at the first and last node of a line and 1 elsewhere
 * (the composite trapezoid rule in each direction; the weights sum to the area nx·hx·ny·hy).
 *
 * @param nx Intervals along x (≥ 1).
 * @param ny Intervals along y (≥ 1).
 * @param hx Spacing along x (> 0).
 * @param hy Spacing along y (> 0).
 * @returns (nx + 1)(ny + 1) weights.
 * @throws {RangeError} when a count is not a positive integer or a spacing is not positive.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { vertexWeights } from "./vertex_weights.ts";
 * const w = vertexWeights(2, 2, 0.5, 0.5);
 * assert.ok(w[0] === 0.0625 && w[4] === 0.25);
 * ```
 */
export function vertexWeights(nx: number, ny: number, hx: number, hy: number): Float64Array {
  if (!(Number.isInteger(nx) && nx >= 1 && Number.isInteger(ny) && ny >= 1)) {
    throw new RangeError(
      `Cannot build grid weights: nx and ny must be positive integers, got nx = ${nx}, ny = ${ny}`,
    );
  }
  if (!(hx > 0 && hy > 0 && Number.isFinite(hx) && Number.isFinite(hy))) {
    throw new RangeError(
      `Cannot build grid weights: spacings must be positive, got hx = ${hx}, hy = ${hy}`,
    );
  }
  const w = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    const cy = j === 0 || j === ny ? 0.5 : 1;
    for (let i = 0; i <= nx; i++) {
      const cx = i === 0 || i === nx ? 0.5 : 1;
      w[j * (nx + 1) + i] = hx * hy * cx * cy;
    }
  }
  return w;
}
