/**
 * From a validated case file to checked expression trees, one operator and one exact solution per
 * region (a case without interfaces has one region). Every expression is parsed and checked once;
 * all problems are collected with the field they belong to, so the caller can report them at once.
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { MathTools } from "./_mathjs.ts";
import type { CaseFile, ConductivityText, ExpressionText } from "./case_file.ts";
import { parseExpression, pointAt } from "./expression.ts";
import type { OperatorForm, OperatorTrees } from "./operator.ts";
import type { SideTrees } from "./operator.ts";
import { type Interfaces, regionCount } from "./regions.ts";
import { type Side, SIDES } from "../reference-solver/mod.ts";

/** One expression problem: the JSON pointer and field of the text, and what is wrong. */
export interface TreeProblem {
  pointer: string;
  field: string;
  message: string;
  /** 1-based column in the expression text, when the text was a string. */
  column?: number;
}

/** The trees of a case. */
export interface CaseTrees {
  form: OperatorForm;
  interfaces: Interfaces;
  /** Per region (west to east, then south to north). */
  regions: { op: OperatorTrees; exact: MathNode }[];
  /** Each side's kind, with the Robin weights as trees (robin sides only). */
  sides: Record<Side, SideTrees>;
  problems: TreeProblem[];
}

/** The field name of a JSON pointer: `/regions/1/conductivity/k11` → `regions[1].conductivity.k11`. */
function fieldOf(pointer: string): string {
  return pointer.slice(1).split("/").map((part, k) =>
    /^\d+$/.test(part) ? `[${part}]` : `${k === 0 ? "" : "."}${part}`
  ).join("").replace(/\.\[/g, "[");
}

/**
 * Parses every expression of a case file into per-region trees.
 *
 * @param math the engine's mathjs tools
 * @param c the validated case file (form rules passed)
 * @param names the case's parameter names
 */
export function caseTrees(math: MathTools, c: CaseFile, names: readonly string[]): CaseTrees {
  const problems: TreeProblem[] = [];
  const cache = new Map<string, MathNode>();
  const zero = math.parse("0");
  const parse = (pointer: string, raw: ExpressionText | undefined): MathNode => {
    if (raw === undefined) return zero;
    const known = cache.get(pointer);
    if (known) return known;
    const text = String(raw);
    const result = parseExpression(math, text, names);
    for (const p of result.problems) {
      const shown = p.column === undefined ? `\n    ${text}` : `\n${pointAt(text, p.column)}`;
      const place = p.column === undefined ? "" : `column ${p.column} of the expression: `;
      problems.push({
        pointer,
        field: fieldOf(pointer),
        message: `${place}${p.message}${shown}`,
        ...(typeof raw === "string" && p.column !== undefined ? { column: p.column } : {}),
      });
    }
    const node = result.node ?? zero;
    cache.set(pointer, node);
    return node;
  };
  const form: OperatorForm = c.form ?? "non-conservative";
  const interfaces: Interfaces = { x: c.interfaces?.x ?? [], y: c.interfaces?.y ?? [] };
  const count = regionCount(interfaces);
  const regions: CaseTrees["regions"] = [];
  for (let r = 0; r < count; r++) {
    const own = c.regions?.[r] ?? {};
    const at = (field: string, value: unknown) =>
      value === undefined ? `/${field}` : `/regions/${r}/${field}`;
    const exact = parse(at("exact", own.exact), own.exact ?? c.exact);
    if (form === "non-conservative") {
      const k = c.coefficients!;
      const op: OperatorTrees = {
        form,
        a: parse("/coefficients/a", k.a),
        b: parse("/coefficients/b", k.b),
        c: parse("/coefficients/c", k.c),
        d: parse("/coefficients/d", k.d),
        e: parse("/coefficients/e", k.e),
        m: parse("/coefficients/m", k.m),
      };
      regions.push({ op, exact });
      continue;
    }
    const conductivity: ConductivityText = own.conductivity ?? c.conductivity!;
    const kBase = at("conductivity", own.conductivity);
    const tensor = typeof conductivity === "object"
      ? {
        k11: parse(`${kBase}/k11`, conductivity.k11),
        k12: parse(`${kBase}/k12`, conductivity.k12),
        k22: parse(`${kBase}/k22`, conductivity.k22),
      }
      : (() => {
        const k = parse(kBase, conductivity);
        return { k11: k, k12: zero, k22: k };
      })();
    const advection = own.advection ?? c.advection ?? {};
    const aBase = at("advection", own.advection);
    const op: OperatorTrees = {
      form,
      ...tensor,
      bx: parse(`${aBase}/x`, advection.x),
      by: parse(`${aBase}/y`, advection.y),
      sigma: parse(at("reaction", own.reaction), own.reaction ?? c.reaction),
    };
    regions.push({ op, exact });
  }
  const sides = {} as Record<Side, SideTrees>;
  for (const side of SIDES) {
    const spec = c.boundary[side];
    sides[side] = spec.kind === "robin"
      ? {
        kind: "robin",
        alpha: parse(`/boundary/${side}/alpha`, spec.alpha ?? 0),
        beta: parse(`/boundary/${side}/beta`, spec.beta ?? 0),
      }
      : { kind: spec.kind };
  }
  return { form, interfaces, regions, sides, problems };
}
