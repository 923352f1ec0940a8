import assert from "node:assert/strict";
import { renderJunit } from "./junit.ts";
import { compareWithBaseline } from "../baseline/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

function withBaseline() {
  const result = makeFixtureResult({ timeScale: 1.5 });
  result.baselineVerdicts = compareWithBaseline(result, makeFixtureResult());
  return result;
}

Deno.test("renderJunit() writes one test case per verdict, study and baseline alike", () => {
  const result = withBaseline();
  const xml = renderJunit(result);
  const verdicts = [...result.studies.flatMap((s) => s.verdicts), ...result.baselineVerdicts];
  assert.equal(xml.match(/<testcase /g)?.length, verdicts.length);
  assert.equal(
    xml.match(/<failure /g)?.length,
    verdicts.filter((v) => v.status === "fail").length,
  );
  assert.equal(
    xml.match(/<skipped /g)?.length,
    verdicts.filter((v) => v.status === "not-applicable").length,
  );
  assert.equal(
    xml.match(/<system-out>warning: /g)?.length,
    verdicts.filter((v) => v.status === "warn").length,
  );
  assert.equal(xml.match(/<testsuite /g)?.length, 4, "one suite per case × solver");
  assert.match(xml, new RegExp(`<testsuites name="gridproof" tests="${verdicts.length}" `));
  // baseline verdicts sit in the suite of their case and solver
  const suite = xml.slice(xml.indexOf('<testsuite name="robin-variable · team-gs"'));
  const end = suite.indexOf("</testsuite>");
  assert.match(suite.slice(0, end), /<testcase name="baseline-time"[^>]*>\s*<failure /);
});

Deno.test("renderJunit() escapes markup in names, reasons and details", () => {
  const result = makeFixtureResult({ hostile: true });
  result.studies[0].verdicts[0].criterion = `order"><x`;
  const xml = renderJunit(result);
  assert.ok(!xml.includes("<img"));
  assert.ok(!xml.includes("<script"));
  assert.ok(!xml.includes("<x"));
  assert.ok(xml.includes('name="order&quot;&gt;&lt;x (max norm, all points)"'));
  assert.ok(xml.includes("&lt;img src=x onerror=alert(1)&gt;"));
});

Deno.test("renderJunit() reports an undecided verdict as an error, never as a pass", () => {
  const result = makeFixtureResult();
  const study = result.studies[0];
  study.verdicts.push({
    caseId: study.caseId,
    solver: study.solver,
    criterion: "order",
    status: "inconclusive",
    reason: "below 2 but rising toward it: refine further",
    details: { norm: "l1", region: "interior" },
  });
  const xml = renderJunit(result);
  assert.match(
    xml,
    /<testcase name="order \(L1 norm, interior points\)"[^>]*>\s*<error message="undecided: below 2/,
  );
  assert.match(xml, /<testsuites name="gridproof" tests="\d+" failures="\d+" errors="1"/);
});

Deno.test("renderJunit() names each order verdict by its norm and region, and no name repeats in a suite", () => {
  const result = makeFixtureResult();
  const xml = renderJunit(result);
  for (const suite of xml.split("<testsuite ").slice(1)) {
    const names = [...suite.matchAll(/<testcase name="([^"]*)"/g)].map((m) => m[1]);
    assert.equal(new Set(names).size, names.length, names.join(" | "));
    assert.ok(!names.some((n) => /\(\d+\)$/.test(n)), "no counter needed");
  }
  // the fixture gives one order verdict per norm on all points (testdata/report/fixture.ts)
  for (const norm of ["max", "L2", "L1"]) {
    assert.match(xml, new RegExp(`<testcase name="order \\(${norm} norm, all points\\)"`));
  }
});

Deno.test("renderJunit() names the solver's reported build, command and file digests as suite properties", () => {
  const xml = renderJunit(makeFixtureResult());
  assert.match(xml, /<property name="solver.reported" value="team-gs 0.9.1 \(build 4f2a9c1\)"\/>/);
  assert.match(
    xml,
    /<property name="solver.command" value="python3 examples\/python\/gauss_seidel.py --tol 1e-10"\/>/,
  );
  assert.match(
    xml,
    new RegExp(`<property name="solver.file" value="solvers.json sha256:${"1".repeat(64)}"/>`),
  );
});
