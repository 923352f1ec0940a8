/**
 * Pure numeric kernels on the padded layout of `level.ts`: flat `Float64Array` loops with no
 * allocation and no closures inside them. Callers pass validated, consistent arrays.
 *
 * The stencil kernels below are five-point loops. A nine-point level (with corner arrays) is
 * handed, by one test at the top of each call, to its counterpart in `_kernels_nine.ts`; on a
 * nine-point level `redBlackSweep` becomes the four-colour sweep (red–black is not an exact
 * two-colouring once corners couple).
 *
 * @module
 */
import { isNinePoint, type LevelOperator } from "./level.ts";
import {
  fourColourSweep,
  gaussSeidelSweepNine,
  lineXSweepNine,
  lineYSweepNine,
  residualNine,
  residualNorm2Nine,
  roundoffScaleNine,
} from "./_kernels_nine.ts";

/** r = f − A·u at every node (halo of r untouched, so it stays zero). */
export function residual(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  r: Float64Array,
): void {
  if (isNinePoint(op)) return residualNine(op, u, f, r);
  const { W, E, S, N, C, nx, ny, stride } = op;
  const symmetric = W === E && S === N;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    const end = base + nx;
    if (symmetric) {
      for (let k = base; k <= end; k++) {
        r[k] = f[k] -
          (C[k] * u[k] + W[k] * (u[k - 1] + u[k + 1]) + S[k] * (u[k - stride] + u[k + stride]));
      }
    } else {
      for (let k = base; k <= end; k++) {
        r[k] = f[k] -
          (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - stride] +
            N[k] * u[k + stride]);
      }
    }
  }
}

/** ‖f − A·u‖₂ without storing the residual. */
export function residualNorm2(op: LevelOperator, u: Float64Array, f: Float64Array): number {
  if (isNinePoint(op)) return residualNorm2Nine(op, u, f);
  const { W, E, S, N, C, nx, ny, stride } = op;
  const symmetric = W === E && S === N;
  let sum = 0;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    const end = base + nx;
    if (symmetric) {
      for (let k = base; k <= end; k++) {
        const t = f[k] -
          (C[k] * u[k] + W[k] * (u[k - 1] + u[k + 1]) + S[k] * (u[k - stride] + u[k + stride]));
        sum += t * t;
      }
    } else {
      for (let k = base; k <= end; k++) {
        const t = f[k] -
          (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - stride] +
            N[k] * u[k + stride]);
        sum += t * t;
      }
    }
  }
  return Math.sqrt(sum);
}

/** ‖r‖₂ of a padded vector whose halo is zero. */
export function norm2(r: Float64Array): number {
  let s = 0;
  for (let k = 0; k < r.length; k++) s += r[k] * r[k];
  return Math.sqrt(s);
}

/** ‖ |f| + |A|·|u| ‖₂: the scale of the round-off in a computed residual (times ε). */
export function roundoffScale(op: LevelOperator, u: Float64Array, f: Float64Array): number {
  if (isNinePoint(op)) return roundoffScaleNine(op, u, f);
  const { W, E, S, N, C, nx, ny, stride } = op;
  let s = 0;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) {
      const t = Math.abs(f[k]) + Math.abs(C[k] * u[k]) + Math.abs(W[k] * u[k - 1]) +
        Math.abs(E[k] * u[k + 1]) + Math.abs(S[k] * u[k - stride]) +
        Math.abs(N[k] * u[k + stride]);
      s += t * t;
    }
  }
  return Math.sqrt(s);
}

/** Relaxes every other node of row j, starting at column i0 (Gauss–Seidel update in place). */
function relaxRow(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  j: number,
  i0: number,
): void {
  const { W, E, S, N, invC, nx, stride } = op;
  const base = (j + 1) * stride + 1;
  const end = base + nx;
  for (let k = base + i0; k <= end; k += 2) {
    u[k] = invC[k] *
      (f[k] - W[k] * u[k - 1] - E[k] * u[k + 1] - S[k] * u[k - stride] - N[k] * u[k + stride]);
  }
}

/**
 * One red–black Gauss–Seidel sweep (red: i + j even, first), fused into a single pass over memory:
 * one loop relaxes the red nodes of row j and, right behind them, the black nodes of row j − 1,
 * whose red neighbours (rows j − 2, j − 1 and the node just done in row j) are then all new. Both
 * rows start at the same column parity. The result equals, bit for bit, a full red pass followed
 * by a full black pass.
 */
