/**
 * Writing a message as bytes without building its text: one line of JSON in UTF-8, where arrays
 * given as `Float64Array` are written in the base64 wire form piece by piece into a small buffer
 * that is reused. At a million nodes a request holds tens of megabytes of base64; JSON-escaping
 * those strings, encoding the whole text a second time and touching fresh memory for it would
 * cost more than the rest of the exchange.
 *
 * @module
 */
import { encodeArray, LITTLE_ENDIAN, swapEach8 } from "./encoding.ts";

/** Marks where an array goes in the text of the skeleton (JSON escapes the NUL as \u0000). */
const MARK = "\u0000gridproof-array:";
const MARK_IN_TEXT = /"\\u0000gridproof-array:(\d+)"/g;
/** Input bytes per base64 call: a multiple of 3 (only the last call can end in `=`), 64 KiB out. */
const PIECE_IN = 3 << 14;
const PIECE_OUT = 4 << 14;
/** Size of each of the two output buffers used in turn (16 base64 calls). */
const BUFFER_BYTES = 1 << 20;

/** A message serialized lazily: its size, and its bytes in order. */
export interface MessageBytes {
  /** Size in bytes, closing newline included. */
  readonly byteLength: number;
  /**
   * The bytes in pieces of at most 1 MiB. A piece may be a view of a buffer that the piece after
   * next overwrites: write or copy each piece before asking for the one after the next (so one
   * write may be in flight while the next piece is made).
   */
  pieces(): Iterable<Uint8Array>;
  /** All the bytes in one new array. */
  bytes(): Uint8Array;
}

/** Copies the objects of a message, replacing every Float64Array property value by `f(array)`. */
function mapArrays(value: unknown, f: (values: Float64Array) => unknown): unknown {
  if (value instanceof Float64Array) return f(value);
  // plain arrays are left as they are: arrays to encode appear only as object properties
  if (value === null || typeof value !== "object" || Array.isArray(value)) return value;
  const out: Record<string, unknown> = {};
  for (const [key, item] of Object.entries(value)) out[key] = mapArrays(item, f);
  return out;
}

function littleEndianBytes(values: Float64Array): Uint8Array {
  const bytes = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  if (LITTLE_ENDIAN) return bytes;
  const copy = bytes.slice();
  swapEach8(copy);
  return copy;
}

/** Splits the skeleton text at its markers: texts[k] comes before array k, the last one after. */
function splitAtMarkers(skeleton: string, count: number): string[] | undefined {
  if (count === 0) return [skeleton];
  const texts: string[] = [];
  let from = 0;
  for (const match of skeleton.matchAll(MARK_IN_TEXT)) {
    if (Number(match[1]) !== texts.length) return undefined;
    texts.push(skeleton.slice(from, match.index) + '{"base64":"');
    from = match.index + match[0].length;
  }
  texts.push(skeleton.slice(from));
  return texts.length === count + 1 ? texts : undefined;
}

/**
 * The bytes of texts[0], array 0, texts[1], …, array n−1, texts[n], in buffer-sized pieces. Two
 * buffers take turns, so a piece stays intact while the next one is made (a writer may keep one
 * write in flight while it asks for the next piece).
 */
function* interleave(texts: Uint8Array[], arrays: Float64Array[]): Generator<Uint8Array> {
  const encoder = new TextEncoder();
  let buffer = new Uint8Array(BUFFER_BYTES);
  let spare: Uint8Array<ArrayBuffer> | undefined;
  let used = 0;
  function* flush(): Generator<Uint8Array> {
    yield buffer.subarray(0, used);
    spare ??= new Uint8Array(BUFFER_BYTES);
    [buffer, spare] = [spare, buffer];
    used = 0;
  }
  for (let k = 0; k < texts.length; k++) {
    const text = texts[k];
    for (let at = 0; at < text.length;) {
      const n = Math.min(text.length - at, buffer.length - used);
      buffer.set(text.subarray(at, at + n), used);
      used += n;
      at += n;
      if (used === buffer.length) yield* flush();
    }
    if (k === arrays.length) break;
    const bytes = littleEndianBytes(arrays[k]);
    for (let at = 0; at < bytes.length; at += PIECE_IN) {
      if (buffer.length - used < PIECE_OUT) yield* flush();
      const piece = bytes.subarray(at, Math.min(bytes.length, at + PIECE_IN)).toBase64();
      used += encoder.encodeInto(piece, buffer.subarray(used)).written;
    }
  }
  if (used > 0) yield buffer.subarray(0, used);
}

/**
 * Serializes a message as one line of JSON followed by a newline, in UTF-8 bytes. Every
 * `Float64Array` found as an object property is written as `{"base64": "…"}` (little-endian
 * float64, as {@link encodeArray} writes it); the rest as `JSON.stringify` writes it. The bytes
 * equal `new TextEncoder().encode(serializeMessage(m))` for the message `m` in which each such
 * array is replaced by `encodeArray(values, "base64")`.
 *
 * @param message a plain JSON-able object; `Float64Array` property values stand for base64 arrays
 * @returns the size and the bytes (the arrays are read when the bytes are; do not change them
 *   before)
 *
 * @example
 * ```ts
 * import { messageBytes } from "./message_bytes.ts";
 * const line = messageBytes({ type: "solution", values: new Float64Array([1]) });
 * new TextDecoder().decode(line.bytes()); // '{"type":"solution","values":{"base64":"AAAAAAAA8D8="}}\n'
 * ```
 */
export function messageBytes(message: object): MessageBytes {
  const encoder = new TextEncoder();
  const arrays: Float64Array[] = [];
  const marked = mapArrays(message, (values) => MARK + (arrays.push(values) - 1));
  const split = splitAtMarkers(JSON.stringify(marked) + "\n", arrays.length);
  if (split === undefined) {
    // a string of the message itself looks like a marker: write the plain text instead
    const plain = mapArrays(message, (values) => encodeArray(values, "base64"));
    return fromTexts([encoder.encode(JSON.stringify(plain) + "\n")], []);
  }
  const texts = split.map((text, k) => encoder.encode(k === 0 ? text : '"}' + text));
  return fromTexts(texts, arrays);
}

function fromTexts(texts: Uint8Array[], arrays: Float64Array[]): MessageBytes {
  let byteLength = 0;
  for (const text of texts) byteLength += text.length;
  for (const values of arrays) byteLength += 4 * Math.ceil(values.byteLength / 3);
  return {
    byteLength,
    pieces: () => interleave(texts, arrays),
    bytes(): Uint8Array {
      const out = new Uint8Array(byteLength);
      let at = 0;
      for (const piece of interleave(texts, arrays)) {
        out.set(piece, at);
        at += piece.length;
      }
      return out;
    },
  };
}
