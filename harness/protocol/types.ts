/**
 * Message types of `gridproof-protocol/1` (see docs/protocol.md). Arrays appear in two shapes:
 * on the wire ({@link WireArray}: JSON numbers or base64 text) and decoded (`Float64Array`).
 *
 * @module
 */

/** The version string every message carries and every reply must echo. */
export const PROTOCOL_VERSION = "gridproof-protocol/1";

/** How arrays are written: plain JSON numbers or base64 of little-endian float64. */
export type ArrayEncoding = "numbers" | "base64";

/** All array encodings, in documentation order. */
export const ENCODINGS: readonly ArrayEncoding[] = ["numbers", "base64"] as const;

/**
 * An array as it appears in a message: JSON numbers, base64 of little-endian float64, or (opt-in,
 * requests only) one repeated value.
 */
export type WireArray = number[] | { base64: string } | { constant: number; length: number };

/** Grid layouts a request can be sampled on. */
export type GridLayout = "vertex" | "cell";

/** The four sides of the rectangle (west x = x0, east x = x1, south y = y0, north y = y1). */
export type SideName = "west" | "east" | "south" | "north";

/** All sides in protocol order. */
export const SIDE_NAMES: readonly SideName[] = ["west", "east", "south", "north"] as const;

/** Boundary condition kinds. */
export type BoundaryKindName = "dirichlet" | "neumann" | "robin";

/** Discretizations the harness checks. */
export type SchemeHint = "central" | "upwind";

/** The rectangle. */
export interface Rectangle {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** One side's boundary data, sampled at the side's points of the layout. */
export interface SampledSide {
  kind: BoundaryKindName;
  /** Robin α (robin only). */
  alpha?: number;
  /** Robin β (robin only). */
  beta?: number;
  values: Float64Array;
}

/**
 * A problem sampled at the points of one layout: everything a solve request carries apart from
 * the case's identity, expressions and hints. Arrays are x-fastest.
 */
export interface SampledProblem {
  domain: Rectangle;
  nx: number;
  ny: number;
  layout: GridLayout;
  coefficients: {
    a: Float64Array;
    b: Float64Array;
    c: Float64Array;
    d: Float64Array;
    e: Float64Array;
  };
  source: Float64Array;
  boundary: Record<SideName, SampledSide>;
  /**
   * Coefficients known to hold one value at every point (from the case's expressions), with
   * that value: a request in the constant form sends them without looking at their arrays.
   * Optional; arrays not named here are looked at.
   */
  constantCoefficients?: Partial<Record<"a" | "b" | "c" | "d" | "e", number>>;
}

/** The expressions of a case as text (mathjs syntax), for solvers that evaluate them. */
export interface ExpressionTexts {
  a: string;
  b: string;
  c: string;
  d: string;
  e: string;
  source: string;
  boundary: Record<SideName, string>;
}

/** A solve request as sent (arrays on the wire). */
export interface SolveRequestMessage {
  protocol: typeof PROTOCOL_VERSION;
  type: "solve";
  id: string;
  case: { id: string; title?: string };
  domain: Rectangle;
  grid: { nx: number; ny: number; layout: GridLayout; order: "x-fastest"; points: number };
  encoding: ArrayEncoding;
  coefficients: { a: WireArray; b: WireArray; c: WireArray; d: WireArray; e: WireArray };
  source: WireArray;
  boundary: Record<
    SideName,
    { kind: BoundaryKindName; alpha?: number; beta?: number; values: WireArray }
  >;
  expressions: ExpressionTexts;
  scheme: SchemeHint;
  tolerance: number;
  timeLimitSeconds: number;
}

/** The solver's name and version as it reports them. */
export interface SolverIdentity {
  name?: string;
  version?: string;
}

/** What a session solver says it supports in its `ready` message (absent list: everything). */
export interface Capabilities {
  boundaryKinds?: BoundaryKindName[];
  schemes?: SchemeHint[];
  layouts?: ("vertex" | "cell" | "points")[];
  encodings?: ArrayEncoding[];
  largestGrid?: { nx: number; ny: number };
  /**
   * true: the solver reads `{ constant, length }` arrays in requests, so constant coefficients
   * are sent as one number (as the solver file's `constantArrays` asks for).
   */
  constantArrays?: boolean;
}

/** The `hello` message opening a session. */
export interface HelloMessage {
  protocol: typeof PROTOCOL_VERSION;
  type: "hello";
}

/** The `goodbye` message closing a session. */
export interface GoodbyeMessage {
  protocol: typeof PROTOCOL_VERSION;
  type: "goodbye";
}

/** The solver's answer to `hello`. */
export interface ReadyMessage {
  protocol: typeof PROTOCOL_VERSION;
  type: "ready";
  solver?: SolverIdentity;
  supports?: Capabilities;
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

/** A decoded `solution` reply. */
export interface DecodedSolution extends SolutionExtras {
  type: "solution";
  id: string;
  values: Float64Array;
}

/** A decoded `not-applicable` or `error` reply. */
export interface DecodedRefusal {
  type: "not-applicable" | "error";
  id?: string;
  reason: string;
}

/** Any decoded reply to a solve request. */
export type DecodedReply = DecodedSolution | DecodedRefusal;
