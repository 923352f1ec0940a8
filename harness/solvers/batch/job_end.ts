/**
 * What a scheduler's end state means for a solve: the words of a failure, or that the reply is to
 * be read. Pure: the states are Slurm's (`squeue`'s %T).
 *
 * @module
 */

/** States after which a job does not run again. */
export const FINAL_STATES = new Set([
  "COMPLETED",
  "FAILED",
  "TIMEOUT",
  "CANCELLED",
  "NODE_FAIL",
  "OUT_OF_MEMORY",
  "PREEMPTED",
  "BOOT_FAIL",
  "DEADLINE",
]);

/** What the end of a job says about its solve. */
export type JobEnd =
  | { kind: "reply" }
  | { kind: "failed"; reason: string };

/**
 * Maps a job's final state to a solve outcome's gist.
 *
 * @param state Slurm's state word
 * @param info the job id, Slurm's reason, the solver's exit status as the job recorded it (null
 *   when the job did not get that far), and the job's time limit in minutes
 * @returns `reply` when the solver's reply decides (a completed job, or a failed one whose solver
 *   exited), else the failure in words
 *
 * @example
 * ```ts
 * import { jobEnd } from "./job_end.ts";
 * const end = jobEnd("TIMEOUT", { id: "7", reason: "TimeLimit", exit: null, minutes: 2 });
 * console.assert(end.kind === "failed" && end.reason.includes("time limit of 2 min"));
 * ```
 */
export function jobEnd(
  state: string,
  info: { id: string; reason: string; exit: number | null; minutes: number },
): JobEnd {
  const job = `Slurm job ${info.id}`;
  switch (state) {
    case "COMPLETED":
      return { kind: "reply" };
    case "FAILED":
      if (info.exit !== null && info.exit !== 0) {
        return {
          kind: "failed",
          reason: `the solver exited with code ${info.exit} (${job} FAILED)`,
        };
      }
      return {
        kind: "failed",
        reason: `${job} FAILED before the solver finished (Slurm's reason: ${
          info.reason || "none given"
        }); the job script or its launch failed`,
      };
    case "TIMEOUT":
      return {
        kind: "failed",
        reason: `${job} reached its time limit of ${info.minutes} min and Slurm ended it ` +
          `(TIMEOUT); raise timeLimitSeconds, or the safety of batch.predictTime`,
      };
    case "CANCELLED":
      return {
        kind: "failed",
        reason: `${job} was cancelled outside gridproof (CANCELLED, by a user or an ` +
          `administrator)`,
      };
    case "NODE_FAIL":
      return { kind: "failed", reason: `the node running ${job} failed (NODE_FAIL)` };
    case "OUT_OF_MEMORY":
      return {
        kind: "failed",
        reason: `${job} ran out of memory (OUT_OF_MEMORY); ask for more with "--mem=…" in ` +
          `batch.submitArguments`,
      };
    case "PREEMPTED":
      return { kind: "failed", reason: `${job} was preempted by another job (PREEMPTED)` };
    case "BOOT_FAIL":
      return { kind: "failed", reason: `the node for ${job} failed to boot (BOOT_FAIL)` };
    case "DEADLINE":
      return { kind: "failed", reason: `${job} missed its deadline (DEADLINE)` };
    default:
      return {
        kind: "failed",
        reason: `${job} ended in the state ${state}, which gridproof does not know`,
      };
  }
}
