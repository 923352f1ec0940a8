/**
 * Galerkin coarse operators: A_c = R·A·P. P is bilinear interpolation, with R the restriction the
 * cycle uses in its volume scaling (`transfer.ts`, `scaling: "volume"`; full weighting is then
 * R = M_c⁻¹·Pᵀ·M, which is Pᵀ/4 away from the boundary); or P is any interpolation given as
 * weights (`prolongation.ts`, e.g. operator-dependent), with R = M_c⁻¹·Pᵀ·M its volume-scaled
 * transpose.
 *
 * - Coarse node (I, J) sits on fine node (cx·I, cy·J); it is Dirichlet exactly when that fine node
 *   is. Dirichlet rows stay identity rows on every level, and no row couples to a Dirichlet node:
 *   the error, hence the coarse correction, is zero there, so those columns drop out of A·P.
 *   Fine Dirichlet rows contribute nothing either (their error is zero: bilinear interpolation
 *   gives a fine Dirichlet node only values from coarse Dirichlet nodes of its side, and the
 *   operator-dependent one gives it weight zero).
 * - Neumann and Robin boundary nodes are unknowns like interior ones and are coarsened the same
 *   way; their rows are balances over half (or quarter) volumes, which the volume scaling of R
 *   takes into account.
 * - With full or semi-coarsening the product reaches at most one coarse node in each direction
 *   (R and P each reach one fine node, A one more), so A_c is a nine-point stencil on the coarse
 *   grid, whatever A is (five- or nine-point). Should every corner of A_c vanish, the level is
 *   stored as five-point.
 * - A singular level (constants in the null space) stays singular: P reproduces constants.
 *
 * The product is formed row by row, once, at setup: for every coarse row, the weighted fine rows
 * of R, each fine stencil entry spread by the bilinear weights of its fine column.
 *
 * @module
 */
import { isNinePoint, levelLayout, type LevelOperator } from "./level.ts";
import type { RestrictionName } from "./options.ts";
import { restrictionRow, RESTRICTIONS } from "./transfer.ts";
import { type Prolongation, transposeRowInto } from "./prolongation.ts";

/**
 * The Galerkin coarse operator of a level.
 *
 * @param fine The fine level operator.
 * @param options `coarsening`: the factors (2 in a coarsened direction, 1 otherwise);
 * `restriction`: the restriction the cycle uses with bilinear P (volume scaling, default
 * "full-weighting"); `prolongation`: an interpolation as weights, whose volume-scaled transpose
 * is then the restriction (default: bilinear with `restriction`).
 * @returns The coarse level operator (nine-point unless every corner vanishes).
 * @throws {RangeError} If a coarsened count is odd or the interpolation's coarsening differs.
 *
 * @example
 * ```ts
 * import { galerkinOperator } from "./galerkin.ts";
 * import { buildLevel } from "./hierarchy.ts";
 * const n = 8, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const fine = buildLevel({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * const coarse = galerkinOperator(fine, { coarsening: { cx: 2, cy: 2 } });
 * // (1/H²)·[[¼, ½, ¼], [½, −3, ½], [¼, ½, ¼]] with H = 1/4: centre −48, corners 4
 * const k = coarse.index(2, 2);
 * if (coarse.C[k] !== -48 || coarse.NE?.[k] !== 4) throw new Error("Galerkin Laplacian");
 * ```
 */
