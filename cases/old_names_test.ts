import assert from "node:assert/strict";
import { expectationFor } from "./expectation_for.ts";
import { checkCaseFiles, loadCase } from "./load.ts";
import { OLD_FIELD_NAMES } from "./old_names.ts";
import { validateCaseText } from "./validate.ts";
import { formatProblem } from "./case_file.ts";
import type { LayoutName, SchemeName } from "./types.ts";

// The two fixtures are one case written twice: testdata/cases/old-names.json with the old field
// names (aspect, exact, observed, tolerance) and new-names.json with the new ones. The reference
// for the old-name file is the new-name file (exact identity of everything compiled from it).
const OLD = "testdata/cases/old-names.json";
const NEW = "testdata/cases/new-names.json";

/** The new-name text with every new name replaced by its old one (and the other id). */
function toOldNames(text: string): string {
  let out = text.replace('"id": "new-names"', '"id": "old-names"');
  for (const [old, name] of Object.entries(OLD_FIELD_NAMES)) {
    out = out.replaceAll(`"${name}"`, `"${old}"`);
  }
  return out;
}

Deno.test("the two fixtures differ only in the field names and the id", async () => {
  // guards the identity test below: it compares one case written two ways, nothing else
  assert.equal(toOldNames(await Deno.readTextFile(NEW)), await Deno.readTextFile(OLD));
});

Deno.test("an old-name case file compiles to exactly the expectations of its new-name twin", async () => {
  const [old, renamed] = [await loadCase(OLD), await loadCase(NEW)];
  assert.deepEqual(old.expected, renamed.expected);
  assert.equal(old.intervalRatio, 2);
  assert.equal(old.intervalRatio, renamed.intervalRatio);
  assert.deepEqual(old.gridFor(16), { nx: 16, ny: 32 });
  assert.deepEqual(old.grids.map(old.gridFor), renamed.grids.map(renamed.gridFor));
  for (const scheme of ["central", "upwind"] as SchemeName[]) {
    for (const layout of ["vertex", "cell", "points"] as LayoutName[]) {
      assert.deepEqual(
        expectationFor(old, scheme, layout),
        expectationFor(renamed, scheme, layout),
        `${scheme} ${layout}`,
      );
    }
  }
  // the file as compiled carries the new names only (id aside, the same object)
  assert.deepEqual({ ...old.file, id: "x" }, { ...renamed.file, id: "x" });
  // the merged values themselves, read from the fixture by hand
  const cell = expectationFor(old, "central", "cell");
  assert.equal(cell.exactToRoundOff, false);
  assert.equal(cell.orderTolerance, 0.3);
  assert.equal(cell.achievable?.max?.order, 1.9);
  assert.equal(expectationFor(old, "central", "vertex").exactToRoundOff, true);
  assert.equal(expectationFor(old, "upwind", "vertex").achievable?.l2?.order, 0.9);
  assert.equal(renamed.warnings, undefined);
});

Deno.test("an old-name case file loads with one deprecation warning per old field, located", async () => {
  const c = await loadCase(OLD);
  const warnings = c.warnings ?? [];
  const want: [string, string][] = [
    ["aspect", "intervalRatio"],
    ["expected.central.exact", "exactToRoundOff"],
    ["expected.central.tolerance", "orderTolerance"],
    ["expected.central.layouts.cell.exact", "exactToRoundOff"],
    ["expected.central.layouts.cell.observed", "achievable"],
    ["expected.central.layouts.cell.tolerance", "orderTolerance"],
    ["expected.central.layouts.points.exact", "exactToRoundOff"],
    ["expected.upwind.observed", "achievable"],
  ];
  assert.equal(warnings.length, want.length, warnings.join("\n"));
  for (const [field, name] of want) {
    const old = field.split(".").at(-1);
    const line = warnings.find((w) => w.includes(`: ${field}: `));
    assert.ok(line, `no warning for ${field} in:\n${warnings.join("\n")}`);
    assert.match(
      line,
      new RegExp(
        `^testdata/cases/old-names\\.json:\\d+:\\d+: ${field.replaceAll(".", "\\.")}: ` +
          `deprecated field name "${old}": rename it to "${name}" \\(same meaning`,
      ),
    );
  }
  // the line of the aspect warning is the line of its key in the file
  const text = await Deno.readTextFile(OLD);
  const aspectLine = text.split("\n").findIndex((l) => l.includes('"aspect"')) + 1;
  assert.match(warnings.find((w) => w.includes(": aspect: "))!, new RegExp(`:${aspectLine}:3: `));
});

