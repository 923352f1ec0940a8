/**
 * External solvers: programs that speak `gridproof-protocol/1` on stdin/stdout, run in their own
 * process group, one process per solve (`once`) or one long-lived process (`session`). Every
 * fault becomes a `failed` outcome with a precise reason; nothing here throws or hangs.
 *
 * @module
 */
import { resolve } from "node:path";
import {
  type Capabilities,
  type ParsedMessage,
  protocolVersion,
  readReady,
  type ReadyMessage,
  serializeMessage,
} from "../protocol/mod.ts";
import { describeExit, GroupProcess, within } from "./process.ts";
import { type EndedProcesses, MARK_VARIABLE } from "./descendants.ts";
import { resolveProgram } from "./resolve_command.ts";
import { emptyOutcome, stderrGist } from "./outcome.ts";
import { applicability, guard, judgeReply, type Prepared, prepareRequest } from "./exchange.ts";
import { launchPrefix, ranksFor } from "./launcher.ts";
import type { ExternalSolverSpec, SolveOutcome, Solver, SolveTask } from "./types.ts";

/** Longest wait for a session's `ready` answer. */
const MAX_STARTUP_SECONDS = 60;
/** Grace after `goodbye` before the session process group is killed. */
const GOODBYE_GRACE_MS = 2000;

/** Options of {@link createExternalSolver}. */
export interface ExternalSolverOptions {
  /** Folder of the solver file: relative command paths and `cwd` are taken from it. */
  solverFileDir: string;
  /**
   * Session processes that may run at once (`session` mode): each answers one request at a time;
   * a second is started only when solves overlap (a campaign with `jobs` > 1). Default: 1.
   */
  sessions?: number;
}

/**
 * Makes a {@link Solver} that runs an external program through the protocol.
 *
 * @param spec the solver as written in the solver file (defaults filled in by `loadSolverFile`)
 * @param options where relative paths start
 * @returns the solver; call `close()` when done (it ends a session)
 *
 * @example
 * ```ts ignore
 * import { createExternalSolver } from "./external.ts";
 * const solver = createExternalSolver(spec, { solverFileDir: "examples" });
 * const outcome = await solver.solve({ case: c, nx: 32, ny: 32, scheme: "central", tolerance: 1e-10 });
 * await solver.close();
 * ```
 */
export function createExternalSolver(
  spec: ExternalSolverSpec,
  options: ExternalSolverOptions,
): Solver {
  const baseDir = resolve(options.solverFileDir);
  const runner = new Runner(spec, baseDir);
  const sessions = spec.mode === "session"
    ? new SessionPool(runner, Math.max(1, Math.floor(options.sessions ?? 1)))
    : undefined;
  // an id names the case, the grid and the number of requests so far for that pair, so it does
  // not depend on the order in which parallel solves start (--jobs)
  const counters = new Map<string, number>();
  return {
    info: {
      name: spec.name,
      kind: "external",
      command: [...spec.command],
      layout: spec.layout,
      scheme: spec.scheme,
      ...(spec.iterationGrowth !== undefined ? { iterationGrowth: spec.iterationGrowth } : {}),
      description: {
        mode: spec.mode,
        encoding: spec.encoding,
        ...(spec.description ? { text: spec.description } : {}),
      },
    },
    solve(task: SolveTask): Promise<SolveOutcome> {
      const key = `${task.case.id}/${task.nx}x${task.ny}`;
      const count = (counters.get(key) ?? 0) + 1;
      counters.set(key, count);
      const id = `${key}/${count}`;
      const work = async (session?: Session): Promise<SolveOutcome> => {
        if (session) {
          // the request's form depends on what the session declared, so start it first
          const refusal = runner.applicability(task, session.capabilities);
          if (refusal) return refusal;
          const failed = await session.ensureStarted(task);
          if (failed) return failed;
        }
        const prepared = runner.prepare(task, id, session?.capabilities);
        if ("status" in prepared) return prepared;
        return session ? await session.solve(prepared) : await runner.runOnce(prepared);
      };
      if (!sessions) return guard(() => work(), task, spec);
      // a session answers one request at a time: the solve waits for an idle one
      return sessions.use((session) => guard(() => work(session), task, spec));
    },
    async close(): Promise<void> {
      await sessions?.close();
    },
    stop(): Promise<void> {
      return runner.endAll();
    },
    ...(spec.rankCheck ? { rankCheck: { ...spec.rankCheck } } : {}),
  };
}

