import assert from "node:assert/strict";
import { formulaMathml, texMathml } from "./formulas.ts";

// Expected markup from the MathML Core specification (W3C, 2023), sections 3.1–3.4: a power is
// <msup>, a quotient <mfrac>, a square root <msqrt>, identifiers and function names <mi>, numbers
// <mn>, operators <mo> (U+2061, FUNCTION APPLICATION, between a function name and its argument).
const MATHML_CORE: [string, RegExp][] = [
  // (an <mrow> around a single child changes nothing: MathML Core, section 3.3.1)
  ["x^2", /<msup>(<mrow>)?<mi>x<\/mi>(<\/mrow>)?(<mrow>)?<mn>2<\/mn>(<\/mrow>)?<\/msup>/],
  ["x / 2", /<mfrac>(<mrow>)?<mi>x<\/mi>(<\/mrow>)?(<mrow>)?<mn>2<\/mn>(<\/mrow>)?<\/mfrac>/],
  ["sqrt(y)", /<msqrt>(<mrow>)?<mi>y<\/mi>(<\/mrow>)?<\/msqrt>/],
  ["exp(-x)", /<mi>exp<\/mi><mo>&#x2061;<\/mo>/],
];

Deno.test("formulaMathml() typesets expression text as MathML Core elements", async (t) => {
  for (const [text, expected] of MATHML_CORE) {
    await t.step(text, () => {
      const out = formulaMathml(text)!;
      assert.match(out, expected);
      assert.match(out, /^<math alttext="[^"]*" xmlns="http:\/\/www\.w3\.org\/1998\/Math\/MathML"/);
    });
  }
});

Deno.test("formulaMathml() sets a sum term by term so a long source term wraps like text", () => {
  const out = formulaMathml("sin(pi*x) - 2*y + x^2")!;
  const maths = out.match(/<math /g) ?? [];
  assert.equal(maths.length, 3);
  // the second term carries its sign: subtraction, U+2212 in MathML
  assert.match(out.split("</math>")[1], /<mo>&#x2212;<\/mo><mn>2<\/mn>/);
});

Deno.test("formulaMathml() leaves text that does not parse, and never lets markup through", () => {
  assert.equal(formulaMathml("sin((x"), undefined);
  assert.equal(formulaMathml(`<img src=x onerror=alert(1)>`), undefined);
  assert.ok(!texMathml("u", `<script>"x"</script>`).includes("<script>"));
});
