/**
 * The bundled reference geometric multigrid solver for
 * a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f on a rectangle, vertex-centred.
 *
 * It knows nothing of cases, expressions or the harness: it takes a {@link Problem} of plain
 * typed arrays and returns a {@link SolveResult} as data (non-convergence included).
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
