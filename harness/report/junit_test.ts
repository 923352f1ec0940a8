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
  assert.ok(xml.includes('name="order&quot;&gt;&lt;x"'));
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
    details: { norm: "l1" },
  });
  const xml = renderJunit(result);
  assert.match(
    xml,
    /<testcase name="order \(l1 norm\)"[^>]*>\s*<error message="undecided: below 2/,
  );
  assert.match(xml, /<testsuites name="gridproof" tests="\d+" failures="\d+" errors="1"/);
});
