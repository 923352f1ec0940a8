import assert from "node:assert/strict";
import { renderText } from "./text.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("renderText() prints a table per case and solver with every grid and the verdicts", () => {
  const result = makeFixtureResult();
  const text = renderText(result);
  for (const study of result.studies) {
    assert.ok(text.includes(`  solver ${study.solver} (expected order 2)`));
    for (const v of study.verdicts) assert.ok(text.includes(v.reason), v.reason);
  }
  // 4 studies × 4 grids
  assert.equal(text.match(/^ {4}(9×9|17×17|33×33|65×65) /gm)?.length, 16);
  assert.match(text, /65×65 +0\.01563 +failed: the solver stopped after 20000 iterations/);
  assert.match(text, /18 pass · 4 fail · 0 undecided · 2 warn · 0 not applicable — exit code 1\n$/);
});

Deno.test("renderText() shows the pairwise order computed from the errors in the row", () => {
  const result = makeFixtureResult();
  const text = renderText(result);
  const solves = result.solves.filter((s) =>
    s.caseId === "robin-variable" && s.solver === "team-gs"
  );
  // derived: ln(E_9/E_17)/ln 2 from the fixture's max errors, shown with two decimals
  const p = Math.log(solves[0].errors!.all.max / solves[1].errors!.all.max) / Math.log(2);
  assert.match(text, new RegExp(`17×17 +0\\.0625 +\\S+ +\\S+ +${p.toFixed(2)} `));
  assert.equal(p.toFixed(2), "1.07");
});

Deno.test("renderText() colours only when asked and neutralises control characters", () => {
  const result = makeFixtureResult();
  assert.ok(!renderText(result).includes("\x1b"));
  assert.ok(renderText(result, { color: true }).includes("\x1b[1;31mFAIL"));
  result.cases[0].title = "evil\x1b[2J title\nsecond line";
  const text = renderText(result, { color: false });
  assert.ok(!text.includes("\x1b"));
  assert.ok(text.includes("poisson-sine — evil?[2J title second line"));
});

Deno.test("renderText() names the builds and what it found before any table", () => {
  const text = renderText(makeFixtureResult(), { width: 90 });
  const builds = text.indexOf("Builds under test:");
  const failed = text.indexOf("Failed (2, from 4 failing verdicts):");
  const warnings = text.indexOf("Warnings (2;");
  const firstTable = text.indexOf("  solver reference");
  assert.ok(builds > 0 && builds < failed && failed < warnings && warnings < firstTable, text);
  // the fixture's team-gs reports its name, version and build with every reply
  assert.match(text, /team-gs +team-gs 0\.9\.1 \(build 4f2a9c1\) · python3 examples/);
  // the three order verdicts (one per norm) are one defect
  assert.match(text, /FAIL {2}robin-variable × team-gs {2}order \(max, L2 and L1 norms\)/);
  // the warning's reason is shown, with the pairs that gave it
  assert.match(text, /- iterations grow with the number of unknowns \(exponent 0\.98\)/);
  assert.match(text, /\n {10}in poisson-sine \(team-gs\); robin-variable \(team-gs\)\n/);
  for (const line of text.slice(0, firstTable).split("\n")) {
    assert.ok([...line].length <= 90 || !line.trim().includes(" "), `wrapped: ${line}`);
  }
});
