import assert from "node:assert/strict";
import { InputError } from "../../errors/mod.ts";
import { loadSolverFile } from "./solver_file.ts";

async function withFile(text: string, f: (path: string) => Promise<void>): Promise<void> {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(`${dir}/solvers.json`, text);
    await f(`${dir}/solvers.json`);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
}

Deno.test("loadSolverFile() fills every documented default and records the file's folder", async () => {
  await withFile(JSON.stringify({ solvers: [{ name: "a", command: ["./run"] }] }), async (path) => {
    const [spec] = await loadSolverFile(path);
    assert.deepEqual(spec, {
      name: "a",
      command: ["./run"],
      mode: "once",
      encoding: "numbers",
      layout: "vertex",
      scheme: "central",
      timeLimitSeconds: 300,
      skipCases: [],
      maxReplyMiB: 1024,
      solverFileDir: path.slice(0, path.lastIndexOf("/")),
    });
  });
});

Deno.test("loadSolverFile() lists every problem with the file and the field", async (t) => {
  await t.step("schema violations", async () => {
    const text = JSON.stringify({
      solvers: [{
        name: "bad name",
        command: [],
        mode: "daemon",
        shell: "sh",
        timeLimitSeconds: 0,
      }],
    });
    await withFile(text, async (path) => {
      await assert.rejects(loadSolverFile(path), (e: InputError) => {
        assert.ok(e instanceof InputError);
        assert.equal(e.where, path);
        assert.deepEqual(
          e.problems.sort(),
          [
            'solvers[0].mode: must be one of "once", "session"',
            "solvers[0].command: must NOT have fewer than 1 items",
            'solvers[0].name: must match pattern "^[A-Za-z0-9._-]+$"',
            "solvers[0].shell: unknown field; see harness/solvers/solvers.schema.json for the fields",
            "solvers[0].timeLimitSeconds: must be > 0",
          ].sort(),
        );
        return true;
      });
    });
  });
  await t.step("duplicate names", async () => {
    const text = JSON.stringify({
      solvers: [{ name: "a", command: ["x"] }, { name: "a", command: ["y"] }],
    });
    await withFile(text, async (path) => {
      await assert.rejects(loadSolverFile(path), /solvers\[1\]\.name: "a" is used twice/);
    });
  });
  await t.step("bad JSON and a missing file", async () => {
    await withFile("{ solvers: [", async (path) => {
      await assert.rejects(loadSolverFile(path), /the solver file is not valid JSON/);
      await assert.rejects(loadSolverFile(path + ".missing"), /cannot read the solver file/);
    });
  });
});

Deno.test("loadSolverFile() refuses a time limit beyond the timer's range (issue 12, item 8)", async () => {
  // before, timeLimitSeconds ≥ 2147484 (2^31 ms) was accepted and every solve failed within 1 ms
  const text = JSON.stringify({
    solvers: [{ name: "a", command: ["./run"], timeLimitSeconds: 3e6 }],
  });
  await withFile(text, async (path) => {
    await assert.rejects(loadSolverFile(path), (e: InputError) => {
      assert.deepEqual(e.problems, ["solvers[0].timeLimitSeconds: must be <= 2147483"]);
      return true;
    });
  });
});

Deno.test("loadSolverFile() refuses a field given twice, as case files do (issue 12, item 16)", async () => {
  // before, JSON.parse kept the second value silently
  const text = '{ "solvers": [ { "name": "a", "command": ["./run"], "name": "b" } ] }';
  await withFile(text, async (path) => {
    await assert.rejects(loadSolverFile(path), (e: InputError) => {
      assert.equal(e.where, path);
      assert.match(e.message, /line 1, column \d+: field "name" appears twice/);
      return true;
    });
  });
});

Deno.test("loadSolverFile() refuses the name of the bundled reference solver (issue 12, item 15)", async () => {
  // before, a user solver named "reference" ran beside the bundled one under the same name
  const text = JSON.stringify({
    solvers: [{ name: "mine", command: ["./run"] }, { name: "reference", command: ["./run"] }],
  });
  await withFile(text, async (path) => {
    await assert.rejects(loadSolverFile(path), (e: InputError) => {
      assert.ok(e instanceof InputError);
      assert.equal(e.where, path);
      assert.match(
        e.message,
        /^solvers\[1\]\.name: "reference" is reserved for gridproof's bundled reference solver.*give this solver another name, e\.g\. "my-reference"$/,
      );
      return true;
    });
  });
});

Deno.test("loadSolverFile() reads a file that starts with a UTF-8 byte-order mark (issue 12, item 15)", async () => {
  // before: "the solver file is not valid JSON at line 1, column 1: expected a JSON value"
  const text = "\uFEFF" + JSON.stringify({ solvers: [{ name: "a", command: ["./run"] }] });
  await withFile(text, async (path) => {
    const [spec] = await loadSolverFile(path);
    assert.equal(spec.name, "a");
  });
});

Deno.test("loadSolverFile() refuses a pipe or device and a folder before reading (issue 12, item 15)", async () => {
  // /dev/null is a character device: reading it would give an empty text, a pipe would hang
  await assert.rejects(
    () => loadSolverFile("/dev/null"),
    /is not a regular file .* save it to a file first/,
  );
  const dir = await Deno.makeTempDir();
  await assert.rejects(() => loadSolverFile(dir), /is a directory, expected a solver file/);
  await Deno.remove(dir);
});
