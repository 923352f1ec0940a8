/**
 * Writing and reading solve requests, and writing replies: the harness builds requests with
 * {@link buildSolveRequest}; a solver written in TypeScript reads them with
 * {@link readSolveRequest} and answers with {@link buildSolutionReply}.
 *
 * The one mapping between gridproof's sampled-problem type (`problem/`) and the wire
 * (docs/protocol.md) lives here, both ways:
 *
 * - `a`–`e` are `coefficients.a`–`e` (non-conservative form), `m` is `coefficients.m`
 *   (version 2; an absent `m` goes as zeros), `f` is `source`;
 * - the conservative form: `a`, `c` go as `conservative.k11`, `k22`, `m` as `conservative.k12`
 *   (m = 2·k12, halved and doubled exactly; absent: zeros), `b`, `d`, `e` as `bx`, `by`, `sigma`,
 *   `conductivity.alongX` as `conservative.faces.x`, `alongY` as `faces.y` (an absent k12 goes
 *   as zeros);
 * - `coordinates` are `grid.x` and `grid.y`; a periodic side carries no values.
 *
 * The reader leaves out an optional array that arrives as zeros everywhere (`m`; k12 at the
 * points and faces, which go or stay together), since an absent one means zero.
 *
 * @module
 */
import { constantForm, decodeArray, encodeArray } from "./encoding.ts";
import { type MessageBytes, messageBytes } from "./message_bytes.ts";
import { type ParsedMessage, parseMessage } from "./parse_message.ts";
import { firstBytes, layoutPointCount } from "./reply.ts";
import { validateMessage } from "./schemas.ts";
import {
  allZero,
  type BoundaryCondition,
  faceCounts,
  formOf,
  type SampledProblem,
} from "../../problem/mod.ts";
import {
  type ArrayEncoding,
  type BoundaryKindName,
  type ExpressionTexts,
  PROTOCOL_VERSION,
  PROTOCOL_VERSION_2,
  PROTOCOL_VERSIONS,
  type ProtocolVersion,
  type SchemeHint,
  SIDE_NAMES,
  type SideName,
  type SolutionExtras,
  type SolveRequestMessage,
  uniformWeight,
  type WireArray,
} from "./types.ts";

/** Everything in a request besides the sampled arrays. */
export interface RequestDetails {
  /** Request id the reply must echo. */
  id: string;
  caseId: string;
  caseTitle?: string;
  expressions: ExpressionTexts;
  scheme: SchemeHint;
  tolerance: number;
  timeLimitSeconds: number;
  encoding: ArrayEncoding;
  /**
   * Send arrays whose entries are all equal as `{ constant, length }` (only for solvers that opted
   * in with `constantArrays`). Default: false.
   */
  constants?: boolean;
  /**
   * The protocol version of the request. Default: version 1, which cannot carry the
   * conservative form or the mixed term (building such a request throws).
   */
  protocol?: ProtocolVersion;
}

/**
 * Builds a solve request from a sampled problem.
 *
 * @param problem arrays at the layout's points (lengths are not checked here: the sampler made them)
 * @param details id, case, expressions, hints and the array encoding
 * @returns the message, ready for {@link serializeMessage}
 *
 * @example
 * ```ts
 * import { buildSolveRequest } from "./request.ts";
 * const z = new Float64Array(9);
 * const side = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const message = buildSolveRequest(
 *   {
 *     domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 2, ny: 2, layout: "vertex",
 *     a: z, b: z, c: z, d: z, e: z, f: z,
 *     boundary: { west: side, east: side, south: side, north: side },
 *   },
 *   {
 *     id: "r1", caseId: "demo", scheme: "central", tolerance: 1e-10, timeLimitSeconds: 10,
 *     encoding: "numbers",
 *     expressions: { a: "1", b: "0", c: "1", d: "0", e: "0", source: "0",
 *       boundary: { west: "0", east: "0", south: "0", north: "0" } },
 *   },
 * );
 * message.grid.points; // 9
 * ```
 */
export function buildSolveRequest(
  problem: SampledProblem,
  details: RequestDetails,
): SolveRequestMessage {
  const constants = details.constants ?? false;
  return assembleRequest(
    problem,
    details,
    (v) => encodeArray(v, details.encoding, { constants }),
  ) as SolveRequestMessage;
}

