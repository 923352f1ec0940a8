import type { NormSet, OrderRecord, Region } from "../result/types.ts";
import { fittedOrder } from "./fitted_order.ts";
import { pairwiseOrders } from "./pairwise_orders.ts";

/**
 * Judges whether a sequence of pairwise observed orders has settled, i.e. the grids are in the
 * asymptotic range where the leading error term dominates: the last two pairwise orders are both
 * known and differ by at most `tolerance`.
 *
 * Criterion (common practice; Oberkampf & Roy 2010 §8.2 describe judging the asymptotic range by
 * the approach of the observed order to a constant): |p_{n−1} − p_{n−2}| ≤ tolerance.
 *
 * @param pairwise Pairwise orders, coarsest pair first (from {@link pairwiseOrders}).
 * @param options `tolerance`: largest change allowed (default 0.1, the default order tolerance).
 * @returns true when settled; false with fewer than two known finest pairs.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { asymptoticRange } from "./order_record.ts";
 * assert.ok(asymptoticRange([1.6, 1.95, 1.99]) && !asymptoticRange([1.2, 1.6]));
 * ```
 */
export function asymptoticRange(
  pairwise: readonly (number | null)[],
  options: { tolerance?: number } = {},
): boolean {
  const tolerance = options.tolerance ?? 0.1;
  const n = pairwise.length;
  if (n < 2) return false;
  const a = pairwise[n - 2];
  const b = pairwise[n - 1];
  return a !== null && b !== null && Math.abs(a - b) <= tolerance;
}

/**
 * Observed orders of one norm in one region over a grid sequence: pairwise orders, the fitted
 * order with its 95 % interval ({@link fittedOrder}) and the asymptotic-range judgement
 * ({@link asymptoticRange}).
 *
 * @param region Region the errors were measured in.
 * @param norm Which norm.
 * @param h Spacing per grid, coarsest first.
 * @param errors Error per grid, aligned.
 * @param options `points` (default 3), `confidence` (default 0.95), `settleTolerance`
 *   (default 0.1).
 * @returns An {@link OrderRecord}.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { orderRecord } from "./order_record.ts";
 * const r = orderRecord("all", "max", [0.2, 0.1, 0.05], [0.04, 0.01, 0.0025]);
 * assert.ok(r.asymptotic && Math.abs(r.fitted.order! - 2) < 1e-12);
 * ```
 */
export function orderRecord(
  region: Region,
  norm: keyof NormSet,
  h: ArrayLike<number>,
  errors: ArrayLike<number | null>,
  options: { points?: number; confidence?: number; settleTolerance?: number } = {},
): OrderRecord {
  const pairwise = pairwiseOrders(h, errors);
  const points = Math.max(2, Math.min(options.points ?? 3, h.length));
  const fitted = h.length >= 2
    ? fittedOrder(h, errors, { points, confidence: options.confidence })
    : { order: null, low: null, high: null, points: 0 };
  return {
    region,
    norm,
    pairwise,
    fitted,
    asymptotic: asymptoticRange(pairwise, { tolerance: options.settleTolerance }),
  };
}
