/**
 * The operator check a case passes when it is built, independent of the study grids: on the whole
 * closed domain (a check lattice plus local refinement between its points, see `domain_check.ts`)
 * a and c keep one strict sign, so that a·c > 0 and the operator is elliptic, and the coefficients,
 * the exact solution, the derived source term and the derived boundary data are finite. Each fault
 * becomes a message naming the field, the point, the value and the fix.
 *
 * @module
 */
import type { Domain, Side } from "../reference-solver/mod.ts";
import {
  CHECK_INTERVALS,
  checkDomain,
  type CheckedFunction,
  type DomainCheckOptions,
  type DomainFault,
  type LatticeFill,
  ROUND_OFF_ZERO,
} from "./domain_check.ts";
import type { CaseBoundary, PointFn } from "./types.ts";

/** What the check needs from a compiled case. */
export interface OperatorParts {
  /** The rectangle checked: the domain, or one region of a case with interfaces. */
  domain: Domain;
  /** The non-conservative coefficients (for the conservative form its expansion); m of u_xy. */
  coefficients: { a: PointFn; b: PointFn; c: PointFn; d: PointFn; e: PointFn; m?: PointFn };
  source: PointFn;
  exact: PointFn;
  boundary: Record<Side, CaseBoundary>;
  /**
   * Fills a, b, c, d, e, f, u (in that order) on a lattice: the compiled row samplers. Default: a
   * loop over the point functions.
   */
  fill?: LatticeFill;
  /** Parameter values in effect, named in messages. */
  parameters: Record<string, number>;
  /** The sides whose boundary data are checked (those of the rectangle on the domain's boundary). Default: all four. */
  sides?: readonly Side[];
  /** The operator's form, for the field names in messages. Default: non-conservative. */
  form?: "non-conservative" | "conservative";
  /** The region checked (0-based), named in messages; absent for a case without interfaces. */
  region?: number;
}

/** One fault of a case, for the file's problem list. */
export interface OperatorFault {
  /** JSON pointer of the field at fault, e.g. `/coefficients/a`. */
  pointer: string;
  /** Dotted field name, e.g. `coefficients.a`. */
  field: string;
  message: string;
}

const SIDES: readonly Side[] = ["west", "east", "south", "north"];
const COEFFICIENTS = ["a", "b", "c", "d", "e"] as const;

/**
 * Checks a compiled case's operator and data on its whole closed domain.
 *
 * @param parts the compiled functions and the lattice sampler
 * @param options check lattice and refinement budget (defaults of `checkDomain`)
 * @returns one fault per failing field; empty when the case passes
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { checkOperator } from "./operator_check.ts";
 * const zero = () => 0;
 * const side = { kind: "dirichlet" as const, data: zero };
 * const [fault] = checkOperator({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
 *   coefficients: { a: (x) => (x - 0.3337) ** 2 - 1e-8, b: zero, c: () => 1, d: zero, e: zero },
 *   source: zero,
 *   exact: zero,
 *   boundary: { west: side, east: side, south: side, north: side },
 *   parameters: {},
 * });
 * assert.equal(fault.field, "coefficients.a");
 * assert.match(fault.message, /^a = -1e-8 at \(x, y\) = \(0\.3337, 0\), between the points/);
 * ```
 */
