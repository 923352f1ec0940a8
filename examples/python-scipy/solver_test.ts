import assert from "node:assert/strict";
import { findScipyPython } from "../../testing/mod.ts";
import {
  buildRequest,
  decodeValues,
  exactValues,
  maxDifference,
  maxRelativeDifference,
  MIXES,
  QUADRATIC,
  runExample,
  SMOOTH,
} from "../test_requests.ts";

const HERE = new URL(".", import.meta.url);
const PYTHON = await findScipyPython();
const NO_SCIPY = PYTHON === undefined;
const SKIP = NO_SCIPY ? " — SKIPPED: no python3 with NumPy and SciPy (install python3-scipy)" : "";

async function solve(args: string[], req: Record<string, unknown>) {
  const run = await runExample([PYTHON!, "-B", "solver.py", ...args], HERE, JSON.stringify(req));
  assert.equal(run.code, 0, run.stderr);
  assert.equal(run.replies.length, 1, `stdout: ${run.stdout}`);
  return run.replies[0];
}

/** Observed order log2(e_coarse/e_fine) of the max-norm errors on grids n, 2n, 4n. */
async function orders(args: string[], layout: "vertex" | "cell", mix: string, n: number) {
  const errors: number[] = [];
  for (const m of [n, 2 * n, 4 * n]) {
    const reply = await solve(args, buildRequest(SMOOTH, MIXES[mix], { nx: m, ny: m }, { layout }));
    assert.equal(reply.type, "solution", JSON.stringify(reply));
    errors.push(maxDifference(decodeValues(reply.values), exactValues(SMOOTH, layout, m, m)));
  }
  return [Math.log2(errors[0] / errors[1]), Math.log2(errors[1] / errors[2])];
}

Deno.test({
  name: `python-scipy (vertex) reproduces a quadratic exact solution to round-off${SKIP}`,
  ignore: NO_SCIPY,
  fn: async (t) => {
    // Source: derived — central differences and ghost nodes are exact for quadratics.
    for (const [mix, sides] of Object.entries(MIXES)) {
      for (const encoding of ["numbers", "base64"] as const) {
        await t.step(`${mix}, ${encoding}`, async () => {
          const reply = await solve(
            [],
            buildRequest(QUADRATIC, sides, { nx: 8, ny: 6 }, { encoding }),
          );
          assert.equal(reply.type, "solution", JSON.stringify(reply));
          const values = decodeValues(reply.values);
          const rel = maxRelativeDifference(values, exactValues(QUADRATIC, "vertex", 8, 6));
          assert.ok(rel < 1e-11, `max relative error ${rel}`);
        });
      }
    }
  },
});

Deno.test({
  name:
    `python-scipy (vertex) equals an independent dense solve with explicit ghost unknowns${SKIP}`,
  ignore: NO_SCIPY,
  fn: async (t) => {
    // Source: independent library — numpy.linalg.solve (LAPACK) of the system written with the
    // ghost nodes as unknowns of their own (testdata/dense_reference.py), not folded as in vertex.py.
    for (const scheme of ["central", "upwind"] as const) {
      for (const [mix, sides] of Object.entries(MIXES)) {
        await t.step(`${scheme}, ${mix}`, async () => {
          const req = buildRequest(SMOOTH, sides, { nx: 10, ny: 7 }, { scheme });
          const reply = await solve([], req);
          const dense = await runExample(
            [PYTHON!, "-B", "testdata/dense_reference.py"],
            HERE,
            JSON.stringify(req),
          );
          assert.equal(dense.code, 0, dense.stderr);
          const rel = maxRelativeDifference(
            decodeValues(reply.values),
            JSON.parse(dense.stdout) as number[],
          );
          assert.ok(rel < 1e-10, `max relative difference ${rel}`);
        });
      }
    }
  },
});

Deno.test({
  name: `python-scipy (cell) shows order 2 on a smooth solution over three grids${SKIP}`,
  ignore: NO_SCIPY,
  fn: async (t) => {
    // Source: common practice / derived — a second-order scheme's max error falls by 4 per halving
    // of h in the asymptotic range (docs/check-values.md, "Manufactured solutions and order of
    // accuracy": Salari & Knupp; Roache); tolerance ±0.1.
    for (const mix of Object.keys(MIXES)) {
      await t.step(mix, async () => {
        const [p1, p2] = await orders(["--layout", "cell"], "cell", mix, 12);
        assert.ok(Math.abs(p2 - 2) < 0.1, `orders ${p1}, ${p2}`);
      });
    }
  },
});