/**
 * Builds a solve request and serializes it as one line of UTF-8 bytes: the same bytes as
 * `serializeMessage(buildSolveRequest(problem, details))` encoded, written without building the
 * text (see {@link messageBytes}).
 *
 * @param problem arrays at the layout's points; read when the bytes are, so keep them unchanged
 * @param details id, case, expressions, hints and the array encoding
 * @returns the size and the bytes of the line
 *
 * @example
 * ```ts
 * import { solveRequestBytes } from "./request.ts";
 * const z = new Float64Array(9);
 * const side = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const line = solveRequestBytes(
 *   {
 *     domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 2, ny: 2, layout: "vertex",
 *     a: z, b: z, c: z, d: z, e: z, f: z,
 *     boundary: { west: side, east: side, south: side, north: side },
 *   },
 *   {
 *     id: "r1", caseId: "demo", scheme: "central", tolerance: 1e-10, timeLimitSeconds: 10,
 *     encoding: "base64",
 *     expressions: { a: "1", b: "0", c: "1", d: "0", e: "0", source: "0",
 *       boundary: { west: "0", east: "0", south: "0", north: "0" } },
 *   },
 * );
 * line.byteLength > 0; // true
 * ```
 */
export function solveRequestBytes(problem: SampledProblem, details: RequestDetails): MessageBytes {
  const constants = details.constants ?? false;
  const known = knownConstants(problem);
  // a Float64Array left in the message is written as base64 by messageBytes
  const lazy = (v: Float64Array): WireArray | Float64Array => {
    const constant = constants ? known.get(v) ?? constantForm(v) : undefined;
    if (constant) return constant;
    return details.encoding === "base64" ? v : Array.from(v);
  };
  return messageBytes(assembleRequest(problem, details, lazy));
}

/**
 * The constant form of the coefficient arrays the problem names as constant, by array. A named
 * value is trusted only when the array's first and last entries hold it (a cheap guard against a
 * stale hint; the others are then looked at in full).
 */
function knownConstants(
  problem: SampledProblem,
): Map<Float64Array, { constant: number; length: number }> {
  const known = new Map<Float64Array, { constant: number; length: number }>();
  if (formOf(problem) === "conservative") return known;
  for (const [name, value] of Object.entries(problem.constantCoefficients ?? {})) {
    const v = problem[name as "a" | "b" | "c" | "d" | "e" | "m"];
    if (v === undefined) continue;
    if (v.length > 0 && v[0] === value && v[v.length - 1] === value && Number.isFinite(value)) {
      known.set(v, { constant: value, length: v.length });
    }
  }
  return known;
}

/**
 * Why a problem cannot be written in version 1 (the conservative form, a mixed term), or
 * undefined when it can.
 *
 * @param problem the sampled problem
 * @returns the reason, for a not-applicable outcome or an error
 */
export function version1Misses(problem: SampledProblem): string | undefined {
  if (formOf(problem) === "conservative") return "protocol 1 has no conservative form";
  if (problem.coordinates) return "protocol 1 has no stretched grids (grid coordinates)";
  if (!allZero(problem.m)) return "protocol 1 has no mixed term (u_xy)";
  for (const side of SIDE_NAMES) {
    if (problem.boundary[side].kind === "periodic") {
      return `protocol 1 has no periodic sides (${side})`;
    }
  }
  for (const side of SIDE_NAMES) {
    const b = problem.boundary[side];
    if (b.kind !== "robin") continue;
    if (uniformWeight(b.alpha) === undefined || uniformWeight(b.beta) === undefined) {
      return `protocol 1 has no Robin weights that vary along a side (${side})`;
    }
  }
  return undefined;
}

