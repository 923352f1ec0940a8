/**
 * Runs a campaign: every case on every grid by every solver, in parallel up to `jobs` solves at
 * once, each finished solve appended to the journal as it finishes. Returns the finished solve
 * records in a fixed order (case, solver, grid), so results do not depend on the job count or on
 * the order solves finished in.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import type { SolveRecord } from "../result/mod.ts";
import type { JobNote, Solver } from "../solvers/mod.ts";
import { type JournaledSolve, JournalWriter, solveInputs, solveKey } from "./journal.ts";
import { measureOutcome, relativeDifference } from "./measure.ts";
import type { MeasuringSolver } from "./reference_pool.ts";
import { SolveQueue } from "./schedule.ts";
import { errorMap, vertexWeights, withoutMean } from "../analysis/mod.ts";

/** One planned solve. */
export interface PlannedSolve {
  kase: CompiledCase;
  solver: Solver;
  nx: number;
  ny: number;
}

/** Progress events for the command line (library code never prints). */
export interface ProgressEvent {
  done: number;
  total: number;
  record: SolveRecord;
  /** Finished before this run (read from the journal on resume). */
  resumed: boolean;
}

/** Options of {@link runSolves}. */
export interface RunOptions {
  /** Solves running at once. Default: 1. */
  jobs?: number;
  /** Relative residual tolerance asked of every solver. Default: 1e-10. */
  tolerance?: number;
  /** Journal to append finished solves to. Default: none. */
  journal?: JournalWriter;
  /**
   * Solves finished earlier (from a journal), by {@link solveKey}; they are not run again when
   * their input digest matches the planned solve's ({@link plannedInputs}), and run again when it
   * does not (a journal without digests is trusted).
   */
  finished?: Map<string, JournaledSolve>;
  /**
   * Scheduler jobs an earlier run submitted and did not see finish, by {@link solveKey}: their
   * batch solves collect or wait for them instead of submitting again. Default: none.
   */
  submitted?: Map<string, JobNote>;
  /** Called after each solve. */
  onProgress?: (event: ProgressEvent) => void;
  /**
   * When aborted, no new solve starts, and solves that end after the abort (interrupted ones) are
   * neither recorded nor journaled.
   */
  signal?: AbortSignal;
}

/**
 * The digest of what determines a planned solve's result: the case (origin, domain, parameters,
 * formulas, boundary kinds), the solver's identity (with the SHA-256 of the solver file that
 * declared it, when the CLI read one) and the residual tolerance.
 */
export function plannedInputs(p: PlannedSolve, tolerance: number): string {
  const { kase, solver } = p;
  const sides = Object.entries(kase.boundary).map(([side, b]) => [side, b.kind, b.weightsText]);
  return solveInputs([
    kase.id,
    kase.origin,
    kase.domain,
    kase.parameters,
    kase.formulas,
    sides,
    solver.info.name,
    solver.info.scheme,
    solver.info.layout,
    solver.info.command ?? null,
    solver.info.build?.solverFile?.sha256 ?? null,
    tolerance,
  ]);
}

/** ny for a case on a grid with nx intervals: the case's interval ratio, at least 2. */
export function gridFor(kase: CompiledCase, nx: number): { nx: number; ny: number } {
  return { nx, ny: Math.max(2, Math.round(nx * kase.intervalRatio)) };
}

/** Plans every case × solver × grid. */
export function planSolves(
  cases: CompiledCase[],
  solvers: Solver[],
  grids: number[],
): PlannedSolve[] {
  const plan: PlannedSolve[] = [];
  for (const kase of cases) {
    for (const solver of solvers) {
      for (const n of grids) plan.push({ kase, solver, ...gridFor(kase, n) });
    }
  }
  return plan;
}

/**
 * Runs the planned solves and returns every record (finished earlier or now), in plan order.
 * A solver fault is a `failed` record; it never stops the campaign.
 */
