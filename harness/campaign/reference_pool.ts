/**
 * The reference solver spread over Deno workers, behind the same {@link Solver} interface, so a
 * campaign uses every core. Each worker runs one solve at a time; tasks wait in a queue. Results
 * do not depend on the number of workers: every solve is the same deterministic computation.
 *
 * Small solves stay on the calling thread: below {@link PooledReferenceOptions.inProcessBelow}
 * unknowns a solve takes less time than a worker needs to start and compile its cases, so handing
 * it over would only add work (a library `check`, grids to 256, measured 0.72× as fast with two
 * workers as with none, bench/check_bench.ts). The workers start when the first larger solve
 * comes, so a campaign of small grids never pays for them.
 *
 * @module
 */
import type { SolveOptions } from "../../reference-solver/mod.ts";
import { type Derivation, derivationOf } from "../../cases/mod.ts";
import type { CaseFile } from "../../cases/case_file.ts";
import type { CompiledCase } from "../../cases/types.ts";
import {
  createReferenceSolver,
  emptyOutcome,
  type SolveOutcome,
  type Solver,
  type SolveTask,
} from "../solvers/mod.ts";
import { measureOutcome } from "./measure.ts";
import type { SolveRecord, SolverInfo } from "../result/mod.ts";

/**
 * A task sent to a worker. A case built from a file travels as its derivation, once per worker
 * (`built`, then only its `key`); the worker compiles it without mathjs. A case made in code travels
 * by reference and the worker loads it itself.
 */
export interface WorkerRequest {
  id: number;
  case: {
    id: string;
    origin: string;
    parameters: Record<string, number>;
    /** The pool's name for a case sent with its derivation. */
    key?: string;
    /** The case's file and derivation, on the first task of this case for this worker. */
    built?: { file: CaseFile; derivation: Derivation };
  };
  task: Omit<SolveTask, "case">;
  /** Measure the outcome in the worker too (`measureOutcome`), under this solver name. */
  measure?: { solver: string; tolerance: number };
}

/** A worker's answer. */
export interface WorkerReply {
  id: number;
  outcome?: SolveOutcome;
  /** The outcome's record, when the request asked for it. */
  record?: SolveRecord;
  error?: string;
}

/**
 * A solver that can also measure its outcome where it solved it (in a worker), so the campaign's
 * main thread does not: `record` is what `measureOutcome(task.case, info.name, outcome,
 * tolerance)` gives, computed by the same code on the same inputs.
 */
export interface MeasuringSolver extends Solver {
  solveMeasured(
    task: SolveTask,
    tolerance: number,
  ): Promise<{ outcome: SolveOutcome; record?: SolveRecord }>;
}

/** Options of {@link createPooledReferenceSolver}. */
export interface PooledReferenceOptions {
  /** Number of workers. Default: 2. */
  workers?: number;
  /** Reference-solver options for every solve. Default: its defaults. */
  solveOptions?: SolveOptions;
  /** Name in results. Default: "reference". */
  name?: string;
  /**
   * Solves with fewer unknowns than this run on the calling thread, not in a worker. Default
   * 263169 (a 512 × 512 grid and larger go to the workers): a warm solve at 256 × 256 takes about
   * 0.05 s, while a worker's start, module load, case compile and JIT warm-up before its first
   * solve took about 1 s (CPU profile of the library `check`: the main thread idle 1.2 s waiting
   * for cold workers on its 256 × 256 solves). 0 sends every solve to the workers.
   */
  inProcessBelow?: number;
}

/** Default of {@link PooledReferenceOptions.inProcessBelow}: the unknowns of a 512 × 512 grid. */
export const IN_PROCESS_BELOW = 513 * 513;

/**
 * Starts a pool of workers running the reference solver.
 *
 * @example
 * ```ts ignore
 * const solver = createPooledReferenceSolver({ workers: 2 });
 * const outcome = await solver.solve({ case: kase, nx: 64, ny: 64, scheme: "central", tolerance: 1e-10 });
 * await solver.close();
 * ```
 */
