import assert from "node:assert/strict";
import { renderMarkdown } from "./markdown.ts";
import { HOSTILE_TEXT, makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("renderMarkdown() puts the failures first, then warnings, then the table and caution", () => {
  const md = renderMarkdown(makeFixtureResult());
  assert.match(md, /^### gridproof: 2 failed, 0 undecided, 2 warnings, 12 passed\n/);
  const failures = md.indexOf("**Failures**");
  const warnings = md.indexOf("**Warnings**");
  const table = md.indexOf("| case | solver |");
  const caution = md.indexOf("> **Caution.** Code verification shows");
  assert.ok(failures > 0 && failures < warnings && warnings < table && table < caution);
  const rows = md.split("\n").filter((l) => /^\| [a-z]/.test(l) && !l.startsWith("| case"));
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
