/**
 * A coarse picture of where the error sits: the field |u_h − u| of a structured grid (mx × my
 * points, x fastest) reduced to at most `blocks` × `blocks` block maxima, rounded to three
 * significant digits so a result file can carry one per failing study.
 *
 * @param values Computed values.
 * @param exact Exact values at the same points.
 * @param mx Points along x.
 * @param my Points along y.
 * @param blocks Largest number of blocks per direction (default 16).
 * @returns Columns and rows of the map and the block maxima, row by row from the south, west first.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { errorMap } from "./error_map.ts";
 * // 4 × 2 points, one error of 0.5 at the east end of the north row
 * const m = errorMap([0, 0, 0, 0, 0, 0, 0, 0.5], new Array(8).fill(0), 4, 2, 2);
 * assert.deepEqual(m, { columns: 2, rows: 2, values: [0, 0, 0, 0.5] });
 * ```
 */
export function errorMap(
  values: ArrayLike<number>,
  exact: ArrayLike<number>,
  mx: number,
  my: number,
  blocks = 16,
): { columns: number; rows: number; values: number[] } {
  const columns = Math.min(blocks, mx), rows = Math.min(blocks, my);
  const out = new Array<number>(columns * rows).fill(0);
  for (let j = 0; j < my; j++) {
    const bj = Math.min(rows - 1, Math.floor((j * rows) / my));
    for (let i = 0; i < mx; i++) {
      const bi = Math.min(columns - 1, Math.floor((i * columns) / mx));
      const e = Math.abs(values[j * mx + i] - exact[j * mx + i]);
      const k = bj * columns + bi;
      if (!(e <= out[k])) out[k] = e;
    }
  }
  return { columns, rows, values: out.map((v) => Number(v.toPrecision(3))) };
}
