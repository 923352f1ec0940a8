/**
 * Where a sequence of observed orders is going: the decision rule of the order criterion.
 *
 * @module
 */

/** How the pairwise orders behave near the finest grids. */
export type TrendKind =
  | "none" // no pairwise order on the finest pair
  | "within" // finest pair within tolerance
  | "falling-within" // within tolerance but falling away from P on the last refinement
  | "above" // settled above P: at least the expected order
  | "approaching-above" // above P and falling toward it
  | "two-grids" // below P with only one pair: never enough to fail
  | "approaching" // below P and shrinking fast enough to be a pre-asymptotic approach
  | "settled-below" // below P, deviation not shrinking
  | "moving-away"; // below P, deviation growing

/** The outcome of {@link orderTrend}. */
export interface OrderTrend {
  kind: TrendKind;
  outcome: "pass" | "fail" | "inconclusive";
  /** Finest pairwise order. */
  finest: number | null;
  /** Deviations d_i = p_i − P, coarsest pair first (null where no order). */
  deviations: (number | null)[];
  /** d_m / d_{m−1}, the shrink of the deviation on the last refinement. */
  ratio: number | null;
  /** The order the pairwise orders approach, continuing the geometric series of their rises. */
  limit: number | null;
  /** The order the errors are heading to, when the trend says so (see {@link headingOrder}). */
  heading: number | null;
}

/**
 * Judges a sequence of pairwise observed orders against the expected order P with tolerance τ.
 * Rules (docs/verdicts.md, with their reasoning):
 * - finest pair within P ± τ: pass — unless it fell by more than τ/2 on the last refinement and
 *   sits below P − τ/2 (inconclusive: refine);
 * - finest pair above P + τ: pass (at least the expected order), or inconclusive while it is still
 *   falling toward P by more than τ/4 per refinement;
 * - finest pair below P − τ with one pair only: inconclusive (two grids never decide a failure);
 * - below with two or more pairs: fail as moving away when the order fell by more than τ/2 on the
 *   last refinement (or crossed P from above); fail as settled when the gap hardly moves (by at
 *   most τ/4 on each of the last refinements, two with three or more pairs); with three or more
 *   pairs and rises that shrink, continue their geometric series (Aitken's Δ²) to the limit the
 *   orders head to and fail when it lies below P − τ; otherwise inconclusive (approaching:
 *   refine).
 *
 * @param h Spacings, coarsest first.
 * @param errors Errors per grid (null where missing).
 * @param pairwise Pairwise orders, coarsest pair first.
 * @param expected The expected order P.
 * @param tolerance τ.
 * @returns The trend with its evidence.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { orderTrend } from "./order_trend.ts";
 * import { pairwiseOrders } from "./pairwise_orders.ts";
 * const h = [1 / 8, 1 / 16, 1 / 32, 1 / 64];
 * const e = h.map((x) => 0.3 * x + 4 * x * x); // a first-order term under a second-order one
 * const t = orderTrend(h, e, pairwiseOrders(h, e), 2, 0.1);
 * assert.equal(t.outcome, "fail");
 * ```
 */