export function galerkinOperator(
  fine: LevelOperator,
  options: {
    coarsening: { cx: 1 | 2; cy: 1 | 2 };
    restriction?: RestrictionName;
    prolongation?: Prolongation;
  },
): LevelOperator {
  const { cx, cy } = options.coarsening;
  if (fine.nx % cx !== 0 || fine.ny % cy !== 0) {
    throw new RangeError(
      `Cannot form a Galerkin coarse operator of a ${fine.nx}×${fine.ny} grid with coarsening ${cx}×${cy}: the coarsened counts must be even`,
    );
  }
  const given = options.prolongation;
  if (given !== undefined && (given.cx !== cx || given.cy !== cy)) {
    throw new RangeError(
      `Cannot form a Galerkin coarse operator: the interpolation was built for coarsening ${given.cx}×${given.cy}, not ${cx}×${cy}`,
    );
  }
  const nx = fine.nx / cx, ny = fine.ny / cy;
  const layout = levelLayout(nx, ny);
  const { stride: cs, length } = layout;
  const fs = fine.stride;
  const fineDir = new Uint8Array(fine.length);
  for (const k of fine.dirichlet) fineDir[k] = 1;
  const coarseDir = new Uint8Array(length);
  const dirichlet: number[] = [];
  for (let J = 0; J <= ny; J++) {
    for (let I = 0; I <= nx; I++) {
      if (fineDir[fine.index(cx * I, cy * J)]) {
        coarseDir[layout.index(I, J)] = 1;
        dirichlet.push(layout.index(I, J));
      }
    }
  }
  // The fine stencil as (array, column offset, ei, ej); corners only on a nine-point level.
  const nine = isNinePoint(fine);
  const entries: { a: Float64Array; off: number; ei: number; ej: number }[] = [];
  const add = (a: Float64Array, ei: number, ej: number) =>
    entries.push({ a, off: ej * fs + ei, ei, ej });
  if (nine) add(fine.SW, -1, -1);
  add(fine.S, 0, -1);
  if (nine) add(fine.SE, 1, -1);
  add(fine.W, -1, 0);
  add(fine.C, 0, 0);
  add(fine.E, 1, 0);
  if (nine) add(fine.NW, -1, 1);
  add(fine.N, 0, 1);
  if (nine) add(fine.NE, 1, 1);
  const stencil = entries.map((e) => e.a), offs = Int32Array.from(entries, (e) => e.off);
  const eis = entries.map((e) => e.ei), ejs = entries.map((e) => e.ej);
  const ne = entries.length;
  // Weights of P: read from `given`, or bilinear.
  const z = new Float64Array(0);
  const p00 = given?.w00 ?? z, p10 = given?.w10 ?? z, p01 = given?.w01 ?? z, p11 = given?.w11 ?? z;
  const bilinear = given === undefined;
  // Everything about a (restriction position r, stencil entry m) pair but the values is the same
  // for every coarse node: the fine row's offset from the coarse node's fine twin, and the fine
  // column's parity, hence its base parent's place in the accumulator and its bilinear weights.
  // The accumulator is a 4 × 4 window of coarse nodes starting at (I − 1, J − 1); the product
  // stays in its inner 3 × 3 (module doc) and the outer row and column must remain zero.
  const nt = 9 * ne;
  const rowOff = new Int32Array(9), AT = new Int32Array(nt);
  const B00 = new Float64Array(nt), B10 = new Float64Array(nt);
  const B01 = new Float64Array(nt), B11 = new Float64Array(nt);
  for (let r = 0; r < 9; r++) {
    const di = (r % 3) - 1, dj = Math.floor(r / 3) - 1;
    rowOff[r] = dj * fs + di;
    for (let m = 0; m < ne; m++) {
      const t = r * ne + m, ii = di + eis[m], jj = dj + ejs[m]; // relative to (cx·I, cy·J)
      const dI0 = cx === 2 ? Math.floor(ii / 2) : ii, dJ0 = cy === 2 ? Math.floor(jj / 2) : jj;
      AT[t] = (dJ0 + 1) * 4 + dI0 + 1;
      const ox = cx === 2 && (ii & 1) !== 0, oy = cy === 2 && (jj & 1) !== 0;
      const x0 = ox ? 0.5 : 1, x1 = ox ? 0.5 : 0, y0 = oy ? 0.5 : 1, y1 = oy ? 0.5 : 0;
      B00[t] = x0 * y0, B10[t] = x1 * y0, B01[t] = x0 * y1, B11[t] = x1 * y1;
    }
  }
  const out = Array.from({ length: 9 }, () => new Float64Array(length));
  const w = RESTRICTIONS[options.restriction ?? "full-weighting"](cx, cy);
  const R = new Float64Array(9);
  const acc = new Float64Array(16);
  for (let J = 0; J <= ny; J++) {
    for (let I = 0; I <= nx; I++) {
      const kc = (J + 1) * cs + I + 1;
      if (coarseDir[kc]) {
        out[4][kc] = 1;
        continue;
      }
      const onBoundary = I === 0 || I === nx || J === 0 || J === ny;
      if (!bilinear) transposeRowInto(given, fine, { nx, ny }, { I, J }, R);
      else if (onBoundary) R.set(restrictionRow(w, fine, { cx, cy, I, J }, "volume"));
      else R.set(w);
      acc.fill(0);
      const twin = (cy * J + 1) * fs + cx * I + 1;
      // R is zero at fine positions off the grid, so kf below is always a grid node.
      for (let r = 0; r < 9; r++) {
        const rw = R[r];
        if (rw === 0) continue;
        const kf = twin + rowOff[r];
        if (fineDir[kf]) continue;
        for (let m = 0, t = r * ne; m < ne; m++, t++) {
          const a = stencil[m][kf];
          if (a === 0) continue;
          const ra = rw * a, at = AT[t];
          if (bilinear) {
            acc[at] += ra * B00[t];
            acc[at + 1] += ra * B10[t];
            acc[at + 4] += ra * B01[t];
            acc[at + 5] += ra * B11[t];
          } else {
            const kcol = kf + offs[m];
            acc[at] += ra * p00[kcol];
            acc[at + 1] += ra * p10[kcol];
            acc[at + 4] += ra * p01[kcol];
            acc[at + 5] += ra * p11[kcol];
          }
        }
      }
      for (let t = 0; t < 16; t++) {
        const dI = (t & 3) - 1, dJ = (t >> 2) - 1;
        if (dI <= 1 && dJ <= 1) {
          // a Dirichlet column drops out (its coarse error is zero); so does the halo
          const X = I + dI, Y = J + dJ;
          const keep = X >= 0 && X <= nx && Y >= 0 && Y <= ny && !coarseDir[(Y + 1) * cs + X + 1];
          out[(dJ + 1) * 3 + dI + 1][kc] = keep ? acc[t] : 0;
        } else if (acc[t] !== 0) {
          throw new Error(
            `Galerkin product left the nine-point stencil at coarse node (${I}, ${J}) (internal error)`,
          );
        }
      }
    }
  }
  const [SW, S, SE, W, C, E, NW, N, NE] = out;
  const invC = new Float64Array(length).fill(1);
  for (let J = 0; J <= ny; J++) {
    for (let I = 0; I <= nx; I++) {
      const k = layout.index(I, J);
      invC[k] = 1 / C[k];
    }
  }
  const cornersVanish = [SW, SE, NW, NE].every((v) => v.every((x) => x === 0));
  return {
    ...layout,
    hx: fine.hx * cx,
    hy: fine.hy * cy,
    W,
    E,
    S,
    N,
    C,
    invC,
    dirichlet: Int32Array.from(dirichlet),
    singular: fine.singular,
    ...(cornersVanish ? {} : { SW, SE, NW, NE }),
  };
}
