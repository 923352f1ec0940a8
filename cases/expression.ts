/**
 * Case expressions: mathjs syntax over x, y, the case's parameters, pi and e, with + − * / ^ and
 * a whitelist of functions. This file parses text with mathjs, checks the tree against the
 * whitelist (collecting every problem), and converts a checked tree to the engine's own small
 * expression tree {@link Expr}, which is all the compiler ever sees.
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { MathTools } from "./_mathjs.ts";
import { closestName } from "./_suggest.ts";
import { scanExpression } from "./_scan_expression.ts";

/** Longest expression text accepted, in characters. */
export const MAX_EXPRESSION_LENGTH = 2000;
/**
 * Deepest nesting accepted: of parentheses in the text, and of operators and function calls in the
 * tree (a sum of n terms counts n − 1).
 */
export const MAX_EXPRESSION_DEPTH = 64;

/** Reported when the tree holds an implicit product the token pass did not locate. */
const IMPLICIT_PRODUCT = "implicit multiplication is not allowed: write every product with *";

/** Whitelisted functions: name → [fewest, most] arguments, and what it computes. */
export const ALLOWED_FUNCTIONS: Readonly<Record<string, readonly [number, number, string]>> = {
  sin: [1, 1, "sine"],
  cos: [1, 1, "cosine"],
  tan: [1, 1, "tangent"],
  sec: [1, 1, "secant 1/cos"],
  csc: [1, 1, "cosecant 1/sin"],
  cot: [1, 1, "cotangent 1/tan"],
  asin: [1, 1, "arcsine"],
  acos: [1, 1, "arccosine"],
  atan: [1, 1, "arctangent"],
  atan2: [2, 2, "atan2(y, x), angle of the point (x, y)"],
  sinh: [1, 1, "hyperbolic sine"],
  cosh: [1, 1, "hyperbolic cosine"],
  tanh: [1, 1, "hyperbolic tangent"],
  sech: [1, 1, "1/cosh"],
  csch: [1, 1, "1/sinh"],
  coth: [1, 1, "1/tanh"],
  exp: [1, 1, "exponential"],
  log: [1, 2, "natural logarithm; log(v, base) for another base"],
  log10: [1, 1, "base-10 logarithm"],
  sqrt: [1, 1, "square root"],
  cbrt: [1, 1, "real cube root"],
  abs: [1, 1, "absolute value"],
  sign: [1, 1, "sign: -1, 0 or 1"],
  pow: [2, 2, "pow(v, p) = v^p"],
  min: [2, 8, "smallest argument"],
  max: [2, 8, "largest argument"],
  hypot: [2, 8, "sqrt of the sum of squares"],
};

/** Named constants usable in every expression. */
export const CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI, e: Math.E };

/** Coordinates. */
export const VARIABLES = ["x", "y"] as const;

/** The engine's expression tree: numbers, x, y, operators and whitelisted calls. */
export type Expr =
  | { kind: "number"; value: number }
  | { kind: "variable"; name: "x" | "y" }
  | { kind: "operator"; op: "+" | "-" | "*" | "/" | "^" | "neg"; args: Expr[] }
  | { kind: "call"; name: string; args: Expr[] };

/** One problem found in an expression: a message and, when known, the 1-based column in its text. */
export interface ExpressionProblem {
  message: string;
  column?: number;
}

const OPERATORS: Readonly<Record<string, "+" | "-" | "*" | "/" | "^" | "neg" | "plus">> = {
  add: "+",
  subtract: "-",
  multiply: "*",
  divide: "/",
  pow: "^",
  unaryMinus: "neg",
  unaryPlus: "plus",
};

// deno-lint-ignore no-explicit-any
type AnyNode = any;

/** Text with a caret under `column` (1-based), for messages. */
export function pointAt(text: string, column: number): string {
  return `    ${text}\n    ${" ".repeat(Math.max(0, column - 1))}^`;
}

function columnOfName(text: string, name: string): number | undefined {
  const escaped = name.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  const match = new RegExp(`(?<![A-Za-z0-9_])${escaped}(?![A-Za-z0-9_])`).exec(text);
  return match ? match.index + 1 : undefined;
}

/** The names an expression may use, for messages. */
export function allowedNamesText(parameters: readonly string[]): string {
  const params = parameters.length ? `; parameters: ${parameters.join(", ")}` : "; no parameters";
  return `allowed names: x, y, pi, e${params}; functions: ${
    Object.keys(ALLOWED_FUNCTIONS).join(", ")
  }`;
}

