/**
 * Interpolation from a coarse level to the next finer one, stored as weights: every fine node
 * (i, j) takes its value from the (up to) four coarse nodes of the coarse cell it lies in,
 * (I0, J0), (I0 + 1, J0), (I0, J0 + 1), (I0 + 1, J0 + 1) with I0 = ⌊i/cx⌋, J0 = ⌊j/cy⌋ (cx, cy
 * the coarsening factors, 2 or 1).
 *
 * - `bilinear`: 1 at a fine node that coincides with a coarse node, ½ and ½ between two, ¼ each at
 *   the centre of a coarse cell — the interpolation of `transfer.ts` written as weights.
 * - `operator-dependent`: the weights follow the fine operator A, so that an interpolated error is
 *   nearly A-harmonic where the coefficients jump (the "matrix-dependent prolongation" of
 *   Alcouffe, Brandt, Dendy and Painter, SIAM J. Sci. Stat. Comput. 2 (1981), in the form of
 *   Dendy's black-box multigrid, J. Comput. Phys. 48 (1982); from memory). With the stencil of A
 *   at the fine node (SW … NE):
 *   - between two coarse nodes along x, the stencil is collapsed in y (each column summed):
 *     weight of the west parent −(SW + W + NW)/(S + C + N), of the east parent
 *     −(SE + E + NE)/(S + C + N);
 *   - between two coarse nodes along y, collapsed in x: south parent −(SW + S + SE)/(W + C + E),
 *     north parent −(NW + N + NE)/(W + C + E);
 *   - at a cell centre, the row of A is solved for the centre value with the eight neighbours
 *     interpolated as above: weight of each parent −(corner coefficient + the two edge-neighbour
 *     coefficients × those neighbours' weights of that parent)/C.
 *   For a constant-coefficient operator with zero row sums these are the bilinear weights; across
 *   a jump k1 | k2 between two coarse nodes the weights become k1/(k1 + k2) and k2/(k1 + k2), so
 *   the interpolated error has a continuous flux instead of a continuous slope. Rows with zero
 *   sum (no e, no Robin term) keep weights that sum to one, so constants stay in the range of P
 *   and a singular level stays singular. With semi-coarsening only the collapsed rule of the
 *   coarsened direction is used.
 *
 * Dirichlet rows of A are identity rows: their collapsed sums give weight 0, so a fine Dirichlet
 * node interpolates nothing (its error is zero).
 *
 * @module
 */
import type { LevelOperator } from "./level.ts";
import { isNinePoint } from "./level.ts";

/** Names of the interpolations. */
export type InterpolationName = "bilinear" | "operator-dependent";

/** An interpolation as per-fine-node weights (see the module doc). */
export interface Prolongation {
  /** Which interpolation. */
  readonly name: InterpolationName;
  /** Coarsening factor in x (2, or 1 when x is not coarsened). */
  readonly cx: 1 | 2;
  /** Coarsening factor in y. */
  readonly cy: 1 | 2;
  /** Weight of coarse node (I0, J0), per fine node (fine padded layout). */
  readonly w00: Float64Array;
  /** Weight of coarse node (I0 + 1, J0). */
  readonly w10: Float64Array;
  /** Weight of coarse node (I0, J0 + 1). */
  readonly w01: Float64Array;
  /** Weight of coarse node (I0 + 1, J0 + 1). */
  readonly w11: Float64Array;
}

/**
 * The bilinear interpolation of a level as weights.
 *
 * @param fine The fine level.
 * @param coarsening The coarsening factors.
 * @returns The weights (see the module doc).
 *
 * @example
 * ```ts
 * import { bilinearProlongation } from "./prolongation.ts";
 * import { levelLayout } from "./level.ts";
 * const p = bilinearProlongation(levelLayout(4, 4) as never, { cx: 2, cy: 2 });
 * if (p.w11[levelLayout(4, 4).index(1, 1)] !== 0.25) throw new Error("cell centre");
 * ```
 */
export function bilinearProlongation(
  fine: Pick<LevelOperator, "nx" | "ny" | "length" | "index">,
  coarsening: { cx: 1 | 2; cy: 1 | 2 },
): Prolongation {
  const { cx, cy } = coarsening;
  const w00 = new Float64Array(fine.length), w10 = new Float64Array(fine.length);
  const w01 = new Float64Array(fine.length), w11 = new Float64Array(fine.length);
  for (let j = 0; j <= fine.ny; j++) {
    const oy = cy === 2 && (j & 1) === 1;
    for (let i = 0; i <= fine.nx; i++) {
      const ox = cx === 2 && (i & 1) === 1, k = fine.index(i, j);
      const ax = ox ? 0.5 : 1, ay = oy ? 0.5 : 1;
      w00[k] = ax * ay;
      if (ox) w10[k] = 0.5 * ay;
      if (oy) w01[k] = ax * 0.5;
      if (ox && oy) w11[k] = 0.25;
    }
  }
  return { name: "bilinear", cx, cy, w00, w10, w01, w11 };
}

/**
 * The operator-dependent interpolation of a level (see the module doc).
 *
 * @param fine The fine level operator.
 * @param coarsening The coarsening factors.
 * @returns The weights.
 *
 * @example
 * ```ts
 * import { operatorProlongation } from "./prolongation.ts";
 * import { buildLevel } from "./hierarchy.ts";
 * const n = 4, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const level = buildLevel({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * const p = operatorProlongation(level, { cx: 2, cy: 2 });
 * // the Laplacian's rows sum to zero: bilinear weights
 * if (p.w10[level.index(1, 2)] !== 0.5 || p.w11[level.index(1, 1)] !== 0.25) throw new Error("");
 * ```
 */
