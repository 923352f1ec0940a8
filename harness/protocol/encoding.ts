/**
 * Array encodings of the protocol: plain JSON numbers, or base64 of IEEE 754 float64 values in
 * little-endian byte order (8 bytes per value, no header).
 *
 * @module
 */
import type { ArrayEncoding, WireArray } from "./types.ts";

/** true when this machine stores float64 little-endian (then the bytes need no swapping). */
export const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/** Reverses the byte order of each 8-byte group in place (float64 between byte orders). */
export function swapEach8(bytes: Uint8Array): void {
  for (let k = 0; k < bytes.length; k += 8) {
    for (let m = 0; m < 4; m++) {
      const t = bytes[k + m];
      bytes[k + m] = bytes[k + 7 - m];
      bytes[k + 7 - m] = t;
    }
  }
}

function isConstant(values: Float64Array): boolean {
  const first = values[0];
  if (!Number.isFinite(first)) return false;
  for (let k = 1; k < values.length; k++) if (values[k] !== first) return false;
  return true;
}

/** The `{ constant, length }` form of an array whose entries are all equal and finite, else undefined. */
export function constantForm(
  values: Float64Array,
): { constant: number; length: number } | undefined {
  if (values.length === 0 || !isConstant(values)) return undefined;
  return { constant: values[0], length: values.length };
}

/** true for an array in the `{ constant, length }` wire form (its fields not yet checked). */
export function isConstantForm(wire: unknown): wire is { constant: unknown; length: unknown } {
  return wire !== null && typeof wire === "object" && "constant" in wire;
}

/**
 * Writes an array in the given encoding; with `constants`, an array whose entries are all equal
 * (and finite) is written as `{ constant, length }` instead (an opt-in form, see docs/protocol.md).
 *
 * @param values the numbers
 * @param encoding "numbers" (a JSON number array) or "base64" ({ base64 } of little-endian float64)
 * @param options `constants`: use the constant form where it applies (default false)
 * @returns the wire form
 *
 * @example
 * ```ts
 * import { encodeArray } from "./encoding.ts";
 * encodeArray(new Float64Array([1]), "base64"); // { base64: "AAAAAAAA8D8=" }
 * ```
 */
export function encodeArray(
  values: Float64Array,
  encoding: ArrayEncoding,
  options: { constants?: boolean } = {},
): WireArray {
  const constant = options.constants ? constantForm(values) : undefined;
  if (constant) return constant;
  if (encoding === "numbers") return Array.from(values);
  let bytes = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  if (!LITTLE_ENDIAN) {
    bytes = bytes.slice();
    swapEach8(bytes);
  }
  return { base64: bytes.toBase64() };
}

/**
 * Reads an array in either wire form. The caller has already checked the shape with the schema;
 * this still refuses what the schema cannot see (base64 whose byte count is not a multiple of 8,
 * entries that are not numbers).
 *
 * @param wire a number array or { base64 }
 * @param path JSON path of the array in its message, used in error messages
 * @param decoded arrays already decoded by `parseMessage`, by the text that stands for them
 *   (default: none)
 * @param kept buffers for the constant form, by path: a constant array is filled into the buffer
 *   kept under its path (made and kept when missing or of another length), so a stream of
 *   requests of one size allocates it once; the array returned is then overwritten by the next
 *   call with the same path (default: none, every constant array is fresh)
 * @returns the values (entries may be non-finite when they came from base64)
 * @throws RangeError naming the path when the array cannot be decoded
 *
 * @example
 * ```ts
 * import { decodeArray } from "./encoding.ts";
 * decodeArray({ base64: "AAAAAAAA8D8=" }, "/values"); // Float64Array [1]
 * ```
 */
export function decodeArray(
  wire: unknown,
  path: string,
  decoded?: ReadonlyMap<string, Float64Array>,
  kept?: Map<string, Float64Array>,
): Float64Array {
  if (Array.isArray(wire)) {
    const out = new Float64Array(wire.length);
    for (let k = 0; k < wire.length; k++) {
      const v = wire[k];
      if (typeof v !== "number") {
        throw new RangeError(`${path}/${k}: must be a number, got ${JSON.stringify(v)}`);
      }
      out[k] = v;
    }
    return out;
  }
  if (isConstantForm(wire)) {
    const { constant, length } = wire;
    if (typeof constant !== "number" || !Number.isInteger(length) || (length as number) < 0) {
      throw new RangeError(
        `${path}: a constant array needs a number "constant" and a whole "length"`,
      );
    }
    let out = kept?.get(path);
    if (out === undefined || out.length !== length) {
      out = new Float64Array(length as number);
      kept?.set(path, out);
    }
    return out.fill(constant);
  }
  if (
    wire !== null && typeof wire === "object" &&
    typeof (wire as { base64: unknown }).base64 === "string"
  ) {
    const text = (wire as { base64: string }).base64;
    const done = decoded?.get(text);
    if (done) return done;
    let bytes: Uint8Array;
    try {
      bytes = Uint8Array.fromBase64(text);
    } catch (error) {
      throw new RangeError(
        `${path}/base64: is not valid base64 (${
          (error as Error).message
        }); use standard base64 with = padding`,
      );
    }
    if (bytes.length % 8 !== 0) {
      throw new RangeError(
        `${path}/base64: decodes to ${bytes.length} bytes, not a multiple of 8; ` +
          `each value must be 8 bytes of little-endian float64`,
      );
    }
    if (!LITTLE_ENDIAN) swapEach8(bytes);
    // fromBase64 returns a fresh buffer, so the view owns it and is 8-byte aligned
    return new Float64Array(bytes.buffer, bytes.byteOffset, bytes.length / 8);
  }
  throw new RangeError(
    `${path}: must be an array of numbers or an object {"base64": text}, got ${
      describeValue(wire)
    }`,
  );
}

/** A short description of a JSON value for messages. */
export function describeValue(v: unknown): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return `an array of ${v.length}`;
  if (typeof v === "object") return "an object";
  const text = JSON.stringify(v) ?? String(v);
  return text.length > 40 ? text.slice(0, 40) + "…" : text;
}
