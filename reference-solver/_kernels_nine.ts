/**
 * Nine-point variants of the kernels in `_kernels.ts`, for levels with corner arrays (a mixed term,
 * a full conductivity tensor, Galerkin coarse operators). Same padded layout, same contracts;
 * five-point levels never reach these loops.
 *
 * @module
 */
import type { NinePointOperator } from "./level.ts";

/** r = f − A·u at every node (nine-point). */
export function residualNine(
  op: NinePointOperator,
  u: Float64Array,
  f: Float64Array,
  r: Float64Array,
): void {
  const { W, E, S, N, C, SW, SE, NW, NE, nx, ny, stride: s } = op;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * s + 1;
    for (let k = base; k <= base + nx; k++) {
      r[k] = f[k] -
        (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - s] + N[k] * u[k + s] +
          SW[k] * u[k - s - 1] + SE[k] * u[k - s + 1] + NW[k] * u[k + s - 1] +
          NE[k] * u[k + s + 1]);
    }
  }
}

/** ‖f − A·u‖₂ (nine-point) without storing the residual. */
export function residualNorm2Nine(op: NinePointOperator, u: Float64Array, f: Float64Array): number {
  const { W, E, S, N, C, SW, SE, NW, NE, nx, ny, stride: s } = op;
  let sum = 0;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * s + 1;
    for (let k = base; k <= base + nx; k++) {
      const t = f[k] -
        (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - s] + N[k] * u[k + s] +
          SW[k] * u[k - s - 1] + SE[k] * u[k - s + 1] + NW[k] * u[k + s - 1] +
          NE[k] * u[k + s + 1]);
      sum += t * t;
    }
  }
  return Math.sqrt(sum);
}

/** ‖ |f| + |A|·|u| ‖₂ (nine-point). */
export function roundoffScaleNine(op: NinePointOperator, u: Float64Array, f: Float64Array): number {
  const { W, E, S, N, C, SW, SE, NW, NE, nx, ny, stride: s } = op;
  let sum = 0;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * s + 1;
    for (let k = base; k <= base + nx; k++) {
      const t = Math.abs(f[k]) + Math.abs(C[k] * u[k]) + Math.abs(W[k] * u[k - 1]) +
        Math.abs(E[k] * u[k + 1]) + Math.abs(S[k] * u[k - s]) + Math.abs(N[k] * u[k + s]) +
        Math.abs(SW[k] * u[k - s - 1]) + Math.abs(SE[k] * u[k - s + 1]) +
        Math.abs(NW[k] * u[k + s - 1]) + Math.abs(NE[k] * u[k + s + 1]);
      sum += t * t;
    }
  }
  return Math.sqrt(sum);
}

/** Gauss–Seidel update of the nodes i0, i0 + di, … of row j (nine-point). */
function relaxRowNine(
  op: NinePointOperator,
  u: Float64Array,
  f: Float64Array,
  j: number,
  i0: number,
  di: number,
): void {
  const { W, E, S, N, SW, SE, NW, NE, invC, nx, stride: s } = op;
  const base = (j + 1) * s + 1;
  for (let k = base + i0; k <= base + nx; k += di) {
    u[k] = invC[k] *
      (f[k] - W[k] * u[k - 1] - E[k] * u[k + 1] - S[k] * u[k - s] - N[k] * u[k + s] -
        SW[k] * u[k - s - 1] - SE[k] * u[k - s + 1] - NW[k] * u[k + s - 1] -
        NE[k] * u[k + s + 1]);
  }
}

/** One lexicographic Gauss–Seidel sweep (x fastest, then y), nine-point. */
export function gaussSeidelSweepNine(
  op: NinePointOperator,
  u: Float64Array,
  f: Float64Array,
): void {
  for (let j = 0; j <= op.ny; j++) relaxRowNine(op, u, f, j, 0, 1);
}

/**
 * One four-colour Gauss–Seidel sweep: the colours are the parities (i mod 2, j mod 2), relaxed in
 * the order (0, 0), (1, 0), (0, 1), (1, 1). Two nodes of one colour are two apart in x or y, so a
 * nine-point stencil never couples them and each colour is an exact block of the Gauss–Seidel
 * iteration — the nine-point counterpart of red–black ordering, which couples same-coloured
 * diagonal neighbours through the corners.
 */
export function fourColourSweep(op: NinePointOperator, u: Float64Array, f: Float64Array): void {
  for (const [i0, j0] of COLOURS) {
    for (let j = j0; j <= op.ny; j += 2) relaxRowNine(op, u, f, j, i0, 2);
  }
}

const COLOURS = [[0, 0], [1, 0], [0, 1], [1, 1]] as const;

/**
 * Line Gauss–Seidel along x on rows j0, j0 + dj, … (nine-point): the tridiagonal part (W, C, E)
 * is solved by the Thomas factors of `lineFactors`; the couplings to the rows below and above
 * (S, N and the four corners) are taken explicitly with the current values.
 */
export function lineXSweepNine(
  op: NinePointOperator,
  u: Float64Array,
  f: Float64Array,
  fac: { cp: Float64Array; dinv: Float64Array },
  j0: number,
  dj: number,
): void {
  const { W, S, N, SW, SE, NW, NE, nx, ny, stride: s } = op;
  const { cp, dinv } = fac;
  for (let j = j0; j <= ny; j += dj) {
    const base = (j + 1) * s + 1;
    const end = base + nx;
    let prev = 0;
    for (let k = base; k <= end; k++) {
      const rhs = f[k] - S[k] * u[k - s] - N[k] * u[k + s] - SW[k] * u[k - s - 1] -
        SE[k] * u[k - s + 1] - NW[k] * u[k + s - 1] - NE[k] * u[k + s + 1];
      prev = u[k] = (rhs - W[k] * prev) * dinv[k];
    }
    for (let k = end - 1; k >= base; k--) u[k] -= cp[k] * u[k + 1];
  }
}

/** Line Gauss–Seidel along y on columns i0, i0 + di, … (nine-point; see {@link lineXSweepNine}). */
export function lineYSweepNine(
  op: NinePointOperator,
  u: Float64Array,
  f: Float64Array,
  fac: { cp: Float64Array; dinv: Float64Array },
  i0: number,
  di: number,
): void {
  const { W, E, S, SW, SE, NW, NE, nx, ny, stride: s } = op;
  const { cp, dinv } = fac;
  for (let i = i0; i <= nx; i += di) {
    const base = s + i + 1;
    const end = base + ny * s;
    let prev = 0;
    for (let k = base; k <= end; k += s) {
      const rhs = f[k] - W[k] * u[k - 1] - E[k] * u[k + 1] - SW[k] * u[k - s - 1] -
        SE[k] * u[k - s + 1] - NW[k] * u[k + s - 1] - NE[k] * u[k + s + 1];
      prev = u[k] = (rhs - S[k] * prev) * dinv[k];
    }
    for (let k = end - s; k >= base; k -= s) u[k] -= cp[k] * u[k + s];
  }
}
