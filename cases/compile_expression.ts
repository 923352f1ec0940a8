/**
 * Text to point function in one call: parse with mathjs, check against the whitelist, compile with
 * the engine's own compiler.
 *
 * @module
 */
import { loadMath } from "./_mathjs.ts";
import { compileExpr, type PointFunction } from "./compile.ts";
import { parseExpression, pointAt, toExpr } from "./expression.ts";

/** Options of {@link compileExpression}. */
export interface CompileExpressionOptions {
  /** Named numbers the expression may use. Default: none. */
  parameters?: Record<string, number>;
}

/**
 * Compiles expression text (mathjs syntax over x, y, pi, e and the given parameters) to a plain
 * JavaScript point function.
 *
 * @throws {RangeError} listing every problem (syntax error with its column, unknown names with the
 *   allowed ones, functions outside the whitelist)
 * @example
 * ```ts
 * import { compileExpression } from "./compile_expression.ts";
 * const u = await compileExpression("sin(k*pi*x) * y", { parameters: { k: 2 } });
 * u(0.25, 2); // 2
 * ```
 */
export async function compileExpression(
  text: string,
  options: CompileExpressionOptions = {},
): Promise<PointFunction> {
  const parameters = options.parameters ?? {};
  const math = await loadMath();
  const { node, problems } = parseExpression(math, text, Object.keys(parameters));
  if (!node) {
    throw new RangeError(
      `cannot compile the expression "${text}": ` +
        problems.map((p) =>
          p.column === undefined
            ? p.message
            : `${p.message} (column ${p.column})\n${pointAt(text, p.column)}`
        ).join("; "),
    );
  }
  return compileExpr(toExpr(node, parameters));
}