export function checkOperator(
  parts: OperatorParts,
  options: Pick<DomainCheckOptions, "intervals" | "refinements"> = {},
): OperatorFault[] {
  const { domain, coefficients } = parts;
  const cx = (domain.x0 + domain.x1) / 2;
  const cy = (domain.y0 + domain.y1) / 2;
  // for continuous a and c, a·c > 0 on the (connected) domain means that each keeps one strict
  // sign, the same one; it is taken from the centre (negative only when both are negative there)
  const sign: 1 | -1 = coefficients.a(cx, cy) < 0 && coefficients.c(cx, cy) < 0 ? -1 : 1;
  const functions: CheckedFunction[] = [
    ...COEFFICIENTS.map((k): CheckedFunction => ({
      name: k,
      at: coefficients[k],
      sign: k === "a" || k === "c" ? sign : 0,
    })),
    { name: "f", at: parts.source, sign: 0 },
    { name: "u", at: parts.exact, sign: 0 },
  ];
  const m = coefficients.m;
  if (m) {
    // with the mixed term, ellipticity asks 4ac − m² > 0 as well (a and c of one sign)
    functions.push({ name: "m", at: m, sign: 0 });
    functions.push({
      name: "discriminant",
      at: (x, y) => 4 * coefficients.a(x, y) * coefficients.c(x, y) - m(x, y) ** 2,
      sign: 1,
    });
  }
  const n = options.intervals ?? CHECK_INTERVALS;
  // the fused lattice sampler fills a, b, c, d, e, f, u only
  const faults = checkDomain(domain, functions, m ? options : { ...options, fill: parts.fill });
  const infinite = (f: DomainFault) => f.kind === "non-finite" || f.kind === "unbounded";
  // f and the boundary data are derived: a non-finite input makes them non-finite too, so only
  // the input is named
  const inputInfinite = faults.some((f) => f.name !== "f" && infinite(f));
  const words = new Words(
    n,
    sign,
    parts.parameters,
    parts.form ?? "non-conservative",
    parts.region,
  );
  const out: OperatorFault[] = [];
  // a or c of the wrong sign breaks 4ac − m² > 0 as well: only the root cause is named
  const signFault = faults.some((f) => (f.name === "a" || f.name === "c") && !infinite(f));
  for (const f of faults) {
    if (f.name === "f" && inputInfinite) continue;
    if (f.name === "discriminant" && (signFault || inputInfinite)) continue;
    out.push(words.fault(f));
  }
  if (faults.some((f) => f.name === "u" && infinite(f))) return out;
  for (const side of parts.sides ?? SIDES) {
    const region = {
      x0: side === "east" ? domain.x1 : domain.x0,
      x1: side === "west" ? domain.x0 : domain.x1,
      y0: side === "north" ? domain.y1 : domain.y0,
      y1: side === "south" ? domain.y0 : domain.y1,
    };
    const b = parts.boundary[side];
    const sideFaults = checkDomain(region, [{ name: side, at: b.data, sign: 0 }], options);
    for (const f of sideFaults) out.push(words.side(f, side, b));
  }
  return out;
}

/** A number with `digits` significant digits, in exponent form from 1e6 up. */
function show(v: number, digits: number): string {
  if (!Number.isFinite(v)) return String(v);
  const rounded = Number(v.toPrecision(digits));
  return Math.abs(rounded) >= 1e6 ? rounded.toExponential() : String(rounded);
}

/** The wording of faults. */
class Words {
  readonly #grid: string;
  readonly #sign: 1 | -1;
  readonly #parameters: string;

  readonly #conservative: boolean;

  constructor(
    n: number,
    sign: 1 | -1,
    parameters: Record<string, number>,
    form: "non-conservative" | "conservative",
    region?: number,
  ) {
    this.#grid = `${n + 1}×${n + 1} check grid`;
    this.#sign = sign;
    this.#conservative = form === "conservative";
    const named = Object.entries(parameters).map(([k, v]) => `${k} = ${v}`);
    this.#parameters = (region === undefined ? "" : ` in region ${region + 1}`) +
      (named.length ? ` (with the parameters ${named.join(", ")})` : "");
  }

