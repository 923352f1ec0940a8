/**
 * The bundled reference geometric multigrid solver for
 * a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f on a rectangle, vertex-centred.
 *
 * It knows nothing of cases, expressions or the harness: it takes a {@link Problem} of plain
 * typed arrays and returns a {@link SolveResult} as data (non-convergence included).
 *
 * Main entry points:
 * - `solve(problem, options?)`: validate, build the levels, cycle until a stopping rule fires
 *   (converged / max-cycles / diverged / stagnated). Singular problems with
 *   `singular: "mean-zero"` are documented at `solve`.
 * - `resolveOptions(options?)`: every default filled in; unknown keys refused by dotted path.
 * - `assembleMatrix(problem, { upwind? })` / `residualNorm(problem, u, { upwind? })`: the exact
 *   discrete system (CSR, one row per node, Dirichlet rows identity) that `solve` works on. The
 *   discretization (central 5-point stencil, optional upwinding, ghost nodes for Neumann/Robin,
 *   corners) is documented in `discretize.ts`.
 * - `describeLevels({ nx, ny, domain? }, options?)`: the levels a solve would use, finest first.
 *
 * Components, for tests and experiments (all work on the padded layout of `level.ts`; convert
 * with `level.pad` / `level.unpad`):
 * - `buildLevel(problem, { upwind?, singular? })`: one level's operator (`LevelOperator`).
 * - `SMOOTHERS` and `createSmoother(name, level, { omega? })` → `{ smooth(u, f, sweeps) }`
 *   (exactly `sweeps` sweeps, in place).
 * - `RESTRICTIONS` and `createTransfer(restriction, fine, coarse)` →
 *   `{ restrict, interpolateAdd, interpolate }` (bilinear interpolation).
 * - `CYCLES`, `cycle(h, level, gamma, params)` (V: γ = 1, W: γ = 2), `fCycle`, `fullMultigrid`
 *   on a `Hierarchy` from `buildHierarchy(problem, resolveOptions(options))`; level 0 is the finest.
 * - `createDirectSolver(level)` (banded LU of a level, factorized once) and `bandedLU`.
 * - A two-grid method with an exact coarse solve: `solve(p, { coarse: { maxLevels: 2 } })`.
 *
 * Coarse operators are rediscretized from injected coefficients and boundary data;
 * `coarse.operator: "galerkin"` is not implemented and is refused with a RangeError.
 *
 * @example
 * ```ts
 * import { solve } from "./mod.ts";
 * const n = 32, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const result = solve({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: one, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * if (!result.converged) throw new Error(result.reason);
 * ```
 *
 * @module
 */
export type { BoundaryCondition, BoundaryKind, Domain, Problem, Side } from "./problem.ts";
export { nodeCount, SIDES } from "./problem.ts";
export type {
  CoarseOperatorName,
  CycleName,
  RestrictionName,
  SmootherName,
  SolveOptions,
  SolverDescription,
  SolveResult,
  StopReason,
} from "./options.ts";
export { FLOOR_MULTIPLE, solve, STAGNATION_CYCLES, STAGNATION_FACTOR } from "./solve.ts";
export {
  CYCLE_NAMES,
  type ResolvedSolveOptions,
  resolveOptions,
  RESTRICTION_NAMES,
  SMOOTHER_NAMES,
} from "./resolve_options.ts";
export { type AssembledSystem, assembleMatrix, residualNorm } from "./assemble.ts";
export { isSingular, validateProblem } from "./validate.ts";
export { type Discretization, discretize } from "./discretize.ts";
export { levelLayout, type LevelOperator } from "./level.ts";
export {
  createSmoother,
  type Smoother,
  type SmootherFactory,
  type SmootherParams,
  SMOOTHERS,
} from "./smoothers.ts";
export {
  createTransfer,
  RESTRICTIONS,
  type RestrictionWeights,
  type Transfer,
} from "./transfer.ts";
export { type BandedLU, bandedLU } from "./banded_lu.ts";
export { createDirectSolver, type DirectSolver, MAX_BAND_STORAGE } from "./direct_solver.ts";
export {
  buildHierarchy,
  buildLevel,
  chooseCoarsening,
  type Coarsening,
  coarsenProblem,
  describeLevels,
  type Hierarchy,
  type Level,
} from "./hierarchy.ts";
export {
  cycle,
  type CycleParams,
  type CycleRunner,
  CYCLES,
  fCycle,
  fullMultigrid,
} from "./cycle.ts";
