/**
 * Quantities of interest of the case author's choosing (a case file's `quantities`): their
 * labels, their exact values from the manufactured solution and their discrete values from a
 * solver's field. The built-in `east-flux` is one of them (the flux of the normal derivative
 * through the whole east side).
 *
 * The flux of a case of the conservative form is the conormal flux (K∇u)·n — what its Neumann
 * data prescribe — with the case's K at the side's points; of the non-conservative form, ∂u/∂n.
 * Exact values: composite 8-point Gauss–Legendre quadrature of the exact expressions (the
 * solution and its derivatives the engine derived symbolically), in pieces split at the material
 * interfaces so that every piece is smooth. Discrete rules: `quantity_rules.ts` (on a stretched
 * family's mapped lines, `quantity_rules_mapped.ts`). On a solver's own
 * points (`points` layout) no grid rule applies: the value is left out and the study says so.
 *
 * @module
 */
import type { QuantitySpec } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import type { DiscreteField } from "./quantities.ts";
import { caseGrid, gaussLegendre, isStretchedCase } from "../../cases/mod.ts";
import {
  cubicPointValue,
  lineWeights,
  rectangleIntegral,
  sideDerivatives,
  type StructuredField,
} from "./quantity_rules.ts";
import { mappedLineWeights } from "./quantity_rules_mapped.ts";

/** What a flux measures: the normal derivative ∂u/∂n, or the conormal flux (K∇u)·n. */
export type FluxMeasure = "normal" | "conormal";

/** The outward normal of each side. */
const NORMAL = {
  west: [-1, 0],
  east: [1, 0],
  south: [0, -1],
  north: [0, 1],
} as const;

/** A quantity's specs with the defaults filled in. */
type Resolved =
  | { name: string; kind: "flux"; side: keyof typeof NORMAL; from: number; to: number }
  | { name: string; kind: "integral"; xa: number; xb: number; ya: number; yb: number }
  | { name: string; kind: "point"; x: number; y: number };

function resolve(spec: QuantitySpec, domain: CompiledCase["domain"]): Resolved {
  if (spec.kind === "flux") {
    const vertical = spec.side === "west" || spec.side === "east";
    const [lo, hi] = vertical ? [domain.y0, domain.y1] : [domain.x0, domain.x1];
    const [from, to] = spec.segment ?? [lo, hi];
    return { name: spec.name, kind: "flux", side: spec.side, from, to };
  }
  if (spec.kind === "integral") {
    const [xa, xb] = spec.x ?? [domain.x0, domain.x1];
    const [ya, yb] = spec.y ?? [domain.y0, domain.y1];
    return { name: spec.name, kind: "integral", xa, xb, ya, yb };
  }
  return { name: spec.name, kind: "point", x: spec.x, y: spec.y };
}

/** The flux measured for a case: conormal for the conservative form, else the normal derivative. */
export function fluxMeasure(kase: CompiledCase): FluxMeasure {
  return kase.conservative ? "conormal" : "normal";
}

/** The quantities a case's file chooses (none for a case made in code). */
export function chosenSpecs(kase: CompiledCase): QuantitySpec[] {
  return kase.file?.quantities ?? [];
}

/** A quantity in words, for reports (the spec's own `label` when it has one). */
export function quantityLabel(spec: QuantitySpec, measure: FluxMeasure): string {
  if (spec.label) return spec.label;
  const range = (r: [number, number]) => `[${r[0]}, ${r[1]}]`;
  if (spec.kind === "flux") {
    const what = measure === "conormal"
      ? "outward conormal flux (K∇u)·n"
      : "outward normal derivative ∂u/∂n";
    const axis = spec.side === "west" || spec.side === "east" ? "y" : "x";
    const where = spec.segment ? `, ${axis} in ${range(spec.segment)}` : "";
    return `integral of the ${what} over the ${spec.side} side${where}`;
  }
  if (spec.kind === "integral") {
    const parts = [spec.x ? `x in ${range(spec.x)}` : "", spec.y ? `y in ${range(spec.y)}` : ""]
      .filter((p) => p !== "");
    return `integral of u over ${parts.length ? parts.join(", ") : "the domain"}`;
  }
  return `u at (${spec.x}, ${spec.y}), cubic interpolation`;
}

/** The pieces of [a, b] between the given breakpoints. */
function pieces(a: number, b: number, breaks: readonly number[]): [number, number][] {
  const cuts = [a, ...breaks.filter((t) => t > a && t < b), b];
  return cuts.slice(1).map((t, k) => [cuts[k], t]);
}

/** Composite Gauss–Legendre nodes and weights on [a, b], split at the breakpoints. */
function rule(a: number, b: number, breaks: readonly number[], panels: number) {
  const x: number[] = [], w: number[] = [];
  for (const [l, r] of pieces(a, b, breaks)) {
    const g = gaussLegendre(l, r, panels);
    x.push(...g.x);
    w.push(...g.w);
  }
  return { x, w };
}

