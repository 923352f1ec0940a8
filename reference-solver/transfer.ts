/**
 * Grid transfers between a fine level and the next coarser one: the restriction registry and
 * bilinear interpolation. Coarse node (I, J) coincides with fine node (cx·I, cy·J), where the
 * coarsening factors cx, cy are 2 in a coarsened direction and 1 otherwise (semi-coarsening).
 *
 * Restrictions are 3×3 weightings of the fine residual around the coinciding node:
 * - `injection`: weight 1 at the coinciding node;
 * - `half-weighting`: 1/2 at the centre, 1/8 at the four edge neighbours (with semi-coarsening:
 *   1/4, 1/2, 1/4 along the coarsened direction only);
 * - `full-weighting`: the tensor product of (1/4, 1/2, 1/4) in every coarsened direction.
 *
 * Near the boundary, weights that fall outside the grid are dropped and the rest rescaled so that
 * they sum to one: a constant restricts to the same constant on every coarse node (Neumann and
 * Robin boundary rows are unknowns written in the same scaling as interior rows). Coarse Dirichlet
 * rows get zero (their error is zero).
 *
 * With `scaling: "volume"` (used with Galerkin coarse operators) each weight is first multiplied
 * by the control-volume fraction of its fine node (1 inside, ½ on a side, ¼ at a corner), then the
 * row is rescaled to sum one. For full weighting this is R = M_c⁻¹·Pᵀ·M with M, M_c the diagonal
 * matrices of fine and coarse control volumes: the rows of a level are balances divided by their
 * volume (A = M⁻¹·S), so R·A·P = M_c⁻¹·(Pᵀ·S·P) is the variational coarse operator in the same
 * per-volume scaling. Coarse nodes away from the boundary are unaffected (all their fine nodes
 * have full volumes).
 *
 * @module
 */
import type { LevelOperator } from "./level.ts";
import type { RestrictionName } from "./options.ts";
import { interpolateAddBoth, restrictRedResidual } from "./_kernels.ts";
import { interpolateCubic } from "./cubic_interpolation.ts";
import { sweepAndRestrict } from "./_kernels_pipelined.ts";

/** A transfer pair between a fine level and its coarse level. */
export interface Transfer {
  /** coarse ← R·fine (fine halo must be zero). Writes every coarse node. */
  restrict(fine: Float64Array, coarse: Float64Array): void;
  /** fine ← fine + P·coarse (bilinear). */
  interpolateAdd(coarse: Float64Array, fine: Float64Array): void;
  /** fine ← P·coarse (bilinear), every fine node written. */
  interpolate(coarse: Float64Array, fine: Float64Array): void;
  /**
   * fine ← cubic interpolation of coarse (`cubic_interpolation.ts`), every fine node written: the
   * first guess of full multigrid. Absent where FMG keeps `interpolate`.
   */
  interpolateFmg?(coarse: Float64Array, fine: Float64Array): void;
  /**
   * coarse ← R·(f − A·u) for a five-point fine level whose black residuals are zero (right after a
   * red–black sweep), without storing the fine residual (`restrictRedResidual` in `_kernels.ts`).
   * Present only where that is the same restriction: full weighting with grid scaling, both
   * directions coarsened. With `sweeps` ≥ 1, first relaxes u by that many red–black sweeps fused
   * into the same pass over memory (`sweepAndRestrict`; same result as sweeping first).
   */
  restrictResidual?(
    op: LevelOperator,
    u: Float64Array,
    f: Float64Array,
    coarse: Float64Array,
    sweeps?: number,
  ): void;
  /** Plain JSON record. */
  describe(): Record<string, unknown>;
}

/** Weights w[(dj+1)·3 + (di+1)] for di, dj ∈ {−1, 0, 1}, given which directions are coarsened. */
export type RestrictionWeights = (cx: 1 | 2, cy: 1 | 2) => Float64Array;

const ONE_D = (c: 1 | 2) => (c === 2 ? [0.25, 0.5, 0.25] : [0, 1, 0]);