  /** The case-file field of a coefficient name (the conservative form's own names for it). */
  #field(k: string): { pointer: string; field: string; shown: string } {
    if (!this.#conservative) {
      return { pointer: `/coefficients/${k}`, field: `coefficients.${k}`, shown: k };
    }
    const named: Record<string, [string, string]> = {
      a: ["/conductivity", "k11"],
      c: ["/conductivity", "k22"],
      m: ["/conductivity", "2·k12"],
      b: ["/advection/x", "βx + ∂x k11 + ∂y k12"],
      d: ["/advection/y", "βy + ∂x k12 + ∂y k22"],
      e: ["/reaction", "σ"],
    };
    const [pointer, shown] = named[k];
    return { pointer, field: pointer.slice(1).replace("/", "."), shown };
  }

  /** The point of a fault: its coordinates and how it was found. */
  #where(f: DomainFault, along?: Side): string {
    const at = `(x, y) = (${show(f.x, 7)}, ${show(f.y, 7)})`;
    if (along) {
      return f.found === "lattice"
        ? `${at} on the ${along} side`
        : `${at} on the ${along} side, between its check points (found by local refinement)`;
    }
    return f.found === "lattice"
      ? `${at}, a point of the ${this.#grid}`
      : `${at}, between the points of the ${this.#grid} (found by local refinement)`;
  }

  /** What is wrong, for a function named `name` in messages. */
  #what(f: DomainFault, name: string, along?: Side): string {
    const where = this.#where(f, along);
    if (f.kind === "unbounded") {
      return `${name} grows without bound near ${where}: |${name}| reaches ` +
        `${show(Math.abs(f.value), 3)} there and keeps growing closer in (a singularity)`;
    }
    if (f.kind === "vanishes") {
      return `${name} = ${show(f.value, 3)} at ${where}: below ${ROUND_OFF_ZERO} of its ` +
        `largest value ${show(f.scale, 3)}, it vanishes there to round-off`;
    }
    return `${name} = ${show(f.value, 3)} at ${where}`;
  }

  fault(f: DomainFault): OperatorFault {
    const p = this.#parameters;
    if (f.name === "u") {
      return {
        pointer: "/exact",
        field: "exact",
        message: `${this.#what(f, "u")}${p}; make the exact solution finite on the whole closed ` +
          "domain, including between grid nodes",
      };
    }
    if (f.name === "f") {
      return {
        pointer: "/exact",
        field: "exact",
        message:
          `the derived source term f = a·u_xx + b·u_x + c·u_yy + d·u_y + e·u: ${
            this.#what(f, "f")
          }${p}; the exact solution needs finite second derivatives on the whole closed domain, ` +
          "including between grid nodes: change it (or the coefficient that makes f infinite)",
      };
    }
    if (f.name === "discriminant") {
      const { pointer, field } = this.#field("m");
      const what = this.#conservative ? "k11·k22 − k12²" : "4ac − m²";
      const value = this.#conservative ? f.value / 4 : f.value;
      return {
        pointer,
        field,
        message: `${this.#what({ ...f, value }, what)}${p}; the operator must be elliptic ` +
          `(${what} > 0) on the whole closed domain: ${
            this.#conservative
              ? "make K positive definite (|k12| below √(k11·k22))"
              : "make |m| smaller than 2·√(a·c)"
          } everywhere, including between grid nodes`,
      };
    }
    const named = this.#field(f.name);
    const k = named.shown;
    const base = { pointer: named.pointer, field: named.field };
    if (f.kind === "sign" || f.kind === "vanishes") {
      const other = f.name === "a" ? this.#field("c").shown : this.#field("a").shown;
      const rule = this.#sign === 1
        ? `make ${k} positive on the whole domain, including between grid nodes`
        : `${k} and ${other} are negative at the centre of the domain, so make ${k} negative on ` +
          "the whole domain, including between grid nodes";
      return {
        ...base,
        message: `${this.#what(f, k)}${p}; the operator must be elliptic (a·c > 0) on the ` +
          `whole closed domain: ${rule}`,
      };
    }
    return {
      ...base,
      message: `${this.#what(f, k)}${p}; make ${k} finite on the whole closed domain, ` +
        "including between grid nodes",
    };
  }

  side(f: DomainFault, side: Side, b: CaseBoundary): OperatorFault {
    const data = b.kind === "dirichlet" ? "u" : b.kind === "neumann" ? "∂u/∂n" : "α·u + β·∂u/∂n";
    const fix = b.kind === "dirichlet"
      ? "make the exact solution finite on the side"
      : "make the exact solution's first derivatives finite on the side, or make the side " +
        "dirichlet";
    return {
      pointer: `/boundary/${side}`,
      field: `boundary.${side}`,
      message: `the derived boundary data g = ${data}: ${
        this.#what(f, "g", side)
      }${this.#parameters}; ${fix}`,
    };
  }
}
