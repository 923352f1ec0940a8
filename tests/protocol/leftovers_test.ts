/**
 * Processes a solver leaves behind: a finished solver's reply counts even while a process it
 * started holds its stdout open, and what it left — in its process group or out of it — is ended.
 * The solver is testdata/protocol/solvers/misbehave.py (Debian's python3).
 */
import assert from "node:assert/strict";
import {
  createExternalSolver,
  type ExternalSolverSpec,
  type SolveOutcome,
} from "../../harness/solvers/mod.ts";
import { testCase } from "./_case.ts";
import { MISBEHAVE_DIR, misbehaveSpec } from "./_misbehave.ts";

async function run(args: string[], extra: Partial<ExternalSolverSpec> = {}): Promise<SolveOutcome> {
  const solver = createExternalSolver(misbehaveSpec(args, extra), { solverFileDir: MISBEHAVE_DIR });
  try {
    return await solver.solve({
      case: testCase(),
      nx: 4,
      ny: 8,
      scheme: "central",
      tolerance: 1e-10,
    });
  } finally {
    await solver.close();
  }
}

/** The pid the solver wrote on stderr as "grandchild pid N". */
function grandchild(outcome: SolveOutcome): number {
  const pid = Number(/grandchild pid (\d+)/.exec(outcome.stderrTail ?? "")?.[1]);
  assert.ok(pid > 0, `grandchild pid in stderr: ${outcome.stderrTail}`);
  return pid;
}

/**
 * Whether `pid` runs as `sleep` (a zombie awaiting its reaper is not running). Asked of `ps`, an
 * outside witness, since Deno reads /proc only with --allow-all; a few tries, since a killed
 * process takes a moment to go on a busy machine.
 */
async function sleepRuns(pid: number): Promise<boolean> {
  for (let tries = 0; tries < 30; tries++) {
    const ps = await new Deno.Command("ps", {
      args: ["-o", "stat=,comm=", "-p", String(pid)],
      stdout: "piped",
    }).output();
    const [state, comm] = new TextDecoder().decode(ps.stdout).trim().split(/\s+/);
    if (!ps.success || state.startsWith("Z") || comm !== "sleep") return false;
    await new Promise((r) => setTimeout(r, 100));
  }
  return true;
}

Deno.test("a once solver that replied and exited is finished though a process it started holds stdout open", async () => {
  // before: the solve waited for the end of stdout, which the `sleep 300` held, and failed as
  // past its time limit
  const o = await run(["holdstdout"], { timeLimitSeconds: 20 });
  assert.equal(o.status, "ok", o.reason);
  assert.equal(o.values.length, 45);
  const pid = grandchild(o);
  assert.equal(await sleepRuns(pid), false, `the leftover sleep ${pid} still runs`);
  assert.match(
    String(o.description?.leftoverProcesses),
    new RegExp(`still running after it exited \\(pid ${pid}\\); it was ended`),
  );
});

Deno.test("a process that left the solver's process group is ended after the solve", async (t) => {
  await t.step("found by the mark in its environment (its parent exited at once)", async () => {
    const o = await run(["escape"]);
    assert.equal(o.status, "ok", o.reason);
    const pid = grandchild(o);
    assert.equal(await sleepRuns(pid), false, `the escaped sleep ${pid} still runs`);
    assert.match(String(o.description?.leftoverProcesses), new RegExp(`\\b${pid}\\b`));
  });
  await t.step(
    "found while the solve ran, through its parent (its environment emptied)",
    async () => {
      const o = await run(["escape-scrubbed"]);
      assert.equal(o.status, "ok", o.reason);
      const pid = grandchild(o);
      assert.equal(await sleepRuns(pid), false, `the escaped sleep ${pid} still runs`);
    },
  );
});

Deno.test("a session process that exits during a solve fails it with its exit, though a process it started holds stdout open", async () => {
  // before: the read waited for the end of stdout until the time limit
  const solver = createExternalSolver(
    misbehaveSpec(["session-crash-held", "2"], { mode: "session", timeLimitSeconds: 20 }),
    { solverFileDir: MISBEHAVE_DIR },
  );
  try {
    const task = { case: testCase(), nx: 4, ny: 8, scheme: "central", tolerance: 1e-10 } as const;
    assert.equal((await solver.solve(task)).status, "ok");
    const crashed = await solver.solve(task);
    assert.equal(crashed.status, "failed");
    assert.match(crashed.reason ?? "", /session process exited with code 5 during the solve/);
    const pid = grandchild(crashed);
    assert.equal(await sleepRuns(pid), false, `the leftover sleep ${pid} still runs`);
    // the next solve gets a fresh process
    assert.equal((await solver.solve(task)).status, "ok");
  } finally {
    await solver.close();
  }
});
