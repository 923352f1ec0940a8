import assert from "node:assert/strict";
import { rendererFor, RENDERERS } from "./registry.ts";
import { parseResult } from "../result/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("RENDERERS renders the fixture in every format", async () => {
  const result = makeFixtureResult();
  assert.deepEqual(Object.keys(RENDERERS), ["text", "html", "pdf", "md", "csv", "junit", "json"]);
  // a printed format renders the page the command line prints
  assert.equal(RENDERERS.pdf.printed, true);
  for (const renderer of Object.values(RENDERERS)) {
    const out = await renderer.render(result);
    assert.ok(out.length > 500, renderer.name);
    assert.ok(out.endsWith("\n"), renderer.name);
  }
});

Deno.test("the json format reads back to the same result", async () => {
  const result = makeFixtureResult();
  const text = await RENDERERS.json.render(result);
  assert.deepEqual(parseResult(text), JSON.parse(JSON.stringify(result)));
});

Deno.test("rendererFor() refuses an unknown format and lists the valid ones", () => {
  assert.equal(rendererFor("junit").extension, "xml");
  assert.throws(
    () => rendererFor("docx"),
    (e: unknown) =>
      e instanceof RangeError &&
      e.message ===
        'unknown report format "docx": use one of text, html, pdf, md, csv, junit, json',
  );
  assert.throws(() => rendererFor("toString"), RangeError);
});

Deno.test("every renderer copes with a result where every solve failed and no study exists", async () => {
  const result = makeFixtureResult();
  result.studies = [];
  for (const s of result.solves) {
    s.status = "failed";
    s.reason = "the solver process exited with code 139";
    delete s.errors;
    s.residualHistory = [];
    s.iterations = null;
  }
  result.summary = { pass: 0, fail: 0, warn: 0, notApplicable: 0, exitCode: 1 };
  for (const renderer of Object.values(RENDERERS)) {
    const out = await renderer.render(result);
    assert.ok(out.length > 0, renderer.name);
  }
  const html = await RENDERERS.html.render(result);
  assert.equal(html.match(/<figure class="plot"/g), null, "nothing to plot, no empty plots");
  assert.ok(html.includes("the solver process exited with code 139"));
});
