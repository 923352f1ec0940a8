/**
 * Reading one message line while its bytes arrive: finds the newline that ends the line and
 * decodes the text of every `"base64"` member as it comes, so that when the last byte of a
 * request of tens of megabytes arrives, little work is left. Bytes are looked at through small
 * decoded windows (fast native string search, no string of the whole line is ever built).
 *
 * @module
 */
import { LITTLE_ENDIAN, swapEach8 } from "./encoding.ts";
import type { ParsedMessage } from "./parse_message.ts";

const MARK = "\u0000gridproof-scanned:";
/** Largest window of bytes decoded to text at once (small strings are cheap to make). */
const WINDOW = 1 << 16;
/** States: outside strings, in a string, after a `"base64"` key, after its colon, in its text. */
const OUT = 0;
const STRING = 1;
const KEY = 2;
const COLON = 3;
const BASE64 = 4;

function isSpace(c: number): boolean {
  return c === 32 || c === 9 || c === 13;
}

/**
 * Where bytes [from, to) can be cut without splitting a UTF-8 character: `to`, or the start of
 * an incomplete character at the end.
 */
function charBoundary(bytes: Uint8Array, from: number, to: number): number {
  for (let k = 1; k <= 3 && to - k >= from; k++) {
    const b = bytes[to - k];
    if ((b & 0xc0) === 0x80) continue;
    const need = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return need > k ? to - k : to;
  }
  return to;
}

/** Options of {@link LineScanner}. */
export interface LineScannerOptions {
  /**
   * Decode the k-th base64 array of every line into the same buffer, kept from line to line, so
   * that a stream of lines of the same size touches no fresh memory. The arrays that
   * {@link LineScanner.finish} returns are then views of those buffers, overwritten by the next
   * line: use this only when a line's arrays are no longer needed once the next line is scanned
   * (a solver answering one request at a time). Default: false (every array is a fresh copy).
   */
  reuseArrays?: boolean;
}

/**
 * Scans the lines of a message stream as their bytes arrive. Call {@link LineScanner.scan} with
 * the bytes received so far (counted from the start of the line) until it returns the offset of
 * the newline, then {@link LineScanner.finish} with the line; the scanner is then ready for the
 * next line (and keeps its decoding buffers, already touched, for it).
 *
 * @example
 * ```ts
 * import { LineScanner } from "./line_scanner.ts";
 * const bytes = new TextEncoder().encode('{"values":{"base64":"AAAAAAAA8D8="}}\n{"next":1}');
 * const scanner = new LineScanner();
 * const end = scanner.scan(bytes); // 37
 * const parsed = scanner.finish(bytes.subarray(0, end));
 * typeof parsed === "object"; // true: values decoded on the way
 * ```
 */
export class LineScanner {
  readonly #decoder = new TextDecoder();
  /** Bytes of the line already scanned. */
  #scanned = 0;
  #state = OUT;
  /** In a string: the next character is escaped. */
  #escape = false;
  /** In a string: its first characters (enough to tell a `"base64"` key). */
  #head = "";
  /** The text of the line with decoded base64 texts replaced by markers. */
  #parts: string[] = [];
  #decoded = new Map<string, Float64Array>();
  /** Buffers to decode into: one for all arrays, or with `reuseArrays` one per array of a line. */
  #buffers: Uint8Array<ArrayBuffer>[] = [];
  readonly #reuse: boolean;
  /** Base64 text being decoded: the buffer it goes to, bytes so far, padding seen. */
  #bytes = new Uint8Array(0);
  #written = 0;
  #padded = false;
  /** Set when the line cannot take the fast way (then `finish` returns undefined). */
  #plain = false;
  #end = -1;

  /** @param options whether decoded arrays reuse the scanner's buffers (default: no) */
  constructor(options: LineScannerOptions = {}) {
    this.#reuse = options.reuseArrays ?? false;
  }

