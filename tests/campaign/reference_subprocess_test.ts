/**
 * The reference solver as a protocol program passes the anisotropic built-in cases like the
 * in-process one: a request carries no solver advice, so the program chooses line relaxation from
 * the coefficients (point smoothers degrade as the coupling ratio grows — LFA, Trottenberg et al.
 * 2001, from memory; alternating line relaxation stays robust).
 */
import assert from "node:assert/strict";
import { smootherFor } from "../../reference-solver/protocol_main.ts";
import { loadCase } from "../../cases/mod.ts";
import { runGridproof } from "../../testing/mod.ts";

Deno.test("smootherFor() picks line relaxation for anisotropic couplings only", async () => {
  const anisotropic = (await loadCase("strong-anisotropy")).sample(32, 32);
  const isotropic = (await loadCase("smooth-baseline")).sample(32, 32);
  assert.equal(smootherFor(anisotropic), "alternating-line");
  assert.equal(smootherFor(isotropic), "red-black");
  // both cases have constant a and c, so their first node decides alike
  assert.equal(smootherFor(anisotropic, { uniform: true }), "alternating-line");
  assert.equal(smootherFor(isotropic, { uniform: true }), "red-black");
});

Deno.test("check passes the anisotropic cases with the reference solver as a subprocess", async () => {
  const dir = await Deno.makeTempDir();
  const run = await runGridproof([
    "check",
    "--solvers",
    "examples/solvers.json",
    "--solver",
    "reference,reference-subprocess",
    "--cases",
    "strong-anisotropy,near-degenerate",
    "--out",
    dir,
    "--no-progress",
  ]);
  assert.equal(run.code, 0, run.stdout + run.stderr);
  const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
  const agreement = result.studies
    .filter((s: { solver: string }) => s.solver === "reference-subprocess")
    .map((s: { verdicts: { criterion: string; status: string }[] }) =>
      s.verdicts.find((v) => v.criterion === "agreement-with-reference")?.status
    );
  assert.deepEqual(agreement, ["pass", "pass"]);
  await Deno.remove(dir, { recursive: true });
});
