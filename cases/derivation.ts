/**
 * A case's derivation as plain data: every expression the compiler needs (per region: the
 * coefficients, the conservative terms, the source term, the exact solution, its gradient, the
 * fluxes and the boundary data), after mathjs has parsed and differentiated them and the parameters
 * have been substituted, plus the readable formulas. It is what the derivation cache stores and
 * what the campaign hands its workers, so that neither needs mathjs to compile a case again.
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { Side } from "../reference-solver/mod.ts";
import type { MathTools } from "./_mathjs.ts";
import { isZeroTree } from "./derive.ts";
import type { CaseTrees } from "./case_trees.ts";
import { COMPILABLE_FUNCTIONS } from "./compile.ts";
import { type Expr, toExpr } from "./expression.ts";
import {
  CONSERVATIVE_TERMS,
  type DerivedRegion,
  GENERAL_TERMS,
  type OperatorForm,
} from "./operator.ts";
import type { CaseFormulas, CompiledCase } from "./types.ts";
import type { Axis } from "../grid/mod.ts";
import type { MappingData } from "./spacing.ts";

const SIDES: readonly Side[] = ["west", "east", "south", "north"];

/** One region's derived expressions. */
export interface RegionDerivation {
  /** The non-conservative coefficients in the order of `GENERAL_TERMS` (a, b, c, d, e, m). */
  coefficients: Expr[];
  /** The conservative terms in the order of `CONSERVATIVE_TERMS`; empty for the other form. */
  conservative: Expr[];
  source: Expr;
  exact: Expr;
  ux: Expr;
  uy: Expr;
  fluxX: Expr;
  fluxY: Expr;
  boundary: Record<Side, Expr>;
}

/** A case's derivation: everything the compiler needs, without mathjs. */
export interface Derivation {
  form: OperatorForm;
  interfaces: { x: number[]; y: number[] };
  regions: RegionDerivation[];
  /** Whether the operator has no convection (b ≡ d ≡ 0, checked symbolically). */
  noConvection: boolean;
  /** The Robin weights α and β of each Robin side (the same in every region). */
  robin: Partial<Record<Side, { alpha: Expr; beta: Expr }>>;
  /** The stretched grid family per axis (absent: uniform), as plain data. */
  mappings?: Partial<Record<Axis, MappingData>>;
  /** true when u is fixed only up to a constant (the case's `singular`); absent: false. */
  singular?: boolean;
}

/** The readable formulas of a case: mathjs text and TeX after simplification. */
export interface ReadableFormulas {
  text: CaseFormulas;
  tex: CaseFormulas;
}

/**
 * Converts the mathjs trees of a derivation into a {@link Derivation}.
 *
 * @param math the engine's mathjs tools (for the symbolic zero tests)
 * @param trees the parsed case
 * @param derived each region's derived trees
 * @param parameters the merged parameter values, substituted into every expression
 */
export function toDerivation(
  math: MathTools,
  trees: CaseTrees,
  derived: DerivedRegion[],
  parameters: Record<string, number>,
): Derivation {
  const expr = (node: MathNode): Expr => toExpr(node, parameters);
  const conservative = trees.form === "conservative";
  const regions = derived.map((d, r): RegionDerivation => ({
    coefficients: GENERAL_TERMS.map((k) => expr(d.expanded[k])),
    conservative: conservative
      ? CONSERVATIVE_TERMS.map((k) => expr((trees.regions[r].op as Record<string, MathNode>)[k]))
      : [],
    source: expr(d.source),
    exact: expr(trees.regions[r].exact),
    ux: expr(d.ux),
    uy: expr(d.uy),
    fluxX: expr(d.flux.x),
    fluxY: expr(d.flux.y),
    boundary: Object.fromEntries(SIDES.map((s) => [s, expr(d.boundary[s])])) as Record<Side, Expr>,
  }));
  const noConvection = conservative
    ? trees.regions.every((r) =>
      r.op.form === "conservative" && isZeroTree(math, r.op.bx) && isZeroTree(math, r.op.by)
    )
    : isZeroTree(math, derived[0].expanded.b) && isZeroTree(math, derived[0].expanded.d);
  return {
    form: trees.form,
    interfaces: { x: [...trees.interfaces.x], y: [...trees.interfaces.y] },
    regions,
    noConvection,
    robin: Object.fromEntries(
      SIDES.flatMap((s) => {
        const spec = trees.sides[s];
        return spec.kind === "robin"
          ? [[s, { alpha: expr(spec.alpha!), beta: expr(spec.beta!) }]]
          : [];
      }),
    ),
  };
}

