/**
 * Every whitelisted function, written by each language's emitter and run there, against the
 * harness's compiler (`compileExpr`, itself checked against mathjs in `cases/compile_test.ts`):
 * the meanings the emitters choose (reciprocals, log with a base, 8-argument min, max and hypot,
 * sign, the cube root) agree to 1e-12 relative at random points.
 */
import assert from "node:assert/strict";
import { ALLOWED_FUNCTIONS, compileExpr, type Expr } from "../../cases/mod.ts";
import { bodyOf, EXPORT_LANGUAGES } from "../../cases/export/mod.ts";
import { mulberry32 } from "../../testing/mod.ts";
import { evaluateExported, toolchainFor } from "./_compile_export.ts";

const x: Expr = { kind: "variable", name: "x" };
const y: Expr = { kind: "variable", name: "y" };
const num = (value: number): Expr => ({ kind: "number", value });
const add = (...args: Expr[]): Expr => ({ kind: "operator", op: "+", args });
const mul = (...args: Expr[]): Expr => ({ kind: "operator", op: "*", args });

/** Arguments inside each function's domain for x, y in (0.1, 0.9). */
function argumentsOf(name: string, most: number): Expr[] {
  const u = add(x, num(0.1));
  const v = mul(y, num(0.7));
  switch (name) {
    case "asin":
    case "acos":
      return [mul(u, num(0.9))];
    case "log":
      return [add(u, num(1)), add(v, num(2))];
    case "pow":
      return [u, add(v, num(0.3))];
    case "sign":
      return [add(x, num(-0.5))];
    case "min":
    case "max":
    case "hypot":
      return Array.from({ length: most }, (_, k) => add(mul(x, num(k - 3)), mul(y, num(1 + k))));
    case "cbrt":
      return [add(x, num(-0.5))];
    default:
      return most === 2 ? [u, v] : [u];
  }
}

const cases = Object.entries(ALLOWED_FUNCTIONS).map(([name, [, most]]) => ({
  name: `f_${name}`,
  expr: { kind: "call", name, args: argumentsOf(name, most) } as Expr,
}));

for (const language of Object.keys(EXPORT_LANGUAGES) as (keyof typeof EXPORT_LANGUAGES)[]) {
  const toolchain = await toolchainFor(language);
  const missing = "missing" in toolchain ? toolchain.missing : undefined;
  Deno.test({
    name: `every whitelisted function keeps its meaning in ${language}${
      missing ? ` (skipped: ${missing})` : ""
    }`,
    ignore: missing !== undefined,
    fn: async () => {
      const lang = EXPORT_LANGUAGES[language];
      const text = lang.file({
        ident: "functions",
        header: ["every whitelisted function"],
        quantities: cases.map((c) => ({
          name: c.name,
          summary: c.name,
          bodies: [bodyOf(c.expr, lang.spelling)],
        })),
      });
      const random = mulberry32(77);
      const points = Array.from(
        { length: 50 },
        () => [0.1 + 0.8 * random(), 0.1 + 0.8 * random()] as const,
      );
      const values = await evaluateExported({
        language,
        toolchain: "command" in toolchain ? toolchain.command : "",
        text,
        ident: "functions",
        names: cases.map((c) => c.name),
        points,
      });
      cases.forEach((c, j) => {
        const f = compileExpr(c.expr);
        points.forEach(([px, py], k) => {
          const want = f(px, py);
          const got = values[k * cases.length + j];
          assert.ok(
            Math.abs(got - want) <= 1e-12 * Math.abs(want) + 1e-300,
            `${c.name.slice(2)} at (${px}, ${py}): ${language} gives ${got}, the harness ${want}`,
          );
        });
      });
    },
  });
}