/**
 * Says which processes the solver left running when it exited (they have been ended), for the
 * outcome's description; undefined when it left none.
 */
function leftoverNote(ended: EndedProcesses): string | undefined {
  const pids = [...ended.inGroup, ...ended.outside];
  if (pids.length === 0) return undefined;
  const which = pids.length === 1 ? `pid ${pids[0]}` : `pids ${pids.join(", ")}`;
  const escaped = ended.outside.length > 0
    ? ` (${ended.outside.length} outside its process group)`
    : "";
  return `${pids.length === 1 ? "a process" : `${pids.length} processes`} the solver started ` +
    `${pids.length === 1 ? "was" : "were"} still running after it exited (${which})${escaped}; ` +
    `${pids.length === 1 ? "it was" : "they were"} ended`;
}

/** Starts processes and runs `once` solves. */
class Runner {
  /** Processes started and not yet ended, so a stop can end them at once. */
  readonly #live = new Set<GroupProcess>();

  constructor(readonly spec: ExternalSolverSpec, readonly baseDir: string) {}

  /** Ends every running process of this solver now, with all it started (see `GroupProcess.end`). */
  async endAll(): Promise<void> {
    await Promise.all([...this.#live].map((proc) => proc.end()));
  }

  /** The protocol version the solver file names (hello, requests and goodbye carry it). */
  get protocol() {
    return protocolVersion(this.spec.protocol ?? 1);
  }

  get env(): Record<string, string> | undefined {
    return this.spec.env;
  }

  get maxReplyBytes(): number {
    return Math.floor(this.spec.maxReplyMiB * 1024 * 1024);
  }

  /** The rank count of a solve under the launcher (1 without one). */
  ranks(p: Prepared): number {
    const launcher = this.spec.launcher;
    if (!launcher) return 1;
    return p.task.ranks ?? ranksFor(launcher, this.spec.layout, p.task.nx, p.task.ny);
  }

  /** The filled launcher command of a solve (of the session when `p` is absent), or []. */
  launch(p?: Prepared): string[] {
    return launchPrefix(this.spec.launcher, {
      solver: this.spec.name,
      caseId: p?.task.case.id ?? "session",
      layout: this.spec.layout,
      nx: p?.task.nx ?? 0,
      ny: p?.task.ny ?? 0,
      ranks: p?.task.ranks,
      limitSeconds: p?.limitSeconds ?? this.spec.timeLimitSeconds,
    });
  }

  /** A not-applicable outcome when the task is outside what the solver handles, else undefined. */
  applicability(task: SolveTask, caps: Capabilities | undefined): SolveOutcome | undefined {
    return applicability(this.spec, task, caps);
  }

  /** Builds the request, or an outcome when the task does not apply or cannot be sampled. */
  prepare(task: SolveTask, id: string, caps: Capabilities | undefined): Prepared | SolveOutcome {
    return prepareRequest(this.spec, task, id, caps);
  }

  /**
   * Resolves the program and starts it in its own process group, or says why it cannot.
   * `prefix` is a filled launcher command (see `launcher.ts`) put before the program.
   */
  async start(prefix: string[] = []): Promise<GroupProcess | string> {
    const [program, ...args] = this.spec.command;
    const found = await resolveProgram(program, { baseDir: this.baseDir, path: this.env?.PATH });
    if (!found.ok) return found.reason;
    const launcher = prefix.length > 0
      ? await resolveProgram(prefix[0], { baseDir: this.baseDir, path: this.env?.PATH })
      : undefined;
    if (launcher && !launcher.ok) return `the launcher: ${launcher.reason}`;
    const cwd = resolve(this.baseDir, this.spec.cwd ?? ".");
    try {
      const info = await Deno.stat(cwd);
      if (!info.isDirectory) return `the working folder ${cwd} is not a folder (field cwd)`;
    } catch {
      return `the working folder ${cwd} does not exist (field cwd, relative to the solver file's folder)`;
    }
    try {
      const proc = GroupProcess.start({
        argv: [...(launcher?.ok ? [launcher.path, ...prefix.slice(1)] : []), found.path, ...args],
        cwd,
        env: this.env,
        memoryLimitMiB: this.spec.memoryLimitMiB,
      });
      this.#live.add(proc);
      proc.status.finally(() => this.#live.delete(proc)).catch(() => {});
      return proc;
    } catch (error) {
      return `could not start ${found.path}: ${(error as Error).message}`;
    }
  }

  async runOnce(p: Prepared): Promise<SolveOutcome> {
    const grid = { layout: this.spec.layout, nx: p.task.nx, ny: p.task.ny };
    const started = performance.now();
    const elapsed = () => (performance.now() - started) / 1000;
    const proc = await this.start(this.launch(p));
    if (typeof proc === "string") return emptyOutcome("failed", proc, grid, { seconds: elapsed() });
    const deadline = started + p.limitSeconds * 1000;
    const left = () => deadline - performance.now();
    const writing = proc.write(p.request.pieces()).then(async (r) => {
      await proc.closeStdin();
      if (!r.error) this.pointsMeanwhile(p);
      return r;
    });
    const finish = async (reason: string): Promise<SolveOutcome> => {
      await proc.end();
      await within(proc.stderrDone, 500);
      await proc.release();
      const tail = proc.stderr.text();
      return emptyOutcome("failed", reason, grid, { seconds: elapsed(), stderrTail: tail });
    };
    // the reply is complete once the solver has exited, even while a process it left holds
    // stdout open: settle() ends such processes as soon as the solver exits
    const read = await proc.settle(proc.readAll(this.maxReplyBytes), left());
    if (read === undefined) {
      const exit = proc.exitStatus;
      if (!exit) {
        return await finish(
          `the solver exceeded its time limit of ${p.limitSeconds} s; its process group ` +
            `(children included) was killed`,
        );
      }
      const why = (await proc.end()).tracked
        ? `one that left its process group and dropped ${MARK_VARIABLE} from its environment, ` +
          `so gridproof could not find it`
        : `one outside its process group, and without Linux's /proc gridproof cannot find it`;
      return await finish(
        `the solver ${describeExit(exit)}, but its standard output stayed open until the time ` +
          `limit of ${p.limitSeconds} s: a process it started holds it, ${why}; its process ` +
          `group was killed`,
      );
    }
    if (read.kind === "overflow") {
      return await finish(
        `the reply exceeded the size limit of ${read.limit} bytes (maxReplyMiB ` +
          `${this.spec.maxReplyMiB}); reading stopped and the solver was killed`,
      );
    }
    const status = await within(proc.status, left());
    if (status === undefined) {
      return await finish(
        `the solver closed stdout but did not exit within its time limit of ${p.limitSeconds} s; ` +
          `its process group was killed`,
      );
    }
    // the solver's time ends with its exit, not with the cleaning up after it
    const seconds = ((proc.exitTime ?? performance.now()) - started) / 1000;
    // stray children of a finished solver must not outlive the solve
    const leftover = leftoverNote(await proc.end());
    const write = (await within(writing, 1000)) ?? { written: -1 };
    await within(proc.stderrDone, 500);
    await proc.release();
    const tail = proc.stderr.text();
    const notes = {
      ...(this.spec.launcher ? { ranks: this.ranks(p) } : {}),
      ...(leftover ? { leftoverProcesses: leftover } : {}),
    };
    const extra = {
      seconds,
      stderrTail: tail,
      ...(Object.keys(notes).length > 0 ? { description: notes } : {}),
    };
    const bytes = read.kind === "data" ? read.bytes : new Uint8Array(0);
    const shortWrite = write.written >= 0 && write.written < p.request.byteLength;
    if (!status.success) {
      const input = shortWrite
        ? ` after reading ${write.written} of ${p.request.byteLength} bytes of the request`
        : "";
      return emptyOutcome(
        "failed",
        `the solver ${describeExit(status, this.spec.memoryLimitMiB)}${input}${stderrGist(tail)}`,
        grid,
        extra,
      );
    }
    if (shortWrite) {
      return emptyOutcome(
        "failed",
        `the solver closed its standard input after taking ${write.written} of ` +
          `${p.request.byteLength} bytes of the request (${write.error ?? "pipe closed"})` +
          (bytes.length === 0 ? " and wrote no reply" : "") +
          `; it must read the whole request`,
        grid,
        extra,
      );
    }
    return this.judge(new TextDecoder().decode(bytes), p, extra, extra.description ?? {});
  }

  /**
   * Makes the grid's points while the harness waits for the solver (a solver on its own points
   * replies with them instead, so nothing is made for it).
   */
  pointsMeanwhile(p: Prepared): void {
    if (this.spec.layout !== "points") p.points();
  }

  /** Turns a reply (its text, or its message parsed as it arrived) into an outcome. */
  judge(
    text: string | ParsedMessage,
    p: Prepared,
    extra: { seconds: number; stderrTail?: string },
    description: Record<string, unknown>,
  ): SolveOutcome {
    return judgeReply(this.spec, text, p, extra, description);
  }
}

/**
 * Up to `most` sessions of one solver, each answering one request at a time. A request takes an
 * idle session that already runs, else starts one while fewer than `most` exist, else waits in
 * arrival order. With `most` = 1 this is the single session of a solver, requests in turn.
 */
class SessionPool {
  readonly #idle: Session[] = [];
  readonly #all: Session[] = [];
  readonly #waiting: ((s: Session) => void)[] = [];
  /** Requests taken and not yet answered (running or waiting), and who waits for none. */
  #open = 0;
  #drained: (() => void)[] = [];

  constructor(readonly runner: Runner, readonly most: number) {}

  /** Runs `work` on a session of its own for as long as it takes. */
  async use<T>(work: (session: Session) => Promise<T>): Promise<T> {
    this.#open++;
    try {
      const session = this.#idle.pop() ?? this.#fresh() ??
        await new Promise<Session>((resolve) => this.#waiting.push(resolve));
      try {
        return await work(session);
      } finally {
        const next = this.#waiting.shift();
        if (next) next(session);
        else this.#idle.push(session);
      }
    } finally {
      if (--this.#open === 0) { for (const wake of this.#drained.splice(0)) wake(); }
    }
  }

  #fresh(): Session | undefined {
    if (this.#all.length >= this.most) return undefined;
    const session = new Session(this.runner);
    this.#all.push(session);
    return session;
  }

  /** Waits for the requests taken so far, then ends every session. */
  async close(): Promise<void> {
    if (this.#open > 0) await new Promise<void>((resolve) => this.#drained.push(resolve));
    await Promise.all(this.#all.map((s) => s.close()));
  }
}

/** One long-lived solver process, restarted after any fault. */
class Session {
  #proc: GroupProcess | undefined;
  #ready: ReadyMessage | undefined;
  #startupSeconds: number | null = null;

  constructor(readonly runner: Runner) {}

  /** What the running session declared (undefined before it started). */
  get capabilities(): Capabilities | undefined {
    return this.#ready?.supports;
  }

  async #start(limitSeconds: number): Promise<string | undefined> {
    const started = performance.now();
    const proc = await this.runner.start(this.runner.launch());
    if (typeof proc === "string") return proc;
    const hello = new TextEncoder().encode(
      serializeMessage({ protocol: this.runner.protocol, type: "hello" }),
    );
    const wrote = await proc.write(hello);
    const wait = Math.min(limitSeconds, MAX_STARTUP_SECONDS) * 1000;
    const line = wrote.error
      ? undefined
      : await proc.settle(proc.readLine(this.runner.maxReplyBytes), wait);
    const abandon = async (why: string) => {
      await proc.end();
      await within(proc.stderrDone, 500);
      await proc.release();
      return `the session did not start: ${why}${stderrGist(proc.stderr.text())}`;
    };
    if (wrote.error) return await abandon(`writing hello failed (${wrote.error})`);
    if (line === undefined) {
      return await abandon(
        `no ready message within ${wait / 1000} s of hello; process group killed`,
      );
    }
    if (line.kind === "overflow") return await abandon("the ready message exceeded the size limit");
    if (line.kind === "eof") {
      const status = await within(proc.status, 2000);
      return await abandon(
        `the process ${
          status ? describeExit(status, this.runner.spec.memoryLimitMiB) : "closed stdout"
        } before answering hello`,
      );
    }
    if (line.kind !== "line") return await abandon("unexpected output");
    const check = readReady(line.text, this.runner.protocol);
    if (!check.ok) return await abandon(check.reason);
    this.#proc = proc;
    this.#ready = check.ready;
    this.#startupSeconds = (performance.now() - started) / 1000;
    return undefined;
  }

  /**
   * Starts the session unless it runs; returns a failed outcome when it cannot start, undefined
   * when it is ready (call before building a request: the request's form follows the session's
   * declared capabilities).
   */
  async ensureStarted(task: SolveTask): Promise<SolveOutcome | undefined> {
    if (this.#proc) return undefined;
    const why = await this.#start(task.timeLimitSeconds ?? this.runner.spec.timeLimitSeconds);
    if (why === undefined) return undefined;
    return emptyOutcome("failed", why, {
      layout: this.runner.spec.layout,
      nx: task.nx,
      ny: task.ny,
    });
  }

  /** Sends a prepared request to the running session (see {@link ensureStarted}) and reads the reply. */
  async solve(p: Prepared): Promise<SolveOutcome> {
    const grid = { layout: this.runner.spec.layout, nx: p.task.nx, ny: p.task.ny };
    const proc = this.#proc;
    if (!proc) return emptyOutcome("failed", "the session is not running", grid);
    const mark = proc.stderr.total;
    const started = performance.now();
    const elapsed = () => (performance.now() - started) / 1000;
    const description = {
      mode: "session",
      startupSeconds: this.#startupSeconds,
      ...(this.#ready?.solver ? { solver: this.#ready.solver } : {}),
    };
    const fail = async (reason: string): Promise<SolveOutcome> => {
      await this.#kill();
      return emptyOutcome("failed", reason + stderrGist(proc.stderr.text(mark)), grid, {
        seconds: elapsed(),
        stderrTail: proc.stderr.text(mark),
        description,
      });
    };
    const deadline = started + p.limitSeconds * 1000;
    const wrote = await within(proc.write(p.request.pieces()), deadline - performance.now());
    if (wrote === undefined) {
      return await fail(
        `the session did not read the request within the time limit of ${p.limitSeconds} s; process group killed`,
      );
    }
    if (wrote.error) {
      const status = await within(proc.status, 1000);
      return await fail(
        `the session process ${
          status
            ? describeExit(status, this.runner.spec.memoryLimitMiB)
            : "closed its standard input"
        } ` +
          `before the request was sent (${wrote.written} of ${p.request.byteLength} bytes); it will be restarted`,
      );
    }
    this.runner.pointsMeanwhile(p);
    let line;
    do {
      // settle: a session that exits is done, even while a process it left holds stdout open
      line = await proc.settle(
        proc.readLine(this.runner.maxReplyBytes, { parse: true }),
        deadline - performance.now(),
      );
    } while (line?.kind === "line" && line.text.trim() === "");
    if (line === undefined) {
      return await fail(
        `the solver exceeded its time limit of ${p.limitSeconds} s; its process group ` +
          `(children included) was killed and will be restarted`,
      );
    }
    if (line.kind === "overflow") {
      return await fail(
        `the reply exceeded the size limit of ${line.limit} bytes (maxReplyMiB ` +
          `${this.runner.spec.maxReplyMiB}); reading stopped and the session was killed`,
      );
    }
    if (line.kind === "eof") {
      const status = await within(proc.status, 2000);
      return await fail(
        `the session process ${
          status ? describeExit(status, this.runner.spec.memoryLimitMiB) : "closed stdout"
        } during the ` +
          `solve; it will be restarted for the next solve`,
      );
    }
    if (line.kind !== "line" && line.kind !== "message") return await fail("unexpected output");
    const seconds = elapsed();
    const reply = line.kind === "message" ? line.message : line.text;
    const outcome = this.runner.judge(reply, p, {
      seconds,
      stderrTail: proc.stderr.text(mark),
    }, description);
    // after a bad reply the conversation may be out of step, and a process that exited after
    // its reply cannot take the next request: start afresh next time
    if (outcome.status === "failed" || proc.exitStatus) await this.#kill();
    return outcome;
  }

  async #kill(): Promise<void> {
    const proc = this.#proc;
    this.#proc = undefined;
    this.#ready = undefined;
    if (!proc) return;
    await proc.end();
    await within(proc.stderrDone, 500);
    await proc.release();
  }

  async close(): Promise<void> {
    const proc = this.#proc;
    if (!proc) return;
    const bye = new TextEncoder().encode(
      serializeMessage({ protocol: this.runner.protocol, type: "goodbye" }),
    );
    await within(proc.write(bye), 500);
    await proc.closeStdin();
    await within(proc.status, GOODBYE_GRACE_MS);
    await this.#kill();
  }
}
