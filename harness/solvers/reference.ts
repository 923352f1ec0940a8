/**
 * The bundled reference multigrid solver behind the {@link Solver} interface, in process.
 *
 * @module
 */
import {
  type CycleName,
  discreteResidual,
  type SmootherName,
  solve,
  type SolveOptions,
} from "../../reference-solver/mod.ts";
import { casePoints } from "./geometry.ts";
import { emptyOutcome } from "./outcome.ts";
import type { SolveOutcome, Solver, SolveTask } from "./types.ts";

/**
 * Fills in a case's advice for the reference solver (smoother, cycle, maxCycles) where the
 * caller's options leave them unset.
 */
function withAdvice(
  base: SolveOptions,
  advice: { smoother?: string; cycle?: string; maxCycles?: number } | undefined,
): SolveOptions {
  if (!advice) return base;
  const out: SolveOptions = { ...base };
  if (advice.smoother !== undefined && base.smoother?.name === undefined) {
    out.smoother = { ...base.smoother, name: advice.smoother as SmootherName };
  }
  if (advice.cycle !== undefined && base.cycle?.type === undefined) {
    out.cycle = { ...base.cycle, type: advice.cycle as CycleName };
  }
  if (advice.maxCycles !== undefined && base.stop?.maxCycles === undefined) {
    out.stop = { ...base.stop, maxCycles: advice.maxCycles };
  }
  return out;
}

/**
 * The local truncation error of the reference scheme at every node: τ = A·u − f, the residual of
 * the exact solution sampled at the nodes in the discrete operator the solve used
 * (`discreteResidual`). Its interior rows are the difference equation in the units of the PDE
 * (the stencil divided by the spacings, f the source at the node), so τ there needs no further
 * scaling to compare with f; boundary rows are left to the measure step to leave out. Null when
 * the case has no exact solution at some node (not finite) or the residual cannot be formed.
 */
function truncationAtNodes(
  task: SolveTask,
  problem: Parameters<typeof discreteResidual>[0],
  x: Float64Array,
  y: Float64Array,
): Float64Array | null {
  const exact = new Float64Array(x.length);
  for (let k = 0; k < exact.length; k++) {
    exact[k] = task.case.exact(x[k], y[k]);
    if (!Number.isFinite(exact[k])) return null;
  }
  try {
    return discreteResidual(problem, exact, { upwind: task.scheme === "upwind" });
  } catch {
    return null; // a reading aid only: the solve stands without it
  }
}

/** Options of {@link createReferenceSolver}. */
export interface ReferenceSolverOptions {
  /** Name in results. Default: "reference". */
  name?: string;
  /**
   * Reference-solver options (cycle, smoother, …). `scheme.upwind` and `stop.tolerance` are set
   * from each task. Default: the reference solver's defaults.
   */
  solveOptions?: SolveOptions;
  /** Scheme recorded in the solver's info. Default: "central". */
  scheme?: "central" | "upwind";
  /**
   * Compute the local truncation error per node with each solve (`SolveOutcome.truncation`): the
   * problem is discretized a second time, which costs about a third of a uniform-grid solve (less
   * on stretched grids). Default: true.
   */
  truncation?: boolean;
}

/**
 * Makes the in-process reference solver: samples the case on the vertex grid with
 * `case.sample(nx, ny)` and solves it with the bundled multigrid (with the case's advice for
 * smoother, cycle and maxCycles where `solveOptions` leaves them unset). The task's time limit does not
 * apply (an in-process solve cannot be interrupted); non-convergence is data (status ok,
 * `converged: false`); a problem the solver refuses (e.g. singular) is `failed` with its message.
 *
 * @param options name, solver options, recorded scheme
 * @returns the solver
 *
 * @example
 * ```ts ignore
 * import { createReferenceSolver } from "./reference.ts";
 * const solver = createReferenceSolver();
 * const outcome = await solver.solve({ case: c, nx: 32, ny: 32, scheme: "central", tolerance: 1e-10 });
 * ```
 */
export function createReferenceSolver(options: ReferenceSolverOptions = {}): Solver {
  const name = options.name ?? "reference";
  return {
    info: {
      name,
      kind: "reference",
      layout: "vertex",
      scheme: options.scheme ?? "central",
      // multigrid: h-independent convergence, held to flat iteration counts
      iterationGrowth: 0,
      description: { solveOptions: structuredClone(options.solveOptions ?? {}) },
    },
    solve(task: SolveTask): Promise<SolveOutcome> {
      const started = performance.now();
      const grid = { layout: "vertex" as const, nx: task.nx, ny: task.ny };
      try {
        const problem = task.case.sample(task.nx, task.ny);
        const base = withAdvice(options.solveOptions ?? {}, task.case.solver);
        const result = solve(problem, {
          ...base,
          // a singular case: the solver fixes the constant by a zero volume-weighted mean
          ...(task.case.singular ? { singular: "mean-zero" as const } : {}),
          scheme: { ...base.scheme, upwind: task.scheme === "upwind" },
          stop: { ...base.stop, tolerance: task.tolerance },
        });
        const points = casePoints(task.case, "vertex", task.nx, task.ny);
        const truncation = options.truncation === false
          ? null
          : truncationAtNodes(task, problem, points.x, points.y);
        return Promise.resolve({
          status: "ok",
          layout: "vertex",
          nx: task.nx,
          ny: task.ny,
          x: points.x,
          y: points.y,
          weights: points.weights,
          boundaryBand: points.boundaryBand,
          values: result.solution,
          ...(truncation ? { truncation } : {}),
          residualHistory: result.residualHistory,
          iterations: result.cycles,
          converged: result.converged,
          solverSeconds: result.seconds,
          seconds: (performance.now() - started) / 1000,
          description: {
            ...result.description,
            stopReason: result.reason,
            averageFactor: result.averageFactor,
            asymptoticFactor: result.asymptoticFactor,
          },
        });
      } catch (error) {
        return Promise.resolve(
          emptyOutcome(
            "failed",
            `the reference solver refused the problem: ${(error as Error).message}`,
            grid,
            {
              seconds: (performance.now() - started) / 1000,
            },
          ),
        );
      }
    },
    close(): Promise<void> {
      return Promise.resolve();
    },
  };
}
