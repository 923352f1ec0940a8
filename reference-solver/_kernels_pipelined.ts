/**
 * Red–black Gauss–Seidel on five-point levels with several sweeps in one pass over memory, and the
 * coarse-grid correction fused into the first post-smoothing sweep (issue 16: do less work than
 * the textbook cycle by reading the level's arrays fewer times).
 *
 * Pipelining. One sweep is, row after row, "relax the red nodes of row j, then the black nodes of
 * row j − 1" (`redBlackSweep`): each black node then sees its three red neighbour rows new. Sweep
 * s + 1 may relax the red nodes of row j once sweep s has finished the black nodes of rows j − 1,
 * j and j + 1, so it runs two rows behind: step t relaxes, for every sweep s, red row t − 2s and
 * black row t − 2s − 1. Every value is computed from the same inputs as in consecutive sweeps, so
 * the result equals them bit for bit while the coefficient rows are fetched once for all sweeps
 * (the 2·count + 2 rows in flight stay in cache).
 *
 * Correction. Right after `fine += P·coarse` a red–black sweep overwrites every red node from its
 * black neighbours without reading the red node itself (a five-point row's update does not read
 * its own old value), so the correction at red nodes is never used: only the black nodes — the
 * edge midpoints of bilinear interpolation, means of two coarse values — take it, one row ahead
 * of the first sweep. The result equals `interpolateAddBoth` followed by the sweeps bit for bit.
 *
 * @module
 */
import type { LevelOperator } from "./level.ts";
import { restrictRedRow } from "./_kernels.ts";

/**
 * Relaxes the red nodes (i + j even) of row j and the black nodes of row j − 1, interleaved, each
 * row only when it is on the grid (0 … ny). Both rows start at column j mod 2.
 */
function pairRow(op: LevelOperator, u: Float64Array, f: Float64Array, j: number): void {
  const { W, E, S, N, invC, nx, ny, stride: s } = op;
  const red = j >= 0 && j <= ny, black = j >= 1 && j <= ny + 1;
  if (!red && !black) return;
  const symmetric = W === E && S === N;
  const i0 = j & 1;
  if (red && black) {
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
    return;
  }
  // Only one row: the red row 0 (first step) or the black row ny (last step).
  const row = red ? j : j - 1;
  const k0 = (row + 1) * s + 1 + i0, end = (row + 1) * s + 1 + nx;
  for (let k = k0; k <= end; k += 2) {
    u[k] = invC[k] *
      (f[k] - W[k] * u[k - 1] - E[k] * u[k + 1] - S[k] * u[k - s] - N[k] * u[k + s]);
  }
}

/**
 * `count` red–black Gauss–Seidel sweeps (red first) on a five-point level in one pass over memory
 * (module doc). Equals `count` calls of `redBlackSweep` bit for bit.
 *
 * @param op A five-point level operator (no corner arrays).
 * @param u Iterate (padded), updated in place.
 * @param f Right-hand side (padded).
 * @param count Number of sweeps (0 does nothing).
 */
export function redBlackSweeps(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  count: number,
): void {
  if (count <= 0) return;
  const last = op.ny + 1 + 2 * (count - 1);
  for (let t = 0; t <= last; t++) {
    for (let sw = 0; sw < count; sw++) pairRow(op, u, f, t - 2 * sw);
  }
}

/** u += bilinear correction at the black nodes (i + j odd) of fine row j; coarse stride cs. */
function correctBlackRow(
  c: Float64Array,
  u: Float64Array,
  j: number,
  cnx: number,
  cs: number,
  fs: number,
): void {
  const J = j >> 1;
  const c0 = (J + 1) * cs + 1, fb = (j + 1) * fs + 1;
  if ((j & 1) === 0) {
    // Even fine row: the black nodes are the odd columns, midpoints along x.
    for (let I = 0, k = fb + 1; I < cnx; I++, k += 2) u[k] += 0.5 * (c[c0 + I] + c[c0 + I + 1]);
    return;
  }
  // Odd fine row: the black nodes are the even columns, midpoints along y.
  const c1 = c0 + cs;
  for (let I = 0, k = fb; I <= cnx; I++, k += 2) u[k] += 0.5 * (c[c0 + I] + c[c1 + I]);
}

/**
 * fine += P·coarse (bilinear, both directions coarsened) followed by `sweeps` ≥ 1 red–black
 * sweeps, in one pass, with the correction added at the black nodes only (module doc). Equals
 * `interpolateAddBoth` then `sweeps` calls of `redBlackSweep` bit for bit.
 *
 * @param op The fine five-point level (nx = 2·cnx, ny = 2·cny).
 * @param coarse The coarse correction (padded, stride cnx + 3).
 * @param u The fine iterate (padded), corrected and relaxed in place.
 * @param f The fine right-hand side.
 * @param sweeps Post-smoothing sweeps, at least 1.
 */
export function correctAndSweep(
  op: LevelOperator,
  coarse: Float64Array,
  u: Float64Array,
  f: Float64Array,
  sweeps: number,
): void {
  const { nx, ny, stride: fs } = op;
  const cnx = nx >> 1, cs = cnx + 3;
  const last = ny + 2 + 2 * (sweeps - 1);
  for (let t = 0; t <= last; t++) {
    if (t <= ny) correctBlackRow(coarse, u, t, cnx, cs, fs);
    for (let sw = 0; sw < sweeps; sw++) pairRow(op, u, f, t - 1 - 2 * sw);
  }
}

/**
 * `sweeps` ≥ 1 red–black sweeps followed by the fused red-residual full-weighting restriction
 * (`restrictRedResidual`), in one pass: coarse row J is restricted as soon as the last sweep has
 * finished fine row 2J + 2. Equals `redBlackSweeps` then `restrictRedResidual` bit for bit (the
 * restriction reads only final values, computed by the same row function). The caller applies
 * the boundary rescaling and the coarse Dirichlet zeros afterwards.
 *
 * @param op The fine five-point level (nx, ny even).
 * @param u The fine iterate, relaxed in place.
 * @param f The fine right-hand side.
 * @param sweeps Pre-smoothing sweeps, at least 1.
 * @param out The coarse right-hand side (padded, stride cs), every coarse node written.
 * @param cs The coarse stride nx/2 + 3.
 * @param rowA Work row of length nx/2 + 2; rowB a second one.
 */
export function sweepAndRestrict(
  op: LevelOperator,
  u: Float64Array,
  f: Float64Array,
  sweeps: number,
  out: Float64Array,
  cs: number,
  rowA: Float64Array,
  rowB: Float64Array,
): void {
  const ny = op.ny, cny = ny >> 1;
  let prev = rowA, next = rowB;
  prev.fill(0);
  let J = 0;
  const last = ny + 1 + 2 * (sweeps - 1);
  for (let t = 0; t <= last; t++) {
    for (let sw = 0; sw < sweeps; sw++) pairRow(op, u, f, t - 2 * sw);
    // Rows 0 … t − 2·sweeps + 1 are final; coarse row J reads fine rows up to 2J + 2.
    const done = t - 2 * sweeps + 1;
    while (J <= cny && Math.min(2 * J + 2, ny) <= done) {
      restrictRedRow(op, u, f, out, cs, J, prev, next);
      const tmp = prev;
      prev = next;
      next = tmp;
      J++;
    }
  }
}
