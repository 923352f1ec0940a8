/**
 * The solver file's scale-out fields (`launcher`, `rankCheck`, `batch`): their defaults and the
 * rules the schema cannot say (placeholders, a rank check without a launcher, a batch session).
 *
 * @module
 */
import { InputError } from "../../errors/mod.ts";
import { launcherProblems } from "./launcher.ts";
import type { BatchSpec, ExternalSolverSpec, LauncherSpec, RankCheckSpec } from "./types.ts";

/**
 * Copies `launcher`, `rankCheck` and `batch` from a schema-valid solver entry onto its spec, with
 * defaults filled in.
 *
 * @param spec the solver's spec, other fields already read
 * @param entry the entry as written in the file (schema-valid)
 * @param field the entry's path in the file, e.g. `solvers[1]`
 * @param path the solver file, for the error
 * @throws InputError listing every problem, each with its field and the fix
 */
export function readScaleOut(
  spec: ExternalSolverSpec,
  entry: Record<string, unknown>,
  field: string,
  path: string,
): void {
  const problems: string[] = [];
  const launcher = entry.launcher as LauncherSpec | undefined;
  if (launcher !== undefined) {
    spec.launcher = structuredClone(launcher);
    problems.push(...launcherProblems(launcher, spec.mode, `${field}.launcher`));
  }
  const check = entry.rankCheck as RankCheckSpec | undefined;
  if (check !== undefined) {
    spec.rankCheck = { ...check };
    if (!launcher || !launcher.command.some((arg) => arg.includes("{ranks}"))) {
      problems.push(
        `${field}.rankCheck: the rank-count check needs a launcher whose command holds ` +
          `{ranks}, e.g. "launcher": {"command": ["mpirun", "-np", "{ranks}"], "ranks": 2}`,
      );
    }
  }
  if (check !== undefined && spec.mode === "session") {
    problems.push(
      `${field}.rankCheck: a session keeps one rank count for every solve, so it cannot be ` +
        `compared at 1 and ${check.ranks} ranks; use mode "once" for the rank-count check`,
    );
  }
  const batch = entry.batch as Partial<BatchSpec> | undefined;
  if (batch !== undefined) {
    spec.batch = {
      scheduler: batch.scheduler ?? "slurm",
      folder: batch.folder ?? "gridproof-jobs",
      submitArguments: [...(batch.submitArguments ?? [])],
      pollSeconds: batch.pollSeconds ?? 1,
      gatherSeconds: batch.gatherSeconds ?? 0.2,
    };
    if (batch.queueLimitSeconds !== undefined) {
      spec.batch.queueLimitSeconds = batch.queueLimitSeconds;
    }
    if (batch.predictTime !== undefined) spec.batch.predictTime = { ...batch.predictTime };
    if (spec.mode === "session") {
      problems.push(
        `${field}.batch: a batch solver runs one job per solve, so its mode must be "once"; ` +
          `remove "mode": "session" or the batch section`,
      );
    }
    if (spec.memoryLimitMiB !== undefined) {
      problems.push(
        `${field}.memoryLimitMiB: a batch job's memory is the scheduler's to limit; put ` +
          `"--mem=…" in ${field}.batch.submitArguments instead`,
      );
    }
  }
  if (problems.length > 0) {
    throw new InputError(
      `the solver file has ${problems.length} problem(s); fix the fields listed (format: ` +
        `docs/cluster.md)`,
      { where: path, problems },
    );
  }
}
