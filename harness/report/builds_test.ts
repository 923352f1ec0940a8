import assert from "node:assert/strict";
import { buildRows, reportedLine } from "./builds.ts";
import { renderText } from "./text.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("buildRows() counts what each solve reported and flags a build that changed", () => {
  const result = makeFixtureResult();
  // one team-gs solve answered from another build (as a solver replaced mid-campaign would)
  const solve = result.solves.find((s) => s.solver === "team-gs" && s.status === "ok")!;
  solve.description = { solver: { name: "team-gs", version: "0.9.2", build: "77aa001" } };
  const row = buildRows(result).find((r) => r.solver === "team-gs")!;
  assert.equal(row.changed, true);
  assert.deepEqual(row.reported.map((r) => r.text), [
    "team-gs 0.9.1 (build 4f2a9c1)",
    "team-gs 0.9.2 (build 77aa001)",
  ]);
  assert.equal(row.reported[1].solves, 1);
  assert.match(reportedLine(row), /team-gs 0\.9\.2 \(build 77aa001\) on 1 solves/);
  assert.match(renderText(result), /THE BUILD CHANGED DURING THE CAMPAIGN/);
});

Deno.test("buildRows() reads a result written before builds were recorded", () => {
  const result = makeFixtureResult();
  for (const s of result.solvers) delete s.build;
  for (const s of result.solves) delete s.description;
  const rows = buildRows(result);
  assert.deepEqual(rows.map((r) => r.files.length), [0, 0]);
  assert.equal(rows[0].reported[0].text, "gridproof reference solver 0.1.0");
  assert.equal(rows[1].reported[0].text, "no name or version reported");
  assert.equal(rows[1].changed, false);
});
