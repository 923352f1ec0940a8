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

/**
 * out[o + i·so] = the value at the midpoint between positions m and m + 1 of `count` + 1 values
 * v[b + t·sb] (t = 0 … count), for the `len` lines i = 0 … len − 1 whose values start at
 * b + i·si: one loop per formula, no branch inside it.
 */
function midpoints(
  v: Float64Array,
  b: number,
  sb: number,
  si: number,
  out: Float64Array,
  o: number,
  so: number,
  m: number,
  count: number,
  len: number,
): void {
  const p = b + m * sb;
  if (count < 3) {
    for (let i = 0, q = p, k = o; i < len; i++, q += si, k += so) {
      out[k] = 0.5 * (v[q] + v[q + sb]);
    }
  } else if (m === 0) {
    for (let i = 0, q = p, k = o; i < len; i++, q += si, k += so) {
      out[k] = 0.0625 * (5 * v[q] + 15 * v[q + sb] - 5 * v[q + 2 * sb] + v[q + 3 * sb]);
    }
  } else if (m === count - 1) {
    for (let i = 0, q = p, k = o; i < len; i++, q += si, k += so) {
      out[k] = 0.0625 * (5 * v[q + sb] + 15 * v[q] - 5 * v[q - sb] + v[q - 2 * sb]);
    }
  } else {
    for (let i = 0, q = p, k = o; i < len; i++, q += si, k += so) {
      out[k] = 0.0625 * (9 * (v[q] + v[q + sb]) - v[q - sb] - v[q + 2 * sb]);
    }
  }
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
      fine.set(coarse.subarray(cb, cb + cnx + 1), fb);
      continue;
    }
    for (let I = 0; I <= cnx; I++) fine[fb + 2 * I] = coarse[cb + I];
    // Midpoints along x: the one-sided formulas at I = 0 and cnx − 1, the interior one between.
    if (cnx < 3) midpoints(coarse, cb, 1, 1, fine, fb + 1, 2, 0, cnx, cnx);
    else {
      midpoints(coarse, cb, 1, 1, fine, fb + 1, 2, 0, cnx, 1);
      for (let I = 1; I < cnx - 1; I++) {
        const q = cb + I;
        fine[fb + 2 * I + 1] = 0.0625 *
          (9 * (coarse[q] + coarse[q + 1]) - coarse[q - 1] - coarse[q + 2]);
      }
      midpoints(coarse, cb, 1, 1, fine, fb + 2 * cnx - 1, 2, cnx - 1, cnx, 1);
    }
  }
  if (cy === 1) return;
  // Midpoints along y: whole fine rows at once from the coinciding rows 2J (stride 2·fs).
  const len = cx * cnx + 1;
  for (let J = 0; J < cny; J++) {
    midpoints(fine, fs + 1, 2 * fs, 1, fine, (2 * J + 2) * fs + 1, 1, J, cny, len);
  }
}
