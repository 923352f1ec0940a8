/**
 * Solvers behind one interface: the bundled reference multigrid in process, and external programs
 * that speak the solver protocol (docs/protocol.md) as subprocesses in their own process group,
 * one process per solve or one long-lived session. A solve never throws: faults come back as
 * `failed` outcomes with a precise reason, cases a solver cannot handle as `not-applicable`.
 *
 * @example
 * ```ts ignore
 * import { createExternalSolver, createReferenceSolver, loadSolverFile } from "./mod.ts";
 * const solvers = [createReferenceSolver()];
 * for (const spec of await loadSolverFile("examples/solvers.json")) {
 *   solvers.push(createExternalSolver(spec, { solverFileDir: spec.solverFileDir }));
 * }
 * const outcome = await solvers[1].solve({ case: c, nx: 64, ny: 64, scheme: "central", tolerance: 1e-10 });
 * for (const s of solvers) await s.close();
 * ```
 *
 * @module
 */
export type {
  BatchSpec,
  ExternalSolverSpec,
  JobNote,
  JobTrack,
  LauncherSpec,
  OutcomeStatus,
  RankCheckSpec,
  SolveOutcome,
  Solver,
  SolveTask,
} from "./types.ts";
export { createReferenceSolver, type ReferenceSolverOptions } from "./reference.ts";
export { emptyOutcome } from "./outcome.ts";
export { createExternalSolver, type ExternalSolverOptions } from "./external.ts";
export { loadSolverFile } from "./solver_file.ts";
export { type BatchSolverOptions, createBatchSolver } from "./batch/mod.ts";
export { createSolver, programsToCheck } from "./create_solver.ts";
export { launchPrefix, PLACEHOLDERS, ranksFor } from "./launcher.ts";
export { expressionTexts, sampleCase } from "./sample.ts";
export { casePoints, freePoints, gridPoints, type LayoutPoints } from "./geometry.ts";
export { resolveProgram } from "./resolve_command.ts";
export { PROBE_ERROR_LIMIT, type ProbeCheck, type ProbeReport, probeSolver } from "./probe.ts";
export { type ProbeBoundarySet, probeCase } from "./probe_cases.ts";
