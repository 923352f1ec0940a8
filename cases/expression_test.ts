import assert from "node:assert/strict";
import type { MathNode } from "mathjs";
import { loadMath, type MathTools } from "./_mathjs.ts";
import { parseExpression } from "./expression.ts";

Deno.test("parseExpression() refuses parentheses nested beyond 64 levels without a stack overflow (issue 12, item 15)", async (t) => {
  // before, 500 levels reached mathjs's recursive parser and came back as "syntax error: Maximum
  // call stack size exceeded" at column 1
  const math = await loadMath();
  for (const levels of [65, 500, 999]) {
    await t.step(`${levels} levels`, () => {
      const text = "(".repeat(levels) + "x" + ")".repeat(levels);
      const { node, problems } = parseExpression(math, text, []);
      assert.equal(node, undefined);
      assert.equal(problems.length, 1, JSON.stringify(problems));
      assert.match(problems[0].message, /parentheses are nested deeper than 64 levels; remove/);
      assert.equal(problems[0].column, 65, "the first parenthesis past the limit");
      assert.doesNotMatch(problems[0].message, /call stack/);
    });
  }
  await t.step("64 levels are accepted", () => {
    const text = "(".repeat(64) + "x" + ")".repeat(64);
    assert.deepEqual(parseExpression(math, text, []).problems, []);
  });
  await t.step("a parser that runs out of stack anyway gives a clear message", () => {
    const overflowing: MathTools = {
      ...math,
      parse(): MathNode {
        throw new RangeError("Maximum call stack size exceeded");
      },
    };
    const { problems } = parseExpression(overflowing, "sin(x)", []);
    assert.equal(problems.length, 1);
    assert.match(
      problems[0].message,
      /^expression is nested too deeply to be read \(Maximum call stack size exceeded\); use at most 64 levels/,
    );
    assert.doesNotMatch(problems[0].message, /syntax error/);
  });
});

Deno.test("parseExpression() refuses syntax mathjs accepts but the grammar does not, with the column and the fix (issue 12, item 16)", async (t) => {
  // before, each of these compiled: sin(x)(y) and 2x as products, x% as x/100, "x # c" as x
  const math = await loadMath();
  const rows: [string, number, RegExp][] = [
    [
      "sin(x)(y)",
      7,
      /implicit multiplication "sin\(x\)\(y\)" is not allowed: write sin\(x\)\*\(y\)/,
    ],
    ["2x", 2, /implicit multiplication "2x" is not allowed: write 2\*x/],
    ["1/2x", 4, /"2x" is not allowed: write 2\*x .*1\/2x as \(1\/2\)\*x/],
    ["2 y", 3, /"2 y" is not allowed: write 2\*y/],
    ["x y", 3, /"x y" is not allowed: write x\*y/],
    ["(x+1)(y-1)", 6, /write \(x\+1\)\*\(y-1\)/],
    ["2(x+1)", 2, /write 2\*\(x\+1\)/],
    ["sin(x)cos(y)", 7, /write sin\(x\)\*cos\(y\)/],
    ["2pi", 2, /write 2\*pi/],
    ["sin x", 5, /"sin x" is not allowed: a function needs parentheses, write sin\(x\)/],
    ["x%", 2, /"%" is not allowed: mathjs reads x% as x\/100 .*write x\/100/],
    ["x % 2", 3, /"%" is not allowed/],
    ["x # comment", 3, /"#" is not allowed: mathjs would read the rest .* as a comment/],
    ["0x10 * x", 1, /"0x10" is not allowed: write numbers in decimal \(16\)/],
  ];
  for (const [text, column, pattern] of rows) {
    await t.step(text, () => {
      const { node, problems } = parseExpression(math, text, []);
      assert.equal(node, undefined, text);
      const found = problems.find((p) => pattern.test(p.message));
      assert.ok(found, `${text}: ${JSON.stringify(problems)}`);
      assert.equal(found.column, column, text);
    });
  }
  await t.step("every documented form is still accepted", () => {
    for (
      const text of [
        "2*x",
        "-x + +y",
        "x^-2",
        "2^3^2",
        ".5*x + 5.25",
        "2.5e-3*x + 1E+2",
        "exp (x)",
        "sin(k*pi*x) * e^y",
        "log(x + 2, 10) - atan2(y, x)",
        "--x",
      ]
    ) {
      assert.deepEqual(parseExpression(math, text, ["k"]).problems, [], text);
    }
  });
});
