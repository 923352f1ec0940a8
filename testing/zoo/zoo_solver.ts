/**
 * The defect-zoo solver: an in-process {@link Solver} that assembles the case's operator itself
 * (second-order central differences for the non-conservative form, finite volumes for the
 * conservative form, on vertex or cell grids), optionally with one seeded defect, and solves the
 * system directly.
 *
 * @module
 */
import {
  casePoints,
  emptyOutcome,
  type SolveOutcome,
  type Solver,
  type SolveTask,
} from "../../harness/solvers/mod.ts";
import { type CompiledCase, sideMidpoint } from "../../cases/mod.ts";
import { SIDES } from "../../reference-solver/mod.ts";
import { assembleCell, assembleVertex } from "./assemble.ts";
import {
  assembleConservativeCell,
  assembleConservativeVertex,
  conservativeDeclines,
} from "./assemble_conservative.ts";
import { assembleMapped, mappedDeclines, needsMapped } from "./assemble_mapped.ts";
import { solveBanded } from "./banded.ts";
import {
  CORRECT_DISCRETIZATION,
  type Defect,
  type DefectName,
  DEFECTS,
  type Discretization,
  type Finished,
} from "./defects.ts";
import { residualNorm } from "./system.ts";

/** Options of {@link createZooSolver}. */
export interface ZooSolverOptions {
  /** Name in results. Default: "zoo-<layout>" or "zoo-<layout>-<defect>". */
  name?: string;
  /** Where the unknowns sit: grid nodes or cell centres. */
  layout: "vertex" | "cell";
  /** The seeded defect. Default: none (the correct scheme). */
  defect?: DefectName;
}

/**
 * Makes a zoo solver. Each solve assembles the central scheme (non-conservative form) or the
 * finite-volume scheme (conservative form, `assemble_conservative.ts`), or on a stretched family
 * or with a periodic west–east pair the scheme on unequal steps (`assemble_mapped.ts`), from the case's
 * coefficients, source and boundary data (never its exact solution), solves it by banded Gaussian
 * elimination and reports the residual history [‖f‖, ‖f − A·u‖] with one iteration, unless the
 * defect rewrites the outcome. Upwind tasks, and conservative cases the finite-volume scheme
 * declines (k12 ≠ 0 with a flux side), are not applicable; a singular system is `failed`.
 *
 * @param options layout, defect and name
 * @returns the solver
 * @throws {RangeError} when the defect is unknown or does not exist on the layout
 *
 * @example
 * ```ts
 * import { loadCase } from "../../cases/mod.ts";
 * import { createZooSolver } from "./zoo_solver.ts";
 * const solver = createZooSolver({ layout: "cell", defect: "robin-sign" });
 * const c = await loadCase("robin-all");
 * const outcome = await solver.solve({ case: c, nx: 8, ny: 8, scheme: "central", tolerance: 1e-10 });
 * outcome.values.length; // 64
 * ```
 */
export function createZooSolver(options: ZooSolverOptions): Solver {
  const { layout } = options;
  let defect: Defect | undefined;
  if (options.defect !== undefined) {
    if (!Object.hasOwn(DEFECTS, options.defect)) {
      throw new RangeError(
        `unknown defect "${options.defect}"; use one of: ${Object.keys(DEFECTS).join(", ")}`,
      );
    }
    defect = DEFECTS[options.defect];
    if (defect.layouts && !defect.layouts.includes(layout)) {
      throw new RangeError(
        `the defect "${options.defect}" exists only on the ${defect.layouts.join(", ")} ` +
          `layout, not on "${layout}"; choose another layout or defect`,
      );
    }
  }
  const disc: Discretization = { ...CORRECT_DISCRETIZATION, ...defect?.discretization };
  const name = options.name ?? ["zoo", layout, options.defect].filter(Boolean).join("-");
  const description = { solver: "zoo", layout, defect: options.defect ?? null };
  const vertex = layout === "vertex";
  const assembleGeneral = vertex ? assembleVertex : assembleCell;
  const assembleConservative = vertex ? assembleConservativeVertex : assembleConservativeCell;
  return {
    info: { name, kind: "external", layout, scheme: "central", description },
    solve(task: SolveTask): Promise<SolveOutcome> {
      const started = performance.now();
      const grid = { layout, nx: task.nx, ny: task.ny };
      const seconds = () => (performance.now() - started) / 1000;
      if (task.scheme !== "central") {
        return Promise.resolve(emptyOutcome(
          "not-applicable",
          `the zoo solver implements only the central scheme, not "${task.scheme}"`,
          grid,
          { seconds: seconds(), description },
        ));
      }
      const conservative = task.case.form === "conservative";
      const mapped = needsMapped(task.case);
      const declined = mapped
        ? mappedDeclines(task.case)
        : conservative
        ? conservativeDeclines(task.case)
        : null;
      if (declined !== null) {
        return Promise.resolve(emptyOutcome("not-applicable", declined, grid, {
          seconds: seconds(),
          description,
        }));
      }
      try {
        const assemble = conservative ? assembleConservative : assembleGeneral;
        const kase = disc.robinWeights === "side-midpoint" ? weightsPerSide(task.case) : task.case;
        const system = mapped
          ? assembleMapped(kase, task.nx, task.ny, disc, layout)
          : assemble(kase, task.nx, task.ny, disc);
        const { u, pivoted } = solveBanded(system);
        const direct: Finished = {
          values: u,
          residualHistory: [
            residualNorm(system, new Float64Array(system.n)),
            residualNorm(system, u),
          ],
          iterations: 1,
          converged: true,
        };
        const finished = defect?.finish?.({
          system,
          direct,
          layout,
          mx: vertex ? task.nx + 1 : task.nx,
          my: vertex ? task.ny + 1 : task.ny,
          tolerance: task.tolerance,
        }) ?? direct;
        const points = casePoints(task.case, layout, task.nx, task.ny);
        return Promise.resolve({
          status: "ok",
          layout,
          nx: task.nx,
          ny: task.ny,
          x: points.x,
          y: points.y,
          weights: points.weights,
          boundaryBand: points.boundaryBand,
          values: finished.values,
          residualHistory: finished.residualHistory,
          iterations: finished.iterations,
          converged: finished.converged,
          solverSeconds: null,
          seconds: seconds(),
          description: { ...description, pivoted },
        });
      } catch (error) {
        return Promise.resolve(emptyOutcome(
          "failed",
          `the zoo solver could not solve the system: ${(error as Error).message}`,
          grid,
          { seconds: seconds(), description },
        ));
      }
    },
    close(): Promise<void> {
      return Promise.resolve();
    },
  };
}

/** The case with each Robin side's α and β frozen to their values at the side's midpoint. */
function weightsPerSide(kase: CompiledCase): CompiledCase {
  const boundary = { ...kase.boundary };
  for (const side of SIDES) {
    const b = boundary[side];
    if (b.kind !== "robin") continue;
    const alpha = b.alpha!(...sideMidpoint(kase.domain, side)),
      beta = b.beta!(...sideMidpoint(kase.domain, side));
    boundary[side] = { ...b, alpha: () => alpha, beta: () => beta };
  }
  // a view, not a copy: copying would run the case's lazy getters (formulas simplify with mathjs)
  return Object.create(kase, { boundary: { value: boundary, enumerable: true } });
}
