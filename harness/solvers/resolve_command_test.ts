import assert from "node:assert/strict";
import { resolveProgram } from "./resolve_command.ts";

/** Runs `f` with an executable script holding `text` in a temporary folder. */
async function withScript(text: string, f: (dir: string) => Promise<void>): Promise<void> {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(`${dir}/solver.sh`, text);
    await Deno.chmod(`${dir}/solver.sh`, 0o755);
    await f(dir);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
}

Deno.test("resolveProgram() names the missing interpreter of a script's #! line (issue 12, item 15)", async (t) => {
  // before, the script resolved and its start failed with a bare "No such file or directory"
  await t.step("an absolute interpreter that does not exist", async () => {
    await withScript("#!/no/such/interpreter -x\necho hi\n", async (dir) => {
      const found = await resolveProgram("./solver.sh", { baseDir: dir });
      assert.equal(found.ok, false);
      assert.match(
        (found as { reason: string }).reason,
        /^command "\.\/solver\.sh" \(.*\/solver\.sh\) names the interpreter \/no\/such\/interpreter on its first line \("#!\/no\/such\/interpreter -x"\), which does not exist; fix the script's first line .*\["python3", "\.\/solver\.sh"\]$/,
      );
    });
  });
  await t.step("#!/usr/bin/env with a name that is not on PATH", async () => {
    await withScript("#!/usr/bin/env no-such-python-xyz\n", async (dir) => {
      const found = await resolveProgram("./solver.sh", { baseDir: dir, path: dir });
      assert.equal(found.ok, false);
      assert.match(
        (found as { reason: string }).reason,
        /runs "no-such-python-xyz" through \/usr\/bin\/env on its first line \("#!\/usr\/bin\/env no-such-python-xyz"\), but "no-such-python-xyz" is not on PATH; install it, or fix/,
      );
    });
  });
  await t.step("a #! line naming nothing", async () => {
    await withScript("#!\n", async (dir) => {
      const found = await resolveProgram("./solver.sh", { baseDir: dir });
      assert.match(
        (found as { reason: string }).reason,
        /starts with "#!" but names no interpreter/,
      );
    });
  });
  await t.step(
    "interpreters that exist, and files without a #! line, resolve as before",
    async () => {
      for (const text of ["#!/bin/sh\necho hi\n", "#! /usr/bin/env sh\n", "echo hi\n"]) {
        await withScript(text, async (dir) => {
          const found = await resolveProgram("./solver.sh", { baseDir: dir });
          assert.deepEqual(found, { ok: true, path: `${dir}/solver.sh` }, text);
        });
      }
    },
  );
});
