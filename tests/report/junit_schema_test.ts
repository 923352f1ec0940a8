/**
 * The JUnit XML report validated against the JUnit XML schema (testdata/report/junit.xsd, the
 * Jenkins/Ant-style schema reproduced from memory) with libxml2's `xmllint`, an XML parser
 * independent of gridproof, which also reads the counts and messages back.
 */
import assert from "node:assert/strict";
import { renderJunit } from "../../harness/report/mod.ts";
import { compareWithBaseline } from "../../harness/baseline/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

const XSD = new URL("../../testdata/report/junit.xsd", import.meta.url).pathname;

async function xmllint(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const out = await new Deno.Command("xmllint", { args, stdout: "piped", stderr: "piped" })
    .output();
  const dec = new TextDecoder();
  return { code: out.code, stdout: dec.decode(out.stdout), stderr: dec.decode(out.stderr) };
}

async function hasXmllint(): Promise<boolean> {
  try {
    return (await xmllint(["--version"])).code === 0;
  } catch {
    // not installed (Debian package libxml2-utils)
    return false;
  }
}

const available = await hasXmllint();
if (!available) {
  console.warn(
    "SKIPPED: xmllint is not installed (Debian package libxml2-utils), so the JUnit XML " +
      "schema tests do not run",
  );
}

function result() {
  const r = makeFixtureResult({ hostile: true, timeScale: 1.5 });
  r.baselineVerdicts = compareWithBaseline(r, makeFixtureResult());
  const failing = r.studies.flatMap((s) => s.verdicts).find((v) => v.status === "fail")!;
  failing.reason = `multi\nline & "quoted" ${failing.reason}`;
  return r;
}

Deno.test({
  name: `renderJunit() output validates against the JUnit XML schema${
    available ? "" : " (skipped: xmllint not found, Debian libxml2-utils)"
  }`,
  ignore: !available,
  async fn() {
    const dir = await Deno.makeTempDir();
    try {
      for (const r of [makeFixtureResult(), result()]) {
        const file = `${dir}/junit.xml`;
        await Deno.writeTextFile(file, renderJunit(r));
        const check = await xmllint(["--noout", "--schema", XSD, file]);
        assert.equal(check.code, 0, check.stderr);
        assert.match(check.stderr, /validates/);
      }
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});

Deno.test({
  name: `an independent XML parser reads back the counts and the exact failure reason${
    available ? "" : " (skipped: xmllint not found, Debian libxml2-utils)"
  }`,
  ignore: !available,
  async fn() {
    const r = result();
    const dir = await Deno.makeTempDir();
    try {
      const file = `${dir}/junit.xml`;
      await Deno.writeTextFile(file, renderJunit(r));
      const count = async (xpath: string) =>
        Number((await xmllint(["--xpath", `count(${xpath})`, file])).stdout.trim());
      const verdicts = [...r.studies.flatMap((s) => s.verdicts), ...r.baselineVerdicts];
      assert.equal(await count("//testcase"), verdicts.length);
      assert.equal(
        await count("//testcase[failure]"),
        verdicts.filter((v) => v.status === "fail").length,
      );
      assert.equal(
        await count("//testcase[skipped]"),
        verdicts.filter((v) => v.status === "not-applicable").length,
      );
      assert.equal(
        await count("//testcase[system-out]"),
        verdicts.filter((v) => v.status === "warn").length,
      );
      assert.equal(await count("//script | //img"), 0, "markup in the result stays text");
      // the first failure carries its reason character for character (line break and markup too)
      const failing = r.studies.flatMap((s) => s.verdicts).find((v) => v.status === "fail")!;
      const got = await xmllint([
        "--xpath",
        `string(//testsuite[@name="${failing.caseId} · ${failing.solver}"]/testcase[@name="${failing.criterion} (max norm, all points)"]/failure/@message)`,
        file,
      ]);
      // xmllint ends its output with one newline of its own
      assert.equal(got.stdout.replace(/\n$/, ""), failing.reason);
      assert.match(failing.reason, /^multi\nline & "quoted" .*<img src=x/);
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});
