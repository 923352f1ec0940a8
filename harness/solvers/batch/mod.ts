/**
 * The batch backend: solves as scheduler jobs (Slurm), with files in, a job (or a job array),
 * states polled with the scheduler's own commands, files out, and jobs that outlive the harness
 * collected by a resumed campaign. See docs/cluster.md.
 *
 * @example
 * ```ts ignore
 * import { createBatchSolver } from "./mod.ts";
 * const solver = createBatchSolver(spec, { solverFileDir: spec.solverFileDir });
 * ```
 *
 * @module
 */
export { type BatchSolverOptions, createBatchSolver } from "./batch_solver.ts";
export { FINAL_STATES, type JobEnd, jobEnd } from "./job_end.ts";
export { predictSeconds, type WorkPoint } from "./predict_time.ts";
