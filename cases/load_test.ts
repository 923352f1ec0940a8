import assert from "node:assert/strict";
import { InputError } from "../errors/mod.ts";
import {
  checkCaseFiles,
  libraryIds,
  loadCase,
  loadCaseFiles,
  loadLibrary,
  MAX_CASE_FILE_BYTES,
} from "./load.ts";

const fixture = (name: string) => `testdata/cases/${name}`;

Deno.test("the library holds at least 14 cases, each file named after its id", async () => {
  const ids = libraryIds();
  assert.ok(ids.length >= 14, ids.join(", "));
  const cases = await loadLibrary();
  assert.deepEqual(cases.map((c) => c.id), ids);
  for (const c of cases) assert.equal(c.origin, "library");
});

Deno.test("loadCase() refuses an unknown id with the list of valid ones and a suggestion", async () => {
  await assert.rejects(loadCase("boundary-layr"), (e: unknown) => {
    assert.ok(e instanceof InputError);
    assert.match(e.message, /unknown case "boundary-layr" \(did you mean "boundary-layer"\?\)/);
    assert.match(e.message, /smooth-baseline/);
    return true;
  });
});

Deno.test("loadCase() applies parameter overrides", async () => {
  const c = await loadCase("boundary-layer", { parameters: { width: 0.1 } });
  assert.deepEqual(c.parameters, { width: 0.1 });
  assert.equal(c.coefficients.a(0.3, 0.3), 0.1);
});

Deno.test("loadCaseFiles() refuses an id used twice, naming both files", async () => {
  await assert.rejects(
    loadCaseFiles([fixture("duplicate-a.json"), fixture("duplicate-b.json")]),
    /id "user-twice" is used twice: in testdata\/cases\/duplicate-a\.json and in testdata\/cases\/duplicate-b\.json/,
  );
  await assert.rejects(
    loadCaseFiles([fixture("library-id.json")]),
    /id "smooth-baseline" is used twice: in cases\/library\/smooth-baseline\.json and in testdata\/cases\/library-id\.json/,
  );
});

Deno.test("a pure-Neumann case without reaction loads as singular (issue 14: accepted, its data balance)", async () => {
  const kase = await loadCase(fixture("singular-neumann.json"));
  assert.equal(kase.singular, true);
});

Deno.test("checkCaseFiles() collects every problem of every file and passes a good one", async () => {
  const results = await checkCaseFiles([fixture("good.json"), fixture("forbidden-functions.json")]);
  assert.deepEqual(results[0].problems, []);
  assert.equal(results[1].problems.length, 5);
  for (const name of ["import", "evaluate", "parse", "createUnit", "config"]) {
    assert.ok(
      results[1].problems.some((p) => p.includes(`function "${name}" is not allowed`)),
      name,
    );
  }
});

Deno.test("loadCase() refuses devices, pipes and oversized files before reading them (issue 12, item 11)", async (t) => {
  // before, /dev/zero was read until memory ran out and a FIFO hung
  await t.step("a device", async () => {
    await assert.rejects(
      loadCaseFiles(["/dev/zero"]),
      (e: InputError) => /not a regular file/.test(e.problems.join(" ") + e.message),
    );
  });
  await t.step("a file beyond the size limit", async () => {
    const path = await Deno.makeTempFile({ suffix: ".json" });
    await Deno.writeTextFile(path, " ".repeat(MAX_CASE_FILE_BYTES + 1));
    await assert.rejects(
      loadCaseFiles([path]),
      (e: InputError) =>
        /more than the 1048576 a case file may have/.test(e.problems.join(" ") + e.message),
    );
    await Deno.remove(path);
  });
});

Deno.test("loadCase() reads a case file that starts with a UTF-8 byte-order mark (issue 12, item 15)", async () => {
  // before, the mark was reported as a JSON error at 1:1 showing an invisible character
  const dir = await Deno.makeTempDir();
  try {
    const text = await Deno.readTextFile(fixture("good.json"));
    await Deno.writeTextFile(`${dir}/bom.json`, "\uFEFF" + text);
    const c = await loadCase(`${dir}/bom.json`);
    assert.equal(c.id, "user-good");
    // positions after the mark are those of the file without it
    await Deno.writeTextFile(`${dir}/bad.json`, "\uFEFF" + text.replace('"x0": 0', '"x0": 2'));
    const [check] = await checkCaseFiles([`${dir}/bad.json`]);
    assert.match(check.problems.join("\n"), /bad\.json:7:13: domain: x0 must be less than x1/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("loadCase() says a case must be a regular file when given /dev/stdin (issue 12, item 15)", async () => {
  // before: 'cannot read the file: Requires all access to "/dev/stdin", run again with the
  // --allow-all flag', a permission flag gridproof never needs
  for (const path of ["/dev/stdin", "/dev/fd/0"]) {
    await assert.rejects(loadCase(path), (e: InputError) => {
      assert.ok(e instanceof InputError);
      assert.equal(e.where, path);
      assert.match(
        e.message,
        /is not a regular file .*case files must be regular files; to read a case from a pipe, save it to a file first/,
      );
      assert.doesNotMatch(e.message, /allow-all/);
      return true;
    });
  }
});
