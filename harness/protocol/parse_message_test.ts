import assert from "node:assert/strict";
import { restoreBase64 } from "./_restore_test_helper.ts";
import { decodeArray, encodeArray } from "./encoding.ts";
import { parseMessage } from "./parse_message.ts";

const ONE = "AAAAAAAA8D8="; // derived: little-endian float64 1.0 (see encoding_test.ts)

Deno.test("parseMessage() gives what JSON.parse gives, with base64 decoded on the way", async (t) => {
  const rows: [string, string, number][] = [
    // [what, text, how many arrays are decoded on the way]
    ["one array", `{"values":{"base64":"${ONE}"}}`, 1],
    ["white space around the key", `{ "v" : { "base64" : "${ONE}" } }`, 1],
    [
      "a key in a string is not a key",
      `{"s":"\\"base64\\":\\"${ONE}\\"","v":{"base64":"${ONE}"}}`,
      1,
    ],
    ["the word as a value", `{"encoding":"base64","v":[1,2]}`, 0],
    ["a string ending in a backslash", `{"s":"x\\\\","v":{"base64":"${ONE}"}}`, 1],
    ["white space inside base64 is left to decodeArray", `{"v":{"base64":"AAAA AAAA8D8="}}`, 0],
    ["unpadded base64 is left to decodeArray", `{"v":{"base64":"AAAAAAAA8D8"}}`, 0],
    ["an escape inside base64 is left to decodeArray", `{"v":{"base64":"AAAAAAAA8D8\\u003d"}}`, 0],
    ["a byte count that is not a multiple of 8", `{"v":{"base64":"AAAA"}}`, 0],
    ["an empty array", `{"v":{"base64":""}}`, 1],
  ];
  for (const [what, text, count] of rows) {
    await t.step(what, () => {
      const { value, decoded } = parseMessage(text);
      assert.equal(decoded.size, count);
      assert.deepEqual(restoreBase64(value, decoded), JSON.parse(text));
    });
  }
});

Deno.test("parseMessage() values equal decodeArray's, and errors equal JSON.parse's", () => {
  const v = new Float64Array([0.1, -0, 5e-324, Math.PI]);
  const wire = encodeArray(v, "base64");
  const { value, decoded } = parseMessage(JSON.stringify({ a: wire }));
  const a = decodeArray((value as { a: unknown }).a, "/a", decoded);
  assert.deepEqual(new Uint8Array(a.buffer), new Uint8Array(v.buffer));
  for (const bad of [`{"v":{"base64":"${ONE}"},}`, `{"v":{"base64":"${ONE}"},"w":NaN}`, `{"v`]) {
    let expected = "";
    try {
      JSON.parse(bad);
    } catch (error) {
      expected = (error as Error).message;
    }
    assert.throws(() => parseMessage(bad), { name: "SyntaxError", message: expected });
  }
});
