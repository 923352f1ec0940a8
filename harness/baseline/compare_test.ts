import assert from "node:assert/strict";
import { compareWithBaseline } from "./compare.ts";
import type { CampaignResult, Verdict } from "../result/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

function clone<T>(x: T): T {
  return JSON.parse(JSON.stringify(x));
}

function study(r: CampaignResult, caseId: string, solver: string) {
  return r.studies.find((s) => s.caseId === caseId && s.solver === solver)!;
}

function solve(r: CampaignResult, caseId: string, solver: string, nx: number) {
  return r.solves.find((s) => s.caseId === caseId && s.solver === solver && s.nx === nx)!;
}

function key(v: Verdict): string {
  return `${v.caseId}/${v.solver}/${v.criterion}`;
}

/**
 * A constructed pair: the "current" run is the baseline on a machine three times slower (every
 * time ×3), with exactly four degradations planted by hand.
 */
function degradedPair() {
  const baseline = makeFixtureResult();
  const current = makeFixtureResult({ machineScale: 3 });
  // 1. the max-norm order of team-gs on poisson-sine falls from 2.03 to 1.80
  const order = study(current, "poisson-sine", "team-gs").orders.find((o) =>
    o.region === "all" && o.norm === "max"
  )!;
  order.fitted.order = 1.8;
  // 2. the reference solver starts failing its convergence criterion on poisson-sine
  study(current, "poisson-sine", "reference").verdicts.find((v) => v.criterion === "convergence")!
    .status = "fail";
  // 3. the reference solver needs 12 instead of 9 iterations on the 33×33 robin-variable grid
  solve(current, "robin-variable", "reference", 33).iterations = 12;
  // 4. team-gs is 1.5× slower on the 33×33 robin-variable grid while the reference is not
  solve(current, "robin-variable", "team-gs", 33).seconds *= 1.5;
  return { baseline, current };
}

Deno.test("compareWithBaseline() flags exactly the four planted degradations", () => {
  const { baseline, current } = degradedPair();
  const verdicts = compareWithBaseline(current, baseline);
  const failed = verdicts.filter((v) => v.status === "fail").map(key).sort();
  assert.deepEqual(failed, [
    "poisson-sine/reference/baseline-status",
    "poisson-sine/team-gs/baseline-order",
    "robin-variable/reference/baseline-iterations",
    "robin-variable/team-gs/baseline-time",
  ]);
  // 4 studies × 4 criteria, no study added or dropped
  assert.equal(verdicts.length, 16);
  const byKey = new Map(verdicts.map((v) => [key(v), v]));
  assert.match(
    byKey.get("poisson-sine/team-gs/baseline-order")!.reason,
    /max error on all nodes fell from 2\.03 to 1\.80/,
  );
  assert.match(
    byKey.get("robin-variable/reference/baseline-iterations")!.reason,
    /33×33 from 9 to 12 \(\+33 %\)/,
  );
  assert.match(byKey.get("robin-variable/team-gs/baseline-time")!.reason, /\+50 %/);
  assert.match(byKey.get("poisson-sine/reference/baseline-status")!.reason, /now fails/);
  // robin-variable/team-gs failed in the baseline already: not a new regression
  assert.equal(byKey.get("robin-variable/team-gs/baseline-status")!.status, "warn");
  // the reference solver is the yardstick of time, so its own time is not judged
  assert.equal(byKey.get("poisson-sine/reference/baseline-time")!.status, "not-applicable");
});

Deno.test("compareWithBaseline() judges time relative to the reference, so a slower machine passes", () => {
  const baseline = makeFixtureResult();
  const slower = makeFixtureResult({ machineScale: 3 });
  const verdicts = compareWithBaseline(slower, baseline);
  assert.deepEqual(verdicts.filter((v) => v.status === "fail").map(key), []);
  const time = verdicts.find((v) => key(v) === "poisson-sine/team-gs/baseline-time")!;
  assert.equal(time.status, "pass");
  // derived: every ratio is unchanged, so each grid's growth is 0 (to round-off)
  for (const row of (time.details!.grids as { growth: number }[])) {
    assert.ok(Math.abs(row.growth) < 1e-12, String(row.growth));
  }
  // but the external solver alone slowing down is caught on every timed grid
  const slowSolver = makeFixtureResult({ timeScale: 1.4 });
  const v = compareWithBaseline(slowSolver, baseline).filter((x) =>
    x.criterion === "baseline-time" && x.status === "fail"
  );
  assert.deepEqual(v.map(key).sort(), [
    "poisson-sine/team-gs/baseline-time",
    "robin-variable/team-gs/baseline-time",
  ]);
});

