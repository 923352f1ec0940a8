/**
 * The bundled reference geometric multigrid solver for
 * a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f on a rectangle, vertex-centred.
 *
 * It knows nothing of cases, expressions or the harness: it takes a {@link Problem} of plain
 * typed arrays and returns a {@link SolveResult} as data (non-convergence included).
 *
 * - `solve(problem, options)`: validate, build the levels, cycle to the tolerance.
 * - `resolveOptions(options)`: every default filled in; unknown keys refused by dotted path.
 * - `assembleMatrix(problem)` / `residualNorm(problem, u)`: the exact discrete system (CSR) that
 *   `solve` works on (discretization documented in `discretize.ts`).
 * - Components for tests and experiments: `SMOOTHERS` / `createSmoother`, `RESTRICTIONS` /
 *   `createTransfer`, `CYCLES` / `cycle` / `fCycle` / `fullMultigrid`, `buildLevel` (one level's
 *   operator, padded layout: see `level.ts`), `buildHierarchy`, `createDirectSolver`, `bandedLU`,
 *   `describeLevels`. A two-grid method: `coarse: { maxLevels: 2 }` (exact coarse solve).
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
