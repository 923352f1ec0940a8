/**
 * The discrete residual of a given field: τ = A·v − rhs at every node, for v e.g. the exact
 * solution sampled at the nodes, in which case τ is the local truncation error of the scheme (the
 * defect of the exact solution in the discrete equations; Dirichlet rows give v − g). On
 * non-uniform grids τ is first order where the spacing jumps while the solution error stays second
 * order (supraconvergence; Manteuffel & White, Math. Comp. 47, 1986), so harnesses report both.
 *
 * @module
 */
import type { Problem } from "./problem.ts";
import { validateProblem } from "./validate.ts";
import { isStretched } from "./validate_stretched.ts";
import {
  discretizeStretched,
  stretchedResidual,
  toNodes,
  toUnknowns,
} from "./discretize_stretched.ts";
import { discretize } from "./discretize.ts";
import { residual } from "./_kernels.ts";

/**
 * τ = A·v − rhs of the problem's discrete operator (the one `solve` uses) at every node, on the
 * public layout. Periodic images repeat the value of their originals.
 *
 * @param problem The problem (validated here; a singular one is accepted).
 * @param v One value per node ((nx + 1)(ny + 1), x fastest).
 * @param options `upwind` (default false), as for `solve`.
 * @returns τ per node.
 * @throws {RangeError} For an invalid problem or a v of the wrong length.
 *
 * @example
 * ```ts
 * import { discreteResidual } from "./truncation.ts";
 * const n = 4, N = 25, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const tau = discreteResidual({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 * }, zero);
 * if (tau.some((t) => t !== 0)) throw new Error("zero solves the homogeneous problem");
 * ```
 */
export function discreteResidual(
  problem: Problem,
  v: Float64Array,
  options: { upwind?: boolean } = {},
): Float64Array {
  validateProblem(problem, { singular: "mean-zero" });
  const count = (problem.nx + 1) * (problem.ny + 1);
  if (!(v instanceof Float64Array) || v.length !== count) {
    throw new RangeError(
      `Invalid field for discreteResidual: expected a Float64Array of (nx+1)(ny+1) = ${count} values, got ${
        v instanceof Float64Array ? `length ${v.length}` : typeof v
      }`,
    );
  }
  const upwind = options.upwind ?? false;
  if (isStretched(problem)) {
    const { op, rhs } = discretizeStretched(problem, upwind);
    const r = new Float64Array(rhs.length);
    stretchedResidual(op, toUnknowns(op, v), rhs, r);
    for (let k = 0; k < r.length; k++) r[k] = -r[k];
    return toNodes(op, r);
  }
  const { op, rhs } = discretize(problem, upwind);
  const r = op.vector();
  residual(op, op.pad(v), rhs, r);
  const out = op.unpad(r);
  for (let k = 0; k < out.length; k++) out[k] = -out[k];
  return out;
}