Deno.test({
  name:
    `python-scipy-defective shows order 1 with Neumann/Robin sides and order 2 with Dirichlet sides only${SKIP}`,
  ignore: NO_SCIPY,
  fn: async (t) => {
    // Source: common practice — a first-order one-sided boundary difference limits the global
    // order to 1; with only Dirichlet sides the seeded defect never triggers (order 2).
    const defect = ["--seeded-defect", "one-sided"];
    await t.step("neumann and robin only: order about 1", async () => {
      const [p1, p2] = await orders(defect, "vertex", "neumann and robin only", 12);
      assert.ok(Math.abs(p2 - 1) < 0.15, `orders ${p1}, ${p2}`);
    });
    await t.step("all dirichlet: order 2, as the correct solver", async () => {
      const [p1, p2] = await orders(defect, "vertex", "all dirichlet", 12);
      assert.ok(Math.abs(p2 - 2) < 0.1, `orders ${p1}, ${p2}`);
    });
    await t.step("the correct solver shows order 2 on the same Neumann/Robin case", async () => {
      const [p1, p2] = await orders([], "vertex", "neumann and robin only", 12);
      assert.ok(Math.abs(p2 - 2) < 0.1, `orders ${p1}, ${p2}`);
    });
  },
});

Deno.test({
  name: `python-scipy answers hello, requests and goodbye in session mode${SKIP}`,
  ignore: NO_SCIPY,
  fn: async () => {
    const hello = { protocol: "gridproof-protocol/1", type: "hello" };
    const goodbye = { protocol: "gridproof-protocol/1", type: "goodbye" };
    const r1 = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 }, {
      id: "cell-one",
      layout: "cell",
    });
    const r2 = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 }, { id: "vertex" });
    const input = [hello, r1, r2, goodbye].map((m) => JSON.stringify(m)).join("\n") + "\n";
    const run = await runExample([PYTHON!, "-B", "solver.py", "--layout", "cell"], HERE, input);
    assert.equal(run.code, 0, run.stderr);
    assert.deepEqual(run.replies.map((r) => r.type), ["ready", "solution", "not-applicable"]);
    const supports = run.replies[0].supports as { layouts: string[] };
    assert.deepEqual(supports.layouts, ["cell"]);
  },
});

Deno.test({
  name:
    `python-scipy solves u = cos πx cos πy with zero Neumann data at order 2 after mean removal${SKIP}`,
  ignore: NO_SCIPY,
  fn: async () => {
    // issue 14, item 8: u = cos πx cos πy has zero normal derivative on every side of the unit
    // square and zero mean; Δu = −2π²u (derived by hand). The singular system is fixed by the
    // example's bordered solve; the max error after removing the trapezoid mean must fall by
    // about 4 per halving (order 2, common practice: central differences)
    const errors: number[] = [];
    for (const n of [16, 32]) {
      const req = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: n, ny: n });
      const count = (n + 1) ** 2;
      const u = new Array(count), f = new Array(count), w = new Array(count);
      for (let j = 0; j <= n; j++) {
        for (let i = 0; i <= n; i++) {
          const k = j * (n + 1) + i, x = i / n, y = j / n;
          u[k] = Math.cos(Math.PI * x) * Math.cos(Math.PI * y);
          f[k] = -2 * Math.PI ** 2 * u[k];
          w[k] = (i === 0 || i === n ? 0.5 : 1) * (j === 0 || j === n ? 0.5 : 1);
        }
      }
      const neumann = { kind: "neumann", values: new Array(n + 1).fill(0) };
      req.domain = { x0: 0, x1: 1, y0: 0, y1: 1 };
      req.boundary = { west: neumann, east: neumann, south: neumann, north: neumann };
      req.coefficients = {
        a: new Array(count).fill(1),
        b: new Array(count).fill(0),
        c: new Array(count).fill(1),
        d: new Array(count).fill(0),
        e: new Array(count).fill(0),
        m: new Array(count).fill(0),
      };
      req.source = f;
      req.singular = true;
      const reply = await solve([], req);
      assert.equal(reply.type, "solution", JSON.stringify(reply).slice(0, 300));
      const v = reply.values as number[];
      const total = w.reduce((s, x) => s + x, 0);
      const mean = v.reduce((s, x, k) => s + w[k] * x, 0) / total;
      assert.ok(Math.abs(mean) < 1e-10, `the bordered solve fixes a zero mean, got ${mean}`);
      errors.push(Math.max(...v.map((x, k) => Math.abs(x - mean - u[k]))));
    }
    const order = Math.log2(errors[0] / errors[1]);
    assert.ok(Math.abs(order - 2) < 0.1, `observed order ${order} (errors ${errors})`);
  },
});

Deno.test({
  name: `python-scipy reads constant arrays and gives the same solution as from full arrays${SKIP}`,
  ignore: NO_SCIPY,
  fn: async () => {
    // Same request twice: once with every coefficient array in full, once with the arrays that
    // hold one value (here d and e, made constant) in the {"constant", "length"} form.
    const req = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 6, ny: 4 });
    const count = 7 * 5;
    const full = {
      ...req,
      coefficients: {
        ...(req.coefficients as object),
        d: new Array(count).fill(-0.25),
        e: new Array(count).fill(-1.5),
      },
    };
    const constants = {
      ...full,
      coefficients: {
        ...(full.coefficients as object),
        d: { constant: -0.25, length: count },
        e: { constant: -1.5, length: count },
      },
    };
    const [a, b] = [await solve([], full), await solve([], constants)];
    assert.equal(b.type, "solution", JSON.stringify(b));
    assert.deepEqual(decodeValues(b.values), decodeValues(a.values));
  },
});
