/**
 * Mean removal for singular problems (solution fixed only up to a constant): a field is compared
 * after subtracting its volume-weighted mean Σ wₖuₖ / Σ wₖ, with wₖ the weights (control volumes)
 * of the solver's points. Removing the mean from both the computed and the exact field makes the
 * error independent of the constant each side chose: (u_h + C) − mean(u_h + C) = u_h − mean(u_h).
 *
 * @module
 */

/**
 * The volume-weighted mean Σ wₖvₖ / Σ wₖ.
 *
 * @param values the field at the points
 * @param weights the points' weights (control volumes), same length
 * @returns the mean (0 for an empty field or zero total weight)
 *
 * @example
 * ```ts
 * import { weightedMean } from "./mean_removal.ts";
 * weightedMean(new Float64Array([1, 3]), new Float64Array([1, 3])); // 2.5
 * ```
 */
export function weightedMean(values: Float64Array, weights: Float64Array): number {
  let s = 0, w = 0;
  for (let k = 0; k < values.length; k++) s += weights[k] * values[k], w += weights[k];
  return w > 0 ? s / w : 0;
}

/**
 * A copy of the field with its volume-weighted mean removed (see {@link weightedMean}).
 *
 * @param values the field at the points
 * @param weights the points' weights, same length
 * @returns a new array whose weighted mean is 0 (to round-off)
 *
 * @example
 * ```ts
 * import { withoutMean } from "./mean_removal.ts";
 * withoutMean(new Float64Array([1, 3]), new Float64Array([1, 1])); // [-1, 1]
 * ```
 */
export function withoutMean(values: Float64Array, weights: Float64Array): Float64Array {
  const mean = weightedMean(values, weights);
  const out = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) out[k] = values[k] - mean;
  return out;
}