export function orderTrend(
  h: readonly number[],
  errors: readonly (number | null)[],
  pairwise: readonly (number | null)[],
  expected: number,
  tolerance: number,
): OrderTrend {
  const deviations = pairwise.map((p) => (p === null ? null : p - expected));
  const m = pairwise.length;
  const last = m > 0 ? pairwise[m - 1] : null;
  const base = {
    finest: last,
    deviations,
    ratio: null as number | null,
    limit: null as number | null,
    heading: null as number | null,
  };
  if (last === null) return { ...base, kind: "none", outcome: "inconclusive" };
  const d = last - expected;
  const prev = m >= 2 ? deviations[m - 2] : null;
  const change = prev === null ? null : d - prev;
  if (Math.abs(d) <= tolerance) {
    if (change !== null && change < -tolerance / 2 && d < -tolerance / 2) {
      return { ...base, kind: "falling-within", outcome: "inconclusive" };
    }
    return { ...base, kind: "within", outcome: "pass" };
  }
  if (d > tolerance) {
    if (change !== null && change < -tolerance / 4) {
      return { ...base, kind: "approaching-above", outcome: "inconclusive" };
    }
    return { ...base, kind: "above", outcome: "pass" };
  }
  if (prev === null) return { ...base, kind: "two-grids", outcome: "inconclusive" };
  // Below P − τ on the finest pair, with at least two pairs.
  base.ratio = prev < 0 ? d / prev : null;
  const fail = (kind: "settled-below" | "moving-away", limit?: number) => {
    const heading = headingOrder(h, errors, expected);
    return {
      ...base,
      heading: limit !== undefined
        ? expected + limit
        : kind === "moving-away"
        ? heading
        : (heading ?? last),
      kind,
      outcome: "fail" as const,
    };
  };
  // Moving away: the order fell by more than τ/2 on the last refinement, or crossed P from above.
  if (prev >= 0 || d - prev < -tolerance / 2) return fail("moving-away");
  const rise = d - prev; // > 0: the order rose toward P
  const prev2 = m >= 3 ? deviations[m - 3] : null;
  if (prev2 === null) {
    // Two pairs: a gap that hardly moved (by τ/4 at most) has settled; anything else needs the
    // next grid before a failure can be called.
    if (Math.abs(rise) <= tolerance / 4) return fail("settled-below");
    return { ...base, kind: rise > 0 ? "approaching" : "settled-below", outcome: "inconclusive" };
  }
  const rise1 = prev - prev2;
  if (Math.abs(rise) <= tolerance / 4 && Math.abs(rise1) <= tolerance / 4) {
    return fail("settled-below");
  }
  if (rise > 0 && rise1 > 0 && rise < rise1) {
    // Rising, but by less each time: continue the geometric series of the rises (Aitken's Δ²)
    // to the order the sequence is heading to.
    const q = rise / rise1;
    const limit = d + rise * q / (1 - q);
    base.limit = expected + limit;
    if (limit < -tolerance) return fail("settled-below", limit);
    return { ...base, kind: "approaching", outcome: "inconclusive" };
  }
  if (rise > 0) return { ...base, kind: "approaching", outcome: "inconclusive" };
  return fail("settled-below");
}

/**
 * The order q of a lower-order term hidden under the expected one: fits E = A·h^q + B·h^P exactly
 * through the finest three errors (q scanned over [0, P − 0.05] in steps of 0.01, A and B by
 * linear least squares for each q) and returns the q with the smallest relative misfit — the
 * "error model with a second term" of docs/verdicts.md. Null with fewer than three errors or
 * when no q fits within 5 %.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { headingOrder } from "./order_trend.ts";
 * const h = [1 / 16, 1 / 32, 1 / 64];
 * const q = headingOrder(h, h.map((x) => 0.5 * x + 3 * x * x), 2);
 * assert.ok(q !== null && Math.abs(q - 1) < 0.02);
 * ```
 */
export function headingOrder(
  h: readonly number[],
  errors: readonly (number | null)[],
  expected: number,
): number | null {
  const pts: [number, number][] = [];
  for (let i = 0; i < h.length; i++) {
    const e = errors[i];
    if (e !== null && e !== undefined && e > 0 && Number.isFinite(e)) pts.push([h[i], e]);
  }
  if (pts.length < 3) return null;
  const use = pts.slice(-3);
  let best: { q: number; misfit: number } | null = null;
  for (let q = 0; q <= expected - 0.05 + 1e-12; q += 0.01) {
    // weighted least squares (rows divided by E) for A, B in E = A h^q + B h^P
    let s11 = 0, s12 = 0, s22 = 0, t1 = 0, t2 = 0;
    for (const [x, e] of use) {
      const u = x ** q / e, v = x ** expected / e;
      s11 += u * u;
      s12 += u * v;
      s22 += v * v;
      t1 += u;
      t2 += v;
    }
    const det = s11 * s22 - s12 * s12;
    if (!(Math.abs(det) > 0)) continue;
    const a = (t1 * s22 - t2 * s12) / det;
    const b = (s11 * t2 - s12 * t1) / det;
    let misfit = 0;
    for (const [x, e] of use) {
      misfit = Math.max(misfit, Math.abs((a * x ** q + b * x ** expected) / e - 1));
    }
    if (a > 0 && (best === null || misfit < best.misfit)) best = { q, misfit };
  }
  return best && best.misfit <= 0.05 ? Math.round(best.q * 100) / 100 : null;
}
