import assert from "node:assert/strict";
import { rendererFor, RENDERERS } from "./registry.ts";
import { parseResult } from "../result/read.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

Deno.test("RENDERERS renders the fixture in every format", async () => {
  const result = makeFixtureResult();
  assert.deepEqual(Object.keys(RENDERERS), ["text", "html", "md", "csv", "junit", "json"]);
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
    () => rendererFor("pdf"),
    (e: unknown) =>
      e instanceof RangeError &&
      e.message === 'unknown report format "pdf": use one of text, html, md, csv, junit, json',
  );
  assert.throws(() => rendererFor("toString"), RangeError);
});
