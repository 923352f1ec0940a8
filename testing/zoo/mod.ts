/**
 * The defect zoo: an in-process solver for tests that discretizes a case's operator itself with
 * second-order central differences (vertex or cell layout), solves the system directly, and can
 * carry one seeded, realistic bug from {@link DEFECTS} — a wrong boundary closure, a shifted
 * sample, a lying convergence flag, a scrambled output. Tests of the analysis use it to check
 * that each bug is caught and placed.
 *
 * @example
 * ```ts
 * import { loadCase } from "../../cases/mod.ts";
 * import { createZooSolver, DEFECTS } from "./mod.ts";
 * const c = await loadCase("neumann-all");
 * const good = createZooSolver({ layout: "vertex" });
 * const bad = createZooSolver({ layout: "vertex", defect: "neumann-one-sided" });
 * const task = { case: c, nx: 16, ny: 16, scheme: "central" as const, tolerance: 1e-10 };
 * const [a, b] = [await good.solve(task), await bad.solve(task)];
 * a.status === "ok" && b.status === "ok"; // true
 * DEFECTS["neumann-one-sided"].place; // "the Neumann sides"
 * ```
 *
 * @module
 */
export { createZooSolver, type ZooSolverOptions } from "./zoo_solver.ts";
export {
  CORRECT_DISCRETIZATION,
  type Defect,
  type DefectName,
  DEFECTS,
  type Discretization,
  type FinishContext,
  type Finished,
} from "./defects.ts";
