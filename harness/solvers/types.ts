/**
 * The one `Solver` interface every backend implements (the in-process reference solver, external
 * programs speaking the protocol), the task it gets and the outcome it returns.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import type { SolverInfo } from "../result/mod.ts";
import type { ArrayEncoding } from "../protocol/mod.ts";

/** One solve: a case on an nx × ny grid under one scheme. */
export interface SolveTask {
  case: CompiledCase;
  /** Intervals (vertex layout) or cells (cell layout) along x. */
  nx: number;
  /** Intervals or cells along y. */
  ny: number;
  scheme: "central" | "upwind";
  /** Relative residual reduction wanted (a hint for external solvers). */
  tolerance: number;
  /** Wall-time limit of this solve; default: the solver's own limit. */
  timeLimitSeconds?: number;
  /**
   * Rank count of this solve for a solver with a launcher; default: the launcher's rule. The
   * rank-count check asks for 1 and N ranks on one grid.
   */
  ranks?: number;
  /** Scheduler jobs of this solve (batch solvers): the earlier run's job, and where to report. */
  jobs?: JobTrack;
}

/** A scheduler job of one solve as the journal keeps it. */
export interface JobNote {
  /** The scheduler's job id (`123`, or `123_4` for a task of a job array). */
  id: string;
  /** The scheduler's state word (PENDING, RUNNING, COMPLETED, FAILED, TIMEOUT, …). */
  state: string;
  /** The request id the job's reply must echo. */
  requestId: string;
  /** The job's folder of files (request, reply, stderr, exit status). */
  folder: string;
}

/**
 * How a batch solve talks to the campaign about its job: the job an earlier, interrupted run
 * submitted (collected or waited for instead of submitting again), and a callback for every new
 * job or state (the campaign journals it).
 */
export interface JobTrack {
  earlier?: JobNote;
  note(job: JobNote): void;
}

/** Status of a solve (the same words as the result object's). */
export type OutcomeStatus = "ok" | "failed" | "not-applicable";

/**
 * What a solve returns. It never throws: faults of the solver are `failed` with a precise reason,
 * cases outside what the solver handles are `not-applicable`.
 *
 * Points: `x`, `y`, `values`, `weights` and `boundaryBand` have one entry per point of `layout`
 * (x fastest for vertex and cell layouts). All arrays are empty unless the status is `ok`.
 */
export interface SolveOutcome {
  status: OutcomeStatus;
  /** Why the solve failed or does not apply (plain words); absent when ok. */
  reason?: string;
  /** Where the values sit: grid nodes, cell centres, or the solver's own points. */
  layout: "vertex" | "cell" | "points";
  nx: number;
  ny: number;
  x: Float64Array;
  y: Float64Array;
  /**
   * Quadrature weights at the points: vertex trapezoid rule, cell hx·hy, own points as given by the
   * solver or area/N.
   */
  weights: Float64Array;
  /**
   * 1 where the point is in the boundary band: vertex — boundary nodes and one layer in; cell — cells
   * touching the boundary and one layer in; own points — within two representative spacings
   * (sqrt(area/N)) of the boundary.
   */
  boundaryBand?: Uint8Array;
  values: Float64Array;
  /**
   * The local truncation error per point, same layout as `values` (vertex layouts): the residual
   * of the exact solution in the solver's discrete operator, in the units of the PDE's source.
   * The reference solver gives it; absent otherwise.
   */
  truncation?: Float64Array;
  /** Residual norms as the solver reported them (empty when none). */
  residualHistory: number[];
  iterations: number | null;
  converged: boolean | null;
  /** The solver's own timing, when it reported one. */
  solverSeconds: number | null;
  /** Wall time measured by the harness (process start to reply for `once` solvers). */
  seconds: number;
  /** Last 64 KiB of the solver's stderr during this solve (external solvers). */
  stderrTail?: string;
  /**
   * The solver's describe() record, or its reported name, version and notes; for a once solver
   * that left processes running when it exited, `leftoverProcesses` says which were ended.
   */
  description?: Record<string, unknown>;
}

