/**
 * The backend a solver file's entry asks for: a Slurm batch solver when it has a `batch`
 * section, else a local process (once or session, with its launcher if any).
 *
 * @module
 */
import { createBatchSolver } from "./batch/mod.ts";
import { createExternalSolver } from "./external.ts";
import type { ExternalSolverSpec, Solver } from "./types.ts";

/**
 * Makes the solver of one solver-file entry.
 *
 * @param spec the entry, defaults filled in (see `loadSolverFile`)
 * @param options the solver file's folder, where relative paths start; `sessions`: session
 *   processes that may run at once (default 1, see `ExternalSolverOptions`)
 * @returns the solver; call `close()` when done
 *
 * @example
 * ```ts ignore
 * import { createSolver, loadSolverFile } from "./mod.ts";
 * const solvers = (await loadSolverFile("examples/cluster/solvers.json"))
 *   .map((s) => createSolver(s, { solverFileDir: s.solverFileDir }));
 * ```
 */
export function createSolver(
  spec: ExternalSolverSpec,
  options: { solverFileDir: string; sessions?: number },
): Solver {
  return spec.batch
    ? createBatchSolver(spec, { solverFileDir: options.solverFileDir })
    : createExternalSolver(spec, options);
}

/**
 * The programs an entry needs on this machine, each with the field that names it: the command,
 * the launcher, and for a batch solver Slurm's `sbatch`, `squeue` and `scancel` (from Debian's
 * `slurm-client`). `check` refuses a missing one before any solve.
 *
 * @example
 * ```ts
 * import { programsToCheck } from "./create_solver.ts";
 * const list = programsToCheck({ command: ["./s"], launcher: { command: ["mpirun"], ranks: 2 } });
 * console.assert(list.map((p) => p.program).join() === "./s,mpirun");
 * ```
 */
export function programsToCheck(
  spec: Pick<ExternalSolverSpec, "command" | "launcher" | "batch">,
): { field: string; program: string }[] {
  const list = [{ field: "command", program: spec.command[0] }];
  if (spec.launcher) list.push({ field: "launcher.command", program: spec.launcher.command[0] });
  if (spec.batch) {
    for (const program of ["sbatch", "squeue", "scancel"]) list.push({ field: "batch", program });
  }
  return list;
}
