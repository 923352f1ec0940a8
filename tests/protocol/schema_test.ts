import assert from "node:assert/strict";
import {
  buildSolutionReply,
  buildSolveRequest,
  decodeArray,
  readReady,
  readSolveRequest,
  serializeMessage,
  validateMessage,
} from "../../harness/protocol/mod.ts";
import { expressionTexts, sampleCase } from "../../harness/solvers/mod.ts";
import type { BoundaryCondition } from "../../problem/mod.ts";
import { testCase } from "./_case.ts";

/** A side's values (none for a periodic side). */
const valuesOf = (b: BoundaryCondition) => b.kind === "periodic" ? new Float64Array(0) : b.values;

/** A request for a 2×4 vertex grid of the test case, in plain numbers. */
function smallRequest(c: ReturnType<typeof testCase>) {
  return buildSolveRequest(sampleCase(c, 2, 4, "vertex"), {
    id: "r",
    caseId: c.id,
    expressions: expressionTexts(c.formulas),
    scheme: "central",
    tolerance: 1e-10,
    timeLimitSeconds: 5,
    encoding: "numbers",
  });
}

const transcriptsDir = new URL("../../testdata/protocol/transcripts/", import.meta.url);

Deno.test("the canned once-mode transcript is valid and decodes to the values written by Python", async () => {
  const t = JSON.parse(await Deno.readTextFile(new URL("vertex-2x2-once.json", transcriptsDir)));
  assert.deepEqual(validateMessage("solve", t.request), []);
  assert.deepEqual(validateMessage("solution", t.reply), []);
  // derived: the transcript's reply was packed by Python struct '<9d' from x² + y² at the nodes
  assert.deepEqual(Array.from(decodeArray(t.reply.values, "/values")), t.expectedValues);
  const read = readSolveRequest(JSON.stringify(t.request));
  assert.equal(read.problem.boundary.south.kind, "robin");
  assert.deepEqual(Array.from(valuesOf(read.problem.boundary.north)), [1, 1.25, 2]);
});

Deno.test("every message of the canned session transcript matches its schema", async () => {
  const lines = (await Deno.readTextFile(new URL("cell-2x1-session.jsonl", transcriptsDir)))
    .trim().split("\n").map((l) => JSON.parse(l));
  const names = ["hello", "ready", "solve", "solution", "goodbye"] as const;
  lines.forEach((message, k) => assert.deepEqual(validateMessage(names[k], message), [], names[k]));
  assert.equal(readReady(JSON.stringify(lines[1])).ok, true);
  const read = readSolveRequest(JSON.stringify(lines[2]));
  assert.equal(read.problem.layout, "cell");
  assert.deepEqual(Array.from(valuesOf(read.problem.boundary.south)), [0.0625, 0.5625]);
});

Deno.test("a request built from a case matches the schema in both encodings and reads back exactly", async (t) => {
  const c = testCase();
  for (const layout of ["vertex", "cell"] as const) {
    for (const encoding of ["numbers", "base64"] as const) {
      await t.step(`${layout} layout, ${encoding}`, () => {
        const sampled = sampleCase(c, 4, 8, layout);
        const message = buildSolveRequest(sampled, {
          id: "r",
          caseId: c.id,
          expressions: expressionTexts(c.formulas),
          scheme: "central",
          tolerance: 1e-10,
          timeLimitSeconds: 5,
          encoding,
        });
        const text = serializeMessage(message);
        assert.equal(text.indexOf("\n"), text.length - 1, "one line");
        assert.deepEqual(validateMessage("solve", JSON.parse(text)), []);
        const back = readSolveRequest(text).problem;
        assert.deepEqual(back.f, sampled.f);
        assert.deepEqual(back.a, sampled.a);
        assert.deepEqual(back.boundary.south, sampled.boundary.south);
        // docs/protocol.md: the exact solution of a case is never sent
        assert.equal(Object.hasOwn(JSON.parse(text).expressions, "exact"), false);
      });
    }
  }
});

Deno.test("validateMessage() lists every violation of a bad reply with its JSON path", () => {
  const problems = validateMessage("solution", {
    protocol: "gridproof-protocol/1",
    type: "solution",
    id: 7,
    values: "1 2 3",
    iterations: 1.5,
    converged: "yes",
    points: { x: [0, "a"], y: [0, 1], extra: 1 },
  });
  assert.deepEqual(
    problems.sort(),
    [
      "/converged: must be boolean",
      "/id: must be string",
      "/iterations: must be integer",
      "/points/x/1: must be number",
      '/points: has unknown field "extra"',
      '/values: must be an array of numbers or an object {"base64": text}',
    ].sort(),
  );
});

Deno.test("validateMessage() names missing fields and wrong constants", async (t) => {
  await t.step("a reply without id and values", () => {
    assert.deepEqual(
      validateMessage("solution", { protocol: "gridproof-protocol/1", type: "solution" }).sort(),
      ['(top level): missing field "id"', '(top level): missing field "values"'],
    );
  });
  await t.step("a robin side without alpha", () => {
    const c = testCase();
    const message = smallRequest(c) as unknown as { boundary: { south: Record<string, unknown> } };
    delete message.boundary.south.alpha;
    assert.deepEqual(validateMessage("solve", message), [
      '/boundary/south: missing field "alpha"',
    ]);
  });
  await t.step("an unknown message type", () => {
    assert.deepEqual(
      validateMessage("solution", { protocol: "gridproof-protocol/1", type: "answer" }),
      [
        '/type: must be "solution" or "not-applicable" or "error"',
      ],
    );
  });
});

Deno.test("readSolveRequest() refuses another protocol version and wrong array lengths", async (t) => {
  const c = testCase();
  const message = smallRequest(c);
  await t.step("version", () => {
    assert.throws(
      () => readSolveRequest(JSON.stringify({ ...message, protocol: "gridproof-protocol/9" })),
      /uses protocol "gridproof-protocol\/9"; this program speaks "gridproof-protocol\/1" and "gridproof-protocol\/2"/,
    );
  });
  await t.step("length", () => {
    const short = { ...message, source: (message.source as number[]).slice(1) };
    assert.throws(
      () => readSolveRequest(JSON.stringify(short)),
      /\/source: has 14 values, expected 15/,
    );
  });
});

Deno.test("buildSolutionReply() output passes the reply schema with and without own points", () => {
  const v = new Float64Array([1, 2]);
  assert.deepEqual(
    validateMessage("solution", buildSolutionReply("r", v, { encoding: "base64" })),
    [],
  );
  const withPoints = buildSolutionReply("r", v, {
    points: { x: new Float64Array([0, 1]), y: new Float64Array([0, 1]) },
    iterations: 3,
    converged: true,
    solver: { name: "t", version: "1" },
  });
  assert.deepEqual(validateMessage("solution", withPoints), []);
});