/**
 * Checks a mathjs tree against the whitelist and collects every problem (never throws, never
 * evaluates anything).
 *
 * @param node a parsed tree
 * @param text the text it came from (for columns)
 * @param parameters names of the case's parameters
 */
export function checkTree(
  node: MathNode,
  text: string,
  parameters: readonly string[],
): ExpressionProblem[] {
  const problems: ExpressionProblem[] = [];
  const seen = new Set<string>();
  const add = (message: string, name?: string) => {
    if (seen.has(message)) return;
    seen.add(message);
    const column = name === undefined ? undefined : columnOfName(text, name);
    problems.push(column === undefined ? { message } : { message, column });
  };
  const visit = (n: AnyNode, depth: number): void => {
    if (depth > MAX_EXPRESSION_DEPTH) {
      add(`nesting is deeper than ${MAX_EXPRESSION_DEPTH} levels; split the expression up`);
      return;
    }
    switch (n.type) {
      case "ParenthesisNode":
        visit(n.content, depth);
        return;
      case "ConstantNode":
        if (typeof n.value !== "number") {
          add(`only numbers are allowed as constants, found ${JSON.stringify(String(n.value))}`);
        } else if (!Number.isFinite(n.value)) add(`the number ${String(n.value)} is not finite`);
        return;
      case "SymbolNode": {
        const name = String(n.name);
        if (VARIABLES.includes(name as "x") || Object.hasOwn(CONSTANTS, name)) return;
        if (parameters.includes(name)) return;
        if (Object.hasOwn(ALLOWED_FUNCTIONS, name)) {
          add(`function ${name} is used without arguments; write ${name}(...)`, name);
          return;
        }
        const near = closestName(name, [...VARIABLES, ...Object.keys(CONSTANTS), ...parameters]);
        add(
          `unknown name "${name}"${near ? ` (did you mean "${near}"?)` : ""}; ${
            allowedNamesText(parameters)
          }`,
          name,
        );
        return;
      }
      case "OperatorNode": {
        const fn = String(n.fn);
        if (n.implicit === true) add(IMPLICIT_PRODUCT);
        if (!Object.hasOwn(OPERATORS, fn)) {
          add(
            `operator "${n.op}" is not allowed; allowed operators: + - * / ^ and unary minus`,
            n.op,
          );
        }
        for (const arg of n.args) visit(arg, depth + 1);
        return;
      }
      case "FunctionNode": {
        const fnNode = n.fn;
        if (!fnNode || fnNode.type !== "SymbolNode") {
          add("only named whitelisted functions may be called");
          return;
        }
        const name = String(fnNode.name);
        if (!Object.hasOwn(ALLOWED_FUNCTIONS, name)) {
          const near = closestName(name, Object.keys(ALLOWED_FUNCTIONS));
          add(
            `function "${name}" is not allowed (refused, never run)${
              near ? ` (did you mean "${near}"?)` : ""
            }; allowed functions: ${Object.keys(ALLOWED_FUNCTIONS).join(", ")}`,
            name,
          );
          // arguments of a refused call are not inspected further: nothing will run anyway
          return;
        }
        const [least, most] = ALLOWED_FUNCTIONS[name];
        if (n.args.length < least || n.args.length > most) {
          const want = least === most ? `${least}` : `${least} to ${most}`;
          add(`${name} takes ${want} argument(s), found ${n.args.length}`, name);
        }
        for (const arg of n.args) visit(arg, depth + 1);
        return;
      }
      default: {
        const kinds: Record<string, string> = {
          AccessorNode: "property or index access",
          ArrayNode: "matrices and arrays",
          AssignmentNode: "assignment",
          BlockNode: "several statements",
          ConditionalNode: "the conditional operator ? :",
          FunctionAssignmentNode: "function definitions",
          IndexNode: "indexing",
          ObjectNode: "objects",
          RangeNode: "ranges",
          RelationalNode: "comparisons",
        };
        const what = Object.hasOwn(kinds, n.type) ? kinds[n.type] : String(n.type);
        add(`${what} are not allowed in an expression; use + - * / ^ and whitelisted functions`);
      }
    }
  };
  visit(node, 0);
  return problems;
}

/**
 * Parses expression text with mathjs and checks it. Returns the tree, or every problem found
 * (a syntax error with its column, names outside the whitelist, length and depth caps).
 *
 * @example
 * ```ts
 * import { loadMath } from "./_mathjs.ts";
 * import { parseExpression } from "./expression.ts";
 * const math = await loadMath();
 * parseExpression(math, "sin(pi*x) * w", ["w"]).problems.length; // 0
 * ```
 */