export async function runSolves(
  plan: PlannedSolve[],
  options: RunOptions = {},
): Promise<SolveRecord[]> {
  const jobs = Math.max(1, options.jobs ?? 1);
  const tolerance = options.tolerance ?? 1e-10;
  const records = new Array<SolveRecord | undefined>(plan.length);
  // Reference solutions kept until the other solvers on the same vertex grid have finished, so
  // each can be compared with the reference's discrete solution.
  const referenceValues = new Map<string, Float64Array>();
  const waitingForReference = new Map<string, { index: number; values: Float64Array }[]>();
  let done = 0;

  plan.forEach((p, index) => {
    const key = solveKey({ caseId: p.kase.id, solver: p.solver.info.name, nx: p.nx, ny: p.ny });
    const earlier = options.finished?.get(key);
    if (
      earlier && (earlier.inputs === undefined || earlier.inputs === plannedInputs(p, tolerance))
    ) {
      records[index] = earlier.record;
      done++;
      options.onProgress?.({ done, total: plan.length, record: earlier.record, resumed: true });
    }
  });

  // Smallest grids first, so every worker's JIT warm-up lands on a cheap solve; then the longest
  // predicted solve first, so the campaign's most expensive one does not start last (schedule.ts)
  const studyOf = (p: PlannedSolve) => `${p.kase.id}\u0000${p.solver.info.name}`;
  const queue = new SolveQueue(
    plan.map((p) => ({ study: studyOf(p), unknowns: p.nx * p.ny })),
    { jobs, pending: plan.map((_, k) => k).filter((k) => records[k] === undefined) },
  );
  records.forEach((r, k) => {
    if (r) queue.finished({ ...queue.solves[k], seconds: r.seconds });
  });

  const compareKey = (p: PlannedSolve) => `${p.kase.id}\u0000${p.nx}\u0000${p.ny}`;
  const settleDifference = (index: number, values: Float64Array, reference: Float64Array) => {
    const record = records[index]!;
    const p = plan[index];
    if (p.kase.singular && values.length === reference.length) {
      // each solver fixed its own constant: compare the mean-free fields
      const { x0, x1, y0, y1 } = p.kase.domain;
      const w = vertexWeights(p.nx, p.ny, (x1 - x0) / p.nx, (y1 - y0) / p.ny);
      if (w.length === values.length) {
        values = withoutMean(values, w);
        reference = withoutMean(reference, w);
      }
    }
    const d = relativeDifference(values, reference, { domain: p.kase.domain, nx: p.nx, ny: p.ny });
    record.differenceFromReference = d?.difference ?? null;
    record.differenceAt = d?.at ?? null;
    if (d) record.differenceMap = errorMap(values, reference, p.nx + 1, p.ny + 1);
  };

  async function worker(): Promise<void> {
    while (queue.size > 0 && !options.signal?.aborted) {
      const index = queue.next()!;
      const p = plan[index];
      const key = solveKey({ caseId: p.kase.id, solver: p.solver.info.name, nx: p.nx, ny: p.ny });
      const earlierJob = options.submitted?.get(key);
      const task = {
        case: p.kase,
        nx: p.nx,
        ny: p.ny,
        scheme: p.solver.info.scheme,
        tolerance,
        // jobs of batch solvers go to the journal (a function: never sent to a worker)
        ...(p.solver.info.kind === "external"
          ? {
            jobs: {
              ...(earlierJob ? { earlier: earlierJob } : {}),
              note: (job: JobNote) => {
                if (!options.signal?.aborted) options.journal?.appendJob(key, job);
              },
            },
          }
          : {}),
      };
      // a pooled solver measures in its worker, off this thread
      const measuring = (p.solver as Partial<MeasuringSolver>).solveMeasured;
      const { outcome, record: measured } = measuring
        ? await measuring.call(p.solver, task, tolerance)
        : { outcome: await p.solver.solve(task), record: undefined };
      // A solve that ended because the campaign was interrupted (its process killed) did not
      // finish: it is not recorded, so a resume runs it again.
      if (options.signal?.aborted) return;
      const record = measured ?? measureOutcome(p.kase, p.solver.info.name, outcome, tolerance);
      records[index] = record;
      queue.finished({ ...queue.solves[index], seconds: record.seconds });
      if (outcome.status === "ok" && outcome.layout === "vertex") {
        const key = compareKey(p);
        if (p.solver.info.kind === "reference") {
          referenceValues.set(key, outcome.values);
          for (const w of waitingForReference.get(key) ?? []) {
            settleDifference(w.index, w.values, outcome.values);
          }
          waitingForReference.delete(key);
        } else {
          const reference = referenceValues.get(key);
          if (reference) settleDifference(index, outcome.values, reference);
          else {
            const list = waitingForReference.get(key) ?? [];
            list.push({ index, values: outcome.values });
            waitingForReference.set(key, list);
          }
        }
      }
      options.journal?.append(record, plannedInputs(p, tolerance));
      done++;
      options.onProgress?.({ done, total: plan.length, record, resumed: false });
    }
  }

  await Promise.all(Array.from({ length: Math.min(jobs, Math.max(queue.size, 1)) }, worker));
  return records.filter((r): r is SolveRecord => r !== undefined);
}
