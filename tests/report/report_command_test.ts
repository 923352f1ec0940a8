/**
 * `gridproof report` end to end: the real command line in a subprocess, reading the saved
 * fixture result (testdata/report/result.json, test data made by testdata/report/fixture.ts).
 */
import assert from "node:assert/strict";
import { runGridproof } from "../../testing/mod.ts";
import { parse } from "csv-parse/sync";
import { parseResult } from "../../harness/result/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

const ROOT = new URL("../../", import.meta.url).pathname;
const FIXTURE = "testdata/report/result.json";

// `report` only reads a result and writes files: it runs with no --allow-run and no --allow-sys.
const gridproof = (args: string[], env: Record<string, string> = {}) =>
  runGridproof(args, { env, permissions: ["--allow-read", "--allow-write", "--allow-env"] });

Deno.test("gridproof report writes every format from a saved result", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const [text, html, csv, junit, json, md] = await Promise.all([
      gridproof(["report", FIXTURE]),
      gridproof(["report", FIXTURE, "--format", "html", "--out", `${dir}/r.html`]),
      gridproof(["report", FIXTURE, "--format", "csv", "--out", `${dir}/r.csv`]),
      gridproof(["report", FIXTURE, "--format", "junit"]),
      gridproof(["report", FIXTURE, "--format", "json"]),
      gridproof(["report", FIXTURE, "-f", "md"]),
    ]);
    for (const r of [text, html, csv, junit, json, md]) assert.equal(r.code, 0, r.stderr);
    assert.match(text.stdout, /^gridproof 0\.1\.0 · result of/);
    assert.ok(!text.stdout.includes("\x1b"), "no colour when not on a terminal");
    assert.match(html.stderr, /wrote .*r\.html/);
    assert.match(await Deno.readTextFile(`${dir}/r.html`), /^<!DOCTYPE html>/);
    const rows = parse(await Deno.readTextFile(`${dir}/r.csv`), { columns: true });
    assert.equal(rows.length, makeFixtureResult().solves.length * 9);
    assert.match(junit.stdout, /^<\?xml version="1\.0" encoding="UTF-8"\?>\n<testsuites /);
    assert.deepEqual(parseResult(json.stdout), JSON.parse(await Deno.readTextFile(ROOT + FIXTURE)));
    assert.match(md.stdout, /^### gridproof: 2 failed/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("gridproof report exits 2 naming the file and field of a bad result, with no stack trace", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const bad = makeFixtureResult() as unknown as { studies: { orders: { norm: string }[] }[] };
    bad.studies[2].orders[1].norm = "sup";
    await Deno.writeTextFile(`${dir}/bad.json`, JSON.stringify(bad));
    const newer = { ...makeFixtureResult(), version: 99 };
    await Deno.writeTextFile(`${dir}/newer.json`, JSON.stringify(newer));
    const [field, version, missing, format] = await Promise.all([
      gridproof(["report", `${dir}/bad.json`]),
      gridproof(["report", `${dir}/newer.json`]),
      gridproof(["report", `${dir}/none.json`]),
      gridproof(["report", FIXTURE, "--format", "pdf"]),
    ]);
    for (const r of [field, version, missing, format]) {
      assert.equal(r.code, 2, r.stderr);
      assert.equal(r.stdout, "");
      assert.ok(!/\n\s+at /.test(r.stderr), `no stack trace: ${r.stderr}`);
    }
    assert.match(field.stderr, /bad\.json: studies\[2\]\.orders\[1\]\.norm: .*must be one of/);
    assert.match(version.stderr, /newer\.json: version: was written by a newer gridproof/);
    assert.match(missing.stderr, /none\.json: cannot read the result file \(no such file\)/);
    assert.match(format.stderr, /--format: unknown report format "pdf": use one of text, html/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
