/**
 * Writing a message as bytes without building its text: one line of JSON in UTF-8, where arrays
 * given as `Float64Array` are written in the base64 wire form straight into the output buffer.
 * At a million nodes a request holds tens of megabytes of base64; JSON-escaping those strings and
 * encoding the whole text a second time would cost more than the rest of the exchange.
 *
 * @module
 */
import { encodeArray, LITTLE_ENDIAN, swapEach8 } from "./encoding.ts";

/** Marks where an array goes in the text of the skeleton (JSON escapes the NUL as \u0000). */
const MARK = "\u0000gridproof-array:";
const MARK_IN_TEXT = /"\\u0000gridproof-array:(\d+)"/g;
/** Bytes of input per base64 piece: a multiple of 3, so only the last piece can end in `=`. */
const PIECE = 3 << 16;
const OPEN = '{"base64":"';
const CLOSE = '"}';

/** Copies the objects of a message, replacing every Float64Array property value by `f(array)`. */
function mapArrays(value: unknown, f: (values: Float64Array) => unknown): unknown {
  if (value instanceof Float64Array) return f(value);
  // plain arrays are left as they are: arrays to encode appear only as object properties
  if (value === null || typeof value !== "object" || Array.isArray(value)) return value;
  const out: Record<string, unknown> = {};
  for (const [key, item] of Object.entries(value)) out[key] = mapArrays(item, f);
  return out;
}

function base64Length(byteCount: number): number {
  return 4 * Math.ceil(byteCount / 3);
}

/** Writes the base64 of `values` (little-endian float64) at `at`; returns the end offset. */
function writeBase64(values: Float64Array, out: Uint8Array, at: number, text: TextEncoder): number {
  let bytes = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  if (!LITTLE_ENDIAN) {
    bytes = bytes.slice();
    swapEach8(bytes);
  }
  for (let k = 0; k < bytes.length; k += PIECE) {
    const piece = bytes.subarray(k, Math.min(bytes.length, k + PIECE)).toBase64();
    at += text.encodeInto(piece, out.subarray(at)).written;
  }
  return at;
}

/**
 * Serializes a message as one line of JSON followed by a newline, in UTF-8 bytes. Every
 * `Float64Array` found as an object property is written as `{"base64": "…"}` (little-endian
 * float64, see {@link encodeArray}); the rest is written as `JSON.stringify` writes it. The bytes
 * equal `new TextEncoder().encode(serializeMessage(m))` for the message `m` with each such array
 * replaced by `encodeArray(values, "base64")`.
 *
 * @param message a plain JSON-able object; `Float64Array`s may stand for base64 arrays
 * @returns the line as bytes
 *
 * @example
 * ```ts
 * import { messageBytes } from "./message_bytes.ts";
 * const bytes = messageBytes({ type: "solution", values: new Float64Array([1]) });
 * new TextDecoder().decode(bytes); // '{"type":"solution","values":{"base64":"AAAAAAAA8D8="}}\n'
 * ```
 */
export function messageBytes(message: object): Uint8Array {
  const text = new TextEncoder();
  const arrays: Float64Array[] = [];
  const marked = mapArrays(message, (values) => MARK + (arrays.push(values) - 1));
  const skeleton = JSON.stringify(marked) + "\n";
  // the pieces of text between the arrays, checked to hold each marker once and in order
  const pieces: Uint8Array[] = [];
  let from = 0;
  for (const match of skeleton.matchAll(MARK_IN_TEXT)) {
    if (Number(match[1]) !== pieces.length) break;
    pieces.push(text.encode(skeleton.slice(from, match.index) + OPEN));
    from = match.index + match[0].length;
  }
  if (pieces.length !== arrays.length) {
    // a string of the message itself looks like a marker: write the plain text instead
    const plain = mapArrays(message, (values) => encodeArray(values, "base64"));
    return text.encode(JSON.stringify(plain) + "\n");
  }
  const tail = text.encode(skeleton.slice(from));
  let size = tail.length;
  for (let k = 0; k < arrays.length; k++) {
    size += pieces[k].length + base64Length(arrays[k].byteLength) + CLOSE.length;
  }
  const out = new Uint8Array(size);
  let at = 0;
  for (let k = 0; k < arrays.length; k++) {
    out.set(pieces[k], at);
    at = writeBase64(arrays[k], out, at + pieces[k].length, text);
    at += text.encodeInto(CLOSE, out.subarray(at)).written;
  }
  out.set(tail, at);
  return out;
}
