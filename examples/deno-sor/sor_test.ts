import assert from "node:assert/strict";
import {
  buildRequest,
  decodeValues,
  DOMAIN,
  exactValues,
  maxDifference,
  MIXES,
  QUADRATIC,
  runExample,
  SMOOTH,
} from "../test_requests.ts";

const HERE = new URL(".", import.meta.url);
// The same deno that runs the tests (the project's ./node_modules/.bin/deno).
const COMMAND = [Deno.execPath(), "run", "--no-lock", "--quiet", "main.ts"];

Deno.test("deno-sor reproduces a quadratic exact solution to round-off with every boundary kind", async (t) => {
  // Source: derived — central differences and the ghost-node formulas are exact for quadratics
  // (docs/check-values.md, "Exact facts of central differences"), so the discrete solution equals
  // u at the nodes up to the solver tolerance.
  for (const [mix, sides] of Object.entries(MIXES)) {
    for (const encoding of ["numbers", "base64"] as const) {
      await t.step(`${mix}, ${encoding}`, async () => {
        const req = buildRequest(QUADRATIC, sides, { nx: 8, ny: 6 }, { encoding, id: mix });
        const run = await runExample(COMMAND, HERE, JSON.stringify(req));
        assert.equal(run.code, 0, run.stderr);
        assert.equal(run.replies.length, 1, `stdout: ${run.stdout}`);
        const reply = run.replies[0];
        assert.equal(reply.type, "solution", JSON.stringify(reply));
        assert.equal(reply.id, mix);
        assert.equal(reply.converged, true);
        const values = decodeValues(reply.values);
        const err = maxDifference(values, exactValues(QUADRATIC, "vertex", 8, 6));
        assert.ok(err < 1e-9, `max error ${err}`);
      });
    }
  }
});

Deno.test("deno-sor with upwinding reproduces a linear exact solution", async () => {
  // Source: derived — one-sided first differences are exact for linear functions.
  const linear = {
    u: (x: number, y: number) => 2 - x + 3 * y,
    ux: () => -1,
    uy: () => 3,
    uxx: () => 0,
    uyy: () => 0,
  };
  const req = buildRequest(linear, MIXES["mixed with a dirichlet side"], { nx: 7, ny: 9 }, {
    scheme: "upwind",
  });
  const run = await runExample(COMMAND, HERE, JSON.stringify(req));
  const reply = run.replies[0];
  assert.equal(reply.type, "solution", JSON.stringify(reply));
  const err = maxDifference(decodeValues(reply.values), exactValues(linear, "vertex", 7, 9));
  assert.ok(err < 1e-9, `max error ${err}`);
});

Deno.test("deno-sor needs about twice the sweeps when the grid is refined twice", async () => {
  // Source: common practice — SOR with the optimal ω needs O(n) sweeps on an n×n grid, so its
  // work grows like N^1.5 in the unknowns N (not a timing: sweep counts are deterministic).
  const sweeps: number[] = [];
  for (const n of [16, 32]) {
    const req = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: n, ny: n });
    const run = await runExample(COMMAND, HERE, JSON.stringify(req));
    sweeps.push(run.replies[0].iterations as number);
  }
  const ratio = sweeps[1] / sweeps[0];
  assert.ok(ratio > 1.5 && ratio < 3, `sweeps ${sweeps.join(", ")}: ratio ${ratio}`);
});

Deno.test("deno-sor answers hello, several requests and goodbye in session mode", async () => {
  const hello = { protocol: "gridproof-protocol/1", type: "hello" };
  const goodbye = { protocol: "gridproof-protocol/1", type: "goodbye" };
  const r1 = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 }, { id: "one" });
  const r2 = buildRequest(QUADRATIC, MIXES["neumann and robin only"], { nx: 5, ny: 4 }, {
    id: "two",
    encoding: "base64",
  });
  const input = [hello, r1, r2, goodbye].map((m) => JSON.stringify(m)).join("\n") + "\n";
  const run = await runExample(COMMAND, HERE, input);
  assert.equal(run.code, 0, run.stderr);
  assert.deepEqual(run.replies.map((r) => r.type), ["ready", "solution", "solution"]);
  assert.deepEqual(run.replies.slice(1).map((r) => r.id), ["one", "two"]);
  const values = decodeValues(run.replies[2].values);
  assert.ok(maxDifference(values, exactValues(QUADRATIC, "vertex", 5, 4)) < 1e-9);
});

