/**
 * A strict JSON reader that remembers where every value sits in the text, so problems found later
 * (by the schema or by the engine) can name a line and column, and a syntax error can name where
 * reading stopped. JSON.parse gives neither reliably.
 *
 * @module
 */

/** Line and column (both counted from 1) of a place in a text. */
export interface TextPosition {
  line: number;
  column: number;
}

/** A parsed JSON document plus the position of every value, keyed by JSON pointer ("" is the root). */
export interface LocatedJson {
  value: unknown;
  /** JSON pointer → position of the value (for object members: of the value after the colon). */
  positions: Map<string, TextPosition>;
  /** JSON pointer → position of the member's key (object members only). */
  keyPositions: Map<string, TextPosition>;
}

/** A JSON syntax error with its place in the text. */
export class JsonSyntaxError extends SyntaxError {
  /** Where reading stopped. */
  readonly position: TextPosition;
  constructor(message: string, position: TextPosition) {
    super(message);
    this.name = "JsonSyntaxError";
    this.position = position;
  }
}

/** Escapes one reference token of a JSON pointer (RFC 6901). */
export function pointerToken(key: string): string {
  return key.replaceAll("~", "~0").replaceAll("/", "~1");
}

/**
 * Reads JSON text strictly (RFC 8259) and records positions.
 *
 * @throws {JsonSyntaxError} with the line and column where the text stops being JSON
 * @example
 * ```ts
 * import { readJsonWithPositions } from "./_json.ts";
 * const doc = readJsonWithPositions('{\n  "a": 1\n}');
 * doc.positions.get("/a"); // { line: 2, column: 8 }
 * ```
 */
export function readJsonWithPositions(text: string): LocatedJson {
  const positions = new Map<string, TextPosition>();
  const keyPositions = new Map<string, TextPosition>();
  let at = 0;
  // line starts, for offset → line/column
  const lineStarts = [0];
  for (let k = 0; k < text.length; k++) if (text.charCodeAt(k) === 10) lineStarts.push(k + 1);
  const where = (offset: number): TextPosition => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lineStarts[mid] <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - lineStarts[lo] + 1 };
  };
  const fail = (message: string, offset = at): never => {
    throw new JsonSyntaxError(message, where(offset));
  };
  const describe = (offset: number) =>
    offset >= text.length ? "the end of the text" : `'${text[offset]}'`;
  const skip = () => {
    while (at < text.length) {
      const ch = text[at];
      if (ch === " " || ch === "\t" || ch === "\n" || ch === "\r") at++;
      else break;
    }
  };
  const readString = (): string => {
    const start = at;
    at++; // opening quote
    let out = "";
    while (true) {
      if (at >= text.length) fail('unterminated string (a closing " is missing)', start);
      const ch = text[at];
      if (ch === '"') {
        at++;
        return out;
      }
      if (ch === "\\") {
        const next = text[at + 1];
        const simple: Record<string, string> = {
          '"': '"',
          "\\": "\\",
          "/": "/",
          b: "\b",
          f: "\f",
          n: "\n",
          r: "\r",
          t: "\t",
        };
        if (next !== undefined && Object.hasOwn(simple, next)) {
          out += simple[next];
          at += 2;
        } else if (next === "u" && /^[0-9a-fA-F]{4}$/.test(text.slice(at + 2, at + 6))) {
          out += String.fromCharCode(parseInt(text.slice(at + 2, at + 6), 16));
          at += 6;
        } else {
          fail("invalid escape sequence in a string");
        }
        continue;
      }
      if (ch.charCodeAt(0) < 0x20) fail("line break or control character inside a string");
      out += ch;
      at++;
    }
  };
  const readValue = (pointer: string, depth: number): unknown => {
    if (depth > 200) fail("nesting deeper than 200 levels");
    skip();
    positions.set(pointer, where(at));
    const ch = text[at];
    if (ch === "{") {
      at++;
      const obj: Record<string, unknown> = {};
      skip();
      if (text[at] === "}") {
        at++;
        return obj;
      }
      while (true) {
        skip();
        if (text[at] !== '"') {
          fail(`expected a field name in double quotes, found ${describe(at)}`);
        }
        const keyAt = at;
        const key = readString();
        const child = `${pointer}/${pointerToken(key)}`;
        if (Object.hasOwn(obj, key)) fail(`field "${key}" appears twice`, keyAt);
        keyPositions.set(child, where(keyAt));
        skip();
        if (text[at] !== ":") {
          fail(`expected ':' after the field name "${key}", found ${describe(at)}`);
        }
        at++;
        obj[key] = readValue(child, depth + 1);
        skip();
        if (text[at] === ",") {
          at++;
          skip();
          if (text[at] === "}") fail("trailing comma before '}'");
          continue;
        }
        if (text[at] === "}") {
          at++;
          return obj;
        }
        fail(`expected ',' or '}' after a field value, found ${describe(at)}`);
      }
    }
    if (ch === "[") {
      at++;
      const arr: unknown[] = [];
      skip();
      if (text[at] === "]") {
        at++;
        return arr;
      }
      while (true) {
        arr.push(readValue(`${pointer}/${arr.length}`, depth + 1));
        skip();
        if (text[at] === ",") {
          at++;
          skip();
          if (text[at] === "]") fail("trailing comma before ']'");
          continue;
        }
        if (text[at] === "]") {
          at++;
          return arr;
        }
        fail(`expected ',' or ']' after an array item, found ${describe(at)}`);
      }
    }
    if (ch === '"') return readString();
    const number = /^-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/.exec(text.slice(at, at + 400));
    if (number && number[0].length > 0) {
      at += number[0].length;
      return Number(number[0]);
    }
    for (const [word, value] of [["true", true], ["false", false], ["null", null]] as const) {
      if (text.startsWith(word, at)) {
        at += word.length;
        return value;
      }
    }
    return fail(`expected a JSON value, found ${describe(at)}`);
  };
  const value = readValue("", 0);
  skip();
  if (at < text.length) fail(`unexpected ${describe(at)} after the end of the JSON value`);
  return { value, positions, keyPositions };
}