/** The request message with each array written by `enc`. */
function assembleRequest<A>(
  problem: SampledProblem,
  details: RequestDetails,
  enc: (v: Float64Array) => A,
) {
  const protocol = details.protocol ?? PROTOCOL_VERSION;
  if (protocol === PROTOCOL_VERSION) {
    const misses = version1Misses(problem);
    if (misses) {
      throw new RangeError(
        `cannot write request ${details.id} (case ${details.caseId}) in ` +
          `${PROTOCOL_VERSION}: ${misses}; send it in ${PROTOCOL_VERSION_2} to a solver that ` +
          `speaks it (docs/protocol.md, "Moving to version 2")`,
      );
    }
  }
  const boundary = {} as Record<
    SideName,
    { kind: BoundaryKindName; alpha?: number | A; beta?: number | A; values?: A }
  >;
  // a Robin weight that is one value along the side goes as a number (the only shape of version 1)
  const weight = (w: Float64Array) => uniformWeight(w) ?? enc(w);
  for (const side of SIDE_NAMES) {
    const b = problem.boundary[side];
    boundary[side] = b.kind === "robin"
      ? { kind: b.kind, alpha: weight(b.alpha), beta: weight(b.beta), values: enc(b.values) }
      : b.kind === "periodic"
      ? { kind: b.kind }
      : { kind: b.kind, values: enc(b.values) };
  }
  const caseInfo: SolveRequestMessage["case"] = { id: details.caseId };
  if (details.caseTitle !== undefined) caseInfo.title = details.caseTitle;
  const layout = problem.layout ?? "vertex";
  const count = layoutPointCount(layout, problem.nx, problem.ny);
  const form = formOf(problem);
  const operator: Record<string, unknown> = {};
  if (protocol === PROTOCOL_VERSION_2) {
    if (problem.singular) operator.singular = true;
    operator.form = form;
    operator.interfaces = {
      x: [...(problem.interfaces?.x ?? [])],
      y: [...(problem.interfaces?.y ?? [])],
    };
  }
  const k = problem.conductivity;
  if (form === "conservative" && k) {
    const faces = faceCounts(layout, problem.nx, problem.ny);
    // m = 2·k12 at the points: halving a double is exact, so the wire's k12 is the case's own
    const k12 = problem.m ? problem.m.map((v) => v / 2) : new Float64Array(count);
    operator.conservative = {
      k11: enc(problem.a),
      k12: enc(k12),
      k22: enc(problem.c),
      bx: enc(problem.b),
      by: enc(problem.d),
      sigma: enc(problem.e),
      faces: {
        x: {
          k11: enc(k.alongX.k11),
          k12: enc(k.alongX.k12 ?? new Float64Array(faces.x)),
        },
        y: {
          k12: enc(k.alongY.k12 ?? new Float64Array(faces.y)),
          k22: enc(k.alongY.k22),
        },
      },
    };
  } else {
    const coefficients: Record<string, A> = {
      a: enc(problem.a),
      b: enc(problem.b),
      c: enc(problem.c),
      d: enc(problem.d),
      e: enc(problem.e),
    };
    if (protocol === PROTOCOL_VERSION_2) coefficients.m = enc(problem.m ?? new Float64Array(count));
    operator.coefficients = coefficients;
  }
  return {
    protocol,
    type: "solve" as const,
    id: details.id,
    case: caseInfo,
    domain: { ...problem.domain },
    grid: {
      nx: problem.nx,
      ny: problem.ny,
      layout,
      order: "x-fastest" as const,
      points: count,
      ...(protocol === PROTOCOL_VERSION_2 && problem.coordinates
        ? { x: enc(problem.coordinates.x), y: enc(problem.coordinates.y) }
        : {}),
    },
    encoding: details.encoding,
    ...operator,
    source: enc(problem.f),
    boundary,
    expressions: details.expressions,
    scheme: details.scheme,
    tolerance: details.tolerance,
    timeLimitSeconds: details.timeLimitSeconds,
  };
}

/** Writes a message as one line of JSON followed by a newline (the session framing). */
export function serializeMessage(message: object): string {
  return JSON.stringify(message) + "\n";
}

/** A request as a solver sees it after reading: arrays decoded, plus the rest of the message. */
export interface ReadRequest {
  message: SolveRequestMessage;
  problem: SampledProblem;
}

/**
 * Reads and checks a solve request (for solvers written in TypeScript and for tests): parses the
 * JSON, validates it against the schema, decodes every array and checks its length.
 *
 * @param text the request text, or the request already parsed (by `parseMessage` or a
 *   `LineScanner`)
 * @param options `keptConstants`: buffers kept from request to request for arrays sent in the
 *   constant form, by path (see `decodeArray`); for a solver answering one request at a time, so
 *   that constant coefficients do not cost fresh memory on every request (default: none);
 *   `versions`: the protocol versions the program speaks (default: both)
 * @returns the decoded request
 * @throws RangeError listing every problem (an adapter answers it with an `error` reply)
 *
 * @example
 * ```ts ignore
 * import { readSolveRequest } from "./request.ts";
 * const { problem } = readSolveRequest(await new Response(Deno.stdin.readable).text());
 * ```
 */
