import assert from "node:assert/strict";
import { buildCase, loadCase, variantEdits } from "../../cases/mod.ts";
import { createReferenceSolver } from "../solvers/mod.ts";
import { createPooledReferenceSolver } from "./reference_pool.ts";
import { measureOutcome } from "./measure.ts";

Deno.test("closing the reference pool ends solves in flight and queued as failed, without hanging", async () => {
  const kase = await loadCase("smooth-baseline");
  const pool = createPooledReferenceSolver({ workers: 1, inProcessBelow: 0 });
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
  // one variant built the way caseVariants() builds each (only this one: a test stays fast)
  const edit = variantEdits(base).find((v) => v.key === "dirichlet:north")!;
  const file = structuredClone(base.file!);
  edit.edit(file);
  file.id = `${base.id}~${edit.key}`;
  const variant = await buildCase(file, { origin: base.origin, parameters: base.parameters });
  const pool = createPooledReferenceSolver({ workers: 2, inProcessBelow: 0 });
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

Deno.test("a record measured in a pool worker equals the record the main thread measures from the same outcome", async () => {
  // Reference: measureOutcome() on this thread, applied to the outcome the worker sent back.
  const pool = createPooledReferenceSolver({ workers: 1, inProcessBelow: 0 });
  try {
    for (const id of ["layered-jump-100", "rectangle-2x1"]) {
      const kase = await loadCase(id);
      const { nx, ny } = kase.gridFor(32);
      const task = { case: kase, nx, ny, scheme: "central" as const, tolerance: 1e-10 };
      const { outcome, record } = await pool.solveMeasured(task, 1e-10);
      assert.ok(record, "the worker measured");
      assert.deepEqual(record, measureOutcome(kase, pool.info.name, outcome, 1e-10));
    }
  } finally {
    await pool.close();
  }
});

Deno.test("a pool solves grids below its in-process size on the calling thread, equal to the in-process solver", async () => {
  // Reference: the in-process reference solver on the same compiled case (exact identity). The
  // pool's workers never start for these grids, so closing it first cannot stop the solve.
  const kase = await loadCase("variable-all");
  const pool = createPooledReferenceSolver({ workers: 2, inProcessBelow: 33 * 33 + 1 });
  const local = createReferenceSolver();
  try {
    const task = { case: kase, nx: 32, ny: 32, scheme: "central" as const, tolerance: 1e-10 };
    const [pooled, inProcess] = await Promise.all([pool.solve(task), local.solve(task)]);
    assert.equal(pooled.status, "ok");
    assert.deepEqual(Array.from(pooled.values), Array.from(inProcess.values));
    const { outcome, record } = await pool.solveMeasured(task, 1e-10);
    assert.deepEqual(record, measureOutcome(kase, pool.info.name, outcome, 1e-10));
  } finally {
    await pool.close();
  }
});
