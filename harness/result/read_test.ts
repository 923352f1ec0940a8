import assert from "node:assert/strict";
import { Ajv2020 } from "ajv/dist/2020";
import { checkResult, parseResult, readResult } from "./read.ts";
import schema from "./result.schema.json" with { type: "json" };
import { RESULT_VERSION } from "./types.ts";
import { InputError } from "../../errors/mod.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";

const FIXTURE = new URL("../../testdata/report/result.json", import.meta.url);

function clone<T>(x: T): T {
  return JSON.parse(JSON.stringify(x));
}

function refused(fn: () => unknown, where: RegExp, message: RegExp): InputError {
  try {
    fn();
  } catch (error) {
    assert.ok(error instanceof InputError, `expected InputError, got ${error}`);
    assert.match(error.where ?? "", where);
    assert.match(error.message, message);
    return error;
  }
  assert.fail("expected the result to be refused");
}

Deno.test("readResult() reads the saved fixture back exactly as its generator makes it", async () => {
  const read = await readResult(FIXTURE.pathname);
  assert.deepEqual(read, clone(makeFixtureResult()));
});

Deno.test("readResult() names the path when the file does not exist", async () => {
  await assert.rejects(
    () => readResult("no-such-dir/result.json"),
    (error: unknown) =>
      error instanceof InputError && error.where === "no-such-dir/result.json" &&
      /no such file/.test(error.message),
  );
});

Deno.test("parseResult() refuses text that is not JSON, naming the source", () => {
  refused(() => parseResult("{oops", { source: "r.json" }), /^r\.json$/, /not valid JSON/);
});

Deno.test("parseResult() refuses a JSON file of another kind by its format field", () => {
  refused(
    () => parseResult(JSON.stringify({ format: "something-else", version: 1 }), { source: "x" }),
    /^x: format$/,
    /not a gridproof result.*"something-else"/,
  );
  refused(() => checkResult([1, 2], { source: "x" }), /^x$/, /JSON object at the top level/);
});

Deno.test("parseResult() refuses a result from a newer version and says to upgrade", () => {
  const data = { ...clone(makeFixtureResult()), version: RESULT_VERSION + 1 };
  refused(
    () => parseResult(JSON.stringify(data), { source: "new.json" }),
    /^new\.json: version$/,
    new RegExp(`newer gridproof \\(result version ${RESULT_VERSION + 1}\\).*upgrade gridproof`),
  );
});

Deno.test("parseResult() refuses a version field it cannot read (0, a string)", () => {
  const data = { ...clone(makeFixtureResult()), version: 0 };
  refused(() => parseResult(JSON.stringify(data)), /version$/, /cannot tell which result version/);
  const damaged = { ...clone(makeFixtureResult()), version: "1" };
  refused(() => parseResult(JSON.stringify(damaged)), /version$/, /field version is "1"/);
});

Deno.test("parseResult() lists every schema problem with the dotted path of its field", () => {
  // deno-lint-ignore no-explicit-any
  const data = clone(makeFixtureResult()) as unknown as Record<string, any>;
  data.solves[3].h = "small";
  data.studies[1].orders[0].norm = "sup";
  delete data.summary.exitCode;
  const error = refused(
    () => parseResult(JSON.stringify(data), { source: "bad.json" }),
    /^bad\.json: /,
    /does not match the result format version 1/,
  );
  assert.ok(error.problems.includes("solves[3].h: must be number"), error.problems.join("\n"));
  assert.ok(
    error.problems.includes('studies[1].orders[0].norm: must be one of "max", "l2", "l1"'),
    error.problems.join("\n"),
  );
  assert.ok(error.problems.includes("summary.exitCode: is missing"), error.problems.join("\n"));
});

Deno.test("parseResult() accepts fields it does not know (additions within a version)", () => {
  const data = { ...clone(makeFixtureResult()), addedLater: { anything: true } };
  assert.equal(parseResult(JSON.stringify(data)).summary.fail, 4);
});

Deno.test("the result schema names every field the typed fixture uses", () => {
  // Close every object schema that lists properties, then validate the fixture (typed with
  // `satisfies CampaignResult`): a field of types.ts missing from the schema fails here.
  const closed = clone(schema) as Record<string, unknown>;
  const close = (node: unknown): void => {
    if (Array.isArray(node)) return node.forEach(close);
    if (node && typeof node === "object") {
      const record = node as Record<string, unknown>;
      if (record.properties && record.type === "object") record.unevaluatedProperties = false;
      Object.values(record).forEach(close);
    }
  };
  close(closed);
  const validate = new Ajv2020({ allErrors: true, allowUnionTypes: true }).compile(closed);
  for (const options of [{}, { hostile: true }]) {
    const fixture = makeFixtureResult(options);
    const full = {
      ...fixture,
      configuration: { ...fixture.configuration, baseline: "release-1.json" },
    };
    assert.ok(validate(full), JSON.stringify(validate.errors, null, 2));
  }
  // and the closed schema does catch a field it does not name
  const extra = clone(makeFixtureResult());
  (extra.solves[0] as unknown as Record<string, unknown>).unnamed = 1;
  assert.equal(validate(extra), false);
});
