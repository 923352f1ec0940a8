/**
 * The rank-count check end to end with real MPI (Debian's Open MPI and mpi4py): the MPI example
 * (examples/mpi-python) passes at 1 and 3 ranks, and its twin with a seeded rank-dependent defect
 * (boundary data read at each rank's local row, defined in examples/mpi-python/solver.py) passes
 * every order verdict on its 1-rank grid sequence yet fails "rank-invariance". The reference for
 * "right" is the defect's definition: the twin without it is the same program.
 */
import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import { createExternalSolver, loadSolverFile } from "../../harness/solvers/mod.ts";
import { mpiMissing } from "../../testing/mpi.ts";

const MISSING = await mpiMissing();
const SKIP = MISSING ? ` (skipped: ${MISSING})` : "";

Deno.test({
  name: `the rank-count check passes the MPI example and fails its seeded per-rank boundary ` +
    `defect, which every order verdict misses on 1 rank${SKIP}`,
  ignore: MISSING !== undefined,
  fn: async () => {
    const specs = await loadSolverFile("examples/cluster/solvers.json");
    const solvers = specs.filter((s) => s.name.startsWith("mpi-local")).map((s) =>
      createExternalSolver(s, { solverFileDir: s.solverFileDir })
    );
    const out = await Deno.makeTempDir();
    try {
      const cases = [await loadCase("smooth-baseline"), await loadCase("variable-all")];
      const result = await runCampaign(cases, solvers, {
        grids: [16, 32, 64],
        jobs: 2,
        isolation: false,
        refine: { maxAdded: 0 },
        outDir: out,
      });
      for (const study of result.studies) {
        const where = `${study.caseId} × ${study.solver}`;
        const rank = study.verdicts.find((v) => v.criterion === "rank-invariance");
        assert.ok(rank, `${where}: a rank-invariance verdict`);
        const orders = study.verdicts.filter((v) => v.criterion === "order");
        assert.ok(orders.length > 0 && orders.every((v) => v.status === "pass"), where);
        const comparisons = (rank.details as { comparisons: { difference: number }[] })
          .comparisons;
        if (study.solver === "mpi-local") {
          assert.equal(rank.status, "pass", `${where}: ${rank.reason}`);
          assert.ok(comparisons[0].difference < 1e-7, where);
        } else {
          assert.equal(rank.status, "fail", `${where}: ${rank.reason}`);
          assert.match(rank.reason, /depends on the rank count/);
          assert.ok(comparisons[0].difference > 1e-3, where);
        }
      }
      // both solves of each pair are journaled with their rank count, the comparison on the second
      const lines = (await Deno.readTextFile(`${out}/journal.jsonl`)).trim().split("\n")
        .map((l) => JSON.parse(l)).filter((e) => e.kind === "solve" && e.record.ranks);
      assert.equal(lines.length, 8);
      assert.equal(lines.filter((e) => e.record.rankComparison).length, 4);
    } finally {
      await Promise.all(solvers.map((s) => s.close()));
      await Deno.remove(out, { recursive: true });
    }
  },
});
