/**
 * A Robin side with constant or per-point weights.
 *
 * @module
 */
import type { BoundaryCondition } from "./types.ts";

/**
 * A Robin side α·u + β·∂u/∂n = values whose weights are constants or per-point arrays.
 *
 * @param alpha α: one number for the whole side, or one value per point
 * @param beta β: one number, or one value per point
 * @param values the data g, one value per point along the side
 * @returns the condition, with α and β as arrays of the length of `values`
 *
 * @example
 * ```ts
 * import { robinCondition } from "./robin.ts";
 * const east = robinCondition(2, 0.5, new Float64Array(9));
 * east.alpha.length; // 9
 * ```
 */
export function robinCondition(
  alpha: number | Float64Array,
  beta: number | Float64Array,
  values: Float64Array,
): Extract<BoundaryCondition, { kind: "robin" }> {
  const spread = (w: number | Float64Array) =>
    typeof w === "number" ? new Float64Array(values.length).fill(w) : w;
  return { kind: "robin", alpha: spread(alpha), beta: spread(beta), values };
}
