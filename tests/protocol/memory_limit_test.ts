/**
 * The solver file's `memoryLimitMiB` (docs/protocol.md, "Solver files": an address-space limit,
 * RLIMIT_AS, applied with `prlimit`): the solver process really runs under it, a solver that
 * allocates far beyond it fails that solve with a reason that names the allocation failure — no
 * hang, no crash of the harness — and the next solve works. The misbehaving solver is
 * testdata/protocol/solvers/misbehave.py (Debian's python3; modes `allocate MIB` and
 * `session-allocate N`), which reads its own limit with Python's `resource.getrlimit`.
 */
import assert from "node:assert/strict";
import {
  createExternalSolver,
  type ExternalSolverSpec,
  sampleCase,
  type SolveOutcome,
} from "../../harness/solvers/mod.ts";
import { testCase } from "./_case.ts";
import { MISBEHAVE_DIR, misbehaveSpec } from "./_misbehave.ts";

const LIMIT_MIB = 256;
/** prlimit --as takes bytes; the harness passes memoryLimitMiB · 2^20 (derived from the docs). */
const LIMIT_BYTES = LIMIT_MIB * 1024 * 1024;

function spec(args: string[], extra: Partial<ExternalSolverSpec> = {}): ExternalSolverSpec {
  return misbehaveSpec(args, {
    name: "memory-hog",
    timeLimitSeconds: 30,
    memoryLimitMiB: LIMIT_MIB,
    ...extra,
  });
}

const task = { case: testCase(), nx: 4, ny: 8, scheme: "central" as const, tolerance: 1e-10 };

async function solveOnce(s: ExternalSolverSpec): Promise<SolveOutcome> {
  const solver = createExternalSolver(s, { solverFileDir: MISBEHAVE_DIR });
  try {
    return await solver.solve(task);
  } finally {
    await solver.close();
  }
}

function notes(o: SolveOutcome): string {
  return String(o.description?.notes ?? "");
}

Deno.test("an external solver runs under the address-space limit its solver file sets", async (t) => {
  await t.step(
    "with memoryLimitMiB 256 the solver sees RLIMIT_AS = 256 MiB and 16 MiB fit",
    async () => {
      const o = await solveOnce(spec(["allocate", "16"]));
      assert.equal(o.status, "ok", o.reason);
      assert.equal(notes(o), `address-space limit ${LIMIT_BYTES}; held ${16 * 1024 * 1024} bytes`);
      // the solve itself is intact: the solver echoes the source it was sent
      assert.deepEqual(o.values, sampleCase(testCase(), 4, 8, "vertex").f);
    },
  );
  await t.step("without memoryLimitMiB the harness sets no 256 MiB limit", async () => {
    const o = await solveOnce(spec(["allocate", "16"], { memoryLimitMiB: undefined }));
    assert.equal(o.status, "ok", o.reason);
    assert.doesNotMatch(notes(o), new RegExp(`limit ${LIMIT_BYTES};`));
  });
});

Deno.test("a once solver that allocates 2 GiB under a 256 MiB limit fails with the allocation error, and the next solve works", async () => {
  const hog = await solveOnce(spec(["allocate", "2048"]));
  assert.equal(hog.status, "failed");
  const reason = hog.reason ?? "";
  // CPython raises MemoryError when malloc fails under RLIMIT_AS and, uncaught, exits with 1
  assert.match(reason, /the solver exited with code 1/);
  assert.match(reason, /address-space limit of 256 MiB \(memoryLimitMiB/);
  assert.match(reason, /MemoryError/);
  assert.doesNotMatch(reason, /time limit/, "it failed at once, not by hanging");
  assert.equal(hog.values.length, 0);
  // the full stderr is kept: the limit the solver saw and what it asked for
  const tail = hog.stderrTail ?? "";
  assert.match(tail, new RegExp(`address-space limit ${LIMIT_BYTES}; allocating 2048 MiB`));
  assert.match(tail, /Traceback[\s\S]*MemoryError/);
  // the same program under the same limit, asking for what fits
  const next = await solveOnce(spec(["allocate", "16"]));
  assert.equal(next.status, "ok", next.reason);
  const echo = await solveOnce(spec(["echo", "numbers"]));
  assert.equal(echo.status, "ok", echo.reason);
});

Deno.test("a session solver that runs out of its memory limit fails that solve and is restarted", async () => {
  const solver = createExternalSolver(spec(["session-allocate", "2"], { mode: "session" }), {
    solverFileDir: MISBEHAVE_DIR,
  });
  try {
    const first = await solver.solve(task);
    assert.equal(first.status, "ok", first.reason);
    const second = await solver.solve(task);
    assert.equal(second.status, "failed");
    assert.match(
      second.reason ?? "",
      /session process exited with code 1; it ran under an address-space limit of 256 MiB.*during the solve; it will be restarted.*MemoryError/s,
    );
    // a fresh process (its request count starts again at one), under the same limit
    const third = await solver.solve(task);
    assert.equal(third.status, "ok", third.reason);
    assert.equal(third.iterations, 1);
  } finally {
    await solver.close();
  }
});
