import assert from "node:assert/strict";
import { JsonSyntaxError, readJsonWithPositions } from "./_json.ts";

Deno.test("readJsonWithPositions() parses like JSON.parse and records positions", () => {
  const text = '{\n  "a": [1, {"b": "x\\u0041"}],\n  "c": -2.5e3\n}';
  const doc = readJsonWithPositions(text);
  assert.deepEqual(doc.value, JSON.parse(text));
  assert.deepEqual(doc.positions.get("/a/1/b"), { line: 2, column: 18 });
  assert.deepEqual(doc.keyPositions.get("/c"), { line: 3, column: 3 });
});

Deno.test("readJsonWithPositions() refuses what JSON refuses, with line and column", async (t) => {
  const bad: [string, number, number, RegExp][] = [
    ['{"a": 1,}', 1, 9, /trailing comma/],
    ['{"a" 1}', 1, 6, /expected ':'/],
    ["{\n'a': 1}", 2, 1, /field name in double quotes/],
    ['{"a": 1', 1, 8, /expected ',' or '}'/],
    ['{"a": 1, "a": 2}', 1, 10, /appears twice/],
    ["[1] 2", 1, 5, /after the end/],
    ['{"a": nan}', 1, 7, /expected a JSON value/],
  ];
  for (const [text, line, column, pattern] of bad) {
    await t.step(text, () => {
      assert.throws(() => readJsonWithPositions(text), (e: unknown) => {
        assert.ok(e instanceof JsonSyntaxError);
        assert.deepEqual(e.position, { line, column });
        assert.match(e.message, pattern);
        // JSON.parse agrees that the text is not JSON (outside reference), except duplicates,
        // which JSON allows but a case file does not
        if (!/twice/.test(e.message)) assert.throws(() => JSON.parse(text));
        return true;
      });
    });
  }
});
