import type { Place, SideName } from "../result/types.ts";

/** A place blamed only when its order is at least this much below the rest (half an order). */
export const ORDER_MARGIN = 0.5;
/** …or its error at least this many times the interior's (and its own order is low). */
export const ERROR_FACTOR = 4;
/** Places whose finest error is below this share of the largest are not judged (too small to matter). */
export const SIGNIFICANT_SHARE = 0.25;

/** One place's evidence: finest-grid max error and finest pairwise order. */
export interface PlaceEvidence {
  place: Place;
  error: number | null;
  order: number | null;
}

/** Where {@link locateDefect} puts a defect. */
export interface Location {
  /** Places blamed (empty: the defect is global). */
  blamed: Place[];
  /** The place with the largest error on the finest grid. */
  largest: Place | null;
  /** One sentence for the verdict's reason. */
  text: string;
}

const f2 = (x: number | null) => (x === null ? "n/a" : x.toFixed(2));
const e2 = (x: number | null) => (x === null ? "n/a" : x.toExponential(1));

/** "the Neumann side east" / "the Dirichlet side west". */
export function sideWords(side: SideName, kinds: Partial<Record<SideName, string>>): string {
  const kind = kinds[side] ?? "";
  const name = kind.startsWith("robin")
    ? "Robin"
    : kind === "neumann"
    ? "Neumann"
    : kind === "dirichlet"
    ? "Dirichlet"
    : kind;
  return `the ${name} side ${side}`.replace("  ", " ");
}

/**
 * Locates a defect from per-place errors and orders (max norm, finest grid): a place is blamed when
 * its error is significant (≥ {@link SIGNIFICANT_SHARE} of the largest) and either its order is at
 * least {@link ORDER_MARGIN} below the interior's (the others' best when the interior is not
 * significant), or its error is at least {@link ERROR_FACTOR} times the interior's while its own
 * order is below `expected − tolerance`. The interior is blamed when it alone holds significant
 * errors, or converges at least {@link ORDER_MARGIN} below every significant band. When no place
 * is blamed the defect is global; the text
 * then says how to tell an interior defect from a boundary closure that pollutes everything.
 *
 * @param evidence Per place (sides, corners, interior).
 * @param kinds Boundary kind per side (for the words).
 * @param expected The expected order.
 * @param tolerance The order tolerance.
 * @returns The blamed places and a sentence.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { locateDefect } from "./locate.ts";
 * const l = locateDefect([
 *   { place: "east", error: 1e-3, order: 1 }, { place: "west", error: 1e-5, order: 2 },
 *   { place: "interior", error: 2e-4, order: 1.9 },
 * ], { east: "neumann", west: "dirichlet" }, 2, 0.1);
 * assert.deepEqual(l.blamed, ["east"]);
 * ```
 */
export function locateDefect(
  evidence: readonly PlaceEvidence[],
  kinds: Partial<Record<SideName, string>>,
  expected: number,
  tolerance: number,
): Location {
  const known = evidence.filter((p) => p.error !== null && p.error > 0);
  if (known.length === 0) return { blamed: [], largest: null, text: "" };
  const top = known.reduce((a, p) => (p.error! > a.error! ? p : a));
  const significant = known.filter((p) => p.error! >= SIGNIFICANT_SHARE * top.error!);
  const interior = known.find((p) => p.place === "interior");
  const blamed: PlaceEvidence[] = [];
  for (const p of significant) {
    if (p.place === "interior") continue;
    const others = significant.filter((q) => q !== p && q.order !== null);
    const ref = interior && significant.includes(interior) && interior.order !== null
      ? interior.order
      : others.length > 0
      ? Math.max(...others.map((q) => q.order!))
      : null;
    const lowOrder = p.order !== null && ref !== null && p.order <= ref - ORDER_MARGIN;
    const bigError = interior !== undefined && p.error! >= ERROR_FACTOR * interior.error! &&
      p.order !== null && p.order < expected - tolerance;
    if (lowOrder || bigError) blamed.push(p);
  }
  // The interior alone lower than every significant band, or holding the error while every band
  // stays below a significant share of it: an interior defect.
  if (
    blamed.length === 0 && interior && significant.includes(interior) && interior.order !== null
  ) {
    const bands = significant.filter((p) => p !== interior && p.order !== null);
    if (bands.length === 0) {
      return {
        blamed: ["interior"],
        largest: top.place,
        text: `the error lives in the interior (${e2(interior.error)} at order ` +
          `${f2(interior.order)}) while every side band and corner stays below ` +
          `${SIGNIFICANT_SHARE * 100} % of it: the interior discretization (stencil, a ` +
          `coefficient or the source) is the likely place`,
      };
    }
    if (bands.every((b) => interior.order! <= b.order! - ORDER_MARGIN)) {
      return {
        blamed: ["interior"],
        largest: top.place,
        text: `the interior converges at ${f2(interior.order)} while the side bands show ` +
          `${bands.map((b) => `${b.place} ${f2(b.order)}`).join(", ")}: the interior ` +
          `discretization (stencil, a coefficient or the source) is the likely place`,
      };
    }
  }
  const name = (p: Place) =>
    p === "corners" ? "the corner blocks" : p === "interior" ? "the interior" : sideWords(p, kinds);
  const table = known.map((p) => `${p.place} ${e2(p.error)} (order ${f2(p.order)})`).join(", ");
  if (blamed.length > 0) {
    const what = blamed.map((p) => name(p.place)).join(" and ");
    const inner = interior
      ? `, against ${e2(interior.error)} at order ${f2(interior.order)} inside`
      : "";
    const words = blamed.map((p) => `${e2(p.error)} at order ${f2(p.order)}`).join(", ");
    return {
      blamed: blamed.map((p) => p.place),
      largest: top.place,
      text: `the defect sits at ${what}: ${words} there${inner} ` +
        `(max error by place on the finest grid: ${table})`,
    };
  }
  const derivative = (Object.keys(kinds) as SideName[]).filter((s) => kinds[s] !== "dirichlet");
  const hint = derivative.length > 0
    ? `to tell which, make ${
      derivative.map((s) => sideWords(s, kinds)).join(", ")
    } Dirichlet in a variant of the case: if the order returns, that closure is at fault`
    : "every side is Dirichlet, so a closure of a derivative side is ruled out: look at the " +
      "interior stencil, the coefficients, the source and the Dirichlet treatment (ghost values " +
      "of a cell-centred scheme)";
  const near = top.place !== "interior" && top.place !== "corners"
    ? `; the largest errors sit next to ${sideWords(top.place, kinds)}`
    : "";
  return {
    blamed: [],
    largest: top.place,
    text: `every place holding a significant share of the error converges at about the same low ` +
      `order (${table}): the defect is global — ` +
      `the interior stencil, a coefficient or the source, or a boundary closure whose error ` +
      `pollutes the whole domain${near}; ${hint}`,
  };
}
