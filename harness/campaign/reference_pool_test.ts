import assert from "node:assert/strict";
import { caseVariants, loadCase } from "../../cases/mod.ts";
import { createReferenceSolver } from "../solvers/mod.ts";
import { createPooledReferenceSolver } from "./reference_pool.ts";

Deno.test("closing the reference pool ends solves in flight and queued as failed, without hanging", async () => {
  const kase = await loadCase("smooth-baseline");
  const pool = createPooledReferenceSolver({ workers: 1 });
  const task = { case: kase, nx: 256, ny: 256, scheme: "central" as const, tolerance: 1e-10 };
  const running = pool.solve(task);
  const queued = pool.solve(task);
  await pool.close();
  const [a, b] = await Promise.all([running, queued]);
  for (const outcome of [a, b]) {
    assert.equal(outcome.status, "failed");
    assert.match(outcome.reason ?? "", /stopped/);
  }
  const after = await pool.solve(task);
  assert.equal(after.status, "failed");
});

Deno.test("pool workers solve a case variant from its handed-over derivation exactly as in process", async () => {
  // A variant shares its base case's origin and parameters, so loading "by reference" in the worker
  // would solve the base case; the derivation handed to the worker keeps the variant. Reference:
  // the in-process reference solver on the same compiled case (exact identity of the values).
  const base = await loadCase("robin-all");
  const variant = (await caseVariants(base)).find((v) => v.key === "dirichlet:north")!.kase;
  const pool = createPooledReferenceSolver({ workers: 2 });
  const local = createReferenceSolver();
  try {
    for (const kase of [variant, base, variant]) {
      const task = { case: kase, nx: 32, ny: 32, scheme: "central" as const, tolerance: 1e-10 };
      const [pooled, inProcess] = await Promise.all([pool.solve(task), local.solve(task)]);
      assert.equal(pooled.status, "ok");
      assert.equal(pooled.values.length, inProcess.values.length);
      for (let k = 0; k < pooled.values.length; k++) {
        if (!Object.is(pooled.values[k], inProcess.values[k])) {
          assert.fail(`${kase.id} value ${k}: ${pooled.values[k]} against ${inProcess.values[k]}`);
        }
      }
    }
  } finally {
    await pool.close();
  }
});
