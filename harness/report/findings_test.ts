import assert from "node:assert/strict";
import { findingsOf } from "./findings.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("findingsOf() folds the norms of one defect into one failure and keeps the others apart", () => {
  const found = findingsOf(makeFixtureResult());
  // the fixture: team-gs fails order in three norms and convergence on robin-variable
  assert.deepEqual(
    found.failures.map((f) => [f.caseId, f.solver, f.criterion, f.measures, f.verdicts.length]),
    [
      ["robin-variable", "team-gs", "order", ["max", "L2", "L1"], 3],
      ["robin-variable", "team-gs", "convergence", [], 1],
    ],
  );
  assert.match(found.failures[0].reason, /max-norm error/);
  assert.deepEqual(found.undecided, []);
});

Deno.test("findingsOf() groups warnings by criterion, then by identical reason with their pairs", () => {
  const result = makeFixtureResult();
  const extra = result.studies[0].verdicts[0];
  result.studies[0].verdicts.push({
    ...extra,
    criterion: "asymptotic-range",
    status: "warn",
    reason: "moves",
  });
  const found = findingsOf(result);
  assert.deepEqual(found.warnings.map((g) => [g.criterion, g.count, g.cases.length]), [
    ["grid-independence", 2, 2],
    ["asymptotic-range", 1, 1],
  ]);
  const [same] = found.warnings[0].reasons;
  assert.deepEqual(same.pairs.map((p) => p.caseId), ["poisson-sine", "robin-variable"]);
});
