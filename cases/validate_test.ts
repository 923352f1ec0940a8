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

Deno.test("validateCaseText() accepts per-layout overrides and locates their problems", async (t) => {
  const withLayouts = (layouts: unknown) => {
    const doc = JSON.parse(good);
    doc.expected.central.layouts = layouts;
    return validateCaseText(JSON.stringify(doc, null, 2), "l.json");
  };
  const messages = (layouts: unknown) =>
    withLayouts(layouts).problems.map(formatProblem).join("\n");

  await t.step("a valid override", () => {
    const { value, problems } = withLayouts({
      cell: { exactToRoundOff: false, formal: 2, reason: "ghost 2g − u₁ is second-order" },
      points: {
        achievable: { max: { order: 1.5, reason: "r" } },
        orderTolerance: 0.2,
        reason: "r",
      },
    });
    assert.deepEqual(problems, []);
    assert.equal(value?.expected.central.layouts?.cell?.exactToRoundOff, false);
  });
  await t.step("an override without its reason", () => {
    assert.match(
      messages({ cell: { exactToRoundOff: false } }),
      /^l\.json:\d+:\d+: expected\.central\.layouts\.cell\.reason: missing field "reason" \(Why/m,
    );
  });
  await t.step("a misspelled layout", () => {
    assert.match(
      messages({ cells: { exactToRoundOff: false, reason: "r" } }),
      /expected\.central\.layouts\.cells: unknown field "cells"; did you mean "cell"\?/,
    );
  });
  await t.step("grids per layout", () => {
    assert.match(
      messages({ cell: { grids: [8, 16], reason: "r" } }),
      /^l\.json:\d+:\d+: expected\.central\.layouts\.cell\.grids: grids cannot be set per layout:.*move them to expected\.central\.grids/m,
    );
  });
  await t.step("an override with nothing but its reason", () => {
    assert.match(
      messages({ vertex: { reason: "r" } }),
      /^l\.json:\d+:\d+: expected\.central\.layouts\.vertex: the vertex override changes nothing, it has only a reason; add the fields/m,
    );
  });
  await t.step("an empty reason and a wrong type", () => {
    const text = messages({ cell: { exactToRoundOff: "no", reason: "" } });
    assert.match(
      text,
      /expected\.central\.layouts\.cell\.exactToRoundOff: must be boolean, found "no"/,
    );
    assert.match(
      text,
      /expected\.central\.layouts\.cell\.reason: must NOT have fewer than 1 characters/,
    );
  });
});

Deno.test("validateCaseText() refuses reference-solver advice with unknown names before any solve", () => {
  const doc = JSON.parse(good);
  doc.solver = { smoother: "line-z", cycle: "Z" };
  const { problems, value } = validateCaseText(JSON.stringify(doc, null, 2), "advice.json");
  assert.equal(value, undefined);
  const text = problems.map((p) => `${p.field}: ${p.message}`).join("\n");
  assert.match(text, /solver\.smoother: unknown smoother "line-z": use one of .*line-y/);
  assert.match(text, /solver\.cycle: unknown cycle "Z": use one of V, W, F, fmg/);
});

Deno.test("validateCaseText() checks the domain itself and names it (issue 12, item 15)", async (t) => {
  // before, a domain of ±1e308 passed and sampling blamed the source term: its width overflows
  const messages = (domain: Record<string, number | string>) => {
    const text = good.replace(/"domain": \{[^}]*\}/, `"domain": ${JSON.stringify(domain)}`);
    const { problems, value } = validateCaseText(text, "d.json");
    assert.equal(value, undefined);
    return problems.map(formatProblem).join("\n");
  };
  await t.step("corners of ±1e308 (x1 − x0 overflows)", () => {
    const text = messages({ x0: -1e308, x1: 1e308, y0: 0, y1: 1 });
    assert.match(
      text,
      /^d\.json:\d+:\d+: domain\.x0: x0 = -1e\+308 is outside \[-1000000, 1000000\]: .*shift and scale the case to a domain near the origin/m,
    );
    assert.match(text, /domain\.x1: x1 = 1e\+308 is outside/);
  });
  await t.step("a corner beyond the number range (1e400 reads as Infinity)", () => {
    const text = good.replace(/"y1": 1\b/, '"y1": 1e400');
    assert.match(
      validateCaseText(text, "d.json").problems.map(formatProblem).join("\n"),
      /domain\.y1/,
    );
  });
  await t.step("a side too short for its coordinates", () => {
    assert.match(
      messages({ x0: 1000, x1: 1000.0001, y0: 0, y1: 1 }),
      /domain: x1 − x0 = 0\.000100 is less than 0\.000001 · max\(1, \|x0\|, \|x1\|\) = 0\.00100: the grid spacing would be lost/,
    );
  });
  await t.step("x0 < x1 as before", () => {
    assert.match(messages({ x0: 1, x1: 0, y0: 0, y1: 1 }), /domain: x0 must be less than x1/);
  });
});

Deno.test("validateCaseText() locates every problem of the quantities of interest", () => {
  const doc = JSON.parse(good);
  doc.quantities = [
    { name: "outflow", kind: "flux", side: "east", segment: [0.5, 1.5] },
    { name: "outflow", kind: "point", x: 0.5, y: 0.5 },
    { name: "flat", kind: "integral", x: [0.2, 0.2] },
    { name: "far", kind: "point", x: 0.5, y: -0.1 },
    { name: "maximum", kind: "integral" },
    { name: "mixed", kind: "point", x: 0.1, y: 0.1, side: "west" },
  ];
  const text = JSON.stringify(doc, null, 2);
  const { problems } = validateCaseText(text, "q.json");
  const messages = problems.map(formatProblem);
  const lines = text.split("\n");
  const expect = [
    /quantities\[0\]\.segment: the segment \[0\.5, 1\.5\] lies outside the east side, which runs over y in \[0, 1\]/,
    /quantities\[1\]\.name: the name "outflow" is already used by quantities\[0\]/,
    /quantities\[2\]\.x: the rectangle has zero area: x runs over \[0\.2, 0\.2\]/,
    /quantities\[3\]\.y: the point lies outside the domain: y = -0\.1/,
    /quantities\[4\]\.name: "maximum" is the name of a built-in quantity/,
    /quantities\[5\]\.side: a point quantity has no "side"/,
  ];
  assert.equal(problems.length, expect.length, messages.join("\n"));
  expect.forEach((re, k) => assert.match(messages[k], re));
  // located: the duplicate name is reported on its own line, the second "outflow"
  assert.equal(problems[1].line, lines.findLastIndex((l) => l.includes('"outflow"')) + 1);
  // a flux without its side is a schema problem
  doc.quantities = [{ name: "f", kind: "flux" }];
  const missing = validateCaseText(JSON.stringify(doc), "q.json").problems.map(formatProblem);
  assert.match(missing.join("\n"), /side/);
});