export function parseExpression(
  math: MathTools,
  text: string,
  parameters: readonly string[],
): { node?: MathNode; problems: ExpressionProblem[] } {
  if (text.length > MAX_EXPRESSION_LENGTH) {
    return {
      problems: [{
        message:
          `expression is ${text.length} characters long, more than the limit of ${MAX_EXPRESSION_LENGTH}`,
      }],
    };
  }
  if (text.trim() === "") return { problems: [{ message: "expression is empty" }] };
  const scan = scanExpression(text, {
    maxDepth: MAX_EXPRESSION_DEPTH,
    functions: Object.keys(ALLOWED_FUNCTIONS),
  });
  // too deep for mathjs's recursive parser: report without parsing
  if (!scan.parseable) return { problems: scan.problems };
  let node: MathNode;
  try {
    node = math.parse(text);
  } catch (error) {
    if (error instanceof RangeError) {
      // the parser ran out of stack: the text is too deeply nested, whatever the counts above say
      return {
        problems: [...scan.problems, {
          message: `expression is nested too deeply to be read (${error.message}); use at most ` +
            `${MAX_EXPRESSION_DEPTH} levels of parentheses and operators, or split it up`,
        }],
      };
    }
    const char = (error as { char?: unknown }).char;
    const column = typeof char === "number" ? Math.max(1, Math.min(char, text.length + 1)) : 1;
    const reason = (error instanceof Error ? error.message : String(error)).replace(
      / \(char \d+\)$/,
      "",
    );
    return { problems: [...scan.problems, { message: `syntax error: ${reason}`, column }] };
  }
  const problems = [
    ...scan.problems,
    ...checkTree(node, text, parameters).filter((p) =>
      !(scan.implicitProduct && p.message === IMPLICIT_PRODUCT)
    ),
  ];
  return problems.length ? { problems } : { node, problems };
}

/**
 * Converts a checked mathjs tree to an {@link Expr}, replacing pi, e and the parameters by their
 * values. Only trees that passed {@link checkTree} (or trees mathjs derived from them) are given
 * here; anything else is refused with a RangeError.
 *
 * @param node checked tree
 * @param values parameter values by name
 */
export function toExpr(node: MathNode, values: Readonly<Record<string, number>>): Expr {
  const convert = (n: AnyNode): Expr => {
    switch (n.type) {
      case "ParenthesisNode":
        return convert(n.content);
      case "ConstantNode":
        if (typeof n.value !== "number" || !Number.isFinite(n.value)) {
          throw new RangeError(`cannot compile the constant ${String(n.value)}`);
        }
        return { kind: "number", value: n.value };
      case "SymbolNode": {
        const name = String(n.name);
        if (name === "x" || name === "y") return { kind: "variable", name };
        if (Object.hasOwn(CONSTANTS, name)) return { kind: "number", value: CONSTANTS[name] };
        if (Object.hasOwn(values, name)) return { kind: "number", value: values[name] };
        throw new RangeError(`cannot compile the unknown name "${name}"`);
      }
      case "OperatorNode": {
        const fn = String(n.fn);
        if (!Object.hasOwn(OPERATORS, fn)) {
          throw new RangeError(`cannot compile the operator "${String(n.op)}"`);
        }
        const op = OPERATORS[fn];
        const args = (n.args as AnyNode[]).map(convert);
        if (op === "plus") return args[0];
        if (op === "neg") return { kind: "operator", op: "neg", args };
        if (args.length < 2) throw new RangeError(`operator ${op} needs two operands`);
        return { kind: "operator", op, args };
      }
      case "FunctionNode": {
        const name = n.fn?.type === "SymbolNode" ? String(n.fn.name) : "";
        if (!Object.hasOwn(ALLOWED_FUNCTIONS, name)) {
          throw new RangeError(`cannot compile a call of "${name}": not whitelisted`);
        }
        return { kind: "call", name, args: (n.args as AnyNode[]).map(convert) };
      }
      default:
        throw new RangeError(`cannot compile a ${String(n.type)}`);
    }
  };
  return convert(node);
}

/**
 * true when an expression tree involves neither x nor y (its value is the same at every point).
 *
 * @example
 * ```ts
 * import { involvesNoPoint } from "./expression.ts";
 * involvesNoPoint({ kind: "number", value: 2 }); // true
 * ```
 */
export function involvesNoPoint(expr: Expr): boolean {
  if (expr.kind === "variable") return false;
  if (expr.kind === "number") return true;
  return expr.args.every(involvesNoPoint);
}
