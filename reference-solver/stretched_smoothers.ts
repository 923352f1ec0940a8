/**
 * Smoothers of the stretched path (`discretize_stretched.ts` operators): lexicographic point
 * Gauss–Seidel, and line Gauss–Seidel along x, along y, or alternating (x-lines then y-lines),
 * each line solved exactly by the Thomas algorithm (cyclic, by Sherman–Morrison, on a periodic
 * axis).
 *
 * Which one, per level ({@link lineChoice}): stretching makes the operator anisotropic node by
 * node, so the decision uses the local couplings: with X = |W| + |E| and Y = |S| + |N| of a row
 * (for a·u_xx + c·u_yy on local spacings, X/Y ≈ a·hy²/(c·hx²) with the local hx, hy), a level
 * whose rows have X/Y > {@link LINE_THRESHOLD} somewhere needs x-lines, Y/X > threshold y-lines;
 * both: alternating lines; neither: the requested smoother. A requested line smoother is always
 * honoured (alternating when "alternating-line").
 *
 * @module
 */
import type { StretchedOperator } from "./discretize_stretched.ts";
import type { SmootherName } from "./options.ts";

/**
 * Coupling ratio above which a level relaxes by lines (the same rule and value as
 * `ANISOTROPY_FOR_LINES` of the protocol program: point smoothers lose their smoothing as the
 * ratio grows, Trottenberg et al. 2001; common practice).
 */
export const LINE_THRESHOLD = 10;

/** What a stretched level relaxes with. */
export type StretchedRelaxation = "point" | "line-x" | "line-y" | "alternating-line";

/** The relaxation of a level (module doc). */
export function lineChoice(op: StretchedOperator, requested: SmootherName): StretchedRelaxation {
  if (requested === "line-x" || requested === "line-y" || requested === "alternating-line") {
    return requested;
  }
  let needX = false, needY = false;
  for (let k = 0; k < op.C.length; k++) {
    const X = Math.abs(op.W[k]) + Math.abs(op.E[k]), Y = Math.abs(op.S[k]) + Math.abs(op.N[k]);
    if (X > LINE_THRESHOLD * Y && Y > 0) needX = true;
    if (Y > LINE_THRESHOLD * X && X > 0) needY = true;
  }
  return needX && needY ? "alternating-line" : needX ? "line-x" : needY ? "line-y" : "point";
}

/** Solves a tridiagonal (cyclic when `cyclic`) system in place into `out`. */
function solveLine(
  lo: Float64Array,
  di: Float64Array,
  up: Float64Array,
  rh: Float64Array,
  m: number,
  cyclic: boolean,
  out: Float64Array,
  work: Float64Array,
): void {
  if (cyclic && m <= 2) {
    if (m === 1) {
      out[0] = rh[0] / (di[0] + lo[0] + up[0]);
      return;
    }
    const a = di[0], b = lo[0] + up[0], c = lo[1] + up[1], d = di[1], det = a * d - b * c;
    out[0] = (rh[0] * d - b * rh[1]) / det, out[1] = (a * rh[1] - c * rh[0]) / det;
    return;
  }
  if (!cyclic) {
    thomas(lo, di, up, rh, m, out, work);
    return;
  }
  // Sherman–Morrison: A = T + v·wᵀ with corner terms lo[0] (row 0, col m−1), up[m−1] (row m−1, col 0).
  const gamma = -di[0];
  const d2 = work.subarray(m, 2 * m);
  d2.set(di.subarray(0, m));
  d2[0] = di[0] - gamma, d2[m - 1] = di[m - 1] - (lo[0] * up[m - 1]) / gamma;
  const y = work.subarray(2 * m, 3 * m), z = work.subarray(3 * m, 4 * m);
  const uvec = work.subarray(4 * m, 5 * m);
  const scratch = work.subarray(5 * m, 6 * m);
  thomas(lo, d2, up, rh, m, y, scratch);
  uvec.fill(0), uvec[0] = gamma, uvec[m - 1] = up[m - 1];
  thomas(lo, d2, up, uvec, m, z, scratch);
  const vy = y[0] + (lo[0] / gamma) * y[m - 1], vz = z[0] + (lo[0] / gamma) * z[m - 1];
  const fac = vy / (1 + vz);
  for (let i = 0; i < m; i++) out[i] = y[i] - fac * z[i];
}

