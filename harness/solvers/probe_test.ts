import assert from "node:assert/strict";
import { probeSolver } from "./probe.ts";
import type { ExternalSolverSpec } from "./types.ts";

const root = new URL("../../", import.meta.url).pathname;

const base: Omit<ExternalSolverSpec, "command"> = {
  name: "probed",
  mode: "once",
  encoding: "base64",
  layout: "vertex",
  scheme: "central",
  timeLimitSeconds: 60,
  skipCases: [],
  maxReplyMiB: 1024,
};

Deno.test("probeSolver() passes the reference protocol program in both modes and encodings", async () => {
  const report = await probeSolver(
    { ...base, command: [Deno.execPath(), "run", "--quiet", "reference-solver/protocol_main.ts"] },
    { solverFileDir: root, modes: ["once", "session"] },
  );
  assert.equal(report.checks.length, 12);
  assert.ok(report.passed, JSON.stringify(report.checks.filter((c) => c.status !== "pass")));
  // derived: a second-order solution of exp(x + y/2) on an 8×16 grid is within 1e-2 relative
  for (const c of report.checks) assert.ok(c.relativeError! < 1e-2);
  assert.ok(report.sessionStartupSeconds !== null);
});

Deno.test("probeSolver() fails a solver whose values are not the solution (the source echoed back)", async () => {
  const report = await probeSolver(
    {
      ...base,
      encoding: "numbers",
      command: ["/usr/bin/python3", "testdata/protocol/solvers/misbehave.py", "echo"],
    },
    { solverFileDir: root },
  );
  assert.equal(report.passed, false);
  assert.match(report.checks[0].reason ?? "", /far from the exact one .*point order \(x fastest\)/);
});
