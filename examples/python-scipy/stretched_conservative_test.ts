/**
 * The Python example's conservative (flux) form on stretched grids, end to end through `check`:
 * a variable conductivity, advection and reaction on a tanh × geometric family, Dirichlet on every
 * side (both layouts) and with a Neumann side (cell layout; the vertex layout takes Dirichlet
 * sides only on stretched grids and declines it).
 *
 * Outside references: each case's manufactured solution (`check` measures the error against it
 * and judges the observed order), and the reference solver's vertex flux form documented in
 * reference-solver/discretize_stretched.ts, which stretched.py implements independently — the
 * same discrete system, so their errors agree to the solvers' algebraic tolerance.
 */
import assert from "node:assert/strict";
import { findScipyPython, runGridproof } from "../../testing/mod.ts";

const SCIPY = await findScipyPython();
const SKIP = SCIPY ? "" : " (skipped: Debian python3-scipy not installed)";
const HERE = "examples/python-scipy/testdata";

Deno.test({
  name:
    `gridproof check: the SciPy example's stretched flux form reaches order 2 on both layouts and its vertex errors equal the reference solver's${SKIP}`,
  ignore: !SCIPY,
  fn: async () => {
    const dir = await Deno.makeTempDir();
    const run = await runGridproof([
      "check",
      "--case-file",
      `${HERE}/stretched-conservative.json`,
      `${HERE}/stretched-conservative-neumann.json`,
      "--solvers",
      "examples/solvers.json",
      "--solver",
      "reference,python-scipy,python-scipy-cell",
      "--grids",
      "16,32,64",
      "--no-isolation",
      "--out",
      dir,
      "--no-progress",
    ]);
    assert.equal(run.code, 0, run.stdout + run.stderr);
    const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
    type Study = { solver: string; caseId: string; verdicts: { status: string }[] };
    type Solve = {
      solver: string;
      caseId: string;
      nx: number;
      status: string;
      reason?: string;
      errors?: { all: { max: number } };
    };
    const judged = [
      ["python-scipy", "stretched-conservative"],
      ["python-scipy-cell", "stretched-conservative"],
      ["python-scipy-cell", "stretched-conservative-neumann"],
    ];
    for (const [solver, caseId] of judged) {
      const s = result.studies.find((x: Study) => x.solver === solver && x.caseId === caseId);
      assert.ok(s, `${solver} × ${caseId} has a study`);
      assert.ok(s.verdicts.length > 0);
      assert.deepEqual(
        s.verdicts.filter((v: { status: string }) => v.status !== "pass"),
        [],
        `${solver} × ${caseId}`,
      );
    }
    const solves: Solve[] = result.solves;
    const declined = solves.filter((s) =>
      s.solver === "python-scipy" && s.caseId === "stretched-conservative-neumann"
    );
    assert.ok(declined.length > 0 && declined.every((s) => s.status === "not-applicable"));
    for (const n of [16, 32, 64]) {
      const at = (solver: string) =>
        solves.find((s) =>
          s.solver === solver && s.caseId === "stretched-conservative" && s.nx === n
        )!.errors!.all.max;
      const rel = Math.abs(at("python-scipy") - at("reference")) / at("reference");
      // both solve one discrete system: the difference is the multigrid's algebraic error, far
      // below the discretization error (common practice); a different scheme differs at O(1)
      assert.ok(rel < 1e-5, `n = ${n}: max errors differ by ${rel} relative`);
    }
  },
});
