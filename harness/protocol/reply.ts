/**
 * Reading a solver's reply: JSON parsing with diagnosis of the usual adapter mistakes (logs on
 * stdout, NaN written as a bare token, another protocol version), schema validation, decoding of
 * arrays and the checks the schema cannot express (counts, finiteness, the request id).
 *
 * @module
 */
import { decodeArray, describeValue } from "./encoding.ts";
import { type ParsedMessage, parseMessage } from "./parse_message.ts";
import { validateMessage } from "./schemas.ts";
import {
  type DecodedReply,
  type DecodedSolution,
  type GridLayout,
  PROTOCOL_VERSION,
  type ProtocolVersion,
  type ReadyMessage,
  type Rectangle,
} from "./types.ts";

/** What the harness expects of a reply to one request. */
export interface ReplyExpectation {
  /** The request id the reply must echo. */
  id: string;
  layout: GridLayout;
  nx: number;
  ny: number;
  domain: Rectangle;
  /** The request's protocol version, which the reply must echo. Default: version 1. */
  protocol?: ProtocolVersion;
}

/** Outcome of reading a reply: the decoded reply, or why it is unusable. */
export type ReplyCheck =
  | { ok: true; reply: DecodedReply }
  | { ok: false; reason: string; problems: string[] };

/** Outcome of reading a session's `ready` message. */
export type ReadyCheck =
  | { ok: true; ready: ReadyMessage }
  | { ok: false; reason: string; problems: string[] };

const NONFINITE = "\u0000nonfinite:";

/** Shows the first bytes of a text in messages (escaped, at most `max` characters). */
export function firstBytes(text: string, max = 120): string {
  const head = JSON.stringify(text.slice(0, max));
  return text.length > max ? `${head}… (${text.length} characters in all)` : head;
}

/**
 * Replaces bare NaN / Infinity / -Infinity tokens outside strings (what Python's json.dumps and
 * some C printers write) by marker strings, so the reply can be parsed and the node named.
 */
function markNonFiniteTokens(text: string): string | undefined {
  let out = "";
  let last = 0;
  let inString = false;
  let found = false;
  for (let k = 0; k < text.length; k++) {
    const ch = text[k];
    if (inString) {
      if (ch === "\\") k++;
      else if (ch === '"') inString = false;
      continue;
    }
    if (ch === '"') {
      inString = true;
      continue;
    }
    for (const token of ["-Infinity", "Infinity", "NaN"]) {
      if (text.startsWith(token, k)) {
        out += text.slice(last, k) + JSON.stringify(NONFINITE + token);
        k += token.length - 1;
        last = k + 1;
        found = true;
        break;
      }
    }
  }
  return found ? out + text.slice(last) : undefined;
}

type Decoded = ReadonlyMap<string, Float64Array>;
type Parsed =
  | { ok: true; value: unknown; logLines: string[]; decoded?: Decoded }
  | { ok: false; reason: string };

function tryParse(
  text: string,
): { ok: true; value: unknown; decoded?: Decoded } | { ok: false; error: string } {
  try {
    return { ok: true, ...parseMessage(text) };
  } catch (error) {
    const marked = markNonFiniteTokens(text);
    if (marked !== undefined) {
      try {
        return { ok: true, value: JSON.parse(marked) };
      } catch {
        // fall through to the original message
      }
    }
    return { ok: false, error: (error as Error).message };
  }
}

function isMessage(v: unknown): boolean {
  return v !== null && typeof v === "object" && !Array.isArray(v) && "protocol" in v;
}

/**
 * Parses stdout text that should hold exactly one JSON message, diagnosing log lines around it.
 */
