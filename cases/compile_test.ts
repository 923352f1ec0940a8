import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { loadMath, mathjsEvaluator } from "./_mathjs.ts";
import { compileExpr, compileFused, compileRowSampler, pointSource } from "./compile.ts";
import { checkTree, parseExpression, toExpr } from "./expression.ts";
import { caseTrees } from "./case_trees.ts";
import { deriveRegion } from "./operator.ts";
import { libraryFiles } from "./load.ts";
import { mulberry32 } from "../testing/mod.ts";

Deno.test("compiled functions agree with mathjs evaluate to round-off on every built-in case", async (t) => {
  // Independent library: mathjs's own evaluator (docs/check-values.md, "Independent libraries").
  const math = await loadMath();
  const random = mulberry32(20240601);
  // the non-conservative cases: their coefficients are the case file's own expressions
  const files = (await libraryFiles()).filter((f) =>
    (f.form ?? "non-conservative") === "non-conservative"
  );
  for (const file of files) {
    await t.step(file.id, () => {
      const params = file.parameters ?? {};
      const names = Object.keys(params);
      const parsed = caseTrees(math, file, names);
      assert.deepEqual(parsed.problems, []);
      const { op, exact } = parsed.regions[0];
      const derived = deriveRegion(math, op, exact, parsed.sides);
      const trees = op.form === "non-conservative"
        ? { a: op.a, b: op.b, c: op.c, d: op.d, e: op.e, m: op.m, exact }
        : { exact };
      const all = {
        ...trees,
        source: derived.source,
        ux: derived.ux,
        uy: derived.uy,
        ...Object.fromEntries(Object.entries(derived.boundary).map(([s, n]) => [`bc-${s}`, n])),
      };
      const { x0, x1, y0, y1 } = file.domain;
      for (const [name, tree] of Object.entries(all)) {
        const compiled = compileExpr(toExpr(tree, params));
        const reference = mathjsEvaluator(tree);
        for (let k = 0; k < 20; k++) {
          // interior points only: the singular case's derivatives are unbounded at x = 0
          const x = x0 + (0.02 + 0.96 * random()) * (x1 - x0);
          const y = y0 + (0.02 + 0.96 * random()) * (y1 - y0);
          const want = reference({ ...params, x, y });
          assertClose(compiled(x, y), want, { rel: 1e-12, abs: 1e-12 }, `${name} at (${x}, ${y})`);
        }
      }
    });
  }
});

Deno.test("the fused point function and the row sampler give the same numbers as separate functions", async () => {
  const math = await loadMath();
  const texts = ["sin(pi*x)*exp(x*y)", "cos(pi*y)*sin(pi*x) + x^2", "exp(x*y)/(1 + y^2)", "3.5"];
  const exprs = texts.map((s) => toExpr(parseExpression(math, s, []).node!, {}));
  const single = exprs.map(compileExpr);
  const fused = compileFused(exprs);
  const out = new Float64Array(texts.length);
  fused(0.3, 0.7, out);
  single.forEach((f, k) => assert.equal(out[k], f(0.3, 0.7)));
  const nx = 5, ny = 3, x0 = -1, y0 = 2, hx = 0.25, hy = 0.5;
  const outputs = texts.map(() => new Float64Array((nx + 1) * (ny + 1)));
  compileRowSampler(exprs).run(x0, hx, nx, y0, hy, 0, ny + 1, outputs);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      single.forEach((f, k) =>
        assertClose(outputs[k][j * (nx + 1) + i], f(x0 + i * hx, y0 + j * hy), {
          rel: 1e-15,
          abs: 0,
        })
      );
    }
  }
});

Deno.test("common subexpressions are evaluated once in generated code", async () => {
  const math = await loadMath();
  const e = toExpr(
    parseExpression(math, "sin(pi*x)*exp(y) + sin(pi*x)^2 + exp(y)*cos(pi*x)", []).node!,
    {},
  );
  const source = pointSource([e]);
  assert.equal(source.match(/Math\.sin/g)?.length, 1, source);
  assert.equal(source.match(/Math\.exp/g)?.length, 1, source);
});

Deno.test("generated source contains only numbers, x, y, temporaries and Math calls", async () => {
  const math = await loadMath();
  const e = toExpr(
    parseExpression(math, "atan2(y, x) + log(x + 2, 3) * hypot(x, y) - k", ["k"]).node!,
    { k: 7 },
  );
  const source = pointSource([e]);
  const identifiers = new Set(source.match(/[A-Za-z_$][A-Za-z0-9_$]*/g));
  const allowed = /^(use|strict|const|return|function|x|y|Math|atan2|log|hypot|[ct]\d+|e)$/;
  for (const id of identifiers) {
    assert.match(id, allowed, `unexpected identifier ${id} in\n${source}`);
  }
});

Deno.test("the whitelist refuses mathjs's own import, evaluate, parse, createUnit and config without running them", async () => {
  const math = await loadMath();
  for (
    const name of ["import", "evaluate", "parse", "createUnit", "config", "simplify", "derivative"]
  ) {
    const { node, problems } = parseExpression(math, `${name}("x")`, []);
    assert.equal(node, undefined);
    assert.ok(problems.some((p) => p.message.includes(`function "${name}" is not allowed`)), name);
  }
  // the refused call never ran: the instance still parses and differentiates in plain numbers
  assert.equal(math.derivative(math.parse("x^2"), "x").toString(), "2 * x");
});

Deno.test("unknown names, matrices, assignments, property access and strings are refused with the allowed list", async () => {
  const math = await loadMath();
  const cases: [string, RegExp][] = [
    ["sin(q*x)", /unknown name "q".*allowed names: x, y, pi, e/],
    ["[1, 2]", /matrices and arrays/],
    ["a = 2", /assignment/],
    ["f(x) = x^2", /function definitions/],
    ["x.y", /property or index access/],
    ["'abc' + x", /only numbers/],
    ["5 cm", /unknown name "cm"/],
    ["x == 1", /operator|comparisons/],
    ["x > 1 ? 1 : 2", /conditional/],
    ["sin", /without arguments/],
    ["atan2(x)", /takes 2 argument/],
  ];
  for (const [text, pattern] of cases) {
    const { problems } = parseExpression(math, text, []);
    assert.ok(
      problems.some((p) => pattern.test(p.message)),
      `${text}: ${JSON.stringify(problems)}`,
    );
  }
});

Deno.test("expressions longer than 2000 characters or deeper than 64 levels are refused", async () => {
  const math = await loadMath();
  assert.match(
    parseExpression(math, "x+".repeat(1000) + "x", []).problems[0].message,
    /limit of 2000/,
  );
  const deep = "sin(".repeat(70) + "x" + ")".repeat(70);
  assert.match(parseExpression(math, deep, []).problems[0].message, /deeper than 64/);
});

Deno.test("a syntax error names the column of the expression", async () => {
  const math = await loadMath();
  const { problems } = parseExpression(math, "1 + (2*x", []);
  assert.equal(problems.length, 1);
  assert.equal(problems[0].column, 9);
  assert.match(problems[0].message, /syntax error/);
});

Deno.test("checkTree collects every problem of an expression at once", async () => {
  const math = await loadMath();
  const node = math.parse("import(q) + zz + evaluate(1)");
  const problems = checkTree(node, "import(q) + zz + evaluate(1)", []);
  assert.equal(problems.length, 3, JSON.stringify(problems));
});
