import assert from "node:assert/strict";
import { buildCase } from "./engine.ts";
import { loadLibrary } from "./load.ts";
import { testCase } from "./_test_case.ts";
import { loadMath } from "./_mathjs.ts";
import { compileExpr, compileRowSampler } from "./compile.ts";
import { parseExpression, toExpr } from "./expression.ts";
import { sampleProblem, type SamplerSpec } from "./sample.ts";

Deno.test("sample() lays nodes out x fastest with boundary values ordered by increasing coordinate", async () => {
  const c = await buildCase(
    testCase({
      domain: { x0: 1, x1: 2, y0: -1, y1: 1 },
      coefficients: { a: "1 + x", b: "y", c: "2", d: "0", e: "x*y" },
      exact: "x + 10*y",
    }),
    { origin: "test" },
  );
  const p = c.sample(4, 2);
  // node (i, j) at (1 + i/4, −1 + j), index j·5 + i (problem.ts)
  assert.equal(p.a[1 * 5 + 2], 1 + 1.5);
  assert.equal(p.e[2 * 5 + 4], 2 * 1);
  assert.equal(p.b[0], -1);
  assert.deepEqual([...(p.boundary.west as { values: Float64Array }).values], [1 - 10, 1, 1 + 10]);
  assert.deepEqual([...(p.boundary.north as { values: Float64Array }).values], [
    11,
    11.25,
    11.5,
    11.75,
    12,
  ]);
  assert.deepEqual([...c.sampleExact(4, 2)].slice(5, 10), [1, 1.25, 1.5, 1.75, 2]);
});

/**
 * A sampler spec made straight from expression texts for a, b, c, d, e and f, without the build's
 * operator check (`operator_check.ts`), so that the sampling checks themselves are exercised: they
 * guard cases made in code, which are not built from a file.
 */
async function specOf(texts: string[], origin: string): Promise<SamplerSpec> {
  const math = await loadMath();
  const exprs = texts.map((t) => toExpr(parseExpression(math, t, []).node!, {}));
  const zero = { kind: "dirichlet" as const, data: () => 0 };
  const [a, b, c, d, e, f] = exprs.map(compileExpr);
  return {
    id: "test-case",
    origin,
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    problemSampler: compileRowSampler(exprs),
    pointFunctions: { a, b, c, d, e, f },
    boundary: { west: zero, east: zero, south: zero, north: zero },
  };
}

Deno.test("sample() refuses a non-elliptic operator, naming the node, its coordinates and the values", async () => {
  const spec = await specOf(["x - 0.5", "0", "1", "0", "0", "0"], "my.json");
  assert.throws(() => sampleProblem(spec, 4, 4), (e: unknown) => {
    assert.ok(e instanceof RangeError);
    assert.match(
      e.message,
      /case "test-case" \(my\.json\): the operator is not elliptic at node \(i=0, j=0\) at \(x, y\) = \(0, 0\): a = -0\.5, c = 1/,
    );
    assert.match(e.message, /fix coefficients\.a or coefficients\.c/);
    return true;
  });
});

Deno.test("sample() names the node and field where NaN or infinity appears", async () => {
  const c = await specOf(["1", "0", "1", "0", "0", "sqrt(x - 0.5)"], "test");
  assert.throws(
    () => sampleProblem(c, 4, 4),
    /the derived source term f is NaN at node \(i=0, j=0\)/,
  );
  const d = await specOf(["1", "1/(y - 0.5)", "1", "0", "0", "0"], "test");
  assert.throws(
    () => sampleProblem(d, 4, 4),
    /coefficients\.b is -?Infinity at node \(i=0, j=2\) at \(x, y\) = \(0, 0\.5\)/,
  );
});

Deno.test("sample() refuses grid sizes below 2 or not whole", async () => {
  const c = await buildCase(testCase(), { origin: "test" });
  assert.throws(() => c.sample(1, 4), /nx must be an integer of at least 2, found 1/);
  assert.throws(() => c.sample(4, 2.5), /ny must be an integer of at least 2, found 2.5/);
});

Deno.test("sampleAsync() split across threads gives exactly the numbers of the single-thread path", async () => {
  const c = await buildCase(
    testCase({
      coefficients: {
        a: "1 + 0.5*sin(2*pi*x)*sin(2*pi*y)",
        b: "x",
        c: "1 + 0.25*cos(pi*x*y)",
        d: "y",
        e: "-(1 + x*y)",
      },
      exact: "sin(pi*x)*sin(pi*y)*exp(x*y)",
    }),
    { origin: "test" },
  );
  const sync = c.sample(64, 48);
  const parallel = await c.sampleAsync(64, 48, { threads: 3, minNodes: 0 });
  for (const f of ["a", "b", "c", "d", "e", "f"] as const) {
    assert.deepEqual(parallel[f], sync[f], f);
  }
  assert.ok(parallel.f.buffer instanceof SharedArrayBuffer);
});

Deno.test("constantCoefficients names exactly the coefficients that hold one value on the grid", async () => {
  // exact identity: a named coefficient equals its value at every node; an unnamed one varies
  // (the conservative form's sampled b, d, e are β and σ, not its expansion: see ConservativeTerms)
  for (const c of (await loadLibrary()).filter((c) => c.form === "non-conservative")) {
    const p = c.sample(12, 12);
    for (const k of ["a", "b", "c", "d", "e"] as const) {
      const named = c.constantCoefficients[k];
      const varies = p[k].some((v) => v !== p[k][0]);
      if (named === undefined) {
        assert.ok(varies, `${c.id}: ${k} = ${c.formulas[k]} is constant but not named`);
      } else {
        assert.ok(p[k].every((v) => v === named), `${c.id}: ${k} is named ${named}`);
      }
    }
  }
  const smooth = (await loadLibrary()).find((c) => c.id === "smooth-baseline")!;
  // the case file's coefficients: a = 1, b = 0.5, c = 2, d = -0.75, e = -1
  assert.deepEqual(smooth.constantCoefficients, { a: 1, b: 0.5, c: 2, d: -0.75, e: -1, m: 0 });
});
