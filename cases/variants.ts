/**
 * Variants of a case that change one ingredient while keeping the manufactured solution: a side's
 * condition made Dirichlet, every Dirichlet side made Robin, an operator term switched off, a
 * variable coefficient frozen, square cells. Sources and boundary data are derived again
 * symbolically, so every variant is a consistent case of its own. Used to isolate the ingredient a
 * defect lives in.
 *
 * @module
 */
import type { Side } from "../reference-solver/mod.ts";
import type { CaseFile } from "./case_file.ts";
import { buildCase } from "./engine.ts";
import type { CompiledCase } from "./types.ts";

/** One variant: what changed, in the trade's words and the case's symbols, and where it points. */
export interface CaseVariant {
  /** Short stable key, e.g. "dirichlet:north", "b=0". */
  key: string;
  /** The change as a clause, e.g. "the Robin condition on the north side is replaced by Dirichlet". */
  change: string;
  /** Where the defect is when this change restores the order, e.g. "the Robin treatment of the north side". */
  place: string;
  /** The variant case (id `<case>~<key>`). */
  kase: CompiledCase;
}

const SIDES: readonly Side[] = ["west", "east", "south", "north"];
const KIND_WORD = {
  dirichlet: "Dirichlet",
  neumann: "Neumann",
  robin: "Robin",
  periodic: "periodic",
} as const;
const TERMS = [
  { k: "b", words: "the first-derivative term in x (b·u_x)" },
  { k: "d", words: "the first-derivative term in y (d·u_y)" },
  { k: "e", words: "the reaction term (e·u)" },
  { k: "m", words: "the mixed-derivative term (m·u_xy)" },
] as const;
const COEFFICIENT_WORDS = {
  a: "the variable coefficient of u_xx (a)",
  b: "the variable coefficient of u_x (b)",
  c: "the variable coefficient of u_yy (c)",
  d: "the variable coefficient of u_y (d)",
  e: "the variable coefficient of u (e)",
} as const;

type Edit = { key: string; change: string; place: string; edit: (f: CaseFile) => void };

/** The operator-term variants of the non-conservative form. */
function termEdits(kase: CompiledCase): Edit[] {
  const out: Edit[] = [];
  const constant = kase.constantCoefficients;
  // Without a Dirichlet or Robin side the reaction term is what makes the problem well posed.
  const anchored = SIDES.some((s) => kase.boundary[s].kind !== "neumann");
  for (const t of TERMS) {
    if (constant[t.k] === 0) continue;
    if (t.k === "e" && !anchored) continue;
    out.push({
      key: `${t.k}=0`,
      change: `${t.words} is switched off (${t.k} = 0)`,
      place: t.words,
      edit: (f) => {
        f.coefficients![t.k] = 0;
      },
    });
  }
  if (constant.b !== 0 && constant.d !== 0) {
    out.push({
      key: "b=d=0",
      change: "both first-derivative terms are switched off (b = d = 0)",
      place: "the first-derivative terms (both directions)",
      edit: (f) => {
        f.coefficients!.b = 0;
        f.coefficients!.d = 0;
      },
    });
  }
  const { x0, x1, y0, y1 } = kase.domain;
  const xm = (x0 + x1) / 2, ym = (y0 + y1) / 2;
  for (const k of ["a", "c", "b", "d", "e"] as const) {
    if (constant[k] !== undefined) continue;
    const value = Number(kase.coefficients[k](xm, ym).toPrecision(4));
    // a first-order or reaction coefficient that vanishes at the centre: freezing it is the same
    // change as switching the term off, which is tried already
    if (k !== "a" && k !== "c" && Math.abs(value) < 1e-9) continue;
    out.push({
      key: `${k}=const`,
      change: `${COEFFICIENT_WORDS[k]} is frozen to its value at the centre, ${value}`,
      place: `${COEFFICIENT_WORDS[k]}: its sampling or its variation in the stencil`,
      edit: (f) => {
        f.coefficients![k] = value;
      },
    });
  }
  return out;
}

/**
 * The operator-term variants of the conservative form: advection or reaction switched off, the
 * jumps across interfaces removed, and (without interfaces, whose flux condition involves it) the
 * off-diagonal k12 of K. Advection and reaction change only where given at the top level and not
 * overridden by a region.
 */
