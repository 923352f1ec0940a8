/**
 * A token pass over expression text before mathjs reads it. It finds what the grammar refuses but
 * mathjs would accept silently or cannot read safely, each with its column:
 *
 * - parentheses nested deeper than the limit (mathjs's recursive parser runs out of stack near
 *   500 levels, so the text must be refused before it is parsed);
 * - `#` (mathjs drops the rest of the text as a comment) and `%` (mathjs reads `x%` as `x/100`
 *   and `x%y` as a remainder);
 * - hexadecimal, binary and octal literals (`0x10`);
 * - implicit multiplication (`2x`, `2 x`, `x y`, `2(x+1)`, `sin(x)(y)`): mathjs reads `1/2x` as
 *   `(1/2)·x`, which many readers take for `1/(2x)`, so every product must be written with `*`.
 *
 * @module
 */
import type { ExpressionProblem } from "./expression.ts";

type Kind = "number" | "radix" | "name" | "string" | "open" | "close" | "space" | "other";

interface Token {
  kind: Kind;
  text: string;
  /** 0-based offset in the text. */
  at: number;
  /** For brackets: index of the matching bracket's token, when there is one. */
  match?: number;
}

/** mathjs operators spelled as words: never operands, so never part of an implicit product. */
const WORD_OPERATORS = new Set(["mod", "to", "in", "and", "or", "xor", "not"]);

const RADIX = /^0[xX][0-9a-fA-F]+|^0[bB][01]+|^0[oO][0-7]+/;
const NUMBER = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/;
const NAME = /^[\p{L}_$][\p{L}\p{N}_$]*/u;

function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  const opens: number[] = [];
  let at = 0;
  while (at < text.length) {
    const rest = text.slice(at);
    const ch = text[at];
    let kind: Kind;
    let length = 1;
    let m: RegExpExecArray | null;
    if (/\s/.test(ch)) {
      kind = "space";
      length = /^\s+/.exec(rest)![0].length;
    } else if (RADIX.test(rest)) {
      kind = "radix";
      // a radix literal may go on with a fraction or a word-size suffix (0xFFi8); take it whole
      length = /^[0-9a-zA-Z.]*/.exec(rest)![0].length;
    } else if ((m = NUMBER.exec(rest))) {
      kind = "number";
      length = m[0].length;
    } else if ((m = NAME.exec(rest))) {
      kind = WORD_OPERATORS.has(m[0]) ? "other" : "name";
      length = m[0].length;
    } else if (ch === '"' || ch === "'") {
      // strings are refused later by the whitelist; skipped whole so a # or % inside them is not
      // reported twice (a lone ' is mathjs's transpose operator and stays one character)
      const end = text.indexOf(ch, at + 1);
      kind = end > at ? "string" : "other";
      length = end > at ? end - at + 1 : 1;
    } else if (ch === "(" || ch === "[" || ch === "{") {
      kind = "open";
    } else if (ch === ")" || ch === "]" || ch === "}") {
      kind = "close";
    } else {
      kind = "other";
    }
    const token: Token = { kind, text: text.slice(at, at + length), at };
    if (kind === "open") opens.push(tokens.length);
    if (kind === "close" && opens.length) {
      const open = opens.pop()!;
      tokens[open].match = tokens.length;
      token.match = open;
    }
    tokens.push(token);
    at += length;
  }
  return tokens;
}

/** What a scan found: the problems, and whether the text is safe to give to mathjs's parser. */
export interface ExpressionScan {
  problems: ExpressionProblem[];
  /** false when the text is nested too deeply for mathjs's recursive parser. */
  parseable: boolean;
  /** true when an implicit multiplication was reported (with its column). */
  implicitProduct: boolean;
}

/**
 * Scans expression text for what the grammar refuses before mathjs parses it.
 *
 * @param text the expression as written
 * @param options `maxDepth`, the deepest nesting of brackets accepted; `functions`, the names
 *   that are called (for the advice on `sin x`)
 * @returns every problem found, each with its 1-based column
 * @example
 * ```ts
 * import { scanExpression } from "./_scan_expression.ts";
 * scanExpression("2x + 1", { maxDepth: 64, functions: [] }).problems[0].column; // 2
 * ```
 */
