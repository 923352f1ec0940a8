/**
 * The gridproof solver protocol, `gridproof-protocol/1` and `/2` (documented in docs/protocol.md): message
 * types, JSON Schemas for every message, the two array encodings (JSON numbers, base64 of
 * little-endian float64), building requests and reading replies with every violation reported
 * with its JSON path. Large messages are written as bytes in pieces ({@link solveRequestBytes},
 * {@link solutionReplyBytes}) and read with base64 decoded straight from the text
 * ({@link parseMessage}). The decoded request is gridproof's one sampled-problem type
 * (`problem/`); `request.ts` maps it to and from the wire. It imports no other part of gridproof
 * than the leaf `problem/`, and no Deno API.
 *
 * @example
 * ```ts
 * import { decodeArray, encodeArray, readReply } from "./mod.ts";
 * const wire = encodeArray(new Float64Array([0.5, 2]), "base64");
 * decodeArray(wire, "/values"); // Float64Array [0.5, 2]
 * const check = readReply(
 *   JSON.stringify({ protocol: "gridproof-protocol/1", type: "solution", id: "r1", values: [1] }),
 *   { id: "r1", layout: "cell", nx: 1, ny: 1, domain: { x0: 0, x1: 1, y0: 0, y1: 1 } },
 * );
 * check.ok; // true
 * ```
 *
 * @module
 */
export * from "./types.ts";
export { decodeArray, describeValue, encodeArray, isConstantForm } from "./encoding.ts";
export { type MessageBytes, messageBytes } from "./message_bytes.ts";
export { LineScanner, type LineScannerOptions } from "./line_scanner.ts";
export { type ParsedMessage, parseMessage } from "./parse_message.ts";
export { MESSAGE_SCHEMAS, type MessageName, validateMessage } from "./schemas.ts";
export {
  firstBytes,
  layoutPointCount,
  namePoint,
  readReady,
  readReply,
  type ReadyCheck,
  type ReplyCheck,
  type ReplyExpectation,
} from "./reply.ts";
export {
  buildSolutionReply,
  buildSolveRequest,
  type ReadRequest,
  readSolveRequest,
  type RequestDetails,
  serializeMessage,
  solutionReplyBytes,
  solveRequestBytes,
  version1Misses,
} from "./request.ts";
