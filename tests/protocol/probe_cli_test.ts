/** `gridproof probe` end to end: exit 0 when every check passes, 1 on misbehaviour, 2 for bad usage. */
import assert from "node:assert/strict";
import { runGridproof } from "../../testing/mod.ts";

const gridproof = (args: string[]) => runGridproof(args);

Deno.test("gridproof probe exits 0 for the reference protocol program and reports overheads", async () => {
  const r = await gridproof([
    "probe",
    "--",
    Deno.execPath(),
    "run",
    "--quiet",
    "reference-solver/protocol_main.ts",
  ]);
  assert.equal(r.code, 0, r.stdout + r.stderr);
  assert.match(r.stdout, /PASS: 6 passed, 0 failed, 0 not applicable/);
  assert.match(r.stdout, /once mode: .* per solve beyond the solver's own time/);
});

Deno.test("gridproof probe exits 1 for a misbehaving adapter and says what is wrong", async () => {
  const r = await gridproof([
    "probe",
    "--",
    "/usr/bin/python3",
    "testdata/protocol/solvers/misbehave.py",
    "logs",
  ]);
  assert.equal(r.code, 1);
  assert.match(r.stdout, /FAIL .*logs belong on stderr/);
});

Deno.test("gridproof probe exits 2 for bad usage", async (t) => {
  await t.step("nothing to probe", async () => {
    const r = await gridproof(["probe"]);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /nothing to probe: give --solvers FILE/);
  });
  await t.step("an unknown mode", async () => {
    const r = await gridproof(["probe", "--mode", "daemon", "--", "true"]);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /--mode: must be one of once, session, both, found "daemon"/);
  });
  await t.step("a solver file with problems", async () => {
    const dir = await Deno.makeTempDir();
    try {
      await Deno.writeTextFile(`${dir}/s.json`, JSON.stringify({ solvers: [{ name: "x" }] }));
      const r = await gridproof(["probe", "--solvers", `${dir}/s.json`]);
      assert.equal(r.code, 2);
      assert.match(r.stderr, /solvers\[0\]\.command: missing \(required\)/);
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  });
});