/** Registered restrictions, by name (see the module doc). */
export const RESTRICTIONS = {
  "injection": () => Float64Array.of(0, 0, 0, 0, 1, 0, 0, 0, 0),
  "half-weighting": (cx, cy) => {
    if (cx === 2 && cy === 2) return Float64Array.of(0, 1 / 8, 0, 1 / 8, 1 / 2, 1 / 8, 0, 1 / 8, 0);
    const wx = ONE_D(cx), wy = ONE_D(cy);
    return Float64Array.from({ length: 9 }, (_, m) => wx[m % 3] * wy[Math.floor(m / 3)]);
  },
  "full-weighting": (cx, cy) => {
    const wx = ONE_D(cx), wy = ONE_D(cy);
    return Float64Array.from({ length: 9 }, (_, m) => wx[m % 3] * wy[Math.floor(m / 3)]);
  },
} satisfies Record<RestrictionName, RestrictionWeights>;

/** How restriction rows are rescaled near the boundary (see the module doc). Default "grid". */
export type RestrictionScaling = "grid" | "volume";

/**
 * The nine weights w[(dj+1)·3 + (di+1)] with which coarse node (I, J) takes the fine residual at
 * (cx·I + di, cy·J + dj), after the boundary rescaling of the module doc (Dirichlet rows aside).
 *
 * @param w The 3×3 weights of the restriction away from the boundary.
 * @param fine Fine grid counts.
 * @param c Coarsening factors and the coarse node.
 * @param scaling "grid" or "volume".
 * @returns Nine weights summing to one; zero where the fine node is off the grid.
 *
 * @example
 * ```ts
 * import { RESTRICTIONS, restrictionRow } from "./transfer.ts";
 * const w = RESTRICTIONS["full-weighting"](2, 2);
 * const r = restrictionRow(w, { nx: 8, ny: 8 }, { cx: 2, cy: 2, I: 0, J: 2 }, "volume");
 * if (r[4] !== 0.25 || r[5] !== 0.25 || r[1] !== 0.125) throw new Error("M_c⁻¹·Pᵀ·M on a side");
 * ```
 */
export function restrictionRow(
  w: Float64Array,
  fine: { nx: number; ny: number },
  c: { cx: 1 | 2; cy: 1 | 2; I: number; J: number },
  scaling: RestrictionScaling,
): Float64Array {
  const out = new Float64Array(9);
  let sum = 0;
  for (let dj = -1; dj <= 1; dj++) {
    for (let di = -1; di <= 1; di++) {
      const i = c.cx * c.I + di, j = c.cy * c.J + dj;
      if (i < 0 || i > fine.nx || j < 0 || j > fine.ny) continue;
      let v = w[(dj + 1) * 3 + di + 1];
      if (scaling === "volume") {
        v *= (i === 0 || i === fine.nx ? 0.5 : 1) * (j === 0 || j === fine.ny ? 0.5 : 1);
      }
      out[(dj + 1) * 3 + di + 1] = v;
      sum += v;
    }
  }
  for (let m = 0; m < 9; m++) out[m] /= sum;
  return out;
}

/**
 * Builds the transfer between a fine level and its coarse level.
 *
 * @param restriction A key of {@link RESTRICTIONS}.
 * @param fine The fine level operator.
 * @param coarse The coarse level operator (nx/cx × ny/cy).
 * @param options `scaling`: "grid" (default) or "volume", see the module doc.
 * @returns The transfer pair, set up once (boundary rescaling precomputed).
 * @throws {RangeError} For an unknown restriction or grids that do not nest.
 *
 * @example
 * ```ts
 * import { createTransfer } from "./transfer.ts";
 * import { levelLayout } from "./level.ts";
 * const fine = { ...levelLayout(4, 4), dirichlet: new Int32Array() };
 * const coarse = { ...levelLayout(2, 2), dirichlet: new Int32Array() };
 * const t = createTransfer("full-weighting", fine as never, coarse as never);
 * const c = coarse.vector(), f = fine.pad(new Float64Array(25).fill(3));
 * t.restrict(f, c);
 * if (c[coarse.index(0, 0)] !== 3) throw new Error("constants restrict to themselves");
 * ```
 */
