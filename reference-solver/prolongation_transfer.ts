/**
 * The transfer pair of a {@link Prolongation}: interpolation by its weights and restriction by its
 * volume-scaled transpose R = M_c⁻¹·Pᵀ·M (`transposeRow`), the pair a Galerkin hierarchy with
 * operator-dependent interpolation uses (R·A·P is then variational in the per-volume scaling of
 * the rows, see `transfer.ts`). Coarse Dirichlet rows of a restriction are set to zero.
 *
 * @module
 */
import type { LevelOperator } from "./level.ts";
import { type Prolongation, transposeRowInto } from "./prolongation.ts";
import type { Transfer } from "./transfer.ts";

/**
 * Builds the transfer of an interpolation given as weights.
 *
 * @param P The interpolation (its coarsening factors must match the two grids).
 * @param fine The fine level.
 * @param coarse The coarse level.
 * @returns `{ restrict, interpolateAdd, interpolate, describe }`, set up once.
 * @throws {RangeError} If the grids do not match the interpolation's coarsening.
 *
 * @example
 * ```ts
 * import { createProlongationTransfer } from "./prolongation_transfer.ts";
 * import { bilinearProlongation } from "./prolongation.ts";
 * import { levelLayout } from "./level.ts";
 * const fine = { ...levelLayout(4, 4), dirichlet: new Int32Array() };
 * const coarse = { ...levelLayout(2, 2), dirichlet: new Int32Array() };
 * const t = createProlongationTransfer(
 *   bilinearProlongation(fine, { cx: 2, cy: 2 }), fine as never, coarse as never,
 * );
 * const f = fine.vector();
 * t.interpolate(coarse.pad(new Float64Array(9).fill(2)), f);
 * if (f[fine.index(1, 1)] !== 2) throw new Error("constants interpolate to themselves");
 * ```
 */
export function createProlongationTransfer(
  P: Prolongation,
  fine: LevelOperator,
  coarse: LevelOperator,
): Transfer {
  const { cx, cy } = P;
  if (fine.nx !== cx * coarse.nx || fine.ny !== cy * coarse.ny) {
    throw new RangeError(
      `Cannot transfer between a ${fine.nx}×${fine.ny} and a ${coarse.nx}×${coarse.ny} grid with an interpolation built for coarsening ${cx}×${cy}`,
    );
  }
  const cnx = coarse.nx, cny = coarse.ny, cs = coarse.stride, fs = fine.stride;
  // Rows of R = M_c⁻¹·Pᵀ·M: stored for the coarse nodes on the boundary (their volume fractions
  // differ); inside, the weight of fine node (cx·I + di, cy·J + dj) is its P weight of (I, J)
  // divided by cx·cy, read from the weight array that (di, dj) selects.
  const bIdx: number[] = [], bRows: number[] = [];
  const row = new Float64Array(9);
  for (let J = 0; J <= cny; J++) {
    for (let I = 0; I <= cnx; I++) {
      if (I !== 0 && I !== cnx && J !== 0 && J !== cny) continue;
      transposeRowInto(P, fine, coarse, { I, J }, row);
      bIdx.push(J * (cnx + 1) + I);
      bRows.push(...row);
    }
  }
  const boundaryNodes = Int32Array.from(bIdx), boundaryRows = Float64Array.from(bRows);
  const taps: { w: Float64Array; off: number }[] = [];
  for (let dj = -1; dj <= 1; dj++) {
    for (let di = -1; di <= 1; di++) {
      if ((cx === 1 && di !== 0) || (cy === 1 && dj !== 0)) continue;
      // relative to the fine node's base parent, (I, J) is one further when d = −1
      const a = di < 0 ? 1 : 0, b = dj < 0 ? 1 : 0;
      const w = a === 0 ? (b === 0 ? P.w00 : P.w01) : (b === 0 ? P.w10 : P.w11);
      taps.push({ w, off: dj * fs + di });
    }
  }
  const tapW = taps.map((t) => t.w), tapOff = taps.map((t) => t.off), nt = taps.length;
  const scale = 1 / (cx * cy);
  // Padded coarse index of the base parent (I0, J0) of every fine node.
  const base = new Int32Array(fine.length);
  for (let j = 0; j <= fine.ny; j++) {
    for (let i = 0; i <= fine.nx; i++) {
      base[fine.index(i, j)] = coarse.index(cx === 2 ? i >> 1 : i, cy === 2 ? j >> 1 : j);
    }
  }
  const { w00, w10, w01, w11 } = P;
  const cDirichlet = coarse.dirichlet;
  function interp(c: Float64Array, f: Float64Array, add: boolean): void {
    for (let j = 0; j <= fine.ny; j++) {
      const k0 = (j + 1) * fs + 1;
      for (let k = k0; k <= k0 + fine.nx; k++) {
        const b = base[k];
        const v = w00[k] * c[b] + w10[k] * c[b + 1] + w01[k] * c[b + cs] + w11[k] * c[b + cs + 1];
        f[k] = add ? f[k] + v : v;
      }
    }
  }
  return {
    restrict(r, out) {
      for (let J = 1; J < cny; J++) {
        for (let I = 1; I < cnx; I++) {
          const k = (cy * J + 1) * fs + cx * I + 1;
          let v = 0;
          for (let t = 0; t < nt; t++) v += tapW[t][k + tapOff[t]] * r[k + tapOff[t]];
          out[(J + 1) * cs + I + 1] = v * scale;
        }
      }
      for (let m = 0; m < boundaryNodes.length; m++) {
        const q = boundaryNodes[m], I = q % (cnx + 1), J = (q - I) / (cnx + 1);
        const k = (cy * J + 1) * fs + cx * I + 1, o = 9 * m;
        let v = 0;
        for (let dj = -1, t = o; dj <= 1; dj++) {
          for (let di = -1; di <= 1; di++, t++) v += boundaryRows[t] * r[k + dj * fs + di];
        }
        out[(J + 1) * cs + I + 1] = v;
      }
      for (let m = 0; m < cDirichlet.length; m++) out[cDirichlet[m]] = 0;
    },
    interpolateAdd: (c, f) => interp(c, f, true),
    interpolate: (c, f) => interp(c, f, false),
    describe: () => ({
      restriction: "transpose of the interpolation (volume-scaled)",
      interpolation: P.name,
      coarsening: cx === 2 && cy === 2 ? "both" : cx === 2 ? "x" : "y",
    }),
  };
}
