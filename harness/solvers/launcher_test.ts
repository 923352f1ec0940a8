import assert from "node:assert/strict";
import { launcherProblems, launchPrefix, ranksFor } from "./launcher.ts";

Deno.test("ranksFor() gives one rank per unknownsPerRank unknowns, rounded up, within 1 and most", async (t) => {
  // unknowns of a vertex grid are (nx + 1)(ny + 1) (docs/protocol.md, "vertex layout")
  const rule = { command: [], ranks: { unknownsPerRank: 1000, most: 4 } };
  await t.step("17×17 nodes = 289 unknowns → 1 rank", () => {
    assert.equal(ranksFor(rule, "vertex", 16, 16), 1);
  });
  await t.step("33×33 = 1089 unknowns → 2 ranks", () => {
    assert.equal(ranksFor(rule, "vertex", 32, 32), 2);
  });
  await t.step("a cell grid counts cells: 32×32 = 1024 → 2", () => {
    assert.equal(ranksFor(rule, "cell", 32, 32), 2);
  });
  await t.step("capped at most", () => assert.equal(ranksFor(rule, "vertex", 256, 256), 4));
});

Deno.test("launchPrefix() fills every placeholder and leaves other text alone", () => {
  const argv = launchPrefix(
    {
      command: ["srun", "-n", "{ranks}", "--time={minutes}", "-J", "{job}", "x{nx}y{ny}"],
      ranks: 3,
    },
    { solver: "s", caseId: "c", layout: "vertex", nx: 8, ny: 4, limitSeconds: 61 },
  );
  assert.deepEqual(argv, ["srun", "-n", "3", "--time=2", "-J", "gridproof-s-c-8x4", "x8y4"]);
});

Deno.test("launcherProblems() names unknown placeholders and grid placeholders in a session", () => {
  const problems = launcherProblems(
    { command: ["mpirun", "-np", "{rank}", "{nx}"], ranks: { unknownsPerRank: 10 } },
    "session",
    "solvers[0].launcher",
  );
  assert.equal(problems.length, 3);
  assert.match(problems[0], /^solvers\[0\]\.launcher\.command\[2\]: unknown placeholder \{rank\}/);
  assert.match(problems[1], /command\[3\]: \{nx\} depends on the grid/);
  assert.match(problems[2], /^solvers\[0\]\.launcher\.ranks: .*fixed number/);
});
