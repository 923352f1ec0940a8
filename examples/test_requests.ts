/**
 * Test support for the example solvers: builds tiny protocol requests (docs/protocol.md) from an
 * exact solution written by hand, runs an example as a subprocess and decodes its reply.
 *
 * Independent of gridproof's case engine and protocol module on purpose: the requests follow the
 * written protocol, so the examples are checked against the document, not against our own code.
 *
 * @module
 */
import assert from "node:assert/strict";
import { runWithInput } from "../testing/mod.ts";

/** A hand-written exact solution with its first and second derivatives. */
export interface Exact {
  u: (x: number, y: number) => number;
  ux: (x: number, y: number) => number;
  uy: (x: number, y: number) => number;
  uxx: (x: number, y: number) => number;
  uyy: (x: number, y: number) => number;
}

/**
 * u = 1 + x + 2y + x² − xy + y²/2. Central differences and the ghost-node formulas are exact for
 * quadratics (derived: docs/check-values.md, "Exact facts of central differences"), so a
 * vertex-centred solver of the reference scheme reproduces it at the nodes to round-off.
 */
export const QUADRATIC: Exact = {
  u: (x, y) => 1 + x + 2 * y + x * x - x * y + 0.5 * y * y,
  ux: (x, y) => 1 + 2 * x - y,
  uy: (x, y) => 2 - x + y,
  uxx: () => 2,
  uyy: () => 1,
};

/** A smooth non-polynomial solution: u = sin(2x + 0.3)·cos(1.5y) + xy. */
export const SMOOTH: Exact = {
  u: (x, y) => Math.sin(2 * x + 0.3) * Math.cos(1.5 * y) + x * y,
  ux: (x, y) => 2 * Math.cos(2 * x + 0.3) * Math.cos(1.5 * y) + y,
  uy: (x, y) => -1.5 * Math.sin(2 * x + 0.3) * Math.sin(1.5 * y) + x,
  uxx: (x, y) => -4 * Math.sin(2 * x + 0.3) * Math.cos(1.5 * y),
  uyy: (x, y) => -2.25 * Math.sin(2 * x + 0.3) * Math.cos(1.5 * y),
};

/** All five coefficients variable; a·c > 0 and e < 0 on the test domain. */
export const COEFFICIENTS = {
  a: (x: number, y: number) => 1 + 0.5 * Math.sin(x + y),
  b: (x: number, _y: number) => 0.3 * Math.cos(x),
  c: (x: number, y: number) => 2 + x * y,
  d: (_x: number, y: number) => -0.4 + y,
  e: (x: number, _y: number) => -1 - x * x,
};

/** The test domain [0, 1.5] × [−0.5, 0.5] (not the unit square, so hx ≠ hy when nx = ny). */
export const DOMAIN = { x0: 0, x1: 1.5, y0: -0.5, y1: 0.5 };

/** A side's condition in a test request: kind plus α, β for Robin. */
export type SideSpec =
  | { kind: "dirichlet" }
  | { kind: "neumann" }
  | { kind: "robin"; alpha: number; beta: number };

/** Boundary conditions of the four sides. */
export type Sides = Record<"west" | "east" | "south" | "north", SideSpec>;

/** Mixes used by the tests: every kind, Neumann/Robin corners, Dirichlet corners. */
export const MIXES: Record<string, Sides> = {
  "all dirichlet": {
    west: { kind: "dirichlet" },
    east: { kind: "dirichlet" },
    south: { kind: "dirichlet" },
    north: { kind: "dirichlet" },
  },
  "mixed with a dirichlet side": {
    west: { kind: "neumann" },
    east: { kind: "robin", alpha: 2, beta: 0.5 },
    south: { kind: "dirichlet" },
    north: { kind: "neumann" },
  },
  "neumann and robin only": {
    west: { kind: "robin", alpha: 1, beta: 1 },
    east: { kind: "neumann" },
    south: { kind: "neumann" },
    north: { kind: "robin", alpha: 0.5, beta: 2 },
  },
};

/** Options of {@link buildRequest}. */
export interface RequestOptions {
  /** Default: "vertex". */
  layout?: "vertex" | "cell";
  /** Default: "numbers". */
  encoding?: "numbers" | "base64";
  /** Default: "central". */
  scheme?: "central" | "upwind";
  /** Default: "test". */
  id?: string;
}

/** Coordinates of the layout's points, x fastest. */
export function gridPoints(
  layout: "vertex" | "cell",
  nx: number,
  ny: number,
): { x: number[]; y: number[] } {
  const { x0, x1, y0, y1 } = DOMAIN;
  const hx = (x1 - x0) / nx, hy = (y1 - y0) / ny;
  const shift = layout === "cell" ? 0.5 : 0;
  const mx = layout === "cell" ? nx : nx + 1, my = layout === "cell" ? ny : ny + 1;
  const x: number[] = [], y: number[] = [];
  for (let j = 0; j < my; j++) {
    for (let i = 0; i < mx; i++) {
      x.push(x0 + (i + shift) * hx);
      y.push(y0 + (j + shift) * hy);
    }
  }
  return { x, y };
}

function encode(values: number[], encoding: string): number[] | { base64: string } {
  if (encoding !== "base64") return values;
  const bytes = new Uint8Array(new Float64Array(values).buffer);
  let bin = "";
  for (const b of bytes) bin += String.fromCharCode(b);
  return { base64: btoa(bin) };
}

/**
 * Builds a solve request for the exact solution `exact` with the test coefficients on an
 * nx × ny grid: source f = a·u_xx + b·u_x + c·u_yy + d·u_y + e·u from the hand-written
 * derivatives, boundary data from u and its outward normal derivative.
 */
