import type { NormSet } from "../result/types.ts";

/** Options of {@link errorNorms}. */
export interface ErrorNormOptions {
  /** Quadrature weights (default all equal). */
  weights?: ArrayLike<number>;
  /** Include point k only when mask[k] is non-zero (default all). */
  mask?: ArrayLike<number>;
  /** Divisor of the L2 and L1 sums (default: the included weights' sum). */
  measure?: number;
}

function isArrayLike(x: unknown): x is ArrayLike<number> {
  return x !== undefined && x !== null && typeof (x as ArrayLike<number>).length === "number";
}

/**
 * Max, discrete L2 and discrete L1 norms of the error e_k = values_k − exact_k over a set of
 * points with quadrature weights w_k, optionally restricted to the points where `mask` is non-zero.
 *
 * Formulas (M = `measure`, by default Σ w_k over the included points):
 * - max = max_k |e_k|
 * - l2 = sqrt(Σ w_k e_k² / M)
 * - l1 = Σ w_k |e_k| / M
 *
 * With the default measure the L2 and L1 norms are the area-weighted root-mean-square and mean
 * error over the included points. That keeps the order of a boundary band honest: the band's
 * area shrinks like h, and dividing by a fixed area would give its norms a spurious extra
 * h^½ (L2) or h (L1). For a region that tends to the whole domain (the interior) pass the
 * domain's area as `measure` instead: dividing by the region's own, h-dependent area would put an
 * O(h) drift into the observed order. With trapezoid weights and measure = area these are the
 * usual discrete L2 and L1 norms (Oberkampf & Roy 2010, §5.4). Non-finite values propagate.
 *
 * @param values Computed values at the points.
 * @param exact Exact values at the same points.
 * @param weights Quadrature weights (default all equal, giving plain RMS and mean errors), or an
 *   options object `{ weights?, mask?, measure? }` — `mask`: include point k only when mask[k] is
 *   non-zero (default all); `measure`: the divisor M (default the included weights' sum).
 * @param mask Same as the option `mask` (when the weights are given as an array).
 * @returns The three norms.
 * @throws {RangeError} when lengths differ, a weight is negative or no point is included.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { errorNorms } from "./error_norms.ts";
 * const n = errorNorms([1, 2, 3], [1, 2, 5]);
 * assert.ok(n.max === 2 && Math.abs(n.l1 - 2 / 3) < 1e-15);
 * ```
 */
export function errorNorms(
  values: ArrayLike<number>,
  exact: ArrayLike<number>,
  weightsOrOptions?: ArrayLike<number> | ErrorNormOptions,
  maskArgument?: ArrayLike<number>,
): NormSet {
  const options: ErrorNormOptions = isArrayLike(weightsOrOptions)
    ? { weights: weightsOrOptions, mask: maskArgument }
    : { mask: maskArgument, ...weightsOrOptions };
  const { weights, mask } = options;
  const n = values.length;
  if (exact.length !== n || (weights && weights.length !== n) || (mask && mask.length !== n)) {
    throw new RangeError(
      `Cannot compute error norms: arrays differ in length (values ${n}, exact ${exact.length}` +
        `${weights ? `, weights ${weights.length}` : ""}${mask ? `, mask ${mask.length}` : ""})`,
    );
  }
  let max = 0;
  let sumW = 0;
  let sum2 = 0;
  let sum1 = 0;
  let count = 0;
  let nan = false;
  for (let k = 0; k < n; k++) {
    if (mask && !mask[k]) continue;
    const w = weights ? weights[k] : 1;
    if (!(w >= 0)) {
      throw new RangeError(`Cannot compute error norms: weight ${k} is ${w}, must be ≥ 0`);
    }
    const e = Math.abs(values[k] - exact[k]);
    if (Number.isNaN(e)) nan = true;
    if (e > max) max = e;
    sumW += w;
    sum2 += w * e * e;
    sum1 += w * e;
    count++;
  }
  if (count === 0) {
    throw new RangeError("Cannot compute error norms: no point is included (empty set or mask)");
  }
  if (nan) return { max: NaN, l2: NaN, l1: NaN };
  const measure = options.measure ?? sumW;
  if (!(measure > 0)) {
    throw new RangeError(`Cannot compute error norms: the measure is ${measure}, must be positive`);
  }
  return { max, l2: Math.sqrt(sum2 / measure), l1: sum1 / measure };
}