export function readSolveRequest(
  text: string | ParsedMessage,
  options: { keptConstants?: Map<string, Float64Array>; versions?: readonly ProtocolVersion[] } =
    {},
): ReadRequest {
  let value: unknown;
  let decoded: ReadonlyMap<string, Float64Array>;
  try {
    ({ value, decoded } = typeof text === "string" ? parseMessage(text) : text);
  } catch (error) {
    throw new RangeError(
      `the request is not valid JSON (${(error as Error).message}); it began with ${
        firstBytes(text as string)
      }`,
    );
  }
  const version = (value as { protocol?: unknown } | null)?.protocol;
  const speaks = options.versions ?? PROTOCOL_VERSIONS;
  if (typeof version === "string" && !speaks.includes(version as ProtocolVersion)) {
    throw new RangeError(
      `the request uses protocol "${version}"; this program speaks ${
        speaks.map((v) => `"${v}"`).join(" and ")
      }`,
    );
  }
  const problems = validateMessage("solve", value);
  if (problems.length > 0) {
    throw new RangeError(`the request does not match the protocol: ${problems.join("; ")}`);
  }
  const message = value as SolveRequestMessage;
  const { nx, ny, layout } = message.grid;
  const count = layoutPointCount(layout, nx, ny);
  const read = (wire: WireArray, path: string, length: number) => {
    const v = decodeArray(wire, path, decoded, options.keptConstants);
    if (v.length !== length) {
      throw new RangeError(`${path}: has ${v.length} values, expected ${length}`);
    }
    return v;
  };
  const boundary = {} as Record<SideName, BoundaryCondition>;
  for (const side of SIDE_NAMES) {
    const b = message.boundary[side];
    if (b.kind === "periodic") {
      boundary[side] = { kind: "periodic" };
      continue;
    }
    const along = side === "west" || side === "east" ? ny : nx;
    const length = layout === "vertex" ? along + 1 : along;
    const values = read(b.values!, `/boundary/${side}/values`, length);
    const weight = (w: number | WireArray | undefined, name: string) =>
      typeof w === "number"
        ? new Float64Array(length).fill(w)
        : read(w!, `/boundary/${side}/${name}`, length);
    boundary[side] = b.kind === "robin"
      ? { kind: "robin", alpha: weight(b.alpha, "alpha"), beta: weight(b.beta, "beta"), values }
      : { kind: b.kind, values };
  }
  const k = message.conservative;
  const conservative = message.form === "conservative" && k !== undefined;
  const c = message.coefficients;
  const problem: SampledProblem = {
    domain: message.domain,
    nx,
    ny,
    layout,
    a: conservative
      ? read(k.k11, "/conservative/k11", count)
      : read(c!.a, "/coefficients/a", count),
    b: conservative ? read(k.bx, "/conservative/bx", count) : read(c!.b, "/coefficients/b", count),
    c: conservative
      ? read(k.k22, "/conservative/k22", count)
      : read(c!.c, "/coefficients/c", count),
    d: conservative ? read(k.by, "/conservative/by", count) : read(c!.d, "/coefficients/d", count),
    e: conservative
      ? read(k.sigma, "/conservative/sigma", count)
      : read(c!.e, "/coefficients/e", count),
    f: read(message.source, "/source", count),
    boundary,
  };
  if (message.singular === true) problem.singular = true;
  if (message.protocol === PROTOCOL_VERSION_2) {
    if (message.grid.x !== undefined && message.grid.y !== undefined) {
      problem.coordinates = {
        x: read(message.grid.x, "/grid/x", nx + 1),
        y: read(message.grid.y, "/grid/y", ny + 1),
      };
    }
    problem.form = message.form;
    problem.interfaces = { x: [...message.interfaces!.x], y: [...message.interfaces!.y] };
  }
  if (conservative) {
    const faces = faceCounts(layout, nx, ny);
    const k12 = read(k.k12, "/conservative/k12", count);
    const x12 = read(k.faces.x.k12, "/conservative/faces/x/k12", faces.x);
    const y12 = read(k.faces.y.k12, "/conservative/faces/y/k12", faces.y);
    // k12 ≡ 0 everywhere: a diagonal K, sent as zeros, read back as absent
    const tensor = !(allZero(k12) && allZero(x12) && allZero(y12));
    problem.conductivity = {
      alongX: {
        k11: read(k.faces.x.k11, "/conservative/faces/x/k11", faces.x),
        ...(tensor ? { k12: x12 } : {}),
      },
      alongY: {
        ...(tensor ? { k12: y12 } : {}),
        k22: read(k.faces.y.k22, "/conservative/faces/y/k22", faces.y),
      },
    };
    // m = 2·k12 at the points (doubling a double is exact)
    if (tensor) problem.m = k12.map((v) => 2 * v);
  } else if (message.protocol === PROTOCOL_VERSION_2 && c!.m !== undefined) {
    const m = read(c!.m, "/coefficients/m", count);
    if (!allZero(m)) problem.m = m;
  }
  return { message, problem };
}