export function createPooledReferenceSolver(
  options: PooledReferenceOptions = {},
): MeasuringSolver {
  const count = Math.max(1, options.workers ?? 2);
  const info: SolverInfo = {
    name: options.name ?? "reference",
    kind: "reference",
    layout: "vertex",
    scheme: "central",
    // multigrid: h-independent convergence, held to flat iteration counts
    iterationGrowth: 0,
    // the worker count stays out: a result must not depend on --jobs
    description: { solveOptions: structuredClone(options.solveOptions ?? {}) },
  };
  const idle: Worker[] = [];
  const all: Worker[] = [];
  const waiting: (() => void)[] = [];
  const pending = new Map<number, (reply: WorkerReply) => void>();
  let nextId = 0;
  let closed = false;
  // the pool's name for each case, and the names each worker has compiled
  const caseKeys = new WeakMap<CompiledCase, string>();
  const known = new Map<Worker, Set<string>>();
  const caseRef = (worker: Worker, kase: CompiledCase): WorkerRequest["case"] => {
    const ref: WorkerRequest["case"] = {
      id: kase.id,
      origin: kase.origin,
      parameters: kase.parameters,
    };
    const derivation = derivationOf(kase);
    if (derivation === undefined || kase.file === undefined) return ref;
    let key = caseKeys.get(kase);
    if (key === undefined) caseKeys.set(kase, key = `case ${nextCase++}`);
    ref.key = key;
    const seen = known.get(worker) ?? new Set<string>();
    known.set(worker, seen);
    if (!seen.has(key)) {
      seen.add(key);
      ref.built = { file: kase.file, derivation };
    }
    return ref;
  };
  let nextCase = 0;
  const inProcessBelow = options.inProcessBelow ?? IN_PROCESS_BELOW;
  let local: Solver | undefined;

  /** Starts the workers (once, at the first solve that goes to them). */
  function start(): void {
    if (all.length > 0) return;
    for (let k = 0; k < count; k++) {
      const worker = new Worker(new URL("./reference_worker.ts", import.meta.url), {
        type: "module",
      });
      worker.onmessage = (event: MessageEvent<WorkerReply>) => {
        const resolve = pending.get(event.data.id);
        pending.delete(event.data.id);
        resolve?.(event.data);
      };
      if (options.solveOptions) worker.postMessage({ setup: options.solveOptions });
      idle.push(worker);
      all.push(worker);
    }
  }

  /** A small solve on this thread, by the same code a worker runs (reference_worker.ts). */
  async function runHere(
    task: SolveTask,
    measure?: WorkerRequest["measure"],
  ): Promise<{ outcome: SolveOutcome; record?: SolveRecord }> {
    local ??= createReferenceSolver(
      options.solveOptions ? { solveOptions: options.solveOptions } : {},
    );
    const outcome = await local.solve(task);
    if (!measure) return { outcome };
    return {
      outcome,
      record: measureOutcome(task.case, measure.solver, outcome, measure.tolerance),
    };
  }

  /** An idle worker, or undefined once the pool is closed. */
  async function acquire(): Promise<Worker | undefined> {
    start();
    while (idle.length === 0 && !closed) {
      await new Promise<void>((resolve) => waiting.push(resolve));
    }
    return closed ? undefined : idle.pop();
  }

  function release(worker: Worker): void {
    idle.push(worker);
    waiting.shift()?.();
  }

  async function run(
    task: SolveTask,
    measure?: WorkerRequest["measure"],
  ): Promise<{ outcome: SolveOutcome; record?: SolveRecord }> {
    const started = performance.now();
    const stopped = () =>
      emptyOutcome("failed", "the reference solver pool was stopped before this solve ended", {
        layout: "vertex",
        nx: task.nx,
        ny: task.ny,
      }, { seconds: (performance.now() - started) / 1000 });
    if (!closed && (task.nx + 1) * (task.ny + 1) < inProcessBelow) return runHere(task, measure);
    const worker = await acquire();
    // closed while this solve waited for its turn: the worker is gone
    if (worker === undefined || closed) return { outcome: stopped() };
    try {
      const id = nextId++;
      const reply = await new Promise<WorkerReply>((resolve) => {
        pending.set(id, resolve);
        const { case: kase, ...rest } = task;
        worker.postMessage(
          {
            id,
            case: caseRef(worker, kase),
            task: rest,
            ...(measure ? { measure } : {}),
          } satisfies WorkerRequest,
        );
      });
      if (reply.outcome) {
        return { outcome: reply.outcome, ...(reply.record ? { record: reply.record } : {}) };
      }
      return {
        outcome: emptyOutcome("failed", `the reference solver failed: ${reply.error}`, {
          layout: "vertex",
          nx: task.nx,
          ny: task.ny,
        }, { seconds: (performance.now() - started) / 1000 }),
      };
    } finally {
      release(worker);
    }
  }

  return {
    info,
    async solve(task: SolveTask): Promise<SolveOutcome> {
      return (await run(task)).outcome;
    },
    solveMeasured(task: SolveTask, tolerance: number) {
      return run(task, { solver: info.name, tolerance });
    },
    close(): Promise<void> {
      if (!closed) {
        closed = true;
        for (const w of all) w.terminate();
        void local?.close();
        // solves in flight or waiting for a worker end now, as failed: nothing hangs
        for (const [id, resolve] of pending) resolve({ id, error: "stopped" });
        pending.clear();
        for (const wake of waiting.splice(0)) wake();
      }
      return Promise.resolve();
    },
  };
}
