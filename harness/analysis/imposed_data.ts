import type { ImposedDataCheck, SideName } from "../result/types.ts";
import { REORDERINGS } from "./reorderings.ts";

/**
 * Relative bound on |u_h − g| at Dirichlet nodes: any vertex scheme returns the imposed value
 * itself, so only round-off and printing (17 significant digits in JSON) separate them; 1e-8
 * leaves room for a solver that prints about 10 digits (our choice).
 */
export const IMPOSED_BOUND = 1e-8;

/** Nodal data of a vertex grid's Dirichlet sides, in increasing coordinate, corners included. */
export type SideData = Partial<Record<SideName, ArrayLike<number>>>;

function sideNodes(side: SideName, nx: number, ny: number): [number, number][] {
  const out: [number, number][] = [];
  if (side === "west" || side === "east") {
    const i = side === "west" ? 0 : nx;
    for (let j = 0; j <= ny; j++) out.push([i, j]);
  } else {
    const j = side === "south" ? 0 : ny;
    for (let i = 0; i <= nx; i++) out.push([i, j]);
  }
  return out;
}

function worstPerSide(
  read: (i: number, j: number) => number,
  data: SideData,
  nx: number,
  ny: number,
): Partial<Record<SideName, number>> {
  const out: Partial<Record<SideName, number>> = {};
  for (const side of Object.keys(data) as SideName[]) {
    const g = data[side]!;
    let worst = 0;
    sideNodes(side, nx, ny).forEach(([i, j], k) => {
      // Corners are left out: which condition holds where two sides meet is the solver's
      // choice (and with two Dirichlet sides a slip on one would show on both).
      if ((i === 0 || i === nx) && (j === 0 || j === ny)) return;
      const d = Math.abs(read(i, j) - g[k]);
      worst = Number.isNaN(d) ? Infinity : Math.max(worst, d);
    });
    out[side] = worst;
  }
  return out;
}

/**
 * Checks that a vertex-layout solution returns the Dirichlet data it was given, side by side, and
 * when it does not, which simple reordering of the output (y-fastest, rows or columns reversed,
 * shifted by one) would reproduce the data — the signature of an output written in the wrong
 * point order rather than a wrong discretization.
 *
 * @param values The returned field, (nx + 1)(ny + 1) values, x fastest.
 * @param grid Intervals along x and y.
 * @param data Nodal data of each Dirichlet side (see {@link SideData}).
 * @param scale max |u| of the case; differences are reported relative to it.
 * @returns Per side the largest relative difference, and the reordering that fixes them (or null).
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { imposedDataCheck } from "./imposed_data.ts";
 * // 2×2 intervals, u = x + 10y at nodes x-fastest; west data u(0, y) = 0, 5, 10
 * const u = [0, 0.5, 1, 5, 5.5, 6, 10, 10.5, 11];
 * assert.equal(imposedDataCheck(u, { nx: 2, ny: 2 }, { west: [0, 5, 10] }, 11).sides.west, 0);
 * const t = [0, 5, 10, 0.5, 5.5, 10.5, 1, 6, 11]; // the same field written y-fastest
 * assert.match(imposedDataCheck(t, { nx: 2, ny: 2 }, { west: [0, 5, 10] }, 11).reordering!, /y-fastest/);
 * ```
 */
export function imposedDataCheck(
  values: ArrayLike<number>,
  grid: { nx: number; ny: number },
  data: SideData,
  scale: number,
): ImposedDataCheck {
  const { nx, ny } = grid;
  const s = scale > 0 ? scale : 1;
  const rel = (m: Partial<Record<SideName, number>>) =>
    Object.fromEntries(Object.entries(m).map(([k, v]) => [k, v! / s])) as Partial<
      Record<SideName, number>
    >;
  const sides = rel(worstPerSide((i, j) => values[j * (nx + 1) + i], data, nx, ny));
  const ok = (m: Partial<Record<SideName, number>>) =>
    Object.values(m).every((v) => v! <= IMPOSED_BOUND);
  if (ok(sides)) return { sides, reordering: null };
  const n = values.length;
  for (const r of REORDERINGS) {
    const read = (i: number, j: number) => {
      const k = r.index(i, j, nx + 1, ny + 1);
      return k >= 0 && k < n ? values[k] : NaN;
    };
    if (ok(rel(worstPerSide(read, data, nx, ny)))) return { sides, reordering: r.name };
  }
  return { sides, reordering: null };
}