/**
 * Builds a `solution` reply (for solvers written in TypeScript and for tests).
 *
 * @param id the request id
 * @param values the solution at the layout's points (or at `extras.points`)
 * @param options extras, the encoding of the arrays (default "numbers") and the protocol version
 *   (default version 1; answer a request in its own version)
 * @returns the message, ready for {@link serializeMessage}
 *
 * @example
 * ```ts
 * import { buildSolutionReply } from "./request.ts";
 * buildSolutionReply("r1", new Float64Array([1, 2]), { encoding: "base64" }).type; // "solution"
 * ```
 */
export function buildSolutionReply(
  id: string,
  values: Float64Array,
  options: SolutionExtras & { encoding?: ArrayEncoding; protocol?: ProtocolVersion } = {},
): Record<string, unknown> {
  const encoding = options.encoding ?? "numbers";
  return assembleReply(id, values, options, (v) => encodeArray(v, encoding));
}

/**
 * Builds a `solution` reply and serializes it as one line of UTF-8 bytes: the same bytes as
 * `serializeMessage(buildSolutionReply(id, values, options))` encoded, written without building
 * the text (see {@link messageBytes}).
 *
 * @param id the request id
 * @param values the solution; read when the bytes are, so keep it unchanged until then
 * @param options extras, the encoding of the arrays (default "numbers") and the protocol version
 *   (default version 1; answer a request in its own version)
 * @returns the size and the bytes of the line
 *
 * @example
 * ```ts
 * import { solutionReplyBytes } from "./request.ts";
 * const line = solutionReplyBytes("r1", new Float64Array([1]), { encoding: "base64" });
 * new TextDecoder().decode(line.bytes()).endsWith('"values":{"base64":"AAAAAAAA8D8="}}\n'); // true
 * ```
 */
export function solutionReplyBytes(
  id: string,
  values: Float64Array,
  options: SolutionExtras & { encoding?: ArrayEncoding; protocol?: ProtocolVersion } = {},
): MessageBytes {
  const base64 = options.encoding === "base64";
  // a Float64Array left in the message is written as base64 by messageBytes
  return messageBytes(assembleReply(id, values, options, (v) => base64 ? v : Array.from(v)));
}

/** The reply message with each array written by `enc`. */
function assembleReply(
  id: string,
  values: Float64Array,
  options: SolutionExtras & { protocol?: ProtocolVersion },
  enc: (v: Float64Array) => unknown,
): Record<string, unknown> {
  const reply: Record<string, unknown> = {
    protocol: options.protocol ?? PROTOCOL_VERSION,
    type: "solution",
    id,
    values: enc(values),
  };
  if (options.points) {
    const p = options.points;
    const points: Record<string, unknown> = { x: enc(p.x), y: enc(p.y) };
    if (p.weights) points.weights = enc(p.weights);
    reply.points = points;
  }
  for (
    const key of [
      "residualHistory",
      "iterations",
      "converged",
      "seconds",
      "solver",
      "notes",
    ] as const
  ) {
    if (options[key] !== undefined) reply[key] = options[key];
  }
  return reply;
}
