import assert from "node:assert/strict";
import { runGridproof as runCli } from "../../testing/mod.ts";

Deno.test("gridproof solve --json prints one object with errors, residual history and timing", async () => {
  const run = await runCli(["solve", "--case", "smooth-baseline", "--n", "32", "--json"]);
  assert.equal(run.code, 0, run.stderr);
  const r = JSON.parse(run.stdout);
  for (
    const key of [
      "case",
      "n",
      "errorMax",
      "errorL2",
      "cycles",
      "residualHistory",
      "convergenceFactor",
      "converged",
      "seconds",
    ]
  ) assert.ok(key in r, key);
  assert.equal(r.case, "smooth-baseline");
  assert.equal(r.n, 32);
  assert.equal(r.residualHistory.length, r.cycles + 1);
  // the error of this case on 32×32 is 2.6e-4 (second order from 1.0e-3 on 16×16): not round-off, not garbage
  assert.ok(r.errorMax > 1e-5 && r.errorMax < 1e-3, String(r.errorMax));
});

Deno.test("gridproof solve takes a case file, options and parameters, and prints text", async () => {
  const run = await runCli([
    "solve",
    "--case",
    "testdata/cases/good.json",
    "--n",
    "16",
    "--cycle",
    "w",
    "--smoother",
    "gauss_seidel",
    "--pre",
    "1",
    "--post",
    "1",
    "--tol",
    "1e-8",
    "--upwind",
  ]);
  assert.equal(run.code, 0, run.stderr);
  assert.match(run.stdout, /case user-good on 16×16 intervals, upwind scheme/);
  assert.match(run.stdout, /error max \d\.\d+e-\d+ {3}L2/);
  assert.match(run.stdout, /residual history/);
  const param = await runCli([
    "solve",
    "--case",
    "boundary-layer",
    "--n",
    "64",
    "--param",
    "width=0.1",
    "--json",
  ]);
  assert.deepEqual(JSON.parse(param.stdout).parameters, { width: 0.1 });
});

Deno.test("gridproof solve refuses unknown cases, cycles, smoothers and bad numbers with the valid values", async (t) => {
  const bad: [string[], RegExp][] = [
    [["--case", "nope"], /--case: unknown case "nope".*smooth-baseline/],
    [
      ["--case", "smooth-baseline", "--cycle", "X"],
      /--cycle: unknown cycle "X"; valid: V, W, F, fmg/,
    ],
    [
      ["--case", "smooth-baseline", "--smoother", "sor"],
      /--smoother: unknown smoother "sor"; valid: jacobi, gauss-seidel/,
    ],
    [
      ["--case", "smooth-baseline", "--n", "1"],
      /--n: must be a whole number of at least 2, found "1"/,
    ],
    [["--case", "smooth-baseline", "--tol", "abc"], /--tol: must be a number between 0 and 1/],
    [
      ["--case", "boundary-layer", "--param", "q=1"],
      /has no parameter "q"; valid parameters: width/,
    ],
    [
      ["--case", "testdata/cases/not-elliptic.json", "--n", "8"],
      /coefficients\.a: a = -0\.5 at \(x, y\) = \(0, 0\)/,
    ],
    [["--case", "testdata/cases/missing.json"], /testdata\/cases\/missing\.json: file not found/],
  ];
  for (const [args, pattern] of bad) {
    await t.step(args.join(" "), async () => {
      const run = await runCli(["solve", ...args]);
      assert.equal(run.code, 2, run.stderr);
      assert.match(run.stderr, pattern);
      assert.doesNotMatch(run.stderr, /\n\s+at .*\.ts:\d+/);
    });
  }
});

Deno.test("gridproof solve --help lists the accepted spellings of every option", async () => {
  const run = await runCli(["solve", "--help"]);
  assert.equal(run.code, 0);
  for (
    const p of [/V, W, F, fmg/, /jacobi, gauss-seidel, red-black, line-x, line-y, alternating-line/]
  ) {
    assert.match(run.stdout.replace(/\s+/g, " "), p);
  }
});

Deno.test("gridproof solve refuses an unknown option with the list of valid ones", async () => {
  const run = await runCli(["solve", "--case", "smooth-baseline", "--cylce", "V"]);
  assert.equal(run.code, 2);
  assert.match(run.stderr, /unknown option '--cylce'/);
  assert.match(run.stderr, /--cycle/);
});
