/**
 * The case file as written on disk (after schema validation), and one problem found in it.
 *
 * @module
 */
import type { BoundaryKind, Side } from "../reference-solver/mod.ts";
import type { ExpectedOrder } from "./types.ts";
import type { AxisSpacingText } from "./spacing.ts";

/** A coefficient or solution: mathjs expression text or a plain number. */
export type ExpressionText = string | number;

/** One side's condition as written in a case file. */
export interface SideSpec {
  kind: BoundaryKind;
  /** Robin weight of u: a number, or an expression in x, y and the parameters (varies along the side). */
  alpha?: ExpressionText;
  /** Robin weight of ∂u/∂n (the conormal flux in the conservative form); like alpha. */
  beta?: ExpressionText;
}

/** The conservative form's conductivity: one expression (K = k·I) or a symmetric tensor. */
export type ConductivityText = ExpressionText | {
  k11: ExpressionText;
  k12?: ExpressionText;
  k22: ExpressionText;
};

/** What one region of a case with interfaces gives for itself (the rest comes from the top level). */
export interface RegionSpec {
  conductivity?: ConductivityText;
  advection?: { x?: ExpressionText; y?: ExpressionText };
  reaction?: ExpressionText;
  exact?: ExpressionText;
}

/**
 * A quantity of interest of the case author's choosing (see `docs/cases.md`): the flux through a
 * side or a segment of it, the integral of u over a rectangle inside the domain, or u at a point.
 * `label` says in words what it is (default: made from the other fields).
 */
export type QuantitySpec =
  | {
    name: string;
    kind: "flux";
    /** The side the flux leaves the domain through (outward normal). */
    side: Side;
    /** [from, to] along the side (y on west and east, x on south and north); default: all of it. */
    segment?: [number, number];
    label?: string;
  }
  | {
    name: string;
    kind: "integral";
    /** [from, to] in x; default: the domain's. */
    x?: [number, number];
    /** [from, to] in y; default: the domain's. */
    y?: [number, number];
    label?: string;
  }
  | { name: string; kind: "point"; x: number; y: number; label?: string };

/** A case file's content, field for field (see `cases/case.schema.json` for the meaning of each). */
export interface CaseFile {
  $schema?: string;
  id: string;
  title: string;
  motivation: string;
  manufactured: string;
  domain: { x0: number; x1: number; y0: number; y1: number };
  /** ny/nx, the ratio of interval counts (old name `aspect`). Default 1. */
  intervalRatio?: number;
  /** The stretched grid family: per axis, its map (absent axes are uniform). */
  spacing?: { x?: AxisSpacingText; y?: AxisSpacingText };
  /** The operator's form. Default: "non-conservative". */
  form?: "non-conservative" | "conservative";
  /** The non-conservative form's coefficients (m, of u_xy, defaults to 0). */
  coefficients?: {
    a: ExpressionText;
    b: ExpressionText;
    c: ExpressionText;
    d: ExpressionText;
    e: ExpressionText;
    m?: ExpressionText;
  };
  /** The conservative form: K in ∇·(K∇u). */
  conductivity?: ConductivityText;
  /** The conservative form: β in β·∇u (each component defaults to 0). */
  advection?: { x?: ExpressionText; y?: ExpressionText };
  /** The conservative form: σ in σ·u. Default: 0. */
  reaction?: ExpressionText;
  /** The exact solution; may be left out when every region gives its own. */
  exact?: ExpressionText;
  /** Material interfaces (conservative form only): lines x = const and y = const. */
  interfaces?: { x?: number[]; y?: number[] };
  /** Per region (west to east, then south to north), what differs from the top level. */
  regions?: RegionSpec[];
  boundary: Record<Side, SideSpec>;
  parameters?: Record<string, number>;
  expected: { central: ExpectedOrder; upwind?: ExpectedOrder };
  tags: string[];
  grids: number[];
  /** Quantities of interest studied besides the built-in ones. */
  quantities?: QuantitySpec[];
  solver?: { smoother?: string; cycle?: string; maxCycles?: number };
}

/** One problem in a case file: which file, which field, where, what. */
export interface CaseProblem {
  file: string;
  /** Dotted field path, e.g. `coefficients.a`; empty for the whole document. */
  field: string;
  line?: number;
  column?: number;
  message: string;
}

/**
 * Formats a problem as `file:line:column: field: message`.
 *
 * @example
 * ```ts
 * import { formatProblem } from "./case_file.ts";
 * formatProblem({ file: "my.json", field: "exact", line: 3, column: 12, message: "expression is empty" });
 * // "my.json:3:12: exact: expression is empty"
 * ```
 */
export function formatProblem(p: CaseProblem): string {
  const place = p.line === undefined ? p.file : `${p.file}:${p.line}:${p.column ?? 1}`;
  return `${place}: ${p.field ? p.field + ": " : ""}${p.message}`;
}