Deno.test("deno-sor answers an unknown protocol version with an error naming both", async () => {
  const req = { ...buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 }) };
  req.protocol = "gridproof-protocol/9";
  const run = await runExample(COMMAND, HERE, JSON.stringify(req));
  assert.equal(run.replies[0].type, "error");
  assert.match(String(run.replies[0].reason), /gridproof-protocol\/1.*gridproof-protocol\/9/);
});

Deno.test("deno-sor reports a cell-layout request as not applicable", async () => {
  const req = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 }, { layout: "cell" });
  const run = await runExample(COMMAND, HERE, JSON.stringify(req));
  assert.equal(run.replies[0].type, "not-applicable");
});

Deno.test("deno-sor --seeded-defect one-sided shows order 1 with Neumann/Robin sides, 2 with Dirichlet only", async (t) => {
  // Source: common practice — a first-order one-sided boundary difference limits the global
  // order to 1; with only Dirichlet sides the seeded defect never triggers (order 2, derived).
  async function finestOrder(mix: string, args: string[]): Promise<number> {
    const errors: number[] = [];
    for (const n of [12, 24, 48]) {
      const req = buildRequest(SMOOTH, MIXES[mix], { nx: n, ny: n }, { encoding: "base64" });
      const run = await runExample([...COMMAND, ...args], HERE, JSON.stringify(req));
      assert.equal(run.replies[0].type, "solution", run.stderr);
      errors.push(
        maxDifference(decodeValues(run.replies[0].values), exactValues(SMOOTH, "vertex", n, n)),
      );
    }
    return Math.log2(errors[1] / errors[2]);
  }
  const defect = ["--seeded-defect", "one-sided"];
  await t.step("neumann and robin only: order about 1", async () => {
    const p = await finestOrder("neumann and robin only", defect);
    assert.ok(Math.abs(p - 1) < 0.15, `order ${p}`);
  });
  await t.step("all dirichlet: order 2", async () => {
    const p = await finestOrder("all dirichlet", defect);
    assert.ok(Math.abs(p - 2) < 0.1, `order ${p}`);
  });
});

Deno.test("deno-sor --reply-points replies at the cell centres with four-node averages and weights hx·hy", async (t) => {
  for (const encoding of ["numbers", "base64"] as const) {
    await t.step(encoding, async () => {
      const req = buildRequest(QUADRATIC, MIXES["mixed with a dirichlet side"], { nx: 8, ny: 6 }, {
        encoding,
      });
      const run = await runExample([...COMMAND, "--reply-points"], HERE, JSON.stringify(req));
      assert.equal(run.code, 0, run.stderr);
      const reply = run.replies[0];
      assert.equal(reply.type, "solution", JSON.stringify(reply));
      const points = reply.points as Record<string, unknown>;
      const x = decodeValues(points.x), y = decodeValues(points.y);
      const w = decodeValues(points.weights);
      const hx = (DOMAIN.x1 - DOMAIN.x0) / 8, hy = (DOMAIN.y1 - DOMAIN.y0) / 6;
      assert.equal(x.length, 48);
      // cell (i, j) at index j·nx + i, centre (x0 + (i + ½)hx, y0 + (j + ½)hy) — docs/protocol.md
      assert.ok(Math.abs(x[8 * 2 + 3] - (DOMAIN.x0 + 3.5 * hx)) < 1e-15);
      assert.ok(Math.abs(y[8 * 2 + 3] - (DOMAIN.y0 + 2.5 * hy)) < 1e-15);
      assert.ok(w.every((v) => Math.abs(v - hx * hy) < 1e-17));
      // derived: the nodes are exact for a quadratic; their four-node average at the centre is
      // u(c) + (hx²·u_xx + hy²·u_yy)/8
      const expected = x.map((xi, k) =>
        QUADRATIC.u(xi, y[k]) +
        (hx * hx * QUADRATIC.uxx(xi, y[k]) + hy * hy * QUADRATIC.uyy(xi, y[k])) / 8
      );
      const err = maxDifference(decodeValues(reply.values), expected);
      assert.ok(err < 1e-9, `max error ${err}`);
    });
  }
  await t.step("its session's ready message declares the points layout", async () => {
    const hello = { protocol: "gridproof-protocol/1", type: "hello" };
    const run = await runExample(
      [...COMMAND, "--reply-points"],
      HERE,
      JSON.stringify(hello) + "\n",
    );
    const supports = run.replies[0].supports as { layouts: string[] };
    assert.deepEqual(supports.layouts, ["points"]);
  });
});