function thomas(
  lo: Float64Array,
  di: Float64Array,
  up: Float64Array,
  rh: Float64Array,
  m: number,
  out: Float64Array,
  cp: Float64Array,
): void {
  let beta = di[0];
  out[0] = rh[0] / beta;
  for (let i = 1; i < m; i++) {
    cp[i] = up[i - 1] / beta;
    beta = di[i] - lo[i] * cp[i];
    out[i] = (rh[i] - lo[i] * out[i - 1]) / beta;
  }
  for (let i = m - 2; i >= 0; i--) out[i] -= cp[i + 1] * out[i + 1];
}

/** A smoother of a stretched level: `sweeps` sweeps in place. */
export interface StretchedSmoother {
  smooth(u: Float64Array, f: Float64Array, sweeps: number): void;
  /** Plain JSON record. */
  describe(): Record<string, unknown>;
}

/** Builds the smoother of a level (see {@link lineChoice}). */
export function createStretchedSmoother(
  op: StretchedOperator,
  requested: SmootherName,
): StretchedSmoother {
  const kind = lineChoice(op, requested);
  const { mx, my, px, py, W, E, S, N, C } = op;
  const len = Math.max(mx, my);
  const lo = new Float64Array(len), di = new Float64Array(len), up = new Float64Array(len);
  const rh = new Float64Array(len), out = new Float64Array(len), work = new Float64Array(6 * len);
  const xLines = (u: Float64Array, f: Float64Array) => {
    for (let j = 0; j < my; j++) {
      const js = j > 0 ? j - 1 : py ? my - 1 : j, jn = j < my - 1 ? j + 1 : py ? 0 : j;
      for (let i = 0; i < mx; i++) {
        const k = j * mx + i;
        lo[i] = W[k], di[i] = C[k], up[i] = E[k];
        rh[i] = f[k] - S[k] * u[js * mx + i] - N[k] * u[jn * mx + i];
      }
      solveLine(lo, di, up, rh, mx, px, out, work);
      u.set(out.subarray(0, mx), j * mx);
    }
  };
  const yLines = (u: Float64Array, f: Float64Array) => {
    for (let i = 0; i < mx; i++) {
      const iw = i > 0 ? i - 1 : px ? mx - 1 : i, ie = i < mx - 1 ? i + 1 : px ? 0 : i;
      for (let j = 0; j < my; j++) {
        const k = j * mx + i;
        lo[j] = S[k], di[j] = C[k], up[j] = N[k];
        rh[j] = f[k] - W[k] * u[j * mx + iw] - E[k] * u[j * mx + ie];
      }
      solveLine(lo, di, up, rh, my, py, out, work);
      for (let j = 0; j < my; j++) u[j * mx + i] = out[j];
    }
  };
  const point = (u: Float64Array, f: Float64Array) => {
    for (let j = 0; j < my; j++) {
      const js = j > 0 ? j - 1 : py ? my - 1 : j, jn = j < my - 1 ? j + 1 : py ? 0 : j;
      for (let i = 0; i < mx; i++) {
        const iw = i > 0 ? i - 1 : px ? mx - 1 : i, ie = i < mx - 1 ? i + 1 : px ? 0 : i;
        const k = j * mx + i;
        u[k] = (f[k] - W[k] * u[j * mx + iw] - E[k] * u[j * mx + ie] - S[k] * u[js * mx + i] -
          N[k] * u[jn * mx + i]) / C[k];
      }
    }
  };
  return {
    smooth(u, f, sweeps) {
      for (let s = 0; s < sweeps; s++) {
        if (kind === "point") point(u, f);
        if (kind === "line-x" || kind === "alternating-line") xLines(u, f);
        if (kind === "line-y" || kind === "alternating-line") yLines(u, f);
      }
    },
    describe: () => ({
      name: kind === "point" ? "gauss-seidel" : kind,
      ordering: "lexicographic",
      requested,
      grid: "stretched",
    }),
  };
}