export function operatorProlongation(
  fine: LevelOperator,
  coarsening: { cx: 1 | 2; cy: 1 | 2 },
): Prolongation {
  const { cx, cy } = coarsening;
  const { nx, ny, length, W, E, S, N, C } = fine;
  const none = new Float64Array(length);
  const nine = isNinePoint(fine);
  const SW = nine ? fine.SW : none, SE = nine ? fine.SE : none;
  const NW = nine ? fine.NW : none, NE = nine ? fine.NE : none;
  const w00 = new Float64Array(length), w10 = new Float64Array(length);
  const w01 = new Float64Array(length), w11 = new Float64Array(length);
  const s = fine.stride;
  const ratio = (num: number, den: number) => (den === 0 ? 0 : -num / den);
  // Coincident nodes and nodes between two coarse nodes first (the centres need them).
  for (let j = 0; j <= ny; j++) {
    const oy = cy === 2 && (j & 1) === 1;
    for (let i = 0, k = (j + 1) * s + 1; i <= nx; i++, k++) {
      const ox = cx === 2 && (i & 1) === 1;
      if (!ox && !oy) w00[k] = 1;
      else if (ox && !oy) {
        const den = S[k] + C[k] + N[k];
        w00[k] = ratio(SW[k] + W[k] + NW[k], den);
        w10[k] = ratio(SE[k] + E[k] + NE[k], den);
      } else if (!ox && oy) {
        const den = W[k] + C[k] + E[k];
        w00[k] = ratio(SW[k] + S[k] + SE[k], den);
        w01[k] = ratio(NW[k] + N[k] + NE[k], den);
      }
    }
  }
  if (cx === 2 && cy === 2) {
    for (let j = 1; j < ny; j += 2) {
      for (let i = 1, k = (j + 1) * s + 2; i < nx; i += 2, k += 2) {
        const c = C[k];
        if (c === 0) continue;
        // Neighbours: west (i−1, j) and east (i+1, j) lie between coarse nodes along y; south
        // (i, j−1) and north (i, j+1) between coarse nodes along x; the corners are coarse nodes.
        const kw = k - 1, ke = k + 1, ks = k - s, kn = k + s;
        w00[k] = -(SW[k] + W[k] * w00[kw] + S[k] * w00[ks]) / c;
        w10[k] = -(SE[k] + E[k] * w00[ke] + S[k] * w10[ks]) / c;
        w01[k] = -(NW[k] + W[k] * w01[kw] + N[k] * w00[kn]) / c;
        w11[k] = -(NE[k] + E[k] * w01[ke] + N[k] * w10[kn]) / c;
      }
    }
  }
  return { name: "operator-dependent", cx, cy, w00, w10, w01, w11 };
}

/**
 * Row (I, J) of the restriction R = M_c⁻¹·Pᵀ·M (M, M_c the diagonal control-volume matrices of
 * the fine and coarse grids: 1, ½, ¼ of the cell area inside, on a side, at a corner): the nine
 * weights w[(dj + 1)·3 + di + 1] of the fine nodes (cx·I + di, cy·J + dj). For bilinear P this is
 * full weighting in the volume scaling of `transfer.ts`.
 *
 * @param P The interpolation.
 * @param fine Fine grid counts and layout.
 * @param coarse Coarse grid counts.
 * @param node The coarse node (I, J).
 * @returns Nine weights (zero off the grid and for fine nodes that are not children of (I, J)).
 *
 * @example
 * ```ts
 * import { bilinearProlongation, transposeRow } from "./prolongation.ts";
 * import { levelLayout } from "./level.ts";
 * const fine = levelLayout(8, 8);
 * const r = transposeRow(bilinearProlongation(fine, { cx: 2, cy: 2 }), fine, { nx: 4, ny: 4 }, {
 *   I: 2,
 *   J: 2,
 * });
 * if (r[4] !== 0.25 || r[0] !== 0.0625) throw new Error("full weighting inside");
 * ```
 */
export function transposeRow(
  P: Prolongation,
  fine: Pick<LevelOperator, "nx" | "ny" | "index">,
  coarse: { nx: number; ny: number },
  node: { I: number; J: number },
): Float64Array {
  const out = new Float64Array(9);
  transposeRowInto(P, fine, coarse, node, out);
  return out;
}

/** {@link transposeRow} written into `out` (nine entries, every one set). */
export function transposeRowInto(
  P: Prolongation,
  fine: Pick<LevelOperator, "nx" | "ny" | "index">,
  coarse: { nx: number; ny: number },
  node: { I: number; J: number },
  out: Float64Array,
): void {
  const { cx, cy } = P;
  const { I, J } = node;
  const fnx = fine.nx, fny = fine.ny;
  const fc = (I === 0 || I === coarse.nx ? 0.5 : 1) * (J === 0 || J === coarse.ny ? 0.5 : 1) *
    cx * cy;
  for (let dj = -1; dj <= 1; dj++) {
    for (let di = -1; di <= 1; di++) {
      const m = (dj + 1) * 3 + di + 1;
      out[m] = 0;
      const i = cx * I + di, j = cy * J + dj;
      if (i < 0 || i > fnx || j < 0 || j > fny) continue;
      const a = I - (cx === 2 ? i >> 1 : i), b = J - (cy === 2 ? j >> 1 : j);
      if (a < 0 || a > 1 || b < 0 || b > 1) continue;
      const k = fine.index(i, j);
      const w = a === 0 ? (b === 0 ? P.w00[k] : P.w01[k]) : (b === 0 ? P.w10[k] : P.w11[k]);
      const ff = (i === 0 || i === fnx ? 0.5 : 1) * (j === 0 || j === fny ? 0.5 : 1);
      out[m] = w * ff / fc;
    }
  }
}