function parseStdout(text: string, what: string): Parsed {
  if (text.trim() === "") return { ok: false, reason: `the solver wrote no ${what} on stdout` };
  const whole = tryParse(text);
  if (whole.ok) return { ok: true, value: whole.value, logLines: [], decoded: whole.decoded };
  const lines = text.split("\n");
  // A one-line message among other lines.
  for (let k = lines.length - 1; k >= 0; k--) {
    const line = lines[k].trim();
    if (!line.startsWith("{")) continue;
    const one = tryParse(line);
    if (one.ok && isMessage(one.value)) {
      const logLines = lines.filter((l, m) => m !== k && l.trim() !== "");
      return { ok: true, value: one.value, logLines };
    }
  }
  // A pretty-printed message after some log lines.
  const start = lines.findIndex((l) => l.startsWith("{"));
  if (start > 0) {
    const rest = tryParse(lines.slice(start).join("\n"));
    if (rest.ok && isMessage(rest.value)) {
      return {
        ok: true,
        value: rest.value,
        logLines: lines.slice(0, start).filter((l) => l.trim() !== ""),
      };
    }
  }
  const hint = /^\s*[{[]/.test(text)
    ? ""
    : "; stdout is for protocol messages only — logs belong on stderr";
  return {
    ok: false,
    reason:
      `the ${what} is not valid JSON (${whole.error}); stdout began with ${firstBytes(text)}` +
      hint,
  };
}

function logProblem(logLines: string[], what: string): string {
  return `the solver printed ${logLines.length} line(s) of other text on stdout besides its ${what} ` +
    `(first: ${
      firstBytes(logLines[0], 80)
    }); stdout is for protocol messages only, logs belong on stderr`;
}

function versionProblem(value: unknown, wanted: ProtocolVersion): string | undefined {
  if (!isMessage(value)) return undefined;
  const version = (value as { protocol: unknown }).protocol;
  if (version === wanted) return undefined;
  return `the solver speaks protocol ${describeValue(version)}; this gridproof speaks ` +
    `"${wanted}" to it (the solver file's "protocol" field) — update the adapter to echo ` +
    `"${wanted}", or set "protocol" to the version it speaks (docs/protocol.md)`;
}

/** Names point k of a layout: grid indices and coordinates. */
export function namePoint(k: number, expect: Omit<ReplyExpectation, "id">): string {
  const { nx, ny, domain } = expect;
  const hx = (domain.x1 - domain.x0) / nx;
  const hy = (domain.y1 - domain.y0) / ny;
  if (expect.layout === "vertex") {
    const i = k % (nx + 1);
    const j = Math.floor(k / (nx + 1));
    return `node i=${i}, j=${j} at x=${domain.x0 + i * hx}, y=${domain.y0 + j * hy}`;
  }
  const i = k % nx;
  const j = Math.floor(k / nx);
  return `cell i=${i}, j=${j} at x=${domain.x0 + (i + 0.5) * hx}, y=${domain.y0 + (j + 0.5) * hy}`;
}

function markedNonFinite(wire: unknown): { index: number; token: string } | undefined {
  if (!Array.isArray(wire)) return undefined;
  for (let k = 0; k < wire.length; k++) {
    const v = wire[k];
    if (typeof v === "string" && v.startsWith(NONFINITE)) {
      return { index: k, token: v.slice(NONFINITE.length) };
    }
  }
  return undefined;
}

function firstNonFinite(values: Float64Array): number {
  for (let k = 0; k < values.length; k++) if (!Number.isFinite(values[k])) return k;
  return -1;
}

/** Number of points of a layout. */
export function layoutPointCount(layout: GridLayout, nx: number, ny: number): number {
  return layout === "vertex" ? (nx + 1) * (ny + 1) : nx * ny;
}

/**
 * Reads the reply to a solve request from the solver's stdout text and checks it fully.
 *
 * @param text everything the solver wrote on stdout for this solve (once mode) or its reply line,
 *   or the reply line already parsed (by a `LineScanner`)
 * @param expect the request's id and grid
 * @returns the decoded reply, or the reason it is unusable and every problem found
 *
 * @example
 * ```ts
 * import { readReply } from "./reply.ts";
 * const check = readReply(
 *   '{"protocol":"gridproof-protocol/1","type":"not-applicable","id":"r1","reason":"no robin"}',
 *   { id: "r1", layout: "vertex", nx: 2, ny: 2, domain: { x0: 0, x1: 1, y0: 0, y1: 1 } },
 * );
 * check.ok; // true
 * ```
 */
export function readReply(text: string | ParsedMessage, expect: ReplyExpectation): ReplyCheck {
  const parsed: Parsed = typeof text === "string"
    ? parseStdout(text, "reply")
    : { ok: true, value: text.value, logLines: [], decoded: text.decoded };
  if (!parsed.ok) return fail(parsed.reason);
  const value = parsed.value;
  const version = versionProblem(value, expect.protocol ?? PROTOCOL_VERSION);
  if (version) return fail(version);
  if (parsed.logLines.length > 0) return fail(logProblem(parsed.logLines, "reply"));
  const message = value as Record<string, unknown>;
  // Bare NaN/Infinity tokens: name the node before the schema complains about strings.
  for (const key of ["values"]) {
    const marked = markedNonFinite(message[key]);
    if (marked) {
      const where = message.points === undefined ? ` (${namePoint(marked.index, expect)})` : "";
      return fail(
        `${key}[${marked.index}] is ${marked.token}${where}; the solution must be finite ` +
          `(JSON has no NaN or Infinity: this reply wrote a bare ${marked.token} token)`,
      );
    }
  }
  const problems = validateMessage("solution", value);
  if (problems.length > 0) {
    return {
      ok: false,
      reason: `the reply does not match the protocol (${problems.length} problem(s)): ` +
        problems.join("; "),
      problems,
    };
  }
  const type = message.type as DecodedReply["type"];
  if (type !== "solution") {
    const id = message.id as string | undefined;
    if (id !== undefined && id !== expect.id) return fail(idProblem(id, expect.id));
    return { ok: true, reply: { type, id, reason: message.reason as string } };
  }
  if (message.id !== expect.id) return fail(idProblem(message.id as string, expect.id));
  return decodeSolution(message, expect, parsed.decoded);
}

function idProblem(got: string, wanted: string): string {
  return `the reply id ${JSON.stringify(got)} does not match the request id ${
    JSON.stringify(wanted)
  }`;
}

function fail(reason: string): { ok: false; reason: string; problems: string[] } {
  return { ok: false, reason, problems: [reason] };
}

function decodeSolution(
  message: Record<string, unknown>,
  expect: ReplyExpectation,
  decoded: Decoded | undefined,
): ReplyCheck {
  let values: Float64Array;
  let points: DecodedSolution["points"];
  let residualHistory: number[] | undefined;
  try {
    values = decodeArray(message.values, "/values", decoded);
    if (message.points !== undefined) {
      const p = message.points as Record<string, unknown>;
      points = {
        x: decodeArray(p.x, "/points/x", decoded),
        y: decodeArray(p.y, "/points/y", decoded),
      };
      if (p.weights !== undefined) {
        points.weights = decodeArray(p.weights, "/points/weights", decoded);
      }
    }
    if (message.residualHistory !== undefined) {
      residualHistory = Array.from(
        decodeArray(message.residualHistory, "/residualHistory", decoded),
      );
    }
  } catch (error) {
    return fail(`the reply could not be decoded: ${(error as Error).message}`);
  }
  if (points) {
    const n = values.length;
    for (const [name, arr] of Object.entries(points)) {
      if (arr && arr.length !== n) {
        return fail(
          `points.${name} has ${arr.length} entries but values has ${n}; they must match`,
        );
      }
    }
    if (n === 0) return fail("the reply has no points: values and points are empty");
    const { x0, x1, y0, y1 } = expect.domain;
    const slack = 1e-9 * Math.max(x1 - x0, y1 - y0);
    for (let k = 0; k < n; k++) {
      const x = points.x[k];
      const y = points.y[k];
      if (!(x >= x0 - slack && x <= x1 + slack && y >= y0 - slack && y <= y1 + slack)) {
        return fail(
          `point ${k} at (${x}, ${y}) lies outside the domain [${x0}, ${x1}] × [${y0}, ${y1}]`,
        );
      }
    }
    if (points.weights) {
      const bad = firstNonFinite(points.weights);
      if (bad >= 0) {
        return fail(`points.weights[${bad}] is ${points.weights[bad]}; weights must be finite`);
      }
    }
  } else {
    const wanted = layoutPointCount(expect.layout, expect.nx, expect.ny);
    if (values.length !== wanted) {
      return fail(
        `values has ${values.length} entries; the ${expect.layout} grid ${expect.nx}×${expect.ny} ` +
          `has ${wanted} points (${
            expect.layout === "vertex" ? "(nx+1)·(ny+1)" : "nx·ny"
          }, x fastest)`,
      );
    }
  }
  const bad = firstNonFinite(values);
  if (bad >= 0) {
    const where = points
      ? `point ${bad} at (${points.x[bad]}, ${points.y[bad]})`
      : namePoint(bad, expect);
    return fail(`values[${bad}] is ${values[bad]} (${where}); the solution must be finite`);
  }
  const reply: DecodedSolution = { type: "solution", id: message.id as string, values };
  if (points) reply.points = points;
  if (residualHistory) reply.residualHistory = residualHistory;
  if (typeof message.iterations === "number") reply.iterations = message.iterations;
  if (typeof message.converged === "boolean") reply.converged = message.converged;
  if (typeof message.seconds === "number") reply.seconds = message.seconds;
  if (message.solver) reply.solver = message.solver as DecodedSolution["solver"];
  if (typeof message.notes === "string") reply.notes = message.notes;
  return { ok: true, reply };
}

/**
 * Reads a session's `ready` message (the answer to `hello`) and checks it.
 *
 * @param text the line the solver wrote
 * @param protocol the version `hello` was sent in, which `ready` must echo (default version 1)
 * @returns the message, or the reason it is unusable
 *
 * @example
 * ```ts
 * import { readReady } from "./reply.ts";
 * readReady('{"protocol":"gridproof-protocol/1","type":"ready"}').ok; // true
 * ```
 */
export function readReady(text: string, protocol: ProtocolVersion = PROTOCOL_VERSION): ReadyCheck {
  const parsed = parseStdout(text, "ready message");
  if (!parsed.ok) return fail(parsed.reason);
  const version = versionProblem(parsed.value, protocol);
  if (version) return fail(version);
  if (parsed.logLines.length > 0) return fail(logProblem(parsed.logLines, "ready message"));
  const problems = validateMessage("ready", parsed.value);
  if (problems.length > 0) {
    return {
      ok: false,
      reason: `the ready message does not match the protocol (${problems.length} problem(s)): ` +
        problems.join("; "),
      problems,
    };
  }
  return { ok: true, ready: parsed.value as ReadyMessage };
}
