import { fitLine } from "./_stats.ts";
import { studentTQuantile } from "./student_t.ts";

/** A least-squares observed order with its confidence interval. */
export interface FittedOrder {
  /** Slope of log E against log h; null when fewer than two usable points. */
  order: number | null;
  /** Lower end of the confidence interval; null with two points (no degrees of freedom left). */
  low: number | null;
  /** Upper end of the confidence interval. */
  high: number | null;
  /** Number of grids fitted. */
  points: number;
}

/**
 * Observed order as the least-squares slope of log E against log h over the finest `points` grids,
 * with a two-sided confidence interval from Student's t distribution.
 *
 * Model: ln E_i = ln C + p·ln h_i + ε_i. Ordinary least squares gives p̂ and its standard error
 * s_p = sqrt(SSR/(k − 2) / Σ(ln h_i − mean)²); the interval is p̂ ± t_{(1+c)/2, k−2}·s_p
 * (standard linear regression, e.g. Montgomery & Runger, Applied Statistics and Probability for
 * Engineers, §11.4). The interval assumes independent errors about a straight line; outside the
 * asymptotic range the curvature of log E inflates it, which is the intended warning sign.
 *
 * @param h Spacing per grid, coarsest first.
 * @param errors Error per grid, aligned with h; grids with a non-positive or non-finite error
 *   among the finest `points` are skipped (and `points` reports how many remained).
 * @param options `points`: grids used, finest first (default 3, at most h.length);
 *   `confidence`: two-sided level (default 0.95).
 * @returns The fitted order and interval.
 * @throws {RangeError} when lengths differ, points < 2 or confidence is outside (0, 1).
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { fittedOrder } from "./fitted_order.ts";
 * const f = fittedOrder([0.4, 0.2, 0.1, 0.05], [0.16, 0.04, 0.01, 0.0025], { points: 4 });
 * assert.ok(Math.abs(f.order! - 2) < 1e-12 && f.points === 4);
 * ```
 */
export function fittedOrder(
  h: ArrayLike<number>,
  errors: ArrayLike<number | null>,
  options: { points?: number; confidence?: number } = {},
): FittedOrder {
  if (h.length !== errors.length) {
    throw new RangeError(
      `Cannot fit an observed order: ${h.length} spacings but ${errors.length} errors`,
    );
  }
  const want = options.points ?? 3;
  const confidence = options.confidence ?? 0.95;
  if (!(Number.isInteger(want) && want >= 2)) {
    throw new RangeError(
      `Cannot fit an observed order: points must be an integer ≥ 2, got ${want}`,
    );
  }
  if (!(confidence > 0 && confidence < 1)) {
    throw new RangeError(
      `Cannot fit an observed order: confidence must lie in (0, 1), got ${confidence}`,
    );
  }
  const x: number[] = [];
  const y: number[] = [];
  for (let i = Math.max(0, h.length - want); i < h.length; i++) {
    const e = errors[i];
    if (e === null || !(e > 0) || !Number.isFinite(e) || !(h[i] > 0)) continue;
    x.push(Math.log(h[i]));
    y.push(Math.log(e));
  }
  const k = x.length;
  if (k < 2) return { order: null, low: null, high: null, points: k };
  const fit = fitLine(x, y);
  if (!Number.isFinite(fit.slope)) return { order: null, low: null, high: null, points: k };
  if (k === 2) return { order: fit.slope, low: null, high: null, points: k };
  const half = studentTQuantile((1 + confidence) / 2, k - 2) * fit.slopeStandardError;
  return { order: fit.slope, low: fit.slope - half, high: fit.slope + half, points: k };
}
