/**
 * The bundled reference geometric multigrid solver, vertex-centred, for
 * a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f (non-conservative form; m optional) or
 * ∇·(K∇u) + b·u_x + d·u_y + e·u = f (conservative form, when the problem carries a conductivity
 * K = [[k11, k12], [k12, k22]] sampled at the edge midpoints) on a rectangle.
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
 *   discrete system (CSR, one row per node, up to nine entries, Dirichlet rows identity) that
 *   `solve` works on. The discretizations are documented in `discretize.ts` (central 5-point
 *   stencil, optional upwinding, the four-corner mixed term, ghost nodes for Neumann/Robin,
 *   corners) and `discretize_conservative.ts` (flux form with the tensor K, half and quarter
 *   control volumes on Neumann/Robin sides, conormal flux data).
 * - `describeLevels({ nx, ny, domain? }, options?)`: the levels a solve would use, finest first.
 * - Stretched grids (`problem.coordinates`) and periodic sides take their own path:
 *   `discretize_stretched.ts` (non-uniform 3-point differences and the flux form, every formula in
 *   its module doc) and `stretched_solve.ts` (multigrid on the hierarchy that keeps every other
 *   node, linear interpolation in physical coordinates, line smoothers chosen by local couplings,
 *   singular problems with the volume-weighted mean fixed). `volumeWeights(problem)` gives the
 *   trapezoid volume of every node; `discreteResidual(problem, v)` the residual A·v − rhs of a
 *   field (the truncation error when v is the exact solution).
 *
 * Coarse operators and transfers: rediscretized from injected coefficients (a conductivity is
 * combined edge by edge) or Galerkin products R·A·P (`galerkin.ts`), nine-point on coarse levels;
 * interpolation bilinear or operator-dependent (`prolongation.ts`). By default a problem with a
 * conductivity gets Galerkin with operator-dependent interpolation (robust for coefficients that
 * jump by orders of magnitude), every other problem rediscretization with bilinear interpolation.
 *
 * Components, for tests and experiments (all work on the padded layout of `level.ts`; convert
 * with `level.pad` / `level.unpad`):
 * - `buildLevel(problem, { upwind?, singular? })`: one level's operator (`LevelOperator`:
 *   five-point, or nine-point with corner arrays — `isNinePoint`).
 * - `SMOOTHERS` and `createSmoother(name, level, { omega? })` → `{ smooth(u, f, sweeps) }`
 *   (exactly `sweeps` sweeps, in place; every smoother handles nine-point levels, red–black
 *   becoming a four-colour ordering there).
 * - `RESTRICTIONS` and `createTransfer(restriction, fine, coarse, { scaling? })` →
 *   `{ restrict, interpolateAdd, interpolate }` (bilinear interpolation); `bilinearProlongation`,
 *   `operatorProlongation` and `createProlongationTransfer` for interpolations given as weights.
 * - `galerkinOperator(fine, { coarsening, restriction?, prolongation? })`: one Galerkin product.
 * - `CYCLES`, `cycle(h, level, gamma, params)` (V: γ = 1, W: γ = 2), `fCycle`, `fullMultigrid`
 *   on a `Hierarchy` from `buildHierarchy(problem, resolveOptions(options))`; level 0 is the finest.
 * - `createDirectSolver(level)` (banded LU of a level, factorized once) and `bandedLU`.
 * - `workUnits(h, kind, params)`: a cycle's or an FMG pass's work units counted from the kernels'
 *   floating-point operations (one WU = one finest-grid sweep).
 * - A two-grid method with an exact coarse solve: `solve(p, { coarse: { maxLevels: 2 } })`.
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
export type {
  BoundaryCondition,
  BoundaryKind,
  Conductivity,
  Domain,
  NodeCoordinates,
  Problem,
  Side,
  ValuedCondition,
} from "./problem.ts";
export { nodeCount, robinCondition, SIDES } from "./problem.ts";
export type {
  CoarseOperatorName,
  CycleName,
  InterpolationName,
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
  INTERPOLATION_NAMES,
  type ResolvedSolveOptions,
  resolveOptions,
  RESTRICTION_NAMES,
  SMOOTHER_NAMES,
} from "./resolve_options.ts";
export { type AssembledSystem, assembleMatrix, residualNorm } from "./assemble.ts";
export { isSingular, validateProblem } from "./validate.ts";
export { isStretched } from "./validate_stretched.ts";
export { nodeCoordinates, volumeWeights } from "./stretched_grid.ts";
export { discreteResidual } from "./truncation.ts";
export { discretizeStretched, type StretchedOperator } from "./discretize_stretched.ts";
export { LINE_THRESHOLD, lineChoice } from "./stretched_smoothers.ts";
export { solveStretched } from "./stretched_solve.ts";
export { type Discretization, discretize } from "./discretize.ts";
export { discretizeConservative } from "./discretize_conservative.ts";
export { isNinePoint, levelLayout, type LevelOperator, type NinePointOperator } from "./level.ts";
export { galerkinOperator } from "./galerkin.ts";
export {
  bilinearProlongation,
  operatorProlongation,
  type Prolongation,
  transposeRow,
} from "./prolongation.ts";
export { createProlongationTransfer } from "./prolongation_transfer.ts";
export {
  createSmoother,
  type Smoother,
  type SmootherFactory,
  type SmootherParams,
  SMOOTHERS,
} from "./smoothers.ts";
export {
  createTransfer,
  restrictionRow,
  RESTRICTIONS,
  type RestrictionScaling,
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
  coarseOperatorFor,
  describeLevels,
  type Hierarchy,
  interpolationFor,
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
export { type CountedCycle, workUnits } from "./work_units.ts";