/** The common shape of every backend. */
export interface Solver {
  info: SolverInfo;
  /** Runs one solve; never throws and never hangs past the time limit (plus 2 s). */
  solve(task: SolveTask): Promise<SolveOutcome>;
  /** Releases processes and resources (ends a session); safe to call twice. */
  close(): Promise<void>;
  /**
   * Ends every running solve at once (their process groups are killed), so a following `close()`
   * returns promptly; the solves end as failed. Optional: in-process solvers finish on their own.
   */
  stop?(): Promise<void>;
  /** The rank-count check the solver file asks for (solvers with a launcher); none by default. */
  rankCheck?: RankCheckSpec;
}

/** A launcher that wraps a solver's command, such as `mpirun -np {ranks}` (see `launcher.ts`). */
export interface LauncherSpec {
  /** Program and arguments put before the solver's command, with placeholders. */
  command: string[];
  /** A fixed rank count, or one rank per `unknownsPerRank` unknowns, at most `most` (default no cap). */
  ranks: number | { unknownsPerRank: number; most?: number };
}

/** Solve one grid at 1 rank and at `ranks` ranks and compare the solutions. */
export interface RankCheckSpec {
  /** The rank count compared with 1 (at least 2). */
  ranks: number;
  /** The grid (intervals along x); default: the study's finest planned grid. */
  grid?: number;
}

/** A solver run as scheduler jobs: files in, a job, files out (see `batch/`). */
export interface BatchSpec {
  /** The scheduler. Only "slurm" so far. */
  scheduler: "slurm";
  /**
   * Folder for the jobs' files, relative to the solver file's folder; the compute nodes must see
   * it. Default "gridproof-jobs".
   */
  folder: string;
  /** Extra arguments of every submission (`sbatch`), e.g. `["--partition=short"]`. Default []. */
  submitArguments: string[];
  /** Longest wait in the queue before the job is cancelled and the solve fails. Default none. */
  queueLimitSeconds?: number;
  /** Seconds between looks at the jobs' states. Default 1. */
  pollSeconds: number;
  /**
   * Solves that arrive within this many seconds of each other go into one job array. Default
   * 0.2; 0 submits one job per solve.
   */
  gatherSeconds: number;
  /**
   * Job time limits predicted from the time the coarser grids took, times `safety`, never above
   * `timeLimitSeconds`. Default: off (every job gets `timeLimitSeconds`).
   */
  predictTime?: { safety: number };
}

/** One external solver as written in a solver file, with defaults filled in. */
export interface ExternalSolverSpec {
  name: string;
  description?: string;
  /** Program and arguments; never run through a shell. */
  command: string[];
  /** Working folder, relative to the solver file's folder (default: that folder). */
  cwd?: string;
  /** Extra environment variables. */
  env?: Record<string, string>;
  /** Default "once". */
  mode: "once" | "session";
  /** Array encoding of requests. Default "numbers". */
  encoding: ArrayEncoding;
  /** Default "vertex". */
  layout: "vertex" | "cell" | "points";
  /** Scheme the solver implements. Default "central". */
  scheme: "central" | "upwind";
  /** Default 300. */
  timeLimitSeconds: number;
  /** Address-space limit (RLIMIT_AS via prlimit); none by default. */
  memoryLimitMiB?: number;
  /**
   * Iteration growth the method has: iterations ~ N^g in the unknowns N. Default (absent) 0.5,
   * as SOR or CG; 0 for multigrid or direct solvers (held to flat counts), 1 for Gauss–Seidel.
   */
  iterationGrowth?: number;
  /** Case ids reported as not applicable. Default []. */
  skipCases: string[];
  /** Largest accepted reply. Default 1024 (1 GiB). */
  maxReplyMiB: number;
  /**
   * true: the solver reads `{ constant, length }` arrays, so constant coefficients are sent as
   * one number; false: never send that form. Default (absent): what a session's `ready` message
   * declares (`supports.constantArrays`); in once mode, never.
   */
  constantArrays?: boolean;
  /**
   * The protocol version the solver speaks (the solver file's `protocol`): 1 or 2. Absent: 1,
   * and cases of the conservative form or with a mixed term are not applicable to it.
   */
  protocol?: 1 | 2;
  /** A launcher around the command (MPI); none by default. */
  launcher?: LauncherSpec;
  /** The rank-count check (needs a launcher); none by default. */
  rankCheck?: RankCheckSpec;
  /** Run every solve as a scheduler job; none by default (a local process). */
  batch?: BatchSpec;
}