function conservativeEdits(kase: CompiledCase): Edit[] {
  const out: Edit[] = [];
  const file = kase.file;
  const terms = kase.conservative;
  if (!file || !terms) return out;
  const regions = file.regions ?? [];
  const anchored = SIDES.some((s) => kase.boundary[s].kind !== "neumann");
  if (
    file.advection && terms.constant.bx !== 0 && terms.constant.by !== 0 &&
    regions.every((r) => r.advection === undefined)
  ) {
    out.push({
      key: "advection=0",
      change: "the advection term is switched off (β = 0)",
      place: "the advection term (β·∇u)",
      edit: (f) => {
        delete f.advection;
      },
    });
  }
  if (
    anchored && file.reaction !== undefined && terms.constant.sigma !== 0 &&
    regions.every((r) => r.reaction === undefined)
  ) {
    out.push({
      key: "reaction=0",
      change: "the reaction term is switched off (σ = 0)",
      place: "the reaction term (σ·u)",
      edit: (f) => {
        delete f.reaction;
      },
    });
  }
  if (regions.length > 1) {
    // Every region takes the first region's conductivity and exact solution: the interfaces stay
    // where they are (the same grids, the same face lines) but nothing jumps across them, and
    // u and its flux are trivially continuous. A defect that restores its order here lives in
    // how the solver treats a jump (face averaging, the source at interface nodes).
    const first = regions[0];
    out.push({
      key: "no-jump",
      change: "the jumps are removed: every region takes the first region's conductivity and " +
        "exact solution",
      place: "the treatment of material interfaces (how K is averaged at faces where it jumps)",
      edit: (f) => {
        const conductivity = first.conductivity ?? f.conductivity;
        const exact = first.exact ?? f.exact;
        f.regions = (f.regions ?? []).map((r) => ({
          ...r,
          ...(conductivity === undefined ? {} : { conductivity: structuredClone(conductivity) }),
          ...(exact === undefined ? {} : { exact }),
          ...(first.advection ? { advection: { ...first.advection } } : {}),
          ...(first.reaction === undefined ? {} : { reaction: first.reaction }),
        }));
      },
    });
  }
  const k = file.conductivity;
  if (
    regions.length === 0 && typeof k === "object" && k.k12 !== undefined && terms.constant.k12 !== 0
  ) {
    out.push({
      key: "k12=0",
      change: "the off-diagonal conductivity is switched off (k12 = 0)",
      place: "the cross-diffusion terms (k12: ∂x(k12·u_y) + ∂y(k12·u_x))",
      edit: (f) => {
        const tensor = f.conductivity as {
          k11: string | number;
          k12?: string | number;
          k22: string | number;
        };
        delete tensor.k12;
      },
    });
  }
  return out;
}

/** The midpoint of a side of the rectangle, (x, y). */
export function sideMidpoint(
  domain: { x0: number; x1: number; y0: number; y1: number },
  side: Side,
): [number, number] {
  const { x0, x1, y0, y1 } = domain;
  return side === "west"
    ? [x0, (y0 + y1) / 2]
    : side === "east"
    ? [x1, (y0 + y1) / 2]
    : side === "south"
    ? [(x0 + x1) / 2, y0]
    : [(x0 + x1) / 2, y1];
}

/**
 * The Robin weights frozen along a side: each side whose α or β varies gets them at the side's
 * midpoint, one side at a time and (with two or more such sides) all at once. A defect that
 * restores its order here lives in where the solver takes the weights along the side.
 */
function robinWeightEdits(kase: CompiledCase): Edit[] {
  const middle = (side: Side) => sideMidpoint(kase.domain, side);
  const varying = SIDES.filter((s) => kase.boundary[s].weightsVary === true);
  const frozen = (s: Side) => {
    const b = kase.boundary[s];
    const round = (v: number) => Number(v.toPrecision(15));
    return { alpha: round(b.alpha!(...middle(s))), beta: round(b.beta!(...middle(s))) };
  };
  const out: Edit[] = varying.map((s) => {
    const w = frozen(s);
    return {
      key: `robin-constant:${s}`,
      change: `the Robin weights on the ${s} side are frozen to their values at its midpoint ` +
        `(α = ${w.alpha}, β = ${w.beta})`,
      place: `the Robin weights along the ${s} side (where α and β are taken along it)`,
      edit: (f: CaseFile) => {
        f.boundary[s] = { kind: "robin", ...w };
      },
    };
  });
  if (varying.length >= 2) {
    out.push({
      key: "robin-constant:all",
      change: `the Robin weights on every side where they vary (${
        varying.join(", ")
      }) are frozen to their values at the side's midpoint`,
      place: "the Robin weights along the sides (where α and β are taken along a side)",
      edit: (f: CaseFile) => {
        for (const s of varying) f.boundary[s] = { kind: "robin", ...frozen(s) };
      },
    });
  }
  return out;
}

