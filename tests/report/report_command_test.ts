/**
 * `gridproof report` end to end: the real command line in a subprocess, reading the saved
 * fixture result (testdata/report/result.json, test data made by testdata/report/fixture.ts).
 */
import assert from "node:assert/strict";
import { runGridproof } from "../../testing/mod.ts";
import { parse } from "csv-parse/sync";
import { parseResult } from "../../harness/result/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";
import { GCI_HEADERS } from "../../harness/report/html.ts";
import { pdfPageTexts } from "./_pdf_text.ts";

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
    assert.match(md.stdout, /^### gridproof: 2 failures \(4 failing verdicts\)/);
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
      gridproof(["report", FIXTURE, "--format", "docx"]),
    ]);
    for (const r of [field, version, missing, format]) {
      assert.equal(r.code, 2, r.stderr);
      assert.equal(r.stdout, "");
      assert.ok(!/\n\s+at /.test(r.stderr), `no stack trace: ${r.stderr}`);
    }
    assert.match(field.stderr, /bad\.json: studies\[2\]\.orders\[1\]\.norm: .*must be one of/);
    assert.match(version.stderr, /newer\.json: version: was written by a newer gridproof/);
    assert.match(missing.stderr, /none\.json: cannot read the result file \(no such file\)/);
    assert.match(
      format.stderr,
      /--format: unknown report format "docx": use one of text, html, pdf, md, csv, junit, json/,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

const CHROMIUM = "/usr/bin/chromium";
const chromium = await Deno.stat(CHROMIUM).then(() => true, () => false);
if (!chromium) console.warn(`SKIPPED: ${CHROMIUM} is not installed, so no PDF is printed`);

Deno.test("gridproof report --format pdf exits 2 before reading the result when Chromium is missing", async () => {
  const r = await runGridproof(
    ["report", "testdata/report/no-such-result.json", "--format", "pdf"],
    {
      env: { GRIDPROOF_CHROMIUM: "/nonexistent/chromium" },
      permissions: ["--allow-read", "--allow-write", "--allow-env", "--allow-run"],
    },
  );
  assert.equal(r.code, 2, r.stderr);
  assert.ok(!/\n\s+at /.test(r.stderr), `no stack trace: ${r.stderr}`);
  // the browser is named, not the missing result: nothing was read
  assert.match(
    r.stderr,
    /--format: GRIDPROOF_CHROMIUM names \/nonexistent\/chromium, which is not a file/,
  );
});

Deno.test({
  name:
    "gridproof report --format pdf prints A4 pages holding every GCI column header (skipped without chromium)",
  ignore: !chromium,
  async fn() {
    const dir = await Deno.makeTempDir();
    try {
      const r = await runGridproof(
        ["report", FIXTURE, "--format", "pdf", "--out", `${dir}/r.pdf`],
        {
          permissions: ["--allow-read", "--allow-write", "--allow-env", "--allow-run"],
        },
      );
      assert.equal(r.code, 0, r.stderr);
      const pdf = await Deno.readFile(`${dir}/r.pdf`);
      assert.equal(new TextDecoder().decode(pdf.subarray(0, 5)), "%PDF-");
      // ISO 216 A4 is 210 × 297 mm = 595.28 × 841.89 pt (1 pt = 1/72 in); Chromium rounds the
      // page to whole CSS pixels (594.96 × 841.92 pt), so within one point
      const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(
        new TextDecoder("latin1").decode(pdf),
      );
      assert.ok(box, "the PDF has a page box");
      assert.ok(
        Math.abs(Number(box[1]) - 595.28) < 1 && Math.abs(Number(box[2]) - 841.89) < 1,
        box[0],
      );
      const text = (await pdfPageTexts(pdf)).join("").normalize("NFKC").replace(/\s/g, "");
      for (const header of GCI_HEADERS) {
        assert.ok(text.includes(header.replace(/\s/g, "")), `the PDF shows "${header}"`);
      }
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});
