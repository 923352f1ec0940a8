/**
 * Norms of a local truncation error given per node of a vertex grid.
 *
 * @module
 */

/**
 * The max and the volume-weighted RMS of τ over the interior nodes of a vertex grid (boundary
 * nodes left out: their rows discretize the boundary condition, not the equation, so their
 * defect is not comparable to the source). RMS = sqrt(Σ w_k τ_k² / Σ w_k) over those nodes, with
 * w the nodes' control volumes, so that it is independent of how the grid is stretched.
 *
 * @param tau τ per node, (nx + 1)(ny + 1) values, x fastest.
 * @param weights Control volume per node (same layout).
 * @param nx Intervals along x.
 * @param ny Intervals along y.
 * @returns `{ max, l2 }` (l2 the weighted RMS), or null when the grid has no interior node.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { truncationNorms } from "./truncation_norms.ts";
 * const tau = new Float64Array(9).fill(5); // 2 × 2 intervals: one interior node
 * tau[4] = -3;
 * assert.deepEqual(truncationNorms(tau, new Float64Array(9).fill(1), 2, 2), { max: 3, l2: 3 });
 * ```
 */
export function truncationNorms(
  tau: Float64Array,
  weights: Float64Array,
  nx: number,
  ny: number,
): { max: number; l2: number } | null {
  let max = 0, sum = 0, volume = 0;
  for (let j = 1; j < ny; j++) {
    for (let i = 1; i < nx; i++) {
      const k = j * (nx + 1) + i, t = Math.abs(tau[k]), w = weights[k];
      if (t > max) max = t;
      sum += w * t * t;
      volume += w;
    }
  }
  return volume > 0 ? { max, l2: Math.sqrt(sum / volume) } : null;
}
