/**
 * `gridproof cases export` end to end: output on stdout or in a file, and exit code 2 with a clear
 * message, before any work, for an unknown case or language and for an --out file that exists.
 */
import assert from "node:assert/strict";
import { runGridproof } from "../../testing/cli.ts";

Deno.test("cases export writes a case's functions to standard output", async () => {
  const run = await runGridproof(["cases", "export", "smooth-baseline", "--lang", "c"]);
  assert.equal(run.code, 0, run.stderr);
  assert.match(run.stdout, /^\/\/ gridproof case "smooth-baseline"/);
  assert.match(run.stdout, /^double smooth_baseline_exact\(double x, double y\) \{$/m);
});

Deno.test("cases export refuses bad input with exit code 2", async (t) => {
  await t.step("an unknown language", async () => {
    const run = await runGridproof(["cases", "export", "smooth-baseline", "--lang", "rust"]);
    assert.equal(run.code, 2);
    assert.match(run.stderr, /unknown language "rust"; choose one of: c, fortran, python/);
  });
  await t.step("an unknown case", async () => {
    const run = await runGridproof(["cases", "export", "no-such-case", "--lang", "python"]);
    assert.equal(run.code, 2);
    assert.match(run.stderr, /unknown case "no-such-case"/);
  });
  await t.step("an --out file in a missing folder", async () => {
    const dir = await Deno.makeTempDir();
    const run = await runGridproof([
      "cases",
      "export",
      "smooth-baseline",
      "--lang",
      "c",
      "--out",
      `${dir}/missing/case.c`,
    ]);
    await Deno.remove(dir, { recursive: true });
    assert.equal(run.code, 2);
    assert.match(run.stderr, /no such folder/);
  });
});

Deno.test("cases export --out writes a file and overwrites it only with --force", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const out = `${dir}/case.f90`;
    const args = ["cases", "export", "layered-jump-100", "--lang", "fortran", "--out", out];
    const first = await runGridproof(args);
    assert.equal(first.code, 0, first.stderr);
    assert.match(await Deno.readTextFile(out), /^module layered_jump_100$/m);
    await Deno.writeTextFile(out, "keep me");
    const again = await runGridproof(args);
    assert.equal(again.code, 2);
    assert.match(again.stderr, /exists; add --force/);
    assert.equal(await Deno.readTextFile(out), "keep me");
    const forced = await runGridproof([...args, "--force"]);
    assert.equal(forced.code, 0, forced.stderr);
    assert.match(await Deno.readTextFile(out), /^end module layered_jump_100$/m);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
