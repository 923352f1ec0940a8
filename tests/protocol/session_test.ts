/** Session mode: hello/ready, one request per line, restart after a fault, clean shutdown. */
import assert from "node:assert/strict";
import {
  createExternalSolver,
  type ExternalSolverSpec,
  sampleCase,
  type Solver,
} from "../../harness/solvers/mod.ts";
import { testCase } from "./_case.ts";
import { MISBEHAVE_DIR, misbehaveSpec } from "./_misbehave.ts";

function sessionSolver(args: string[], extra: Partial<ExternalSolverSpec> = {}): Solver {
  return createExternalSolver(
    misbehaveSpec(args, {
      name: "misbehave-session",
      mode: "session",
      encoding: "base64",
      ...extra,
    }),
    { solverFileDir: MISBEHAVE_DIR },
  );
}

const task = (nx: number) => ({
  case: testCase(),
  nx,
  ny: 2 * nx,
  scheme: "central" as const,
  tolerance: 1e-10,
});

function sessionPid(outcome: { description?: Record<string, unknown> }): number | undefined {
  const m = /pid (\d+)/.exec(String(outcome.description?.notes ?? ""));
  return m ? Number(m[1]) : undefined;
}

Deno.test("a session answers several requests from one process, in order", async () => {
  const solver = sessionSolver(["session"]);
  try {
    const first = await solver.solve(task(4));
    assert.equal(first.status, "ok", first.reason);
    assert.deepEqual(first.values, sampleCase(testCase(), 4, 8, "vertex").f);
    const pid = sessionPid(first);
    assert.ok(pid);
    const [second, third] = await Promise.all([solver.solve(task(8)), solver.solve(task(2))]);
    assert.equal(second.iterations, 2, "the second request was the process's second");
    assert.equal(third.iterations, 3);
    assert.equal(second.values.length, 9 * 17);
    assert.equal(sessionPid(third), pid, "the same process answered");
    // per-solve stderr holds only that solve's lines (never an earlier solve's)
    assert.doesNotMatch(third.stderrTail ?? "", /request [12]/);
  } finally {
    await solver.close();
  }
});

Deno.test("a session crash fails that solve only; the next solve starts a fresh process", async () => {
  const solver = sessionSolver(["session-crash", "2"]);
  try {
    const first = await solver.solve(task(4));
    assert.equal(first.status, "ok", first.reason);
    const firstPid = sessionPid(first);
    const second = await solver.solve(task(4));
    assert.equal(second.status, "failed");
    assert.match(
      second.reason ?? "",
      /session process exited with code 5 during the solve; it will be restarted.*crashing on request 2/s,
    );
    const third = await solver.solve(task(4));
    assert.equal(third.status, "ok", third.reason);
    const thirdPid = sessionPid(third);
    assert.ok(thirdPid && thirdPid !== firstPid, "a new process answered");
    assert.equal(third.iterations, 1, "the new process counts from one");
  } finally {
    await solver.close();
  }
});

Deno.test("a session that hangs is killed at its limit and restarted", async () => {
  const solver = sessionSolver(["session-hang", "1"], { timeLimitSeconds: 1 });
  try {
    const first = await solver.solve(task(2));
    assert.equal(first.status, "failed");
    assert.match(first.reason ?? "", /exceeded its time limit of 1 s; its process group/);
    // the restarted process hangs again on its first request: still a clean failure
    const second = await solver.solve(task(2));
    assert.equal(second.status, "failed");
    assert.match(second.reason ?? "", /exceeded its time limit/);
  } finally {
    await solver.close();
  }
});

Deno.test("a session that logs on stdout fails with the stderr advice", async () => {
  const solver = sessionSolver(["session-logs"]);
  try {
    const o = await solver.solve(task(2));
    assert.equal(o.status, "failed");
    assert.match(o.reason ?? "", /"log line on stdout".*logs belong on stderr/);
  } finally {
    await solver.close();
  }
});

