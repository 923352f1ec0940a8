/**
 * Parsing a message whose base64 arrays are decoded straight from the text: `JSON.parse` would
 * copy every base64 string (tens of megabytes at a million nodes) before it could be decoded.
 *
 * @module
 */
import { LITTLE_ENDIAN, swapEach8 } from "./encoding.ts";

/** Prefix of the text that stands in for a decoded array in the parsed value. */
const MARK = "\u0000gridproof-decoded:";
const QUOTE = 34;
const COLON = 58;

/** A parsed message and the arrays decoded on the way. */
export interface ParsedMessage {
  /** The message as `JSON.parse` gives it, except that decoded base64 texts are replaced by keys. */
  value: unknown;
  /**
   * The decoded arrays by the text that replaced them (pass it to `decodeArray`). Empty when the
   * message was parsed by `JSON.parse` alone.
   */
  decoded: Map<string, Float64Array>;
}

/** Index of the quote that closes the string whose contents start at `from`, or -1. */
function closingQuote(text: string, from: number): number {
  for (let q = text.indexOf('"', from); q >= 0; q = text.indexOf('"', q + 1)) {
    let back = q;
    while (text.charCodeAt(back - 1) === 92) back--;
    if ((q - back) % 2 === 0) return q;
  }
  return -1;
}

function skipSpace(text: string, at: number): number {
  while (true) {
    const c = text.charCodeAt(at);
    if (c !== 32 && c !== 9 && c !== 10 && c !== 13) return at;
    at++;
  }
}

/**
 * Decodes base64 text to float64 values, or undefined when it is anything but padded standard
 * base64 of a whole number of values.
 */
function decodeBody(body: string): Float64Array | undefined {
  const length = body.length;
  if (length % 4 !== 0 || body.includes("\\")) return undefined;
  const padding = body.endsWith("==") ? 2 : body.endsWith("=") ? 1 : 0;
  const byteCount = (length / 4) * 3 - padding;
  if (byteCount % 8 !== 0) return undefined;
  const values = new Float64Array(byteCount / 8);
  const bytes = new Uint8Array(values.buffer);
  try {
    const { read, written } = bytes.setFromBase64(body);
    // fromBase64 skips white space, which JSON forbids raw in strings: count every character
    if (read !== length || written !== byteCount) return undefined;
  } catch {
    return undefined;
  }
  if (!LITTLE_ENDIAN) swapEach8(bytes);
  return values;
}

/**
 * Parses one JSON message like `JSON.parse`, decoding the text of every `"base64"` member on the
 * way. The string structure is followed exactly (escapes included), so only real `"base64"` keys
 * are touched. When any such text is not clean padded base64 of float64 values, or anything else
 * is unusual, the message is parsed by plain `JSON.parse` and nothing is decoded, so the errors
 * are the usual ones (from `JSON.parse`, or later from `decodeArray`).
 *
 * @param text the message text
 * @returns the value and the arrays decoded on the way
 * @throws SyntaxError exactly when `JSON.parse(text)` does
 *
 * @example
 * ```ts
 * import { parseMessage } from "./parse_message.ts";
 * const { value, decoded } = parseMessage('{"values":{"base64":"AAAAAAAA8D8="}}');
 * const key = (value as { values: { base64: string } }).values.base64;
 * decoded.get(key); // Float64Array [1]
 * ```
 */
export function parseMessage(text: string): ParsedMessage {
  const decoded = new Map<string, Float64Array>();
  const parts: string[] = [];
  let copied = 0;
  // outside strings every quote opens one; `at` is always outside strings
  for (let at = text.indexOf('"'); at >= 0; at = text.indexOf('"', at)) {
    const close = closingQuote(text, at + 1);
    if (close < 0) break;
    const isKey = close - at === 7 && text.startsWith("base64", at + 1);
    at = close + 1;
    if (!isKey) continue;
    const colon = skipSpace(text, at);
    if (text.charCodeAt(colon) !== COLON) continue;
    const start = skipSpace(text, colon + 1);
    if (text.charCodeAt(start) !== QUOTE) continue;
    const end = closingQuote(text, start + 1);
    if (end < 0) break;
    at = end + 1;
    const values = decodeBody(text.slice(start + 1, end));
    // one text left as it is could imitate a key: then take the plain way for all of them
    if (values === undefined) return { value: JSON.parse(text), decoded: new Map() };
    const key = MARK + decoded.size;
    decoded.set(key, values);
    parts.push(text.slice(copied, start), JSON.stringify(key));
    copied = at;
  }
  if (decoded.size > 0) {
    parts.push(text.slice(copied));
    try {
      return { value: JSON.parse(parts.join("")), decoded };
    } catch {
      // let JSON.parse report the error on the text as it came
    }
  }
  return { value: JSON.parse(text), decoded: new Map() };
}
