/**
 * Cubic interpolation from a coarse level to the next finer one, for the first guess of full
 * multigrid: FMG's interpolation must be of higher order than the discretization (order 4 for a
 * second-order scheme) so that the interpolated coarse solution is as accurate as the fine
 * discretization, and one cycle per level then reaches the discretization error (Trottenberg,
 * Oosterlee & Schüller, *Multigrid*, 2001, §2.6, recalled from memory: FMG interpolation order
 * greater than the discretization order; bilinear interpolation is order 2 and leaves more).
 *
 * Tensor product of one-dimensional four-point Lagrange interpolation at the midpoints of a
 * coarsened direction: (−1, 9, 9, −1)/16 inside, and the one-sided (5, 15, −5, 1)/16 in the first
 * and last coarse interval (nodes 0 … 3 for the point ½). Both reproduce cubics exactly. A
 * coarsened direction with fewer than 3 coarse intervals takes the linear mean (½, ½) instead. The
 * x direction is done first on the fine rows that coincide with coarse rows; the fine rows between
 * them are then interpolated along y from those (the tensor product).
 *
 * @module
 */

/** v at the midpoint between coarse positions m and m + 1 of a line of `count` + 1 values. */
function midpoint(
  v: Float64Array,
  base: number,
  step: number,
  m: number,
  count: number,
): number {
  const p = base + m * step;
  if (count < 3) return 0.5 * (v[p] + v[p + step]);
  if (m === 0) {
    return 0.0625 * (5 * v[p] + 15 * v[p + step] - 5 * v[p + 2 * step] + v[p + 3 * step]);
  }
  if (m === count - 1) {
    return 0.0625 * (5 * v[p + step] + 15 * v[p] - 5 * v[p - step] + v[p - 2 * step]);
  }
  return 0.0625 * (9 * (v[p] + v[p + step]) - v[p - step] - v[p + 2 * step]);
}

/**
 * fine ← cubic interpolation of coarse (padded layouts, module doc), every fine node written.
 *
 * @param coarse Coarse vector (stride cnx + 3).
 * @param fine Fine vector (stride cx·cnx + 3).
 * @param grid Coarse counts and the coarsening factors.
 *
 * @example
 * ```ts
 * import { interpolateCubic } from "./cubic_interpolation.ts";
 * import { levelLayout } from "./level.ts";
 * const C = levelLayout(4, 4), F = levelLayout(8, 8), cube = (x: number) => x * x * x;
 * const c = C.vector(), f = F.vector();
 * for (let J = 0; J <= 4; J++) for (let I = 0; I <= 4; I++) c[C.index(I, J)] = cube(I / 4);
 * interpolateCubic(c, f, { cnx: 4, cny: 4, cx: 2, cy: 2 });
 * if (Math.abs(f[F.index(1, 3)] - cube(1 / 8)) > 1e-15) throw new Error("cubics are exact");
 * ```
 */
export function interpolateCubic(
  coarse: Float64Array,
  fine: Float64Array,
  grid: { cnx: number; cny: number; cx: 1 | 2; cy: 1 | 2 },
): void {
  const { cnx, cny, cx, cy } = grid;
  const cs = cnx + 3, fs = cx * cnx + 3;
  for (let J = 0; J <= cny; J++) {
    const cb = (J + 1) * cs + 1, fb = (cy * J + 1) * fs + 1;
    if (cx === 1) {
      for (let I = 0; I <= cnx; I++) fine[fb + I] = coarse[cb + I];
      continue;
    }
    for (let I = 0; I < cnx; I++) {
      fine[fb + 2 * I] = coarse[cb + I];
      fine[fb + 2 * I + 1] = midpoint(coarse, cb, 1, I, cnx);
    }
    fine[fb + 2 * cnx] = coarse[cb + cnx];
  }
  if (cy === 1) return;
  const fnx = cx * cnx;
  for (let J = 0; J < cny; J++) {
    const fb = (2 * J + 2) * fs + 1;
    for (let i = 0; i <= fnx; i++) {
      fine[fb + i] = midpoint(fine, fs + 1 + i, 2 * fs, J, cny);
    }
  }
}
