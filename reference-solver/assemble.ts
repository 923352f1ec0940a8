/**
 * The assembled discrete system in compressed sparse row form, and its residual norm: the exact
 * system `solve` works on (see `discretize.ts` and, for a problem with a conductivity,
 * `discretize_conservative.ts`), for residual checks, debugging and comparison with other solvers.
 * Rows have up to nine entries (the corners of a mixed term or a full conductivity tensor).
 *
 * @module
 */
import type { Problem } from "./problem.ts";
import { discretize } from "./discretize.ts";
import { validateProblem } from "./validate.ts";

/** A square sparse matrix in CSR form with its right-hand side, one row per node (x fastest). */
export interface AssembledSystem {
  /** Number of rows (= nodes, (nx+1)(ny+1)). */
  n: number;
  /** Row pointers, length n + 1. */
  rowPtr: Int32Array;
  /** Column of each stored entry (ascending within a row). */
  col: Int32Array;
  /** Value of each stored entry. */
  val: Float64Array;
  /** Right-hand side (Dirichlet rows: the boundary value; Neumann/Robin rows: f with boundary terms). */
  rhs: Float64Array;
}

/**
 * Assembles the discrete system of a problem. Dirichlet rows are identity rows; zero stencil
 * entries are not stored.
 *
 * @param problem The problem (validated here; a singular one is accepted).
 * @param options `upwind`: first-order upwinding of b·u_x, d·u_y (default false).
 * @returns The CSR matrix and right-hand side.
 * @throws {RangeError} For an invalid problem.
 *
 * @example
 * ```ts
 * import { assembleMatrix } from "./assemble.ts";
 * const n = 2, N = 9, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const A = assembleMatrix({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: one, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * if (A.rowPtr[9] !== 8 + 5) throw new Error("8 identity rows and one 5-point row");
 * ```
 */
export function assembleMatrix(
  problem: Problem,
  options: { upwind?: boolean } = {},
): AssembledSystem {
  validateProblem(problem, { singular: "mean-zero" });
  const { op, rhs: padded } = discretize(problem, options.upwind ?? false);
  const { nx, ny, stride, W, E, S, N, C } = op;
  const n = (nx + 1) * (ny + 1);
  const none = new Float64Array(op.length);
  const SW = op.SW ?? none, SE = op.SE ?? none, NW = op.NW ?? none, NE = op.NE ?? none;
  const rowPtr = new Int32Array(n + 1);
  const col: number[] = [], val: number[] = [];
  const rhs = op.unpad(padded);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const q = j * (nx + 1) + i, k = (j + 1) * stride + i + 1;
      const entries: [number, number][] = [
        [q - (nx + 1) - 1, SW[k]],
        [q - (nx + 1), S[k]],
        [q - (nx + 1) + 1, SE[k]],
        [q - 1, W[k]],
        [q, C[k]],
        [q + 1, E[k]],
        [q + nx + 1 - 1, NW[k]],
        [q + nx + 1, N[k]],
        [q + nx + 1 + 1, NE[k]],
      ];
      for (const [c, v] of entries) if (v !== 0) (col.push(c), val.push(v));
      rowPtr[q + 1] = col.length;
    }
  }
  return { n, rowPtr, col: Int32Array.from(col), val: Float64Array.from(val), rhs };
}

/**
 * ‖f − A·u‖₂ over all nodes of the assembled discrete system (Dirichlet rows included).
 *
 * @param problem The problem.
 * @param u Values at every node, (nx+1)(ny+1), x fastest.
 * @param options `upwind` as in {@link assembleMatrix}.
 * @returns The 2-norm of the residual.
 * @throws {RangeError} For an invalid problem or a `u` of the wrong length.
 *
 * @example
 * ```ts
 * import { residualNorm } from "./assemble.ts";
 * const n = 2, N = 9, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const p = {
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: one, boundary: { west: bc, east: bc, south: bc, north: bc },
 * };
 * if (residualNorm(p, new Float64Array(N)) !== 1) throw new Error("only the centre row is off");
 * ```
 */
export function residualNorm(
  problem: Problem,
  u: Float64Array,
  options: { upwind?: boolean } = {},
): number {
  const A = assembleMatrix(problem, options);
  if (!(u instanceof Float64Array) || u.length !== A.n) {
    throw new RangeError(
      `Cannot compute the residual: u must be a Float64Array of ${A.n} values, got length ${u?.length}`,
    );
  }
  let s = 0;
  for (let q = 0; q < A.n; q++) {
    let t = A.rhs[q];
    for (let m = A.rowPtr[q]; m < A.rowPtr[q + 1]; m++) t -= A.val[m] * u[A.col[m]];
    s += t * t;
  }
  return Math.sqrt(s);
}