export function createTransfer(
  restriction: RestrictionName,
  fine: LevelOperator,
  coarse: LevelOperator,
  options: { scaling?: RestrictionScaling } = {},
): Transfer {
  const scaling = options.scaling ?? "grid";
  const make = (RESTRICTIONS as Record<string, RestrictionWeights>)[restriction];
  if (make === undefined) {
    throw new RangeError(
      `Unknown restriction ${JSON.stringify(restriction)}: valid names are ${
        Object.keys(RESTRICTIONS).join(", ")
      }`,
    );
  }
  const cx = fine.nx === coarse.nx ? 1 : 2, cy = fine.ny === coarse.ny ? 1 : 2;
  if (fine.nx !== cx * coarse.nx || fine.ny !== cy * coarse.ny) {
    throw new RangeError(
      `Cannot transfer between a ${fine.nx}×${fine.ny} and a ${coarse.nx}×${coarse.ny} grid: counts must halve or stay`,
    );
  }
  const w = make(cx, cy);
  // Rescaling of coarse boundary nodes: 1 / (sum of the weights that fall on the grid).
  const bIdx: number[] = [], bScale: number[] = [];
  for (let J = 0; J <= coarse.ny; J++) {
    for (let I = 0; I <= coarse.nx; I++) {
      if (I !== 0 && I !== coarse.nx && J !== 0 && J !== coarse.ny) continue;
      let sum = 0;
      for (let dj = -1; dj <= 1; dj++) {
        for (let di = -1; di <= 1; di++) {
          const i = cx * I + di, j = cy * J + dj;
          if (i >= 0 && i <= fine.nx && j >= 0 && j <= fine.ny) sum += w[(dj + 1) * 3 + di + 1];
        }
      }
      if (sum !== 1) (bIdx.push(coarse.index(I, J)), bScale.push(1 / sum));
    }
  }
  const boundaryIndex = Int32Array.from(bIdx), boundaryScale = Float64Array.from(bScale);
  // With volume scaling, every coarse boundary node gets its own nine weights (fine index
  // offsets alongside), recomputed after the interior formula.
  const vIdx: number[] = [], vFine: number[] = [], vW: number[] = [];
  if (scaling === "volume") {
    for (let J = 0; J <= coarse.ny; J++) {
      for (let I = 0; I <= coarse.nx; I++) {
        if (I !== 0 && I !== coarse.nx && J !== 0 && J !== coarse.ny) continue;
        vIdx.push(coarse.index(I, J));
        vFine.push(fine.index(cx * I, cy * J));
        vW.push(...restrictionRow(w, fine, { cx, cy, I, J }, "volume"));
      }
    }
  }
  const volIndex = Int32Array.from(vIdx), volFine = Int32Array.from(vFine);
  const volW = Float64Array.from(vW);
  const cDirichlet = coarse.dirichlet;
  const fs = fine.stride, cs = coarse.stride, cnx = coarse.nx, cny = coarse.ny;
  const [w0, w1, w2, w3, w4, w5, w6, w7, w8] = w;

  // Bilinear interpolation, one fine row at a time; `add` selects fine += P·c or fine = P·c.
  function interpRow(c: Float64Array, f: Float64Array, j: number, add: boolean): void {
    const J = cy === 2 ? j >> 1 : j;
    const c0 = (J + 1) * cs + 1;
    const c1 = cy === 2 && (j & 1) === 1 ? c0 + cs : c0;
    const fb = (j + 1) * fs + 1;
    if (cx === 2) {
      if (c1 === c0) {
        if (add) {
          for (let I = 0, k = fb; I < cnx; I++, k += 2) {
            const v0 = c[c0 + I];
            f[k] += v0;
            f[k + 1] += 0.5 * (v0 + c[c0 + I + 1]);
          }
        } else {
          for (let I = 0, k = fb; I < cnx; I++, k += 2) {
            const v0 = c[c0 + I];
            f[k] = v0;
            f[k + 1] = 0.5 * (v0 + c[c0 + I + 1]);
          }
        }
        if (add) f[fb + 2 * cnx] += c[c0 + cnx];
        else f[fb + 2 * cnx] = c[c0 + cnx];
        return;
      }
      if (add) {
        for (let I = 0, k = fb; I < cnx; I++, k += 2) {
          const v0 = c[c0 + I] + c[c1 + I];
          f[k] += 0.5 * v0;
          f[k + 1] += 0.25 * (v0 + c[c0 + I + 1] + c[c1 + I + 1]);
        }
      } else {
        for (let I = 0, k = fb; I < cnx; I++, k += 2) {
          const v0 = c[c0 + I] + c[c1 + I];
          f[k] = 0.5 * v0;
          f[k + 1] = 0.25 * (v0 + c[c0 + I + 1] + c[c1 + I + 1]);
        }
      }
      const last = 0.5 * (c[c0 + cnx] + c[c1 + cnx]);
      if (add) f[fb + 2 * cnx] += last;
      else f[fb + 2 * cnx] = last;
    } else {
      for (let I = 0; I <= cnx; I++) {
        const v = 0.5 * (c[c0 + I] + c[c1 + I]);
        if (add) f[fb + I] += v;
        else f[fb + I] = v;
      }
    }
  }

  function interp(c: Float64Array, f: Float64Array, add: boolean): void {
    for (let j = 0; j <= fine.ny; j++) interpRow(c, f, j, add);
  }

  const rowA = new Float64Array(cnx + 2), rowB = new Float64Array(cnx + 2);
  const fused = restriction === "full-weighting" && scaling === "grid" && cx === 2 && cy === 2;
  function boundaryRows(out: Float64Array): void {
    for (let m = 0; m < boundaryIndex.length; m++) out[boundaryIndex[m]] *= boundaryScale[m];
    for (let m = 0; m < cDirichlet.length; m++) out[cDirichlet[m]] = 0;
  }
  return {
    ...(fused
      ? {
        restrictResidual(
          op: LevelOperator,
          u: Float64Array,
          f: Float64Array,
          out: Float64Array,
          sweeps = 0,
        ) {
          if (sweeps > 0) sweepAndRestrict(op, u, f, sweeps, out, cs, rowA, rowB);
          else restrictRedResidual(op, u, f, out, cs, rowA, rowB);
          boundaryRows(out);
        },
      }
      : {}),
    restrict(r, out) {
      for (let J = 0; J <= cny; J++) {
        const cb = (J + 1) * cs + 1;
        let k = (cy * J + 1) * fs + 1;
        for (let I = 0; I <= cnx; I++, k += cx) {
          out[cb + I] = w0 * r[k - fs - 1] + w1 * r[k - fs] + w2 * r[k - fs + 1] +
            w3 * r[k - 1] + w4 * r[k] + w5 * r[k + 1] +
            w6 * r[k + fs - 1] + w7 * r[k + fs] + w8 * r[k + fs + 1];
        }
      }
      if (scaling === "grid") {
        for (let m = 0; m < boundaryIndex.length; m++) out[boundaryIndex[m]] *= boundaryScale[m];
      } else {
        for (let m = 0; m < volIndex.length; m++) {
          const k = volFine[m], o = 9 * m;
          let v = 0;
          for (let dj = -1, t = o; dj <= 1; dj++) {
            for (let di = -1; di <= 1; di++, t++) v += volW[t] * r[k + dj * fs + di];
          }
          out[volIndex[m]] = v;
        }
      }
      for (let m = 0; m < cDirichlet.length; m++) out[cDirichlet[m]] = 0;
    },
    interpolateAdd: cx === 2 && cy === 2
      ? (c, f) => interpolateAddBoth(c, f, cnx, cny, cs, fs)
      : (c, f) => interp(c, f, true),
    interpolate: (c, f) => interp(c, f, false),
    interpolateFmg: (c, f) => interpolateCubic(c, f, { cnx, cny, cx, cy }),
    describe: () => ({
      restriction,
      ...(scaling === "volume" ? { scaling } : {}),
      interpolation: "bilinear",
      coarsening: cx === 2 && cy === 2 ? "both" : cx === 2 ? "x" : "y",
    }),
  };
}
