import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
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
