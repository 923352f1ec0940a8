import assert from "node:assert/strict";
import { restoreBase64 } from "./_restore_test_helper.ts";
import { encodeArray } from "./encoding.ts";
import { LineScanner } from "./line_scanner.ts";
import { messageBytes } from "./message_bytes.ts";

/** A small deterministic generator (Park–Miller) for the sizes of the pieces that arrive. */
function pieces(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647);
}

const ONE = "AAAAAAAA8D8="; // derived: little-endian float64 1.0 (see encoding_test.ts)

const LINES = [
  ...[0, 1, 3, 1000, 70000].map((n) => {
    const v = new Float64Array(n).map((_, k) => Math.sin(k) * 1e3);
    const message = {
      t: 'é × "base64":"x\\',
      a: v,
      b: { c: v, base64: ONE },
      base64: 3,
      s: ["base64", 'q"base64":"AAAA'],
    };
    return new TextDecoder().decode(messageBytes(message).bytes()).slice(0, -1);
  }),
  `{ "base64" : "${ONE}" , "x": { "base64":"AAAA AAAA8D8=" } }`,
  `{"v":{"base64":"AAAAAAAA8D8"}}`,
  `{"v":{"base64":"${ONE}"},"w":NaN}`,
  `{"v":{"base64":"${ONE}"},"w":"\u2028 ok ✓"}`,
  `{"v":{"bas\\u0065\\u00364":"${ONE}"}}`,
  ``,
];

Deno.test("LineScanner finds each line and parses it as JSON.parse does, however the bytes arrive", () => {
  // the reference is JSON.parse of the line's text, and the line ends at its first newline
  const scanner = new LineScanner();
  const next = pieces(12345);
  let fast = 0;
  for (const text of LINES) {
    const bytes = new TextEncoder().encode(text + '\n{"next":1}\n');
    for (let trial = 0; trial < 12; trial++) {
      let end = -1;
      let got = 0;
      while (end < 0) {
        got = Math.min(bytes.length, got + 1 + (next() % (trial < 4 ? 5 : 70000)));
        end = scanner.scan(bytes.subarray(0, got));
      }
      const line = bytes.subarray(0, end);
      assert.equal(new TextDecoder().decode(line), text);
      const parsed = scanner.finish(line);
      if (parsed === undefined) continue;
      fast++;
      assert.deepEqual(
        restoreBase64(parsed.value, parsed.decoded),
        JSON.parse(text),
        text.slice(0, 60),
      );
    }
  }
  // the messages written by messageBytes, the escaped-quote and the U+2028 lines take the fast way
  assert.equal(fast, 12 * 6);
});

Deno.test("LineScanner leaves unusual lines to the caller, and reads the last line without newline", () => {
  const scanner = new LineScanner();
  for (const text of [`{"v":{"base64":"${ONE}"}`, `{"v":{"base64":"${ONE}"}}x`, "\xff"]) {
    const bytes = new TextEncoder().encode(text);
    assert.equal(scanner.scan(bytes), -1);
    assert.equal(scanner.finish(bytes), undefined, text);
  }
  const last = new TextEncoder().encode(`{"v":{"base64":"${ONE}"}}`);
  assert.equal(scanner.scan(last), -1);
  const parsed = scanner.finish(last);
  assert.ok(parsed);
  assert.deepEqual(Array.from(parsed.decoded.values()).map((v) => Array.from(v)), [[1]]);
});

Deno.test("LineScanner with reuseArrays decodes each line's arrays into the same buffers", () => {
  // derived: the k-th array of every line lands in the k-th kept buffer, with the values of an
  // independent decode (encodeArray's base64 read back by Uint8Array.fromBase64)
  const scanner = new LineScanner({ reuseArrays: true });
  const arrays = (seed: number, n: number) =>
    [0, 1].map((k) => new Float64Array(n).map((_, m) => Math.cos(seed + 7 * k + m)));
  let buffers: ArrayBufferLike[] = [];
  for (const [seed, n] of [[1, 9000], [2, 9000], [3, 5000]]) {
    const [a, b] = arrays(seed, n);
    const bytes = messageBytes({ a, nested: { b } }).bytes();
    const next = pieces(seed);
    let end = -1;
    for (let got = 0; end < 0;) {
      got = Math.min(bytes.length, got + 1 + (next() % 5000));
      end = scanner.scan(bytes.subarray(0, got));
    }
    const parsed = scanner.finish(bytes.subarray(0, end));
    assert.ok(parsed);
    const got = Array.from(parsed.decoded.values());
    for (const [k, wanted] of [a, b].entries()) {
      const text = (encodeArray(wanted, "base64") as { base64: string }).base64;
      assert.deepEqual(got[k], new Float64Array(Uint8Array.fromBase64(text).buffer));
    }
    if (buffers.length > 0) {
      assert.ok(got.every((v, k) => v.buffer === buffers[k]), "the arrays reuse the buffers");
    }
    buffers = got.map((v) => v.buffer);
  }
});