  /**
   * Scans the bytes not yet scanned.
   *
   * @param line the bytes received so far, starting at the start of the line (may run past it)
   * @returns the offset of the newline that ends the line, or -1 while it has not arrived
   */
  scan(line: Uint8Array): number {
    if (this.#end >= 0) return this.#end;
    while (this.#scanned < line.length) {
      const from = this.#scanned;
      const to = charBoundary(line, from, Math.min(line.length, from + WINDOW));
      if (to === from) break;
      const text = this.#decoder.decode(line.subarray(from, to));
      const newline = text.indexOf("\n");
      if (text.includes("\uFFFD")) this.#plain = true;
      const limit = newline < 0 ? text.length : newline;
      const used = this.#plain ? limit : this.#walk(text, limit);
      if (newline >= 0) {
        this.#end = line.indexOf(10, from);
        return this.#end;
      }
      // what is left unread is base64 text short of a group of 4, one byte per character
      const next = to - (text.length - used);
      if (next === from) break;
      this.#scanned = next;
    }
    return -1;
  }

  /**
   * The parsed line, or undefined when it must be parsed from its text (anything unusual:
   * invalid JSON, base64 that is not clean and padded, text that is not valid UTF-8).
   *
   * @param line the line without its newline (at the end of input: the bytes left)
   */
  finish(line: Uint8Array): ParsedMessage | undefined {
    if (this.#end < 0) {
      this.scan(line);
      if (this.#scanned < line.length || this.#state !== OUT) this.#plain = true;
    }
    const { parts, decoded } = { parts: this.#parts, decoded: this.#decoded };
    const plain = this.#plain || decoded.size === 0;
    this.#reset();
    if (plain) return undefined;
    try {
      return { value: JSON.parse(parts.join("")), decoded };
    } catch {
      return undefined;
    }
  }

  #reset(): void {
    this.#scanned = 0;
    this.#state = OUT;
    this.#parts = [];
    this.#decoded = new Map();
    this.#plain = false;
    this.#end = -1;
  }

  /**
   * Runs the states over text[0, limit); returns where it stopped: `limit`, or earlier in base64
   * text when fewer than 4 characters are left (they are read again with the next bytes).
   */
  #walk(text: string, limit: number): number {
    let at = 0;
    while (at < limit && !this.#plain) {
      switch (this.#state) {
        case OUT: {
          const quote = text.indexOf('"', at);
          const stop = quote < 0 || quote >= limit ? limit : quote + 1;
          this.#parts.push(text.slice(at, stop));
          if (stop === quote + 1) this.#openString();
          at = stop;
          break;
        }
        case STRING:
          at = this.#inString(text, at, limit);
          break;
        case KEY:
        case COLON: {
          const c = text.charCodeAt(at);
          if (isSpace(c)) {
            this.#parts.push(text[at++]);
          } else if (this.#state === KEY && c === 58) {
            this.#parts.push(":");
            this.#state = COLON;
            at++;
          } else if (this.#state === COLON && c === 34) {
            this.#startArray();
            at++;
          } else {
            this.#state = OUT;
          }
          break;
        }
        case BASE64: {
          const stop = this.#inBase64(text, at, limit);
          if (this.#state === BASE64) return stop;
          at = stop;
          break;
        }
      }
    }
    return limit;
  }

  #openString(): void {
    this.#state = STRING;
    this.#escape = false;
    this.#head = "";
  }

  #inString(text: string, at: number, limit: number): number {
    if (this.#escape) {
      this.#escape = false;
      this.#head = "\\";
      this.#parts.push(text[at]);
      return at + 1;
    }
    const quote = text.indexOf('"', at);
    const stop = quote < 0 || quote >= limit ? limit : quote;
    let run = 0;
    while (stop - run - 1 >= at && text.charCodeAt(stop - run - 1) === 92) run++;
    if (this.#head.length < 7) this.#head += text.slice(at, Math.min(stop, at + 7));
    if (stop === limit) {
      this.#escape = run % 2 === 1;
      this.#parts.push(text.slice(at, limit));
      return limit;
    }
    this.#parts.push(text.slice(at, stop + 1));
    if (run % 2 === 1) return stop + 1;
    this.#state = this.#head === "base64" ? KEY : OUT;
    return stop + 1;
  }

  #startArray(): void {
    this.#state = BASE64;
    const k = this.#reuse ? this.#decoded.size : 0;
    this.#buffers[k] ??= new Uint8Array(1 << 16);
    this.#bytes = this.#buffers[k];
    this.#written = 0;
    this.#padded = false;
  }

  /**
   * Decodes the whole groups of 4 characters of base64 text from `at`; returns the index after
   * the closing quote, or, while the text goes on, the index of the first character not decoded.
   */
  #inBase64(text: string, at: number, limit: number): number {
    const quote = text.indexOf('"', at);
    const closed = quote >= 0 && quote < limit;
    const stop = closed ? quote : at + ((limit - at) & ~3);
    if (closed && (stop - at) % 4 !== 0) {
      this.#plain = true;
      return limit;
    }
    if (stop > at) this.#decodeChunk(text.slice(at, stop));
    if (!closed) return stop;
    if (this.#written % 8 !== 0) {
      this.#plain = true;
      return limit;
    }
    let values: Float64Array;
    if (this.#reuse) {
      values = new Float64Array(this.#bytes.buffer, 0, this.#written / 8);
      if (!LITTLE_ENDIAN) swapEach8(this.#bytes.subarray(0, this.#written));
    } else {
      values = new Float64Array(this.#written / 8);
      const bytes = new Uint8Array(values.buffer);
      bytes.set(this.#bytes.subarray(0, this.#written));
      if (!LITTLE_ENDIAN) swapEach8(bytes);
    }
    const key = MARK + this.#decoded.size;
    this.#decoded.set(key, values);
    this.#parts.push(JSON.stringify(key));
    this.#state = OUT;
    return stop + 1;
  }

  /** Decodes whole groups of 4 base64 characters after the bytes so far. */
  #decodeChunk(chunk: string): void {
    if (this.#padded) {
      this.#plain = true;
      return;
    }
    const padding = chunk.endsWith("==") ? 2 : chunk.endsWith("=") ? 1 : 0;
    const expected = (chunk.length / 4) * 3 - padding;
    if (this.#written + expected > this.#bytes.length) {
      const grown = new Uint8Array(Math.max(2 * this.#bytes.length, this.#written + expected));
      grown.set(this.#bytes.subarray(0, this.#written));
      this.#buffers[this.#reuse ? this.#decoded.size : 0] = grown;
      this.#bytes = grown;
    }
    try {
      const { read, written } = this.#bytes.subarray(this.#written).setFromBase64(chunk);
      // fromBase64 skips white space, which JSON forbids raw in strings: count every character
      if (read !== chunk.length || written !== expected) this.#plain = true;
      this.#written += written;
    } catch {
      this.#plain = true;
    }
    this.#padded = padding > 0;
  }
}