export function scanExpression(
  text: string,
  options: { maxDepth: number; functions: readonly string[] },
): ExpressionScan {
  const { maxDepth, functions } = options;
  const tokens = tokenize(text);
  const problems: ExpressionProblem[] = [];
  let parseable = true;
  let implicitProduct = false;
  let depth = 0;
  for (const token of tokens) {
    const column = token.at + 1;
    if (token.kind === "open" && ++depth > maxDepth && parseable) {
      parseable = false;
      problems.push({
        message: `parentheses are nested deeper than ${maxDepth} levels; remove redundant ` +
          `parentheses or split the expression up`,
        column,
      });
    }
    if (token.kind === "close") depth = Math.max(0, depth - 1);
    if (token.kind === "other" && token.text === "#") {
      problems.push({
        message: `"#" is not allowed: mathjs would read the rest of the expression as a comment ` +
          `and drop it; remove it (an expression has no comments)`,
        column,
      });
    }
    if (token.kind === "other" && token.text === "%") {
      problems.push({
        message: `"%" is not allowed: mathjs reads x% as x/100 and x%y as a remainder; write ` +
          `x/100 for a percentage`,
        column,
      });
    }
    if (token.kind === "radix") {
      const value = Number(token.text);
      problems.push({
        message: `"${token.text}" is not allowed: write numbers in decimal${
          Number.isFinite(value) ? ` (${value})` : ""
        }`,
        column,
      });
    }
  }
  // implicit products: an operand directly followed by another (whitespace between allowed)
  const solid = tokens.map((t, k) => ({ t, k })).filter(({ t }) => t.kind !== "space");
  for (let s = 1; s < solid.length; s++) {
    const prev = solid[s - 1].t;
    const next = solid[s].t;
    const endsOperand = ["number", "radix", "name", "string"].includes(prev.kind) ||
      (prev.kind === "close" && prev.text === ")");
    const startsOperand = ["number", "radix", "name", "string"].includes(next.kind) ||
      (next.kind === "open" && next.text === "(");
    // a name followed by "(" is a call, not a product
    if (!endsOperand || !startsOperand || (prev.kind === "name" && next.text === "(")) continue;
    implicitProduct = true;
    const [from] = operandBefore(tokens, solid[s - 1].k);
    const [, to] = operandAfter(tokens, solid[s].k);
    const left = text.slice(from, prev.at + prev.text.length);
    const right = text.slice(next.at, to);
    const call = prev.kind === "name" && functions.includes(prev.text);
    const what = to - from > 60
      ? "is not allowed: write * between the two factors"
      : call
      ? `"${text.slice(from, to)}" is not allowed: a function needs parentheses, write ` +
        `${left}(${right})`
      : `"${text.slice(from, to)}" is not allowed: write ${left}*${right}`;
    problems.push({
      message: `implicit multiplication ${what} (every product needs its *: mathjs would read ` +
        `1/2x as (1/2)*x)`,
      column: next.at + 1,
    });
  }
  return { problems, parseable, implicitProduct };
}

/** Where the operand ending at token `k` starts and ends (a call or parenthesis whole). */
function operandBefore(tokens: Token[], k: number): [number, number] {
  const end = tokens[k].at + tokens[k].text.length;
  if (tokens[k].text !== ")" || tokens[k].match === undefined) return [tokens[k].at, end];
  const open = tokens[k].match!;
  // a call: the function's name just before its "("
  let before = open - 1;
  while (before >= 0 && tokens[before].kind === "space") before--;
  const first = before >= 0 && tokens[before].kind === "name" ? before : open;
  return [tokens[first].at, end];
}

/** Where the operand starting at token `k` starts and ends (a call or parenthesis whole). */
function operandAfter(tokens: Token[], k: number): [number, number] {
  let last = k;
  if (tokens[k].kind === "name") {
    let after = k + 1;
    while (after < tokens.length && tokens[after].kind === "space") after++;
    if (after < tokens.length && tokens[after].text === "(") last = after;
  }
  if (tokens[last].text === "(") last = tokens[last].match ?? tokens.length - 1;
  return [tokens[k].at, tokens[last].at + tokens[last].text.length];
}