export function redBlackSweep(op: LevelOperator, u: Float64Array, f: Float64Array): void {
  if (isNinePoint(op)) return fourColourSweep(op, u, f);
  const { W, E, S, N, invC, nx, ny, stride: s } = op;
  const symmetric = W === E && S === N;
  relaxRow(op, u, f, 0, 0);
  for (let j = 1; j <= ny; j++) {
    const i0 = j & 1;
    const k0 = (j + 1) * s + 1 + i0, end = (j + 1) * s + 1 + nx;
    if (symmetric) {
      for (let k = k0, q = k0 - s; k <= end; k += 2, q += 2) {
        u[k] = invC[k] * (f[k] - W[k] * (u[k - 1] + u[k + 1]) - S[k] * (u[k - s] + u[k + s]));
        u[q] = invC[q] * (f[q] - W[q] * (u[q - 1] + u[q + 1]) - S[q] * (u[q - s] + u[q + s]));
      }
    } else {
      for (let k = k0, q = k0 - s; k <= end; k += 2, q += 2) {
        u[k] = invC[k] *
          (f[k] - W[k] * u[k - 1] - E[k] * u[k + 1] - S[k] * u[k - s] - N[k] * u[k + s]);
        u[q] = invC[q] *
          (f[q] - W[q] * u[q - 1] - E[q] * u[q + 1] - S[q] * u[q - s] - N[q] * u[q + s]);
      }
    }
  }
  relaxRow(op, u, f, ny, (ny + 1) & 1);
}

/** One lexicographic Gauss–Seidel sweep (x fastest, then y). */
export function gaussSeidelSweep(op: LevelOperator, u: Float64Array, f: Float64Array): void {
  if (isNinePoint(op)) return gaussSeidelSweepNine(op, u, f);
  const { W, E, S, N, invC, nx, ny, stride } = op;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) {
      u[k] = invC[k] *
        (f[k] - W[k] * u[k - 1] - E[k] * u[k + 1] - S[k] * u[k - stride] - N[k] * u[k + stride]);
    }
  }
}

/** One weighted Jacobi sweep u ← u + ω·D⁻¹(f − A·u), using `tmp` (padded, halo zero) for r. */
export function jacobiSweep(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  omega: number,
  tmp: Float64Array,
): void {
  residual(op, u, f, tmp);
  const { invC, nx, ny, stride } = op;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) u[k] += omega * invC[k] * tmp[k];
  }
}

/**
 * Thomas factors of the tridiagonal line systems: for x-lines (sub W, diagonal C, super E) or
 * y-lines (sub S, diagonal C, super N). Returns per node the modified super-diagonal `cp` and the
 * inverse pivot `dinv`.
 */
export function lineFactors(
  op: LevelOperator,
  direction: "x" | "y",
): { cp: Float64Array; dinv: Float64Array } {
  const { nx, ny, stride, C } = op;
  const sub = direction === "x" ? op.W : op.S;
  const sup = direction === "x" ? op.E : op.N;
  const cp = new Float64Array(op.length), dinv = new Float64Array(op.length);
  const lines = direction === "x" ? ny : nx, len = direction === "x" ? nx : ny;
  const step = direction === "x" ? 1 : stride;
  for (let l = 0; l <= lines; l++) {
    let k = direction === "x" ? (l + 1) * stride + 1 : stride + l + 1;
    let prev = 0;
    for (let m = 0; m <= len; m++, k += step) {
      const piv = C[k] - (m > 0 ? sub[k] * prev : 0);
      dinv[k] = 1 / piv;
      prev = cp[k] = sup[k] / piv;
    }
  }
  return { cp, dinv };
}

/** Line Gauss–Seidel along x on rows j0, j0 + dj, … (Thomas solve per row; `tmp` ≥ nx + 1). */
export function lineXSweep(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  fac: { cp: Float64Array; dinv: Float64Array },
  j0: number,
  dj: number,
): void {
  if (isNinePoint(op)) return lineXSweepNine(op, u, f, fac, j0, dj);
  const { W, S, N, nx, ny, stride } = op;
  const { cp, dinv } = fac;
  for (let j = j0; j <= ny; j += dj) {
    const base = (j + 1) * stride + 1;
    const end = base + nx;
    // Forward elimination writes the intermediate values into u (each entry read before written).
    let prev = 0;
    for (let k = base; k <= end; k++) {
      const rhs = f[k] - S[k] * u[k - stride] - N[k] * u[k + stride];
      prev = u[k] = (rhs - W[k] * prev) * dinv[k];
    }
    for (let k = end - 1; k >= base; k--) u[k] -= cp[k] * u[k + 1];
  }
}

