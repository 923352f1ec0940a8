/**
 * Reorderings of a structured field (mx × my points, x fastest) that a solver's output can suffer
 * by mistake: another index order, reversed rows or columns, a value dropped or added at the start.
 * Each maps a point (i, j) to the index the misordered output holds it at.
 */
export const REORDERINGS: readonly {
  name: string;
  index: (i: number, j: number, mx: number, my: number) => number;
}[] = [
  { name: "the values come y-fastest instead of x-fastest", index: (i, j, _mx, my) => i * my + j },
  {
    name: "the rows come north first instead of south first",
    index: (i, j, mx, my) => (my - 1 - j) * mx + i,
  },
  {
    name: "each row comes east first instead of west first",
    index: (i, j, mx) => j * mx + mx - 1 - i,
  },
  {
    name: "the values are shifted by one position (a value dropped at the start)",
    index: (i, j, mx) => j * mx + i - 1,
  },
  {
    name: "the values are shifted by one position (a value added at the start)",
    index: (i, j, mx) => j * mx + i + 1,
  },
];

/** A reordering must fit the exact solution this many times better to be named (our choice). */
export const REORDER_GAIN = 10;

/**
 * Errors below this share of max |u| are round-off: no reordering is judged from them (a
 * symmetric solution reproduced to round-off matches itself transposed, by chance better).
 */
export const REORDER_FLOOR = 1e-9;

/**
 * Finds a reordering under which a structured field matches the exact solution at least
 * {@link REORDER_GAIN} times better (max norm) than as given: the signature of an output written
 * in the wrong point order. A correct field never qualifies — any reordering of a non-trivial
 * solution makes O(1) errors, and a symmetric solution maps onto itself, matching equally well.
 *
 * @param values The field as returned, mx·my values, x fastest.
 * @param exact The exact solution at the same points.
 * @param mx Points along x.
 * @param my Points along y.
 * @returns The reordering's name, or null.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { betterOrder } from "./reorderings.ts";
 * const exact = [0, 1, 2, 10, 11, 12]; // 3 × 2 points, u = i + 10j
 * const written = [0, 10, 1, 11, 2, 12]; // the same field written y-fastest
 * assert.match(betterOrder(written, exact, 3, 2)!, /y-fastest/);
 * assert.equal(betterOrder(exact, exact, 3, 2), null);
 * ```
 */
export function betterOrder(
  values: ArrayLike<number>,
  exact: ArrayLike<number>,
  mx: number,
  my: number,
): string | null {
  const n = mx * my;
  if (values.length !== n || exact.length !== n) return null;
  let given = 0, scale = 0;
  for (let k = 0; k < n; k++) {
    given = Math.max(given, Math.abs(values[k] - exact[k]));
    scale = Math.max(scale, Math.abs(exact[k]));
  }
  if (!(given > REORDER_FLOOR * scale)) return null;
  for (const r of REORDERINGS) {
    let worst = 0;
    for (let j = 0; j < my && worst * REORDER_GAIN < given; j++) {
      for (let i = 0; i < mx; i++) {
        const k = r.index(i, j, mx, my);
        // the value a shift pushes out of the array is unknown: leave that point out
        if (k < 0 || k >= n) continue;
        worst = Math.max(worst, Math.abs(values[k] - exact[j * mx + i]));
      }
    }
    if (worst * REORDER_GAIN < given) return r.name;
  }
  return null;
}