const OPERATORS = new Set(["+", "-", "*", "/", "^", "neg"]);
const CALLS = new Set(COMPILABLE_FUNCTIONS);

/** True when a value read from outside is an {@link Expr} the compiler accepts. */
export function isExpr(value: unknown, depth = 0): value is Expr {
  if (depth > 10_000 || typeof value !== "object" || value === null) return false;
  const v = value as Record<string, unknown>;
  switch (v.kind) {
    case "number":
      return typeof v.value === "number";
    case "variable":
      return v.name === "x" || v.name === "y";
    case "operator":
      return typeof v.op === "string" && OPERATORS.has(v.op) && Array.isArray(v.args) &&
        v.args.length >= 1 && v.args.every((a) => isExpr(a, depth + 1));
    case "call":
      return typeof v.name === "string" && CALLS.has(v.name) && Array.isArray(v.args) &&
        v.args.every((a) => isExpr(a, depth + 1));
  }
  return false;
}

/** True when a value read from outside has the shape of a {@link Derivation}. */
export function isDerivation(value: unknown): value is Derivation {
  if (typeof value !== "object" || value === null) return false;
  const v = value as Record<string, unknown>;
  const numbers = (a: unknown) =>
    Array.isArray(a) && a.every((n) => typeof n === "number" && Number.isFinite(n));
  const interfaces = v.interfaces as Record<string, unknown> | undefined;
  if (
    (v.form !== "conservative" && v.form !== "non-conservative") ||
    typeof v.noConvection !== "boolean" || !interfaces || !numbers(interfaces.x) ||
    !numbers(interfaces.y) || !Array.isArray(v.regions) || v.regions.length === 0 ||
    typeof v.robin !== "object" || v.robin === null ||
    !Object.entries(v.robin).every(([s, w]) =>
      SIDES.includes(s as Side) && typeof w === "object" && w !== null &&
      isExpr((w as Record<string, unknown>).alpha) && isExpr((w as Record<string, unknown>).beta)
    ) ||
    (v.mappings !== undefined && !isMappingData(v.mappings)) ||
    (v.singular !== undefined && typeof v.singular !== "boolean")
  ) return false;
  return v.regions.every((r: Record<string, unknown>) =>
    typeof r === "object" && r !== null &&
    Array.isArray(r.coefficients) && r.coefficients.length === GENERAL_TERMS.length &&
    r.coefficients.every((e) => isExpr(e)) &&
    Array.isArray(r.conservative) &&
    r.conservative.length === (v.form === "conservative" ? CONSERVATIVE_TERMS.length : 0) &&
    r.conservative.every((e) => isExpr(e)) &&
    ["source", "exact", "ux", "uy", "fluxX", "fluxY"].every((k) => isExpr(r[k])) &&
    typeof r.boundary === "object" && r.boundary !== null &&
    SIDES.every((s) => isExpr((r.boundary as Record<string, unknown>)[s]))
  );
}

/** Whether a value is a derivation's per-axis mapping data (see `spacing.ts`). */
function isMappingData(value: unknown): boolean {
  if (typeof value !== "object" || value === null) return false;
  const finite = (n: unknown) => typeof n === "number" && Number.isFinite(n);
  return Object.entries(value).every(([axis, m]) => {
    if ((axis !== "x" && axis !== "y") || typeof m !== "object" || m === null) return false;
    const d = m as Record<string, unknown>;
    switch (d.kind) {
      case "uniform":
        return true;
      case "tanh":
        return finite(d.strength) && ["start", "end", "both"].includes(d.toward as string);
      case "geometric":
        return finite(d.ratio) && finite(d.cells);
      case "expression":
        return isExpr(d.coordinate) && finite(d.start) && finite(d.length);
    }
    return false;
  });
}

const DERIVATIONS = new WeakMap<CompiledCase, Derivation>();

/** Records the derivation a compiled case was built from (the engine calls this). */
export function rememberDerivation(kase: CompiledCase, derivation: Derivation): void {
  DERIVATIONS.set(kase, derivation);
}

/**
 * The derivation a compiled case was built from, or undefined for a case made in code. The campaign
 * sends it to its workers, which compile it without mathjs.
 */
export function derivationOf(kase: CompiledCase): Derivation | undefined {
  return DERIVATIONS.get(kase);
}