/** Line Gauss–Seidel along y on columns i0, i0 + di, … (Thomas solve per column). */
export function lineYSweep(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  fac: { cp: Float64Array; dinv: Float64Array },
  i0: number,
  di: number,
): void {
  if (isNinePoint(op)) return lineYSweepNine(op, u, f, fac, i0, di);
  const { W, E, S, nx, ny, stride } = op;
  const { cp, dinv } = fac;
  for (let i = i0; i <= nx; i += di) {
    const base = stride + i + 1;
    const end = base + ny * stride;
    let prev = 0;
    for (let k = base; k <= end; k += stride) {
      const rhs = f[k] - W[k] * u[k - 1] - E[k] * u[k + 1];
      prev = u[k] = (rhs - S[k] * prev) * dinv[k];
    }
    for (let k = end - stride; k >= base; k -= stride) u[k] -= cp[k] * u[k + stride];
  }
}

/** Subtracts the mean of r over the real nodes (halo stays zero). */
export function removeMean(op: LevelOperator, r: Float64Array): number {
  const { nx, ny, stride } = op;
  let s = 0;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) s += r[k];
  }
  const mean = s / ((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) r[k] -= mean;
  }
  return mean;
}

/** Subtracts the trapezoid-rule mean of u (the discrete ∫u/area), so that mean becomes zero. */
export function removeTrapezoidMean(op: LevelOperator, u: Float64Array): void {
  const { nx, ny, stride } = op;
  let s = 0;
  for (let j = 0; j <= ny; j++) {
    const wy = j === 0 || j === ny ? 0.5 : 1;
    const base = (j + 1) * stride + 1;
    let row = 0.5 * (u[base] + u[base + nx]);
    for (let k = base + 1; k < base + nx; k++) row += u[k];
    s += wy * row;
  }
  const mean = s / (nx * ny);
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) u[k] -= mean;
  }
}

/** v ← v + c at every real node (halo untouched). */
export function addToNodes(op: LevelOperator, v: Float64Array, c: number): void {
  const { nx, ny, stride } = op;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * stride + 1;
    for (let k = base; k <= base + nx; k++) v[k] += c;
  }
}

/**
 * fine += P·coarse for bilinear interpolation when both directions are coarsened (the common
 * case, kept free of closures and per-node branches): even fine rows take the coarse row, odd
 * fine rows the mean of the two coarse rows around them.
 */
export function interpolateAddBoth(
  c: Float64Array,
  f: Float64Array,
  cnx: number,
  cny: number,
  cs: number,
  fs: number,
): void {
  for (let J = 0; J <= cny; J++) {
    const c0 = (J + 1) * cs + 1;
    const fe = (2 * J + 1) * fs + 1;
    // Even fine row 2J.
    for (let I = 0, k = fe; I < cnx; I++, k += 2) {
      const v = c[c0 + I];
      f[k] += v;
      f[k + 1] += 0.5 * (v + c[c0 + I + 1]);
    }
    f[fe + 2 * cnx] += c[c0 + cnx];
    if (J === cny) break;
    // Odd fine row 2J + 1.
    const c1 = c0 + cs, fo = fe + fs;
    for (let I = 0, k = fo; I < cnx; I++, k += 2) {
      const v = c[c0 + I] + c[c1 + I];
      f[k] += 0.5 * v;
      f[k + 1] += 0.25 * (v + c[c0 + I + 1] + c[c1 + I + 1]);
    }
    f[fo + 2 * cnx] += 0.5 * (c[c0 + cnx] + c[c1 + cnx]);
  }
}

