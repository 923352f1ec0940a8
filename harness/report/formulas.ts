/**
 * Formulas of a case typeset for the HTML report: the expression text from the result is parsed by
 * mathjs, written as TeX by mathjs (`toTex`), and turned into MathML by MathJax (its TeX input and
 * MathML serializer, run here at report time; no script reaches the page). Browsers draw MathML
 * natively, and so does Chromium when it prints the PDF. A sum is typeset term by term, so a long
 * derived source term wraps between its terms like text; each `<math>` keeps the expression text as
 * `alttext`. Text that does not parse stays as text (escaped).
 *
 * @module
 */
import { mathjax } from "@mathjax/src/js/mathjax.js";
import { TeX } from "@mathjax/src/js/input/tex.js";
import { liteAdaptor } from "@mathjax/src/js/adaptors/liteAdaptor.js";
import { RegisterHTMLHandler } from "@mathjax/src/js/handlers/html.js";
import { SerializedMmlVisitor } from "@mathjax/src/js/core/MmlTree/SerializedMmlVisitor.js";
import { STATE } from "@mathjax/src/js/core/MathItem.js";
import "@mathjax/src/js/input/tex/base/BaseConfiguration.js";
import "@mathjax/src/js/input/tex/ams/AmsConfiguration.js";
import { type MathNode, parse } from "mathjs";
import { escapeHtml as esc } from "./escape.ts";

/**
 * A term longer than this (TeX characters) is left as text: MathML Core does not break lines, so
 * a longer term could run past a 1400 px page or an A4 sheet.
 */
const LONGEST_TERM = 160;

interface Converter {
  toMathml(tex: string): string;
}

let converter: Converter | undefined;

/** MathJax's TeX-to-MathML conversion, set up once (MathJax keeps global handler state). */
function mathjaxConverter(): Converter {
  if (converter) return converter;
  const adaptor = liteAdaptor();
  RegisterHTMLHandler(adaptor);
  const document = mathjax.document("", { InputJax: new TeX({ packages: ["base", "ams"] }) });
  const visitor = new SerializedMmlVisitor();
  converter = {
    toMathml(tex: string): string {
      // deno-lint-ignore no-explicit-any
      const tree = document.convert(tex, { display: false, end: STATE.CONVERT }) as any;
      return visitor.visitTree(tree)
        // MathJax's bookkeeping attributes: only the markup matters to a browser
        .replace(/\s(data-latex|data-mjx-texclass|data-semantic-[\w-]+)="[^"]*"/g, "")
        .replace(/>\s+</g, "><");
    },
  };
  return converter;
}

/** The terms of a top-level sum, with their signs: `a - b + c` → [+a, −b, +c]. */
function terms(node: MathNode): { sign: "+" | "−"; node: MathNode }[] {
  // deno-lint-ignore no-explicit-any
  const n = node as any;
  if (n.type === "OperatorNode" && (n.fn === "add" || n.fn === "subtract") && n.args.length === 2) {
    const right = terms(n.args[1]).map((t) =>
      n.fn === "subtract" ? { ...t, sign: t.sign === "+" ? "−" as const : "+" as const } : t
    );
    return [...terms(n.args[0]), ...right];
  }
  if (n.type === "ParenthesisNode") return terms(n.content);
  return [{ sign: "+", node }];
}

/** One `<math>` element from TeX, with the source text as `alttext`. */
function math(tex: string, alt: string): string {
  return converter!.toMathml(tex).replace(/^<math /, `<math alttext="${esc(alt)}" `);
}

/**
 * The expression typeset as MathML (one `<math>` per term of a sum), or undefined when the text
 * does not parse or a term is too long to typeset on one line.
 *
 * @param text Expression text as the case gives it (mathjs syntax).
 * @returns HTML with MathML, or undefined.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { formulaMathml } from "./formulas.ts";
 * // MathML Core: a quotient is an <mfrac>, a power an <msup>
 * assert.match(formulaMathml("x^2 / 2")!, /^<math [^>]*><mfrac>(<mrow>)?<msup>/);
 * assert.equal(formulaMathml("sin(("), undefined);
 * ```
 */
export function formulaMathml(text: string): string | undefined {
  let node: MathNode;
  try {
    node = parse(text);
  } catch {
    // not an expression mathjs reads (a hand-written note): shown as text by the caller
    return undefined;
  }
  mathjaxConverter();
  const parts = terms(node);
  const texts = parts.map((t) => t.node.toTex({ parenthesis: "auto", implicit: "hide" }));
  if (texts.some((t) => t.length > LONGEST_TERM)) return undefined;
  try {
    return parts.map((t, k) => {
      const sign = k === 0 ? (t.sign === "−" ? "-" : "") : t.sign === "−" ? "- " : "+ ";
      return math(`${sign}${texts[k]}`, k === 0 ? text : `${sign}${t.node.toString()}`);
    }).join(" ");
  } catch {
    // MathJax refused the TeX (an unusual symbol name): the text stays
    return undefined;
  }
}

/**
 * TeX typeset as MathML (for fixed formulas such as the operator).
 *
 * @param tex TeX source.
 * @param alt Plain text of the formula (`alttext`).
 * @returns One `<math>` element.
 */
export function texMathml(tex: string, alt: string): string {
  mathjaxConverter();
  return math(tex, alt);
}