/** The changes that make sense for a case, as edits of its file (without building them). */
export function variantEdits(
  kase: CompiledCase,
): { key: string; change: string; place: string; edit: (f: CaseFile) => void }[] {
  const out: { key: string; change: string; place: string; edit: (f: CaseFile) => void }[] = [];
  const kind = (s: Side) => kase.boundary[s].kind;
  const derivative = SIDES.filter((s) => kind(s) !== "dirichlet");
  const dirichlet = SIDES.filter((s) => kind(s) === "dirichlet");
  for (const s of derivative) {
    const k = KIND_WORD[kind(s)];
    out.push({
      key: `dirichlet:${s}`,
      change: `the ${k} condition on the ${s} side is replaced by Dirichlet`,
      place: `the ${k} treatment of the ${s} side`,
      edit: (f) => {
        f.boundary[s] = { kind: "dirichlet" };
      },
    });
  }
  // Groups: every side of one derivative kind, then every derivative side (a defect shared by
  // several sides is restored only when all of them change).
  const kinds = [...new Set(derivative.map(kind))];
  for (const k of kinds) {
    const sides = derivative.filter((s) => kind(s) === k);
    if (sides.length < 2 || kinds.length < 2) continue;
    const word = KIND_WORD[k];
    out.push({
      key: `dirichlet:all-${k}`,
      change: `every ${word} side (${sides.join(", ")}) is replaced by Dirichlet`,
      place: `the ${word} treatment (every ${word} side)`,
      edit: (f) => {
        for (const s of sides) f.boundary[s] = { kind: "dirichlet" };
      },
    });
  }
  if (derivative.length >= 2) {
    const words = kinds.map((k) => KIND_WORD[k]).join(" and ");
    out.push({
      key: "dirichlet:all",
      change: `every ${words} side (${derivative.join(", ")}) is replaced by Dirichlet`,
      place: `the ${words} treatment (every ${words} side)`,
      edit: (f) => {
        for (const s of derivative) f.boundary[s] = { kind: "dirichlet" };
      },
    });
  }
  if (dirichlet.length > 0) {
    // α, β > 0 with the outward normal keep the problem well posed (coercive) for a, c > 0.
    out.push({
      key: "robin:dirichlet-sides",
      change: `every Dirichlet side (${dirichlet.join(", ")}) is replaced by a Robin condition ` +
        `(α = 1, β = 1)`,
      place: "the treatment of the Dirichlet sides",
      edit: (f) => {
        for (const s of dirichlet) f.boundary[s] = { kind: "robin", alpha: 1, beta: 1 };
      },
    });
  }
  out.push(...robinWeightEdits(kase));
  if (kase.form === "conservative") out.push(...conservativeEdits(kase));
  else out.push(...termEdits(kase));
  const { x0, x1, y0, y1 } = kase.domain;
  const g = kase.gridFor(64);
  const ratio = ((x1 - x0) / g.nx) / ((y1 - y0) / g.ny);
  if (Math.abs(ratio - 1) > 1e-9) {
    out.push({
      key: "square-cells",
      change: `the cells are made square (hx = hy instead of hx/hy = ${
        Number(ratio.toPrecision(3))
      })`,
      place: "the spacing of one direction (hx and hy mixed up)",
      edit: (f) => {
        f.intervalRatio = (y1 - y0) / (x1 - x0);
      },
    });
  }
  return out;
}

/**
 * Builds every variant of a case ({@link variantEdits}): each is the case's file with one change,
 * derived and compiled like any case, id `<case>~<key>`.
 *
 * @param kase A case built from a file (`kase.file`); cases made in code have no variants.
 * @returns The variants, sides first, then terms, coefficients and cell shape.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { caseVariants, loadCase } from "./mod.ts";
 * const v = await caseVariants(await loadCase("robin-all"));
 * assert.ok(v.some((x) => x.key === "dirichlet:north"));
 * ```
 */
export async function caseVariants(kase: CompiledCase): Promise<CaseVariant[]> {
  if (!kase.file) return [];
  const out: CaseVariant[] = [];
  for (const v of variantEdits(kase)) {
    const file = structuredClone(kase.file);
    v.edit(file);
    file.id = `${kase.id}~${v.key}`;
    const built = await buildCase(file, { origin: kase.origin, parameters: kase.parameters });
    out.push({ key: v.key, change: v.change, place: v.place, kase: built });
  }
  return out;
}