/** Residuals of fine row j at the odd columns 1, 3, …, nx − 1 into row[1 …], row[0] and the last zero. */
function oddColumnResiduals(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  j: number,
  row: Float64Array,
): void {
  const { W, E, S, N, C, stride: s } = op;
  const cnx = op.nx >> 1;
  if (W === E && S === N) {
    for (let I = 0, k = (j + 1) * s + 2; I < cnx; I++, k += 2) {
      row[I + 1] = f[k] -
        (C[k] * u[k] + W[k] * (u[k - 1] + u[k + 1]) + S[k] * (u[k - s] + u[k + s]));
    }
    return;
  }
  for (let I = 0, k = (j + 1) * s + 2; I < cnx; I++, k += 2) {
    row[I + 1] = f[k] -
      (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - s] + N[k] * u[k + s]);
  }
}

/**
 * Coarse row J of {@link restrictRedResidual}: `prev` holds the odd-column residuals of fine row
 * 2J − 1 (zeros for J = 0); `next` receives those of row 2J + 1 (zeros for J = cny), and the
 * caller swaps the two before row J + 1. Reads u on fine rows 2J − 1 … 2J + 2 only.
 */
export function restrictRedRow(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  out: Float64Array,
  cs: number,
  J: number,
  prev: Float64Array,
  next: Float64Array,
): void {
  const { W, E, S, N, C, stride: s } = op;
  const cnx = op.nx >> 1, cny = op.ny >> 1;
  if (J < cny) oddColumnResiduals(op, u, f, 2 * J + 1, next);
  else next.fill(0);
  const cb = (J + 1) * cs + 1;
  if (W === E && S === N) {
    for (let I = 0, k = (2 * J + 1) * s + 1; I <= cnx; I++, k += 2) {
      const rc = f[k] -
        (C[k] * u[k] + W[k] * (u[k - 1] + u[k + 1]) + S[k] * (u[k - s] + u[k + s]));
      out[cb + I] = 0.0625 * (4 * rc + prev[I] + prev[I + 1] + next[I] + next[I + 1]);
    }
    return;
  }
  for (let I = 0, k = (2 * J + 1) * s + 1; I <= cnx; I++, k += 2) {
    const rc = f[k] -
      (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - s] + N[k] * u[k + s]);
    out[cb + I] = 0.0625 * (4 * rc + prev[I] + prev[I + 1] + next[I] + next[I + 1]);
  }
}

/**
 * Full-weighting restriction of the residual f − A·u of a five-point level whose black nodes
 * (i + j odd) have zero residual, as they have right after a red–black Gauss–Seidel sweep: the
 * edge weights of full weighting then multiply zeros, so only the red residuals enter,
 *
 *   out(I, J) = (4·r(2I, 2J) + r(2I ± 1, 2J ± 1)) / 16,
 *
 * and the residual is computed at the red nodes only (at the coinciding nodes and at the odd–odd
 * nodes, each of the latter shared by four coarse nodes through two row buffers), never stored on
 * the fine grid. Off-grid fine nodes count as zero, like the zero halo of the unfused path. Both
 * directions must be coarsened (nx, ny even). The caller applies the boundary rescaling and the
 * coarse Dirichlet zeros afterwards. Equals `residual` then full weighting up to the round-off
 * left in the black residuals.
 *
 * @param rowA Work row of length nx/2 + 2 (entries 0 and the last are kept zero).
 * @param rowB A second such row.
 */
export function restrictRedResidual(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  out: Float64Array,
  cs: number,
  rowA: Float64Array,
  rowB: Float64Array,
): void {
  const cny = op.ny >> 1;
  let prev = rowA, next = rowB;
  prev.fill(0);
  for (let J = 0; J <= cny; J++) {
    restrictRedRow(op, u, f, out, cs, J, prev, next);
    const t = prev;
    prev = next;
    next = t;
  }
}

/**
 * ‖f − A·u‖₂ over the red nodes (i + j even) of a five-point level: the whole residual norm when
 * the black residuals are zero, as right after a red–black sweep (up to their round-off).
 */
export function redResidualNorm2(op: LevelOperator, u: Float64Array, f: Float64Array): number {
  const { W, E, S, N, C, nx, ny, stride: s } = op;
  let sum = 0;
  for (let j = 0; j <= ny; j++) {
    const base = (j + 1) * s + 1;
    for (let k = base + (j & 1); k <= base + nx; k += 2) {
      const t = f[k] -
        (C[k] * u[k] + W[k] * u[k - 1] + E[k] * u[k + 1] + S[k] * u[k - s] + N[k] * u[k + s]);
      sum += t * t;
    }
  }
  return Math.sqrt(sum);
}
