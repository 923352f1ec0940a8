import assert from "node:assert/strict";
import { Buffer } from "node:buffer";
import { encodeArray } from "./encoding.ts";
import { messageBytes } from "./message_bytes.ts";
import { serializeMessage } from "./request.ts";

/** Values with a length that is not a multiple of 3 bytes in some pieces, and awkward bits. */
function values(n: number): Float64Array {
  const v = new Float64Array(n);
  for (let k = 0; k < n; k++) v[k] = Math.sin(k) * 10 ** ((k % 40) - 20);
  if (n > 2) v[1] = -0;
  return v;
}

/** The same message with every array in the base64 form written by encodeArray. */
function plainText(m: Record<string, unknown>): string {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(m)) {
    out[k] = v instanceof Float64Array
      ? encodeArray(v, "base64")
      : v !== null && typeof v === "object" && !Array.isArray(v)
      ? JSON.parse(plainText(v as Record<string, unknown>))
      : v;
  }
  return JSON.stringify(out);
}

Deno.test("messageBytes() writes exactly the UTF-8 of serializeMessage with encodeArray", async (t) => {
  // derived: the bytes must equal TextEncoder(JSON.stringify(...) + "\n") of the plain message,
  // for sizes around the 49152-byte base64 piece and the 1 MiB output buffer
  for (const n of [0, 1, 2, 3, 5, 6143, 6144, 6145, 131072, 131073, 400000]) {
    await t.step(`${n} values`, () => {
      const v = values(n);
      const message = { title: 'ü × α "q" \\', a: v, nested: { b: v, list: [1, 2.5] }, n };
      const line = messageBytes(message);
      const expected = new TextEncoder().encode(plainText(message) + "\n");
      assert.equal(line.byteLength, expected.length);
      assert.deepEqual(line.bytes(), expected);
      let joined = 0;
      for (const piece of line.pieces()) {
        assert.ok(piece.length <= 1 << 20, "a piece is at most 1 MiB");
        assert.deepEqual(piece, expected.subarray(joined, joined + piece.length));
        joined += piece.length;
      }
      assert.equal(joined, expected.length);
    });
  }
});

Deno.test("messageBytes() base64 decodes with node:buffer to the same float64 values", () => {
  // an independent decoder: Buffer.from(text, "base64") and readDoubleLE
  const v = values(1000);
  const text = new TextDecoder().decode(messageBytes({ values: v }).bytes());
  const wire = JSON.parse(text).values.base64 as string;
  const buf = Buffer.from(wire, "base64");
  for (let k = 0; k < v.length; k++) assert.ok(Object.is(buf.readDoubleLE(8 * k), v[k]), `${k}`);
});

Deno.test("messageBytes() writes plain text when a string of the message imitates a marker", () => {
  const v = values(4);
  const message = { note: "\u0000gridproof-array:0", a: v };
  assert.equal(
    new TextDecoder().decode(messageBytes(message).bytes()),
    serializeMessage({ note: message.note, a: encodeArray(v, "base64") }),
  );
});

Deno.test("messageBytes() keeps each piece intact while the next one is made", () => {
  // derived: a writer may hold piece k until it has piece k+1 (one write in flight), so piece k
  // must still equal its bytes of the expected text then; 3 MiB of base64 make several pieces
  const v = values(400000);
  const expected = new TextEncoder().encode(plainText({ a: v, b: v }) + "\n");
  let previous: { piece: Uint8Array; at: number } | undefined;
  let at = 0;
  let count = 0;
  for (const piece of messageBytes({ a: v, b: v }).pieces()) {
    if (previous) {
      const { piece: held, at: from } = previous;
      const intact = held.every((b, k) => b === expected[from + k]);
      assert.ok(intact, `piece ${count - 1} changed when piece ${count} was made`);
    }
    previous = { piece, at };
    at += piece.length;
    count++;
  }
  assert.ok(count >= 4, `${count} pieces`);
  assert.equal(at, expected.length);
});
