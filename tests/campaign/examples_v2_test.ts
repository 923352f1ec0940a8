/**
 * The SciPy example speaks protocol version 2 and passes the cases of the new operator forms
 * (issue 13) end to end through `check`, on both layouts: the conservative form from K at the
 * faces (layered jumps of 100 and 10^4, a rotated full tensor, a smooth variable K) and the
 * non-conservative form with u_xy. The outside reference is each case's manufactured solution:
 * `check` measures the error against it and judges the observed order. The deno-sor example
 * speaks version 1 and gets every one of these studies as not applicable, with the reason.
 */
import assert from "node:assert/strict";
import { findScipyPython, runGridproof } from "../../testing/mod.ts";

const SCIPY = await findScipyPython();
const SKIP = SCIPY ? "" : " (skipped: Debian python3-scipy not installed)";
const CASES = [
  "conservative-smooth",
  "rotated-anisotropy",
  "mixed-derivative",
  "layered-jump-100",
  "layered-jump-10000",
  "variable-robin-edge",
];

Deno.test({
  name:
    `gridproof check: the SciPy example passes the six new cases on both layouts; a version 1 solver gets them as not applicable${SKIP}`,
  ignore: !SCIPY,
  fn: async () => {
    const dir = await Deno.makeTempDir();
    const run = await runGridproof([
      "check",
      "--solvers",
      "examples/solvers.json",
      "--solver",
      "python-scipy,python-scipy-cell,deno-sor",
      "--cases",
      CASES.join(","),
      "--grids",
      "16,32,64",
      "--no-isolation",
      "--out",
      dir,
      "--no-progress",
    ]);
    assert.equal(run.code, 0, run.stdout + run.stderr);
    const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
    type Study = {
      solver: string;
      caseId: string;
      verdicts: { status: string; criterion: string }[];
    };
    const study = (solver: string, caseId: string): Study =>
      result.studies.find((s: Study) => s.solver === solver && s.caseId === caseId);
    for (const caseId of CASES) {
      for (const solver of ["python-scipy", "python-scipy-cell"]) {
        const s = study(solver, caseId);
        assert.ok(s, `${solver} × ${caseId} has a study`);
        assert.deepEqual(
          s.verdicts.filter((v) => v.status === "fail" || v.status === "undecided"),
          [],
          `${solver} × ${caseId}`,
        );
        assert.ok(s.verdicts.some((v) => v.criterion === "order"), `${solver} × ${caseId} order`);
      }
    }
    const declined = result.solves.filter((s: { solver: string }) => s.solver === "deno-sor");
    assert.equal(declined.length, CASES.length * 3);
    for (const s of declined) {
      assert.equal(s.status, "not-applicable");
      assert.match(
        s.reason,
        /speaks protocol 1, which has no (conservative form|mixed term|Robin weights that vary)/,
      );
    }
    await Deno.remove(dir, { recursive: true });
  },
});
