/**
 * Exact solve of a level's system by banded LU, factorized once: the coarsest grid of the cycle.
 *
 * @module
 */
import { isNinePoint, type LevelOperator } from "./level.ts";
import { bandedLU } from "./banded_lu.ts";

/** Largest band storage (in doubles) the coarsest level may take: 400 MB. */
export const MAX_BAND_STORAGE = 5e7;

/** A direct solver bound to one level. */
export interface DirectSolver {
  /** u ← A⁻¹·f (padded vectors). For a singular level see {@link createDirectSolver}. */
  solve(u: Float64Array, f: Float64Array): void;
  /** Plain JSON record. */
  describe(): Record<string, unknown>;
}

/**
 * Factorizes a level's operator. Nodes are numbered along the shorter side first, so the
 * bandwidth is m = min(nx, ny) + 1 for a five-point level; on a nine-point level the corner
 * neighbours sit one further away (m − 1 and m + 1 positions), so the band is m + 1.
 *
 * A singular level (constants in the null space) is solved as the bordered system
 * A·u = f − λ·1 with λ chosen to make it compatible: the row of node (0, 0) is replaced by u = 0,
 * giving a regular A′; then x = A′⁻¹f′ and y = A′⁻¹1′ (both with 0 in the pinned row),
 * λ = (f₀ − A₀·x)/(1 − A₀·y) and u = x − λ·y satisfies every original row with f − λ.
 *
 * @param op The level operator.
 * @returns The factorized solver.
 * @throws {RangeError} If the band storage would exceed {@link MAX_BAND_STORAGE} (grid counts that
 * cannot be coarsened) or the operator is singular.
 *
 * @example
 * ```ts
 * import { createDirectSolver } from "./direct_solver.ts";
 * import { buildLevel } from "./hierarchy.ts";
 * const n = 4, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const level = buildLevel({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: one, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * const u = level.vector();
 * createDirectSolver(level).solve(u, level.pad(one));
 * ```
 */
export function createDirectSolver(op: LevelOperator): DirectSolver {
  const { nx, ny, stride, W, E, S, N, C } = op;
  const xFirst = nx <= ny;
  const nine = isNinePoint(op);
  const m = (xFirst ? nx + 1 : ny + 1) + (nine ? 1 : 0);
  const n = (nx + 1) * (ny + 1);
  if (n * (3 * m + 1) > MAX_BAND_STORAGE) {
    throw new RangeError(
      `Cannot solve the ${nx}×${ny} coarsest grid directly: its band matrix would need ${
        n * (3 * m + 1)
      } numbers; choose nx and ny divisible by a higher power of two so multigrid can coarsen further`,
    );
  }
  // order[q] = padded index of unknown q.
  const order = new Int32Array(n);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      order[xFirst ? j * (nx + 1) + i : i * (ny + 1) + j] = (j + 1) * stride + i + 1;
    }
  }
  const pos = (i: number, j: number) => (xFirst ? j * (nx + 1) + i : i * (ny + 1) + j);
  const singular = op.singular;
  const lu = bandedLU(n, m, m, (set) => {
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) {
        const q = pos(i, j), k = (j + 1) * stride + i + 1;
        if (singular && q === 0) {
          set(0, 0, 1);
          continue;
        }
        set(q, q, C[k]);
        if (i > 0 && W[k] !== 0) set(q, pos(i - 1, j), W[k]);
        if (i < nx && E[k] !== 0) set(q, pos(i + 1, j), E[k]);
        if (j > 0 && S[k] !== 0) set(q, pos(i, j - 1), S[k]);
        if (j < ny && N[k] !== 0) set(q, pos(i, j + 1), N[k]);
        if (!nine) continue;
        if (i > 0 && j > 0 && op.SW[k] !== 0) set(q, pos(i - 1, j - 1), op.SW[k]);
        if (i < nx && j > 0 && op.SE[k] !== 0) set(q, pos(i + 1, j - 1), op.SE[k]);
        if (i > 0 && j < ny && op.NW[k] !== 0) set(q, pos(i - 1, j + 1), op.NW[k]);
        if (i < nx && j < ny && op.NE[k] !== 0) set(q, pos(i + 1, j + 1), op.NE[k]);
      }
    }
  });
  const b = new Float64Array(n);
  let y: Float64Array | undefined;
  const k0 = order[0];
  const s = stride;
  const rowDot = (u: Float64Array) =>
    C[k0] * u[k0] + W[k0] * u[k0 - 1] + E[k0] * u[k0 + 1] + S[k0] * u[k0 - s] +
    N[k0] * u[k0 + s] +
    (nine
      ? op.SW[k0] * u[k0 - s - 1] + op.SE[k0] * u[k0 - s + 1] + op.NW[k0] * u[k0 + s - 1] +
        op.NE[k0] * u[k0 + s + 1]
      : 0);
  if (singular) {
    b.fill(1);
    b[0] = 0;
    lu.solve(b);
    y = op.vector();
    for (let q = 0; q < n; q++) y[order[q]] = b[q];
  }
  return {
    solve(u, f) {
      for (let q = 0; q < n; q++) b[q] = f[order[q]];
      if (singular) b[0] = 0;
      lu.solve(b);
      for (let q = 0; q < n; q++) u[order[q]] = b[q];
      if (y !== undefined) {
        const lambda = (f[k0] - rowDot(u)) / (1 - rowDot(y));
        for (let q = 0; q < n; q++) u[order[q]] -= lambda * y[order[q]];
      }
    },
    describe: () => ({ name: "banded-lu", unknowns: n, bandwidth: m }),
  };
}
