/**
 * Reading a gridproof solve request (docs/protocol.md, vertex layout) into plain typed arrays.
 * Self-contained on purpose: an adapter should not depend on gridproof's own modules.
 *
 * @module
 */

/** The protocol version this example speaks. */
export const PROTOCOL = "gridproof-protocol/1";

/** Sides of the rectangle: west x = x0, east x = x1, south y = y0, north y = y1. */
export type Side = "west" | "east" | "south" | "north";

/** A side's boundary condition with its sampled data g (corners included, increasing coordinate). */
export type Boundary =
  | { kind: "dirichlet"; values: Float64Array }
  | { kind: "neumann"; values: Float64Array }
  | { kind: "robin"; alpha: number; beta: number; values: Float64Array };

/** A vertex-layout problem: node (i, j) at index j·(nx + 1) + i. */
export interface Problem {
  domain: { x0: number; x1: number; y0: number; y1: number };
  nx: number;
  ny: number;
  a: Float64Array;
  b: Float64Array;
  c: Float64Array;
  d: Float64Array;
  e: Float64Array;
  f: Float64Array;
  boundary: Record<Side, Boundary>;
}

/** A request the solver cannot read; the message names the field. */
export class RequestError extends Error {
  override name = "RequestError";
}

/**
 * Decodes an array field: plain JSON numbers or `{ base64 }` (little-endian float64).
 *
 * @throws {RequestError} when the field has another shape, another length or a non-finite value
 */
export function decodeArray(value: unknown, field: string, length: number): Float64Array {
  let out: Float64Array;
  if (Array.isArray(value)) {
    out = Float64Array.from(value, (v) => (typeof v === "number" ? v : NaN));
  } else if (
    typeof value === "object" && value !== null &&
    typeof (value as { base64?: unknown }).base64 === "string"
  ) {
    const bin = atob((value as { base64: string }).base64);
    if (bin.length % 8 !== 0) {
      throw new RequestError(`${field}: base64 data has ${bin.length} bytes, not a multiple of 8`);
    }
    const bytes = new Uint8Array(bin.length);
    for (let k = 0; k < bin.length; k++) bytes[k] = bin.charCodeAt(k);
    const view = new DataView(bytes.buffer);
    out = new Float64Array(bin.length / 8);
    for (let k = 0; k < out.length; k++) out[k] = view.getFloat64(8 * k, true);
  } else {
    throw new RequestError(`${field}: must be an array of numbers or an object with base64`);
  }
  if (out.length !== length) {
    throw new RequestError(`${field}: has ${out.length} values, expected ${length}`);
  }
  const bad = out.findIndex((v) => !Number.isFinite(v));
  if (bad >= 0) throw new RequestError(`${field}[${bad}]: is not a finite number`);
  return out;
}

/** Encodes values as plain numbers or base64 little-endian float64. */
export function encodeArray(values: Float64Array, encoding: string): number[] | { base64: string } {
  if (encoding !== "base64") return Array.from(values);
  const bytes = new Uint8Array(values.length * 8);
  const view = new DataView(bytes.buffer);
  for (let k = 0; k < values.length; k++) view.setFloat64(8 * k, values[k], true);
  let bin = "";
  const chunk = 0x8000;
  for (let k = 0; k < bytes.length; k += chunk) {
    bin += String.fromCharCode(...bytes.subarray(k, k + chunk));
  }
  return { base64: btoa(bin) };
}

// deno-lint-ignore no-explicit-any
type Json = any;

/**
 * Reads a vertex-layout solve request into a {@link Problem}.
 *
 * @throws {RequestError} naming the field that is missing or wrong
 */
export function readProblem(req: Json): Problem {
  const nx = Number(req?.grid?.nx), ny = Number(req?.grid?.ny);
  if (!Number.isInteger(nx) || !Number.isInteger(ny) || nx < 2 || ny < 2) {
    throw new RequestError(`grid.nx, grid.ny: must be integers ≥ 2, got ${nx}, ${ny}`);
  }
  const dom = req?.domain ?? {};
  const domain = { x0: Number(dom.x0), x1: Number(dom.x1), y0: Number(dom.y0), y1: Number(dom.y1) };
  if (
    !Object.values(domain).every(Number.isFinite) || domain.x1 <= domain.x0 ||
    domain.y1 <= domain.y0
  ) {
    throw new RequestError(`domain: needs finite x0 < x1 and y0 < y1, got ${JSON.stringify(dom)}`);
  }
  const points = (nx + 1) * (ny + 1);
  const coef = req.coefficients ?? {};
  const arr = (k: string) => decodeArray(coef[k], `coefficients.${k}`, points);
  const boundary = {} as Record<Side, Boundary>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const s = req.boundary?.[side];
    const count = side === "west" || side === "east" ? ny + 1 : nx + 1;
    const kind = s?.kind;
    if (kind !== "dirichlet" && kind !== "neumann" && kind !== "robin") {
      throw new RequestError(`boundary.${side}.kind: must be dirichlet, neumann or robin`);
    }
    const values = decodeArray(s.values, `boundary.${side}.values`, count);
    if (kind === "robin") {
      const alpha = Number(s.alpha), beta = Number(s.beta);
      if (!Number.isFinite(alpha) || !Number.isFinite(beta)) {
        throw new RequestError(`boundary.${side}: robin needs finite alpha and beta`);
      }
      boundary[side] = { kind, alpha, beta, values };
    } else {
      boundary[side] = { kind, values };
    }
  }
  return {
    domain,
    nx,
    ny,
    a: arr("a"),
    b: arr("b"),
    c: arr("c"),
    d: arr("d"),
    e: arr("e"),
    f: decodeArray(req.source, "source", points),
    boundary,
  };
}
