import assert from "node:assert/strict";
import { renderMarkdown } from "./markdown.ts";
import { HOSTILE_TEXT, makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("renderMarkdown() puts the failures first, then warnings, then the table and caution", () => {
  const md = renderMarkdown(makeFixtureResult());
  // the fixture's team-gs fails order (three norms, one defect) and convergence on robin-variable
  assert.match(
    md,
    /^### gridproof: 2 failures \(4 failing verdicts\), 0 undecided, 2 warnings, 18 passed\n/,
  );
  const builds = md.indexOf("**Builds under test**");
  assert.ok(builds > 0 && builds < md.indexOf("**Failures**"));
  assert.match(md, /\| team-gs \| team-gs 0\.9\.1 \(build 4f2a9c1\) \|/);
  assert.match(md, /- \*\*FAIL\*\* robin-variable · team-gs · order \(max, L2 and L1 norms\) — /);
  const failures = md.indexOf("**Failures**");
  const warnings = md.indexOf("**Warnings**");
  const table = md.indexOf("| case | solver |");
  const caution = md.indexOf("> **Caution.** Code verification shows");
  assert.ok(failures > 0 && failures < warnings && warnings < table && table < caution);
  const rows = md.slice(table).split("\n").filter((l) =>
    /^\| [a-z]/.test(l) && !l.startsWith("| case")
  );
  assert.equal(rows.length, 4);
  assert.match(
    rows[0],
    /^\| robin-variable \| team-gs \| 1\.05 \| 2 \| 20000 \| FAIL: order, convergence \|$/,
  );
  assert.match(md, /does not validate the physical model/);
});

Deno.test("renderMarkdown() escapes markup and table pipes from the result", () => {
  const result = makeFixtureResult({ hostile: true });
  result.studies[3].verdicts[0].reason = "a | b " + HOSTILE_TEXT;
  const md = renderMarkdown(result);
  assert.ok(!md.includes("<img"), "no raw HTML reaches the comment");
  assert.ok(!md.includes("<script"));
  assert.ok(md.includes("a \\| b &lt;img src=x onerror=alert(1)&gt;"));
});
