/**
 * Stretched grid families caught at the harness (issue 14): a solver that differences a stretched
 * grid as if it were uniform (the data at the mapped nodes, the stencil with equal steps) must
 * fail the order with the place named, while its twin (the same solver given the node
 * coordinates) passes on both library families. The comparison is the case's manufactured exact
 * solution; the twin is the reference solver's non-uniform scheme, the defect drops only
 * `Problem.coordinates`.
 */
import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import { casePoints, type Solver, type SolveTask } from "../../harness/solvers/mod.ts";
import { solve } from "../../reference-solver/mod.ts";

/** The reference solver, with or without the node coordinates of the stretched family. */
function solver(name: string, uniformSpacing: boolean): Solver {
  return {
    info: { name, kind: "reference", layout: "vertex", scheme: "central", iterationGrowth: 0 },
    solve(task: SolveTask) {
      const problem = task.case.sample(task.nx, task.ny);
      if (uniformSpacing) delete problem.coordinates;
      const result = solve(problem, { stop: { tolerance: task.tolerance } });
      const points = casePoints(task.case, "vertex", task.nx, task.ny);
      return Promise.resolve({
        status: "ok" as const,
        layout: "vertex" as const,
        nx: task.nx,
        ny: task.ny,
        ...points,
        values: result.solution,
        residualHistory: result.residualHistory,
        iterations: result.cycles,
        converged: result.converged,
        solverSeconds: null,
        seconds: 0,
      });
    },
    close: () => Promise.resolve(),
  };
}

for (const id of ["stretched-wall-layer", "geometric-stretch"]) {
  Deno.test(`uniform spacing on the ${id} family fails the order naming the place; the twin with coordinates passes`, async () => {
    const kase = await loadCase(id);
    const grids = [16, 32, 64];
    const bad = await runCampaign([kase], [solver("uniform-spacing", true)], { grids });
    const good = await runCampaign([kase], [solver("mapped", false)], { grids });
    const order = bad.studies[0].verdicts.find((v) => v.criterion === "order");
    assert.equal(order?.status, "fail", JSON.stringify(bad.studies[0].verdicts, null, 1));
    assert.match(order!.reason, /interior|boundary|corner|everywhere|edge/);
    for (const v of good.studies[0].verdicts) {
      assert.notEqual(v.status, "fail", `${v.criterion}: ${v.reason}`);
    }
  });
}
