/**
 * Writing and reading solve requests, and writing replies: the harness builds requests with
 * {@link buildSolveRequest}; a solver written in TypeScript reads them with
 * {@link readSolveRequest} and answers with {@link buildSolutionReply}.
 *
 * @module
 */
import { decodeArray, encodeArray } from "./encoding.ts";
import { firstBytes, layoutPointCount } from "./reply.ts";
import { validateMessage } from "./schemas.ts";
import {
  type ArrayEncoding,
  type ExpressionTexts,
  PROTOCOL_VERSION,
  type SampledProblem,
  type SampledSide,
  type SchemeHint,
  SIDE_NAMES,
  type SideName,
  type SolveRequestMessage,
  type SolverIdentity,
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
 *     coefficients: { a: z, b: z, c: z, d: z, e: z }, source: z,
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
  const enc = (v: Float64Array) => encodeArray(v, details.encoding, { constants });
  const boundary = {} as SolveRequestMessage["boundary"];
  for (const side of SIDE_NAMES) {
    const b = problem.boundary[side];
    boundary[side] = b.kind === "robin"
      ? { kind: b.kind, alpha: b.alpha, beta: b.beta, values: enc(b.values) }
      : { kind: b.kind, values: enc(b.values) };
  }
  const c = problem.coefficients;
  const caseInfo: SolveRequestMessage["case"] = { id: details.caseId };
  if (details.caseTitle !== undefined) caseInfo.title = details.caseTitle;
  return {
    protocol: PROTOCOL_VERSION,
    type: "solve",
    id: details.id,
    case: caseInfo,
    domain: { ...problem.domain },
    grid: {
      nx: problem.nx,
      ny: problem.ny,
      layout: problem.layout,
      order: "x-fastest",
      points: layoutPointCount(problem.layout, problem.nx, problem.ny),
    },
    encoding: details.encoding,
    coefficients: { a: enc(c.a), b: enc(c.b), c: enc(c.c), d: enc(c.d), e: enc(c.e) },
    source: enc(problem.source),
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
 * @param text the request text
 * @returns the decoded request
 * @throws RangeError listing every problem (an adapter answers it with an `error` reply)
 *
 * @example
 * ```ts ignore
 * import { readSolveRequest } from "./request.ts";
 * const { problem } = readSolveRequest(await new Response(Deno.stdin.readable).text());
 * ```
 */
export function readSolveRequest(text: string): ReadRequest {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new RangeError(
      `the request is not valid JSON (${(error as Error).message}); it began with ${
        firstBytes(text)
      }`,
    );
  }
  const version = (value as { protocol?: unknown } | null)?.protocol;
  if (typeof version === "string" && version !== PROTOCOL_VERSION) {
    throw new RangeError(
      `the request uses protocol "${version}"; this program speaks "${PROTOCOL_VERSION}"`,
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
    const v = decodeArray(wire, path);
    if (v.length !== length) {
      throw new RangeError(`${path}: has ${v.length} values, expected ${length}`);
    }
    return v;
  };
  const c = message.coefficients;
  const boundary = {} as Record<SideName, SampledSide>;
  for (const side of SIDE_NAMES) {
    const b = message.boundary[side];
    const along = side === "west" || side === "east" ? ny : nx;
    const length = layout === "vertex" ? along + 1 : along;
    const values = read(b.values, `/boundary/${side}/values`, length);
    boundary[side] = b.kind === "robin"
      ? { kind: "robin", alpha: b.alpha, beta: b.beta, values }
      : { kind: b.kind, values };
  }
  return {
    message,
    problem: {
      domain: message.domain,
      nx,
      ny,
      layout,
      coefficients: {
        a: read(c.a, "/coefficients/a", count),
        b: read(c.b, "/coefficients/b", count),
        c: read(c.c, "/coefficients/c", count),
        d: read(c.d, "/coefficients/d", count),
        e: read(c.e, "/coefficients/e", count),
      },
      source: read(message.source, "/source", count),
      boundary,
    },
  };
}

/** Optional fields of a solution reply. */
export interface SolutionExtras {
  residualHistory?: number[];
  iterations?: number;
  converged?: boolean;
  seconds?: number;
  solver?: SolverIdentity;
  notes?: string;
  /** Own points, for solvers that do not reply on the request's grid. */
  points?: { x: Float64Array; y: Float64Array; weights?: Float64Array };
}

/**
 * Builds a `solution` reply (for solvers written in TypeScript and for tests).
 *
 * @param id the request id
 * @param values the solution at the layout's points (or at `extras.points`)
 * @param options extras and the encoding of the arrays (default "numbers")
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
  options: SolutionExtras & { encoding?: ArrayEncoding } = {},
): Record<string, unknown> {
  const encoding = options.encoding ?? "numbers";
  const reply: Record<string, unknown> = {
    protocol: PROTOCOL_VERSION,
    type: "solution",
    id,
    values: encodeArray(values, encoding),
  };
  if (options.points) {
    const p = options.points;
    const points: Record<string, unknown> = {
      x: encodeArray(p.x, encoding),
      y: encodeArray(p.y, encoding),
    };
    if (p.weights) points.weights = encodeArray(p.weights, encoding);
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