Deno.test("cases check passes an old-name file and returns its warnings as data", async () => {
  const [old, renamed] = await checkCaseFiles([OLD, NEW]);
  assert.deepEqual(old.problems, []);
  assert.equal(old.warnings.length, 8);
  assert.deepEqual(renamed, { file: NEW, problems: [], warnings: [] });
});

Deno.test("a case file giving both the old and the new name of one field is refused, located", async (t) => {
  const text = await Deno.readTextFile(NEW);
  type Fields = Record<string, unknown>;
  type Doc = { aspect?: number; expected: { central: Fields & { layouts: { cell: Fields } } } };
  const both = (edit: (doc: Doc) => void) => {
    const doc = JSON.parse(text);
    edit(doc);
    const out = JSON.stringify(doc, null, 2);
    const { value, problems } = validateCaseText(out, "both.json");
    return { value, messages: problems.map(formatProblem), out };
  };
  await t.step("top level: aspect and intervalRatio", () => {
    const { value, messages, out } = both((d) => d.aspect = 2);
    assert.equal(value, undefined);
    const line = out.split("\n").findIndex((l) => l.includes('"aspect"')) + 1;
    assert.deepEqual(messages, [
      `both.json:${line}:3: aspect: both "aspect" (the old name) and "intervalRatio" are given; ` +
      `they name the same field: keep "intervalRatio" and remove "aspect"`,
    ]);
  });
  await t.step("in a layout override: observed and achievable", () => {
    const { value, messages } = both((d) =>
      d.expected.central.layouts.cell.observed = { max: { order: 1, reason: "r" } }
    );
    assert.equal(value, undefined);
    assert.equal(messages.length, 1, messages.join("\n"));
    assert.match(
      messages[0],
      /^both\.json:\d+:\d+: expected\.central\.layouts\.cell\.observed: both "observed" \(the old name\) and "achievable" are given; they name the same field: keep "achievable" and remove "observed"$/,
    );
  });
  await t.step("in a scheme: tolerance and orderTolerance, exact and exactToRoundOff", () => {
    const { messages } = both((d) => {
      d.expected.central.tolerance = 0.5;
      d.expected.central.exact = false;
    });
    assert.equal(messages.length, 2, messages.join("\n"));
    assert.match(messages.join("\n"), /expected\.central\.tolerance: both "tolerance"/);
    assert.match(messages.join("\n"), /expected\.central\.exact: both "exact"/);
  });
});

Deno.test("the top-level exact solution keeps its name: only expected.* exact is the flag", () => {
  // "exact" at the top level is the solution (an expression), never renamed or warned about
  const doc = JSON.parse(Deno.readTextFileSync(NEW));
  const { value, warnings } = validateCaseText(JSON.stringify(doc), "n.json");
  assert.equal(value?.exact, doc.exact);
  assert.deepEqual(warnings, []);
});

Deno.test("a misspelled old name is pointed to the new name, and old names are not offered", () => {
  const doc = JSON.parse(Deno.readTextFileSync(NEW));
  doc.expected.central.tolerence = 0.2;
  const { problems } = validateCaseText(JSON.stringify(doc, null, 2), "t.json");
  assert.equal(problems.length, 1);
  assert.equal(
    problems[0].message,
    'unknown field "tolerence"; did you mean "orderTolerance"? (valid fields here: formal, ' +
      "achievable, exactToRoundOff, grids, orderTolerance, layouts)",
  );
});