Deno.test("compareWithBaseline() applies the growth limits strictly", async (t) => {
  await t.step("exactly 20 % more iterations passes, one more fails", () => {
    const baseline = makeFixtureResult();
    const current = clone(baseline);
    solve(baseline, "poisson-sine", "team-gs", 9).iterations = 10;
    solve(current, "poisson-sine", "team-gs", 9).iterations = 12;
    const pass = compareWithBaseline(current, baseline).find((v) =>
      key(v) === "poisson-sine/team-gs/baseline-iterations"
    )!;
    assert.equal(pass.status, "pass");
    solve(current, "poisson-sine", "team-gs", 9).iterations = 13;
    const fail = compareWithBaseline(current, baseline).find((v) =>
      key(v) === "poisson-sine/team-gs/baseline-iterations"
    )!;
    assert.equal(fail.status, "fail");
  });
  await t.step("an order drop within the tolerance passes, beyond it fails", () => {
    const baseline = makeFixtureResult();
    const current = clone(baseline);
    const o = study(current, "poisson-sine", "reference").orders[0];
    const before = o.fitted.order!;
    o.fitted.order = before - 0.05;
    const find = (vs: Verdict[]) =>
      vs.find((v) => key(v) === "poisson-sine/reference/baseline-order")!;
    assert.equal(
      find(compareWithBaseline(current, baseline, { orderTolerance: 0.1 })).status,
      "pass",
    );
    assert.equal(
      find(compareWithBaseline(current, baseline, { orderTolerance: 0.02 })).status,
      "fail",
    );
  });
  await t.step("an identical run passes every criterion that applies", () => {
    const r = makeFixtureResult();
    const statuses = new Set(compareWithBaseline(r, clone(r)).map((v) => v.status));
    assert.ok(!statuses.has("fail"));
  });
});

Deno.test("compareWithBaseline() reports studies added and dropped since the baseline", () => {
  const baseline = makeFixtureResult();
  const current = clone(baseline);
  current.studies = current.studies.filter((s) =>
    s.solver !== "team-gs" || s.caseId !== "poisson-sine"
  );
  baseline.studies = baseline.studies.filter((s) =>
    s.caseId !== "robin-variable" || s.solver !== "reference"
  );
  const verdicts = compareWithBaseline(current, baseline);
  const dropped = verdicts.find((v) => key(v) === "poisson-sine/team-gs/baseline-status")!;
  assert.equal(dropped.status, "warn");
  assert.match(dropped.reason, /ran in the baseline but not in this run/);
  const added = verdicts.filter((v) => v.caseId === "robin-variable" && v.solver === "reference");
  assert.deepEqual(added.map((v) => [v.criterion, v.status]), [[
    "baseline-status",
    "not-applicable",
  ]]);
});

Deno.test("compareWithBaseline() leaves out solves too short to time", () => {
  const r = makeFixtureResult();
  const verdicts = compareWithBaseline(r, clone(r), { minSeconds: 100 });
  const time = verdicts.find((v) => key(v) === "poisson-sine/team-gs/baseline-time")!;
  assert.equal(time.status, "not-applicable");
  assert.match(time.reason, /too short to time reliably/);
});

Deno.test("compareWithBaseline() refuses a negative tolerance with a RangeError", () => {
  const r = makeFixtureResult();
  assert.throws(
    () => compareWithBaseline(r, r, { iterationGrowth: -0.1 }),
    (e: unknown) => e instanceof RangeError && /iterationGrowth is -0\.1/.test(e.message),
  );
});
