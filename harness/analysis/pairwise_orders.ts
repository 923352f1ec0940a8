/**
 * Observed orders of accuracy between successive grids.
 *
 * Formula: p_i = ln(E_i / E_{i+1}) / ln(h_i / h_{i+1}) for successive grids i, i + 1 (Roache,
 * Verification and Validation in Computational Science and Engineering, 1998; Oberkampf & Roy
 * 2010, eq. 5.23), valid for any refinement ratio, not only 2.
 *
 * @param h Representative spacing per grid, coarsest first.
 * @param errors Error norm per grid, aligned with h.
 * @returns n − 1 orders, coarsest pair first; null where an error is zero, negative or not finite,
 *   or two spacings coincide (an exact case's round-off errors give meaningless orders anyway).
 * @throws {RangeError} when the arrays differ in length.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { pairwiseOrders } from "./pairwise_orders.ts";
 * const p = pairwiseOrders([0.1, 0.05], [4e-3, 1e-3]);
 * assert.ok(Math.abs(p[0]! - 2) < 1e-12);
 * ```
 */
export function pairwiseOrders(
  h: ArrayLike<number>,
  errors: ArrayLike<number | null>,
): (number | null)[] {
  if (h.length !== errors.length) {
    throw new RangeError(
      `Cannot compute observed orders: ${h.length} spacings but ${errors.length} errors`,
    );
  }
  const out: (number | null)[] = [];
  for (let i = 0; i + 1 < h.length; i++) {
    const e0 = errors[i];
    const e1 = errors[i + 1];
    const ratio = h[i] / h[i + 1];
    if (
      e0 === null || e1 === null || !(e0 > 0) || !(e1 > 0) || !Number.isFinite(e0) ||
      !Number.isFinite(e1) || !(ratio > 0) || ratio === 1 || !Number.isFinite(ratio)
    ) {
      out.push(null);
      continue;
    }
    out.push(Math.log(e0 / e1) / Math.log(ratio));
  }
  return out;
}
