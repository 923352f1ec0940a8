/**
 * Message types of `gridproof-protocol/1` and `gridproof-protocol/2` (see docs/protocol.md).
 * Version 2 adds the operator form (conservative or not), the mixed term u_xy, K at the faces and
 * the material interfaces. Arrays appear in two shapes: on the wire ({@link WireArray}: JSON
 * numbers or base64 text) and decoded (`Float64Array`).
 *
 * @module
 */

/** Version 1: the non-conservative operator without the mixed term; the default of a solver file. */
export const PROTOCOL_VERSION = "gridproof-protocol/1";

/** Version 2: the operator form, the mixed term, K at faces and material interfaces. */
export const PROTOCOL_VERSION_2 = "gridproof-protocol/2";

/** A version string a message may carry. */
export type ProtocolVersion = typeof PROTOCOL_VERSION | typeof PROTOCOL_VERSION_2;

/** Every version this gridproof speaks, oldest first. */
export const PROTOCOL_VERSIONS: readonly ProtocolVersion[] = [
  PROTOCOL_VERSION,
  PROTOCOL_VERSION_2,
] as const;

/** The version string of a protocol number (1 or 2), as a solver file's `protocol` names it. */
export function protocolVersion(number: 1 | 2): ProtocolVersion {
  return number === 2 ? PROTOCOL_VERSION_2 : PROTOCOL_VERSION;
}

/**
 * The operator's form: `non-conservative` a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f, or
 * `conservative` ∇·(K∇u) + βx·u_x + βy·u_y + σ·u = f.
 */
export type OperatorFormName = "non-conservative" | "conservative";

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

/**
 * Boundary condition kinds. `periodic` (version 2 only) carries no values: west pairs with east,
 * south with north, and the solver wraps its stencil across the seam.
 */
export type BoundaryKindName = "dirichlet" | "neumann" | "robin" | "periodic";

/** Discretizations the harness checks. */
export type SchemeHint = "central" | "upwind";

/** The rectangle. */
export interface Rectangle {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** The one value of a side's Robin weight, or undefined when it varies along the side. */
export function uniformWeight(w: Float64Array): number | undefined {
  const first = w[0];
  for (let k = 1; k < w.length; k++) if (w[k] !== first) return undefined;
  return first;
}

/**
 * The problem a request carries, decoded: gridproof's one sampled-problem type (`problem/`). The
 * request writer and reader map it to and from the wire (`request.ts`).
 */
export type { SampledProblem } from "../../problem/mod.ts";

/** Number of values of each face array of a layout (the conductivity's counts). */
export { faceCounts } from "../../problem/mod.ts";

/** The expressions of a case as text (mathjs syntax), for solvers that evaluate them. */
export interface ExpressionTexts {
  a: string;
  b: string;
  c: string;
  d: string;
  e: string;
  /** Coefficient of u_xy, when the case has one. */
  m?: string;
  /** The conservative form's terms (cases of that form without interfaces). */
  conservative?: { k11: string; k12: string; k22: string; bx: string; by: string; sigma: string };
  source: string;
  boundary: Record<SideName, string>;
}

/** The conservative form's arrays of a version 2 request (on the wire). */
export interface WireConservative {
  k11: WireArray;
  k12: WireArray;
  k22: WireArray;
  bx: WireArray;
  by: WireArray;
  sigma: WireArray;
  faces: { x: { k11: WireArray; k12: WireArray }; y: { k12: WireArray; k22: WireArray } };
}

/** A solve request as sent (arrays on the wire). */
export interface SolveRequestMessage {
  protocol: ProtocolVersion;
  type: "solve";
  id: string;
  case: { id: string; title?: string };
  domain: Rectangle;
  grid: {
    nx: number;
    ny: number;
    layout: GridLayout;
    order: "x-fastest";
    points: number;
    /** Version 2, stretched grids: the grid lines along x (nx + 1 values). */
    x?: WireArray;
    /** Version 2, stretched grids: the grid lines along y (ny + 1 values). */
    y?: WireArray;
  };
  encoding: ArrayEncoding;
  /** Version 2: the operator's form (version 1 is always non-conservative). */
  form?: OperatorFormName;
  /** Version 2: material interfaces (empty lists when none). */
  interfaces?: { x: number[]; y: number[] };
  /**
   * The non-conservative coefficients (absent for the conservative form); `m` (u_xy) is sent in
   * version 2 only.
   */
  coefficients?: {
    a: WireArray;
    b: WireArray;
    c: WireArray;
    d: WireArray;
    e: WireArray;
    m?: WireArray;
  };
  /** Version 2, conservative form: K at points and faces, β and σ at points. */
  conservative?: WireConservative;
  source: WireArray;
  boundary: Record<
    SideName,
    {
      kind: BoundaryKindName;
      alpha?: number | WireArray;
      beta?: number | WireArray;
      /** Absent for a periodic side. */
      values?: WireArray;
    }
  >;
  /**
   * Version 2: true when the solution is fixed only up to a constant; the solver fixes it as it
   * likes and the harness removes the mean anyway (docs/protocol.md).
   */
  singular?: boolean;
  expressions: ExpressionTexts;
  scheme: SchemeHint;
  tolerance: number;
  timeLimitSeconds: number;
}

/** The solver's name and version as it reports them. */
export interface SolverIdentity {
  name?: string;
  version?: string;
  /** Any build id the solver reports (a commit, a build number, compiler flags). */
  build?: string;
}

/** What a session solver says it supports in its `ready` message (absent list: everything). */
export interface Capabilities {
  boundaryKinds?: BoundaryKindName[];
  schemes?: SchemeHint[];
  layouts?: ("vertex" | "cell" | "points")[];
  encodings?: ArrayEncoding[];
  largestGrid?: { nx: number; ny: number };
  /** Version 2: the operator forms the solver solves (absent: both). */
  forms?: OperatorFormName[];
  /**
   * true: the solver reads `{ constant, length }` arrays in requests, so constant coefficients
   * are sent as one number (as the solver file's `constantArrays` asks for).
   */
  constantArrays?: boolean;
}

/** The `hello` message opening a session. */
export interface HelloMessage {
  protocol: ProtocolVersion;
  type: "hello";
}

/** The `goodbye` message closing a session. */
export interface GoodbyeMessage {
  protocol: ProtocolVersion;
  type: "goodbye";
}

/** The solver's answer to `hello`. */
export interface ReadyMessage {
  protocol: ProtocolVersion;
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
