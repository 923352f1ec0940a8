import assert from "node:assert/strict";
import { jobEnd } from "./job_end.ts";
import { predictSeconds } from "./predict_time.ts";

// States and exit codes as Slurm 22.05 showed them on the one-node cluster (squeue %T,
// scontrol ExitCode); measured, recorded in docs/cluster.md, "Failure messages".
Deno.test("jobEnd() maps each final Slurm state to a reply to read or a failure in words", async (t) => {
  const info: { id: string; reason: string; exit: number | null; minutes: number } = {
    id: "42",
    reason: "",
    exit: null,
    minutes: 3,
  };
  const rows: [string, Partial<typeof info>, RegExp | "reply"][] = [
    ["COMPLETED", {}, "reply"],
    [
      "FAILED",
      { exit: 3, reason: "NonZeroExitCode" },
      /solver exited with code 3 \(Slurm job 42 FAILED\)/,
    ],
    ["FAILED", { reason: "JobLaunchFailure" }, /before the solver finished .*JobLaunchFailure/],
    ["TIMEOUT", { reason: "TimeLimit" }, /time limit of 3 min .*TIMEOUT/],
    ["CANCELLED", {}, /cancelled outside gridproof/],
    ["NODE_FAIL", {}, /node running Slurm job 42 failed/],
    ["OUT_OF_MEMORY", {}, /--mem=/],
  ];
  for (const [state, extra, expected] of rows) {
    await t.step(`${state} ${extra.reason ?? ""}`, () => {
      const end = jobEnd(state, { ...info, ...extra });
      if (expected === "reply") assert.equal(end.kind, "reply");
      else assert.ok(end.kind === "failed" && expected.test(end.reason), JSON.stringify(end));
    });
  }
});

Deno.test("predictSeconds() continues the power law of the two largest smaller grids", () => {
  // exact power laws: t = N^2 / 1e6 → g = 2
  const points = [1e3, 2e3, 4e3].map((n) => ({ unknowns: n, seconds: n * n / 1e6 }));
  assert.ok(Math.abs(predictSeconds(points, 8e3)! - 64) < 1e-9);
  assert.equal(predictSeconds(points.slice(0, 1), 8e3), null);
  // growth below 1 is read as 1 (no solver's work grows slower than its unknowns)
  const flat = [{ unknowns: 1e3, seconds: 1 }, { unknowns: 2e3, seconds: 1 }];
  assert.equal(predictSeconds(flat, 4e3), 2);
});
