import assert from "node:assert/strict";
import { renderHtml } from "./html.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("renderHtml() makes one page with an SVG for every plot and no script", async () => {
  const result = makeFixtureResult();
  const html = await renderHtml(result);
  assert.match(html, /^<!DOCTYPE html>/);
  // 2 cases × (errors + 2 residual histories + cost)
  assert.equal(html.match(/<figure class="plot[^"]*"[^>]*><svg /g)?.length, 8);
  assert.equal(html.match(/data-plot="errors"/g)?.length, 2);
  assert.equal(html.match(/data-plot="residuals"/g)?.length, 4);
  assert.equal(html.match(/data-plot="cost"/g)?.length, 2);
  assert.ok(!/<script/i.test(html));
  // nothing is fetched: no src attributes, no stylesheet links, no remote url() or @import
  assert.ok(!/\ssrc=/i.test(html));
  assert.ok(!/<link/i.test(html));
  assert.ok(!/url\((?!#)/i.test(html));
  assert.ok(!/@import/i.test(html));
  assert.match(html, /Code verification shows that the discrete equations are solved correctly/);
});

Deno.test("renderHtml() shows formulas, GCI table, coverage, verdicts and the environment", async () => {
  const result = makeFixtureResult();
  result.configuration.baseline = "release-1.3/result.json";
  const html = await renderHtml(result);
  // typeset as MathML with the expression text kept as alternative text
  assert.ok(html.includes(`<math alttext="sin(pi*x)*sin(pi*y)"`));
  assert.ok(html.includes(`<math alttext="1 + 0.5*x*y"`));
  // MathML Core: sin(πx) is the function name, an invisible function application and the argument
  assert.match(html, /<mi>sin<\/mi><mo>&#x2061;<\/mo>/);
  assert.match(html, /<mi>&#x3C0;<\/mi>/);
  // one audit per case, each over the quantity of both solvers
  const audits = html.match(
    /Coverage audit:<\/strong> the finest-grid GCI band contained the true error in (\d) of (\d) quantities/g,
  );
  assert.equal(audits?.length, 2);
  assert.ok(audits!.every((a) => a.endsWith("in 2 of 2 quantities")), String(audits));
  for (const v of result.studies.flatMap((s) => s.verdicts)) {
    assert.ok(html.includes(v.reason.replaceAll("<", "&lt;")), v.reason);
  }
  assert.ok(html.includes("<code>python3 examples/python/gauss_seidel.py --tol 1e-10</code>"));
  assert.ok(html.includes("ci-runner-3 (linux, x86_64, 2 CPUs)"));
  assert.ok(html.includes("release-1.3/result.json"));
  assert.ok(html.includes("2025-01-15T10:30:00.000Z"));
});

Deno.test("renderHtml() escapes markup from titles, notes, formulas and reasons", async () => {
  const result = makeFixtureResult({ hostile: true });
  result.solvers[1].name = "<b>gs</b>";
  for (const s of result.solves) if (s.solver === "team-gs") s.solver = "<b>gs</b>";
  for (const s of result.studies) if (s.solver === "team-gs") s.solver = "<b>gs</b>";
  const html = await renderHtml(result);
  assert.ok(!html.includes("<img"));
  assert.ok(!/<script/i.test(html));
  assert.ok(!html.includes("</svg><script"));
  assert.ok(!html.includes("<b>gs"));
  assert.ok(html.includes("&lt;img src=x onerror=alert(1)&gt;&lt;/svg&gt;&lt;script&gt;"));
  assert.ok(html.includes("&lt;b&gt;gs&lt;/b&gt;"));
});
