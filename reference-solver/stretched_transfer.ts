/**
 * Transfers between stretched levels. Coarsening keeps every other node (coarse coordinates are
 * every other fine coordinate); an axis may also be left alone (semi-coarsening).
 *
 * Interpolation P: linear in the physical coordinate along each axis, tensor product in 2-D. A fine
 * node 2I is the coarse node I; a fine node 2I + 1 between x[2I] and x[2I+2] takes
 * (x[2I+2] − x[2I+1])/(x[2I+2] − x[2I]) of coarse node I and (x[2I+1] − x[2I])/(x[2I+2] − x[2I])
 * of coarse node I + 1 (on a periodic axis coarse node nx/2 is coarse node 0). Dirichlet fine rows
 * get no correction.
 *
 * Restriction R: the volume-scaled transpose, r_c[I] = Σ_i P[i, I]·w[i]·r[i] / Σ_i P[i, I]·w[i]
 * with w the fine volume weights (`stretched_grid.ts`): a weighted average, so a constant residual
 * restricts to the same constant, and the restricted residual has the pointwise scaling of the
 * rediscretized coarse rows. Coarse Dirichlet rows get zero.
 *
 * @module
 */
import type { StretchedOperator } from "./discretize_stretched.ts";

/** Interpolation weights of one axis: fine node i takes w0·coarse[i0] + w1·coarse[i1]. */
interface AxisWeights {
  i0: Int32Array;
  i1: Int32Array;
  w0: Float64Array;
  w1: Float64Array;
}

function axis(
  x: Float64Array,
  periodic: boolean,
  coarsen: boolean,
  mf: number,
  mc: number,
): AxisWeights {
  const i0 = new Int32Array(mf), i1 = new Int32Array(mf);
  const w0 = new Float64Array(mf), w1 = new Float64Array(mf);
  for (let i = 0; i < mf; i++) {
    if (!coarsen) {
      i0[i] = i1[i] = i, w0[i] = 1;
      continue;
    }
    if (i % 2 === 0) {
      i0[i] = i1[i] = i / 2, w0[i] = 1;
      continue;
    }
    const I = (i - 1) / 2, t = x[i + 1] - x[i - 1];
    i0[i] = I, i1[i] = periodic ? (I + 1) % mc : I + 1;
    w0[i] = (x[i + 1] - x[i]) / t, w1[i] = (x[i] - x[i - 1]) / t;
  }
  return { i0, i1, w0, w1 };
}

/** The transfers between a fine and the next coarser stretched level. */
export interface StretchedTransfer {
  /** coarse ← R·fine (module doc). */
  restrict(fine: Float64Array, coarse: Float64Array): void;
  /** fine ← fine + P·coarse (Dirichlet fine rows untouched). */
  interpolateAdd(coarse: Float64Array, fine: Float64Array): void;
}

/** Builds P and R for a fine level and its coarse level (coarsened along x, y or both). */
export function createStretchedTransfer(
  fine: StretchedOperator,
  coarse: StretchedOperator,
): StretchedTransfer {
  const ax = axis(fine.x, fine.px, coarse.nx !== fine.nx, fine.mx, coarse.mx);
  const ay = axis(fine.y, fine.py, coarse.ny !== fine.ny, fine.my, coarse.my);
  const { mx, my } = fine, cmx = coarse.mx;
  const norm = new Float64Array(coarse.mx * coarse.my);
  const each = (fn: (k: number, K: number, w: number) => void) => {
    for (let j = 0; j < my; j++) {
      for (let i = 0; i < mx; i++) {
        const k = j * mx + i;
        const pairs: [number, number][] = [
          [ay.i0[j] * cmx + ax.i0[i], ay.w0[j] * ax.w0[i]],
          [ay.i0[j] * cmx + ax.i1[i], ay.w0[j] * ax.w1[i]],
          [ay.i1[j] * cmx + ax.i0[i], ay.w1[j] * ax.w0[i]],
          [ay.i1[j] * cmx + ax.i1[i], ay.w1[j] * ax.w1[i]],
        ];
        for (const [K, w] of pairs) if (w !== 0) fn(k, K, w);
      }
    }
  };
  // Flattened weights, built once.
  const fk: number[] = [], cK: number[] = [], wt: number[] = [];
  each((k, K, w) => (fk.push(k), cK.push(K), wt.push(w)));
  const F = Int32Array.from(fk), CK = Int32Array.from(cK), WT = Float64Array.from(wt);
  for (let t = 0; t < F.length; t++) norm[CK[t]] += WT[t] * fine.weights[F[t]];
  const vw = fine.weights;
  return {
    restrict(rf, rc) {
      rc.fill(0);
      for (let t = 0; t < F.length; t++) rc[CK[t]] += WT[t] * vw[F[t]] * rf[F[t]];
      for (let K = 0; K < rc.length; K++) rc[K] = coarse.dirichlet[K] ? 0 : rc[K] / norm[K];
    },
    interpolateAdd(ec, ef) {
      for (let t = 0; t < F.length; t++) {
        if (!fine.dirichlet[F[t]]) ef[F[t]] += WT[t] * ec[CK[t]];
      }
    },
  };
}