export function buildRequest(
  exact: Exact,
  sides: Sides,
  grid: { nx: number; ny: number },
  options: RequestOptions = {},
): Record<string, unknown> {
  const layout = options.layout ?? "vertex";
  const encoding = options.encoding ?? "numbers";
  const { nx, ny } = grid;
  const { x, y } = gridPoints(layout, nx, ny);
  const sample = (fn: (x: number, y: number) => number) => x.map((xi, k) => fn(xi, y[k]));
  const C = COEFFICIENTS;
  const f = (px: number, py: number) =>
    C.a(px, py) * exact.uxx(px, py) + C.b(px, py) * exact.ux(px, py) +
    C.c(px, py) * exact.uyy(px, py) + C.d(px, py) * exact.uy(px, py) +
    C.e(px, py) * exact.u(px, py);
  const { x0, x1, y0, y1 } = DOMAIN;
  const hx = (x1 - x0) / nx, hy = (y1 - y0) / ny;
  const shift = layout === "cell" ? 0.5 : 0;
  const alongX = Array.from(
    { length: layout === "cell" ? nx : nx + 1 },
    (_, i) => x0 + (i + shift) * hx,
  );
  const alongY = Array.from(
    { length: layout === "cell" ? ny : ny + 1 },
    (_, j) => y0 + (j + shift) * hy,
  );
  const sidePoints = {
    west: { pts: alongY.map((py) => [x0, py]), normal: [-1, 0] },
    east: { pts: alongY.map((py) => [x1, py]), normal: [1, 0] },
    south: { pts: alongX.map((px) => [px, y0]), normal: [0, -1] },
    north: { pts: alongX.map((px) => [px, y1]), normal: [0, 1] },
  };
  const boundary: Record<string, unknown> = {};
  for (const side of ["west", "east", "south", "north"] as const) {
    const spec = sides[side];
    const { pts, normal } = sidePoints[side];
    const g = pts.map(([px, py]) => {
      const u = exact.u(px, py);
      const dn = normal[0] * exact.ux(px, py) + normal[1] * exact.uy(px, py);
      if (spec.kind === "dirichlet") return u;
      if (spec.kind === "neumann") return dn;
      return spec.alpha * u + spec.beta * dn;
    });
    boundary[side] = { ...spec, values: encode(g, encoding) };
  }
  return {
    protocol: "gridproof-protocol/1",
    type: "solve",
    id: options.id ?? "test",
    case: { id: "examples-test", title: "hand-written exact solution" },
    domain: DOMAIN,
    grid: { nx, ny, layout, order: "x-fastest", points: x.length },
    encoding,
    coefficients: {
      a: encode(sample(C.a), encoding),
      b: encode(sample(C.b), encoding),
      c: encode(sample(C.c), encoding),
      d: encode(sample(C.d), encoding),
      e: encode(sample(C.e), encoding),
    },
    source: encode(sample(f), encoding),
    boundary,
    expressions: {
      a: "1 + 0.5 * sin(x + y)",
      b: "0.3 * cos(x)",
      c: "2 + x * y",
      d: "-0.4 + y",
      e: "-1 - x^2",
      source: "(not given in this test)",
      boundary: { west: "", east: "", south: "", north: "" },
    },
    scheme: options.scheme ?? "central",
    tolerance: 1e-12,
    timeLimitSeconds: 60,
  };
}

/** Exact values at the layout's points. */
export function exactValues(
  exact: Exact,
  layout: "vertex" | "cell",
  nx: number,
  ny: number,
): number[] {
  const { x, y } = gridPoints(layout, nx, ny);
  return x.map((xi, k) => exact.u(xi, y[k]));
}

/** Decodes a reply array (numbers or base64 little-endian float64). */
export function decodeValues(value: unknown): number[] {
  if (Array.isArray(value)) return value as number[];
  const b64 = (value as { base64?: string })?.base64;
  assert.equal(
    typeof b64,
    "string",
    `values must be numbers or {base64}, got ${JSON.stringify(value)}`,
  );
  const bin = atob(b64 as string);
  const bytes = Uint8Array.from(bin, (ch) => ch.charCodeAt(0));
  return Array.from(new Float64Array(bytes.buffer));
}

/** The outcome of one run of an example. */
export interface RunOutcome {
  code: number;
  stdout: string;
  stderr: string;
  /** The stdout lines parsed as JSON (a once-mode reply is one line). */
  replies: Record<string, unknown>[];
}

/** Runs `command` (argv, no shell) in `cwd` with `input` on stdin. */
export async function runExample(
  command: string[],
  cwd: string | URL,
  input: string,
): Promise<RunOutcome> {
  const { code, stdout, stderr } = await runWithInput(command, input, { cwd });
  const replies = stdout.split("\n").filter((l) => l.trim() !== "").map((l) => JSON.parse(l));
  return { code, stdout, stderr, replies };
}

/** Largest |a_k − b_k| over max(1, max |b_k|). */
export function maxRelativeDifference(a: number[], b: number[]): number {
  assert.equal(a.length, b.length, `lengths differ: ${a.length} vs ${b.length}`);
  let diff = 0, scale = 1;
  for (let k = 0; k < a.length; k++) {
    diff = Math.max(diff, Math.abs(a[k] - b[k]));
    scale = Math.max(scale, Math.abs(b[k]));
  }
  return diff / scale;
}

/** Largest |a_k − b_k|. */
export function maxDifference(a: number[], b: number[]): number {
  assert.equal(a.length, b.length, `lengths differ: ${a.length} vs ${b.length}`);
  let diff = 0;
  for (let k = 0; k < a.length; k++) diff = Math.max(diff, Math.abs(a[k] - b[k]));
  return diff;
}
