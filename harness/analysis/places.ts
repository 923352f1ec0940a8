import type { NormSet, Place } from "../result/types.ts";
import { PLACES } from "../result/types.ts";
import { errorNorms } from "./error_norms.ts";

/** Point layers in each side's band (the boundary row and one layer in), as the boundary band. */
export const PLACE_LAYERS = 2;

/** Index of each place in {@link PLACES}, the code stored by {@link placeOfPoints}. */
const CODE: Record<Place, number> = Object.fromEntries(PLACES.map((p, k) => [p, k])) as Record<
  Place,
  number
>;

/**
 * Assigns every point to a place: the band along a side holds the points within
 * (layers − ½)·h of that side (h the spacing across it: the boundary row and layers − 1 more on
 * vertex and cell grids alike); points near two sides form the corner blocks; the rest is the
 * interior.
 *
 * @param x Point abscissae.
 * @param y Point ordinates (same length).
 * @param domain The rectangle.
 * @param spacing Grid spacing along x and y (for free points: the representative spacing twice).
 * @returns A code per point: the index of its place in {@link PLACES}.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { placeOfPoints } from "./places.ts";
 * import { PLACES } from "../result/types.ts";
 * const code = placeOfPoints([0, 0.5, 0.5], [0.5, 0.5, 0], { x0: 0, x1: 1, y0: 0, y1: 1 }, {
 *   hx: 0.125, hy: 0.125 });
 * assert.deepEqual([...code].map((c) => PLACES[c]), ["west", "interior", "south"]);
 * ```
 */
export function placeOfPoints(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  domain: { x0: number; x1: number; y0: number; y1: number },
  spacing: { hx: number; hy: number },
): Uint8Array {
  const wx = (PLACE_LAYERS - 0.5) * spacing.hx * (1 + 1e-9);
  const wy = (PLACE_LAYERS - 0.5) * spacing.hy * (1 + 1e-9);
  const code = new Uint8Array(x.length);
  for (let k = 0; k < x.length; k++) {
    const west = x[k] - domain.x0 <= wx, east = domain.x1 - x[k] <= wx;
    const south = y[k] - domain.y0 <= wy, north = domain.y1 - y[k] <= wy;
    const nearX = west || east, nearY = south || north;
    code[k] = nearX && nearY
      ? CODE.corners
      : west
      ? CODE.west
      : east
      ? CODE.east
      : south
      ? CODE.south
      : north
      ? CODE.north
      : CODE.interior;
  }
  return code;
}

/**
 * Error norms per place ({@link placeOfPoints} codes). Each place's L2 and L1 norms divide by the
 * place's own weight (mean errors over the place), so a thin band keeps its own order; places
 * without points are left out.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { placeNorms } from "./places.ts";
 * const n = placeNorms([1, 2], [1, 2.5], new Uint8Array([0, 5]), [1, 1]);
 * assert.ok(n.west!.max === 0 && n.interior!.max === 0.5 && n.east === undefined);
 * ```
 */
export function placeNorms(
  values: ArrayLike<number>,
  exact: ArrayLike<number>,
  code: Uint8Array,
  weights: ArrayLike<number>,
): Partial<Record<Place, NormSet>> {
  const out: Partial<Record<Place, NormSet>> = {};
  // one mask buffer, refilled per place: errorNorms stays the one place the formulas live
  const mask = new Uint8Array(code.length);
  for (let p = 0; p < PLACES.length; p++) {
    let any = false;
    for (let k = 0; k < code.length; k++) {
      mask[k] = code[k] === p ? 1 : 0;
      any ||= mask[k] === 1;
    }
    if (any) out[PLACES[p]] = errorNorms(values, exact, { weights, mask });
  }
  return out;
}
