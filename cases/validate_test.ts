import assert from "node:assert/strict";
import { formatProblem } from "./case_file.ts";
import { fieldPath, validateCaseText } from "./validate.ts";

const good = await Deno.readTextFile(new URL("../testdata/cases/good.json", import.meta.url));

Deno.test("validateCaseText() accepts a valid case file", () => {
  const { value, problems } = validateCaseText(good, "good.json");
  assert.deepEqual(problems, []);
  assert.equal(value?.id, "user-good");
});

Deno.test("validateCaseText() gives the line and column of malformed JSON", () => {
  const { problems } = validateCaseText('{\n  "id": "x",\n  "title": }', "bad.json");
  assert.equal(problems.length, 1);
  assert.deepEqual([problems[0].line, problems[0].column], [3, 12]);
  assert.match(
    formatProblem(problems[0]),
    /^bad\.json:3:12: malformed JSON: expected a JSON value/,
  );
});

Deno.test("validateCaseText() suggests the closest valid name for a misspelled field", () => {
  const text = good.replace('"coefficients"', '"coeficients"').replace('"exact"', '"exakt"');
  const { problems } = validateCaseText(text, "m.json");
  const messages = problems.map(formatProblem).join("\n");
  assert.match(messages, /coeficients: unknown field "coeficients"; did you mean "coefficients"\?/);
  assert.match(messages, /exakt: unknown field "exakt"; did you mean "exact"\?/);
  // the misspelling is reported once, not again as a missing field
  assert.doesNotMatch(messages, /missing field "coefficients"/);
});

Deno.test("validateCaseText() reports every problem at once with field paths and positions", () => {
  const doc = JSON.parse(good);
  delete doc.title;
  doc.domain.y1 = "1";
  doc.boundary.west = { kind: "dirchlet" };
  doc.boundary.east = { kind: "robin", alpha: 1 };
  doc.boundary.north = { kind: "dirichlet", beta: 2 };
  doc.grids = [16, 8];
  const { problems } = validateCaseText(JSON.stringify(doc, null, 2), "all.json");
  const text = problems.map(formatProblem).join("\n");
  for (
    const pattern of [
      /all\.json:1:1: title: missing field "title"/,
      /all\.json:\d+:\d+: domain\.y1: must be number, found "1"/,
      /boundary\.west\.kind: "dirchlet" is not allowed; did you mean "dirichlet"\?/,
      /boundary\.east\.beta: missing field "beta"/,
      /boundary\.north: alpha and beta belong to robin sides only/,
    ]
  ) assert.match(text, pattern);
  assert.ok(problems.length >= 5, text);
});

Deno.test("validateCaseText() checks the rules a schema cannot say", () => {
  const doc = JSON.parse(good);
  doc.domain.x1 = -1;
  doc.grids = [16, 8];
  doc.parameters = { pi: 3 };
  const text = validateCaseText(JSON.stringify(doc), "r.json").problems.map(formatProblem).join(
    "\n",
  );
  assert.match(text, /domain: x0 must be less than x1/);
  assert.match(text, /grids\[1\]: grids must increase, found 8 after 16/);
  assert.match(text, /parameters\.pi: parameter name "pi" is reserved/);
});

Deno.test("fieldPath() turns JSON pointers into dotted paths", () => {
  assert.equal(fieldPath("/coefficients/a"), "coefficients.a");
  assert.equal(fieldPath("/grids/2"), "grids[2]");
  assert.equal(fieldPath(""), "");
});
