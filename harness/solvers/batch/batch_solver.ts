/**
 * The batch backend: every solve is a Slurm job. The request goes to a file, solves that arrive
 * together go into one job array, the jobs' states are polled with Slurm's own commands, and the
 * reply file is judged like a local solver's stdout. Scheduler outcomes map to solve outcomes
 * (`job_end.ts`); waiting in the queue is not solver time and has its own limit. Every new job
 * and state goes to the campaign through `task.jobs.note`, so a resumed campaign collects or
 * waits for the jobs of an interrupted one instead of submitting them again.
 *
 * @module
 */
import { resolve } from "node:path";
import { applicability, guard, judgeReply, type Prepared, prepareRequest } from "../exchange.ts";
import { gridUnknowns, launchPrefix, ranksFor } from "../launcher.ts";
import { emptyOutcome, stderrGist } from "../outcome.ts";
import { resolveProgram } from "../resolve_command.ts";
import type { BatchSpec, ExternalSolverSpec, SolveOutcome, Solver, SolveTask } from "../types.ts";
import { FINAL_STATES, jobEnd } from "./job_end.ts";
import { jobScript, readSolveFiles, writeSolveFolder } from "./job_files.ts";
import { cancelJob, jobExit, jobStates, submitJob } from "./slurm.ts";
import { predictSeconds, type WorkPoint } from "./predict_time.ts";

/** Seconds a running job may overrun its limit before gridproof cancels it (Slurm ends jobs up to about 30 s late). */
const OVERRUN_SECONDS = 120;
/** Polls without news of a job (not in squeue, no exit file) before it counts as gone. */
const MISSING_POLLS = 5;
/** Failed `squeue` calls in a row before the waiting solves fail. */
const POLL_FAILURES = 30;

/** Options of {@link createBatchSolver}. */
export interface BatchSolverOptions {
  /** Folder of the solver file: relative paths (command, cwd, batch.folder) start there. */
  solverFileDir: string;
}

/** How a job ended, as the poller saw it. */
type Ending =
  | { kind: "state"; state: string; reason: string }
  | { kind: "files" }
  | { kind: "failed"; reason: string; gone?: boolean };

/** One solve's job while the harness waits for it. */
interface Waiter {
  id: string;
  folder: string;
  state: string;
  minutes: number;
  /** performance.now() when the wait began (submission, or the resume). */
  since: number;
  runningSince?: number;
  missing: number;
  note: (state: string) => void;
  finish: (ending: Ending) => void;
}

/** Solves waiting to be submitted together. */
interface Gathered {
  items: { folder: string; got: (id: string | { error: string }) => void }[];
}

/**
 * Makes a {@link Solver} that runs every solve of an external program as a Slurm job.
 *
 * @param spec the solver as written in the solver file, with its `batch` section
 * @param options where relative paths start
 * @returns the solver
 * @throws TypeError when the spec has no batch section
 *
 * @example
 * ```ts ignore
 * import { createBatchSolver } from "./batch_solver.ts";
 * const solver = createBatchSolver(spec, { solverFileDir: "examples/cluster" });
 * const outcome = await solver.solve({ case: c, nx: 32, ny: 32, scheme: "central", tolerance: 1e-10 });
 * outcome.description?.job; // { id, state, queueSeconds, runSeconds, … }
 * ```
 */