Deno.test("a session's declared largest grid makes bigger grids not applicable", async () => {
  // misbehave.py declares largestGrid 64×128
  const solver = sessionSolver(["session"]);
  try {
    assert.equal((await solver.solve(task(4))).status, "ok");
    const big = await solver.solve(task(128));
    assert.equal(big.status, "not-applicable");
    assert.match(big.reason ?? "", /grid 128×256 is larger than the solver's largest grid 64×128/);
  } finally {
    await solver.close();
  }
});

Deno.test("a session that cannot start says why", async () => {
  const solver = sessionSolver(["echo"], { timeLimitSeconds: 1 });
  try {
    // a once-mode script waits for the end of stdin and never answers hello
    const o = await solver.solve(task(2));
    assert.equal(o.status, "failed");
    assert.match(
      o.reason ?? "",
      /^the session did not start: no ready message within 1 s of hello/,
    );
  } finally {
    await solver.close();
  }
});

Deno.test("a session's first solve is judged against what the session declared", async () => {
  // the declaration is only known once the session runs: the first task must wait for it
  const solver = sessionSolver(["session"]);
  try {
    const big = await solver.solve(task(128));
    assert.equal(big.status, "not-applicable");
    assert.match(big.reason ?? "", /larger than the solver's largest grid 64×128/);
  } finally {
    await solver.close();
  }
});

Deno.test("constant coefficients go as one number only to solvers that read that form", async (t) => {
  // testCase(): c = 1, d = 0.5 and e = −1 are constant, a and b vary; misbehave.py names in its
  // notes the coefficients that arrived in the constant form
  const constantsIn = async (solver: Solver) => {
    try {
      const o = await solver.solve(task(4));
      assert.equal(o.status, "ok", o.reason);
      // the source, which varies, arrives in full and is echoed back intact
      assert.deepEqual(o.values, sampleCase(testCase(), 4, 8, "vertex").f);
      return /constant arrays: ([a-z,]+)/.exec(String(o.description?.notes))?.[1];
    } finally {
      await solver.close();
    }
  };
  await t.step("a session that declares constantArrays in ready", async () => {
    assert.equal(await constantsIn(sessionSolver(["session-constants"])), "c,d,e");
  });
  await t.step("a session that does not declare it", async () => {
    assert.equal(await constantsIn(sessionSolver(["session"])), "none");
  });
  await t.step("the solver file's false wins over the declaration", async () => {
    const solver = sessionSolver(["session-constants"], { constantArrays: false });
    assert.equal(await constantsIn(solver), "none");
  });
  await t.step("the solver file's true asks without a declaration", async () => {
    const solver = sessionSolver(["session"], { constantArrays: true });
    assert.equal(await constantsIn(solver), "c,d,e");
  });
});

Deno.test("with sessions: 2, overlapping solves run in two processes and later ones reuse them", async () => {
  const solver = createExternalSolver(
    misbehaveSpec(["session"], { name: "misbehave-sessions", mode: "session", encoding: "base64" }),
    { solverFileDir: MISBEHAVE_DIR, sessions: 2 },
  );
  try {
    const [a, b] = await Promise.all([solver.solve(task(4)), solver.solve(task(8))]);
    assert.equal(a.status, "ok", a.reason);
    assert.equal(b.status, "ok", b.reason);
    // the exact answer of misbehave.py: the sampled source, whichever process answered
    assert.deepEqual(a.values, sampleCase(testCase(), 4, 8, "vertex").f);
    assert.deepEqual(b.values, sampleCase(testCase(), 8, 16, "vertex").f);
    assert.notEqual(sessionPid(a), sessionPid(b), "two processes answered");
    assert.equal(a.iterations, 1, "each was its process's first request");
    assert.equal(b.iterations, 1);
    const [c, d, e] = await Promise.all([2, 4, 2].map((n) => solver.solve(task(n))));
    const pids = new Set([a, b, c, d, e].map(sessionPid));
    assert.equal(pids.size, 2, "no third process was started");
    // three requests on two processes: the counts of the second round are 2, 2 and 3
    assert.deepEqual([c, d, e].map((o) => o.iterations).sort(), [2, 2, 3]);
  } finally {
    await solver.close();
  }
});