/** The flux density at a point of a side: ∂u/∂n or (K∇u)·n from the exact derivatives. */
function exactFluxDensity(
  kase: CompiledCase,
  side: keyof typeof NORMAL,
  measure: FluxMeasure,
  x: number,
  y: number,
): number {
  const [nx, ny] = NORMAL[side];
  const k = kase.conservative;
  // the normal derivative needs one derivative only
  if (measure === "normal" || !k) {
    return nx !== 0 ? nx * kase.exactDx(x, y) : ny * kase.exactDy(x, y);
  }
  const ux = kase.exactDx(x, y), uy = kase.exactDy(x, y);
  const k11 = k.k11(x, y), k12 = k.k12(x, y), k22 = k.k22(x, y);
  return nx * (k11 * ux + k12 * uy) + ny * (k12 * ux + k22 * uy);
}

/**
 * The exact value of a quantity for a manufactured case.
 *
 * @param kase The case.
 * @param spec The quantity (validated: inside the domain).
 * @param measure What a flux measures (default: {@link fluxMeasure} of the case).
 */
export function exactQuantity(
  kase: CompiledCase,
  spec: QuantitySpec,
  measure: FluxMeasure = fluxMeasure(kase),
): number {
  const q = resolve(spec, kase.domain);
  const { x0, x1, y0, y1 } = kase.domain;
  if (q.kind === "point") return kase.exact(q.x, q.y);
  if (q.kind === "flux") {
    const vertical = q.side === "west" || q.side === "east";
    const g = rule(q.from, q.to, (vertical ? kase.interfaces?.y : kase.interfaces?.x) ?? [], 64);
    let sum = 0;
    for (let k = 0; k < g.x.length; k++) {
      const [x, y] = vertical
        ? [q.side === "west" ? x0 : x1, g.x[k]]
        : [g.x[k], q.side === "south" ? y0 : y1];
      sum += g.w[k] * exactFluxDensity(kase, q.side, measure, x, y);
    }
    return sum;
  }
  const gx = rule(q.xa, q.xb, kase.interfaces?.x ?? [], 32);
  const gy = rule(q.ya, q.yb, kase.interfaces?.y ?? [], 32);
  let sum = 0;
  for (let j = 0; j < gy.x.length; j++) {
    let row = 0;
    for (let i = 0; i < gx.x.length; i++) row += gx.w[i] * kase.exact(gx.x[i], gy.x[j]);
    sum += gy.w[j] * row;
  }
  return sum;
}

/**
 * The solver's field as a structured grid, or null on its own points. A stretched family's field
 * (a map other than uniform in `mappings`) carries its mapped grid lines; a uniform one none, so
 * its rules stay those of equal steps.
 */
export function structured(
  field: DiscreteField,
  domain: CompiledCase["domain"],
  mappings?: CompiledCase["mappings"],
): StructuredField | null {
  if (field.layout === "points") return null;
  const cell = field.layout === "cell";
  const grid: StructuredField = {
    layout: field.layout,
    values: field.values,
    ni: cell ? field.nx : field.nx + 1,
    nj: cell ? field.ny : field.ny + 1,
    domain,
  };
  if (isStretchedCase({ mappings })) {
    grid.lines = caseGrid({ domain, mappings }, field.nx, field.ny, field.layout).lines;
  }
  return grid;
}

/**
 * The discrete value of a quantity from a solver's field (rules in `quantity_rules.ts`); null on a
 * solver's own points or on a grid too small for the rule.
 *
 * @param field The solver's values and where they sit.
 * @param kase The case (its domain, its stretched family's maps, and K for a conormal flux).
 * @param spec The quantity.
 * @param measure What a flux measures (default: {@link fluxMeasure} of the case).
 */
export function discreteQuantity(
  field: DiscreteField,
  kase: Pick<CompiledCase, "domain" | "conservative" | "mappings">,
  spec: QuantitySpec,
  measure: FluxMeasure = kase.conservative ? "conormal" : "normal",
): number | null {
  const grid = structured(field, kase.domain, kase.mappings);
  if (!grid) return null;
  const q = resolve(spec, kase.domain);
  if (q.kind === "point") return cubicPointValue(grid, q.x, q.y);
  if (q.kind === "integral") return rectangleIntegral(grid, q.xa, q.xb, q.ya, q.yb);
  const d = sideDerivatives(grid, q.side);
  if (!d) return null;
  const { x0, x1, y0, y1 } = kase.domain;
  const vertical = q.side === "west" || q.side === "east";
  const [nx, ny] = NORMAL[q.side];
  const k = measure === "conormal" ? kase.conservative : undefined;
  const w = d.lines
    ? mappedLineWeights(grid.layout, d.lines, q.from, q.to)
    : lineWeights(grid.layout, d.lo, d.h, d.n, q.from, q.to);
  let sum = 0;
  for (let m = 0; m < w.length; m++) {
    if (w[m] === 0) continue;
    let density = d.dn[m];
    if (k) {
      const [x, y] = vertical
        ? [q.side === "west" ? x0 : x1, d.t[m]]
        : [d.t[m], q.side === "south" ? y0 : y1];
      // the gradient from the outward normal and the tangential derivative
      const ux = vertical ? nx * d.dn[m] : d.dt[m];
      const uy = vertical ? d.dt[m] : ny * d.dn[m];
      density = nx * (k.k11(x, y) * ux + k.k12(x, y) * uy) +
        ny * (k.k12(x, y) * ux + k.k22(x, y) * uy);
    }
    sum += w[m] * density;
  }
  return sum;
}
