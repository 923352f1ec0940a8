import { fitLine } from "./_stats.ts";

/**
 * Exponent b of a power law y ≈ a·x^b fitted by least squares in log–log over the pairs with
 * x > 0 and y > 0 (others are skipped). Used for the growth of iterations, convergence factor and
 * solve time with the number of unknowns: b ≈ 0 means grid-independent, b ≈ 1 linear cost.
 *
 * Formula: b = slope of ln y against ln x (ordinary least squares).
 *
 * @returns The exponent, or null with fewer than two usable points or coinciding x.
 * @throws {RangeError} when the arrays differ in length.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { powerLawExponent } from "./power_law_exponent.ts";
 * assert.ok(Math.abs(powerLawExponent([100, 400, 1600], [1, 4, 16])! - 1) < 1e-12);
 * ```
 */
export function powerLawExponent(
  x: ArrayLike<number>,
  y: ArrayLike<number | null>,
): number | null {
  if (x.length !== y.length) {
    throw new RangeError(`Cannot fit a power law: ${x.length} x values but ${y.length} y values`);
  }
  const lx: number[] = [];
  const ly: number[] = [];
  for (let i = 0; i < x.length; i++) {
    const yi = y[i];
    if (x[i] > 0 && yi !== null && yi > 0 && Number.isFinite(x[i]) && Number.isFinite(yi)) {
      lx.push(Math.log(x[i]));
      ly.push(Math.log(yi));
    }
  }
  if (lx.length < 2) return null;
  const slope = fitLine(lx, ly).slope;
  return Number.isFinite(slope) ? slope : null;
}