export function createBatchSolver(spec: ExternalSolverSpec, options: BatchSolverOptions): Solver {
  const batch: BatchSpec | undefined = spec.batch;
  if (!batch) throw new TypeError(`solver ${spec.name} has no batch section`);
  const baseDir = resolve(options.solverFileDir);
  const runFolder = resolve(
    baseDir,
    batch.folder,
    `${new Date().toISOString().replace(/[:.]/g, "-")}-${Deno.pid}`,
  );
  const waiters = new Set<Waiter>();
  const gathering = new Map<string, Gathered>();
  const history = new Map<string, WorkPoint[]>();
  let counter = 0;
  let arrays = 0;
  let polling: Promise<void> | undefined;
  let pollFailures = 0;

  const pollOnce = async (): Promise<void> => {
    const list = [...waiters];
    const states = await jobStates(list.map((w) => w.id));
    if (typeof states === "string") {
      if (++pollFailures >= POLL_FAILURES) {
        for (const w of list) {
          w.finish({ kind: "failed", reason: `cannot read job states: ${states}` });
        }
      }
      return;
    }
    pollFailures = 0;
    const now = performance.now();
    for (const w of list) {
      const seen = states.get(w.id);
      if (!seen) {
        // gone from squeue: finished longer ago than MinJobAge, or never known
        const files = await readSolveFiles(w.folder);
        if (files.exit !== null) w.finish({ kind: "files" });
        else if (++w.missing >= MISSING_POLLS) {
          w.finish({
            kind: "failed",
            gone: true,
            reason: `Slurm job ${w.id} is no longer known to Slurm and left no exit status in ` +
              `${w.folder} (Slurm forgets finished jobs after MinJobAge, 300 s by default)`,
          });
        }
        continue;
      }
      w.missing = 0;
      if (seen.state !== w.state) {
        w.state = seen.state;
        w.note(seen.state);
      }
      if (FINAL_STATES.has(seen.state)) {
        w.finish({ kind: "state", state: seen.state, reason: seen.reason });
      } else if (seen.state === "PENDING") {
        const waited = (now - w.since) / 1000;
        if (batch.queueLimitSeconds !== undefined && waited > batch.queueLimitSeconds) {
          const refusal = await cancelJob(w.id);
          w.finish({
            kind: "failed",
            reason: `Slurm job ${w.id} waited in the queue for ${Math.round(waited)} s, beyond ` +
              `batch.queueLimitSeconds (${batch.queueLimitSeconds} s; Slurm's reason: ${
                seen.reason || "none"
              }); ${refusal ? `cancelling it failed: ${refusal}` : "it was cancelled"}`,
          });
        }
      } else if (seen.state === "RUNNING") {
        w.runningSince ??= now;
        const ran = (now - w.runningSince) / 1000;
        if (ran > w.minutes * 60 + OVERRUN_SECONDS) {
          await cancelJob(w.id);
          w.finish({
            kind: "failed",
            reason: `Slurm job ${w.id} ran ${Math.round(ran)} s, past its time limit of ` +
              `${w.minutes} min, and Slurm did not end it; gridproof cancelled it`,
          });
        }
      }
    }
  };

  const ensurePolling = (): void => {
    polling ??= (async () => {
      while (waiters.size > 0) {
        await new Promise((r) => setTimeout(r, batch.pollSeconds * 1000));
        if (waiters.size > 0) await pollOnce();
      }
      polling = undefined;
    })();
  };

  /** Waits for a job until it ends (or the solver is stopped). */
  const waitFor = (
    id: string,
    folder: string,
    minutes: number,
    note: (state: string) => void,
  ): Promise<{ ending: Ending; state: string }> =>
    new Promise((done) => {
      const w: Waiter = {
        id,
        folder,
        state: "SUBMITTED",
        minutes,
        since: performance.now(),
        missing: 0,
        note,
        finish: (ending) => {
          if (!waiters.delete(w)) return;
          done({ ending, state: w.state });
        },
      };
      waiters.add(w);
      ensurePolling();
    });

  /** Submits the gathered solves of one key as a job or a job array. */
  const flush = async (key: string, args: string[]): Promise<void> => {
    const g = gathering.get(key);
    if (!g) return;
    gathering.delete(key);
    const folders = g.items.map((i) => i.folder);
    const script = `${runFolder}/job-${++arrays}.sh`;
    await Deno.writeTextFile(script, jobScript(folders));
    const array = folders.length > 1 ? [`--array=0-${folders.length - 1}`] : [];
    const submitted = await submitJob(script, [...args, ...array, ...batch.submitArguments]);
    g.items.forEach((item, k) =>
      item.got(
        "error" in submitted
          ? submitted
          : folders.length > 1
          ? `${submitted.id}_${k}`
          : submitted.id,
      )
    );
  };

  /** Queues a solve's folder for submission; resolves with its job id. */
  const submit = (
    folder: string,
    ranks: number,
    minutes: number,
  ): Promise<string | { error: string }> =>
    new Promise((got) => {
      const key = `${ranks}|${minutes}`;
      const args = [
        `--job-name=gridproof-${spec.name}`,
        `--output=${runFolder}/slurm-%A_%a.txt`,
        `--time=${minutes}`,
        `--ntasks=${ranks}`,
      ];
      let g = gathering.get(key);
      if (g === undefined) {
        g = { items: [] };
        gathering.set(key, g);
        setTimeout(() => flush(key, args), batch.gatherSeconds * 1000);
      }
      g.items.push({ folder, got });
    });

  const minutesFor = (task: SolveTask, limitSeconds: number): number => {
    const most = Math.max(1, Math.ceil(limitSeconds / 60));
    if (!batch.predictTime) return most;
    const unknowns = gridUnknowns(spec.layout, task.nx, task.ny);
    const predicted = predictSeconds(history.get(task.case.id) ?? [], unknowns);
    if (predicted === null) return most;
    return Math.min(most, Math.max(1, Math.ceil(predicted * batch.predictTime.safety / 60)));
  };

  const solveOne = async (task: SolveTask): Promise<SolveOutcome> => {
    const grid = { layout: spec.layout, nx: task.nx, ny: task.ny };
    const refusal = applicability(spec, task, undefined);
    if (refusal) return refusal;
    const earlier = task.jobs?.earlier;
    const ranks = task.ranks ??
      (spec.launcher ? ranksFor(spec.launcher, spec.layout, task.nx, task.ny) : 1);
    let p: Prepared | SolveOutcome;
    let id: string;
    let folder: string;
    let minutes: number;
    let submittedAt: number;
    let submittedWall = Date.now() / 1000;
    let resumed = false;
    const notes: Record<string, unknown> = {};
    const earlierThere = earlier !== undefined &&
      await Deno.stat(`${earlier.folder}/request.json`).then(() => true, () => false);
    if (earlier && earlierThere) {
      p = prepareRequest(spec, task, earlier.requestId, undefined);
      if ("status" in p) return p;
      id = earlier.id;
      folder = earlier.folder;
      minutes = Math.max(1, Math.ceil(p.limitSeconds / 60));
      submittedAt = performance.now();
      resumed = true;
    } else {
      const requestId = `${task.case.id}/${task.nx}x${task.ny}/${++counter}`;
      p = prepareRequest(spec, task, requestId, undefined);
      if ("status" in p) return p;
      folder = `${runFolder}/${counter}`;
      minutes = minutesFor(task, p.limitSeconds);
      const [program, ...args] = spec.command;
      const found = await resolveProgram(program, { baseDir, path: spec.env?.PATH });
      if (!found.ok) return emptyOutcome("failed", found.reason, grid);
      const prefix = launchPrefix(spec.launcher, {
        solver: spec.name,
        caseId: task.case.id,
        layout: spec.layout,
        nx: task.nx,
        ny: task.ny,
        ranks,
        limitSeconds: minutes * 60,
      });
      await writeSolveFolder(folder, p.request, {
        argv: [...prefix, found.path, ...args],
        cwd: resolve(baseDir, spec.cwd ?? "."),
        env: spec.env,
      });
      submittedAt = performance.now();
      submittedWall = Date.now() / 1000;
      const got = await submit(folder, ranks, minutes);
      if (typeof got !== "string") {
        return emptyOutcome("failed", `Slurm refused the job: ${got.error}`, grid);
      }
      id = got;
      task.jobs?.note({ id, state: "SUBMITTED", requestId, folder });
    }
    const requestId = p.expect.id;
    const note = (state: string) => task.jobs?.note({ id, state, requestId, folder });
    const { ending, state } = await waitFor(id, folder, minutes, note);
    if (resumed && ending.kind === "failed" && ending.gone) {
      // the earlier run's job is lost without a result: this solve starts afresh
      const { earlier: _, ...track } = task.jobs!;
      return await solveOne({ ...task, jobs: track });
    }
    const files = await readSolveFiles(folder);
    const job = {
      id,
      state: ending.kind === "state" ? ending.state : state,
      ranks,
      minutes,
      queueSeconds: files.startedAt !== null && !resumed
        ? Math.max(0, files.startedAt - submittedWall)
        : null,
      runSeconds: files.runSeconds,
      submitToResultSeconds: resumed ? null : (performance.now() - submittedAt) / 1000,
      ...(resumed ? { collectedAfterResume: true } : {}),
    };
    Object.assign(notes, { job });
    const extra = {
      seconds: files.runSeconds ?? 0,
      stderrTail: files.stderrTail,
      description: notes,
    };
    if (ending.kind === "failed") {
      return emptyOutcome("failed", ending.reason + stderrGist(files.stderrTail), grid, extra);
    }
    let exit = files.exit;
    if (ending.kind === "state" && ending.state === "FAILED" && exit === null) {
      exit = (await jobExit(id))?.code ?? null;
    }
    const end = ending.kind === "files"
      ? (exit === 0
        ? { kind: "reply" as const }
        : jobEnd("FAILED", { id, reason: "", exit, minutes }))
      : jobEnd(ending.state, { id, reason: ending.reason, exit, minutes });
    if (end.kind === "failed") {
      return emptyOutcome("failed", end.reason + stderrGist(files.stderrTail), grid, extra);
    }
    if (files.reply === null) {
      return emptyOutcome(
        "failed",
        `Slurm job ${id} completed but left no reply in ${folder}` + stderrGist(files.stderrTail),
        grid,
        extra,
      );
    }
    const outcome = judgeReply(spec, files.reply, p, extra, notes);
    if (outcome.status === "ok" && files.runSeconds !== null) {
      const list = history.get(task.case.id) ?? [];
      list.push({
        unknowns: gridUnknowns(spec.layout, task.nx, task.ny),
        seconds: files.runSeconds,
      });
      history.set(task.case.id, list);
    }
    return outcome;
  };

  return {
    info: {
      name: spec.name,
      kind: "external",
      command: [...spec.command],
      layout: spec.layout,
      scheme: spec.scheme,
      ...(spec.iterationGrowth !== undefined ? { iterationGrowth: spec.iterationGrowth } : {}),
      description: {
        mode: "batch",
        scheduler: batch.scheduler,
        encoding: spec.encoding,
        ...(spec.description ? { text: spec.description } : {}),
      },
    },
    solve: (task) => guard(() => solveOne(task), task, spec),
    close(): Promise<void> {
      return polling ?? Promise.resolve();
    },
    stop(): Promise<void> {
      // the jobs keep running on the cluster: a resumed campaign collects them
      for (const w of [...waiters]) {
        w.finish({
          kind: "failed",
          reason: `the harness stopped waiting; Slurm job ${w.id} keeps running and ` +
            `check --resume collects it`,
        });
      }
      return Promise.resolve();
    },
    ...(spec.rankCheck ? { rankCheck: { ...spec.rankCheck } } : {}),
  };
}
