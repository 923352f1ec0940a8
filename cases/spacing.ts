/**
 * A case file's `spacing` (its stretched grid family) to per-axis {@link AxisMapping}s. The
 * expression kind is the user's coordinate as a function of the parameter t, compiled with the
 * engine's whitelisted compiler (never evaluated otherwise) and checked at load: the ends must
 * be the domain's within 1e-12 of its length, and the map strictly increasing.
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { MathTools } from "./_mathjs.ts";
import { compileExpr } from "./compile.ts";
import { type Expr, parseExpression, toExpr } from "./expression.ts";
import type { CaseFile } from "./case_file.ts";
import { AXES, type Axis, type AxisMapping, axisRange, mappingFault } from "../grid/mod.ts";

/** One axis' spacing as a case file writes it. */
export type AxisSpacingText =
  | { kind: "uniform" }
  | { kind: "tanh"; strength: number; toward: "start" | "end" | "both" }
  | { kind: "geometric"; ratio: number; cells: number }
  | { kind: "expression"; expression: string };

/**
 * One axis' mapping as plain data (what a derivation cache entry and a pool worker carry): the
 * expression kind holds the compiled tree of x(t) (t written as x) and the axis' range.
 */
export type MappingData =
  | Exclude<AxisMapping, { kind: "expression" }>
  | { kind: "expression"; coordinate: Expr; start: number; length: number };

/** The mappings of plain data, compiled (no mathjs). */
export function mappingsFromData(
  data: Partial<Record<Axis, MappingData>>,
): Partial<Record<Axis, AxisMapping>> {
  const out: Partial<Record<Axis, AxisMapping>> = {};
  for (const axis of AXES) {
    const d = data[axis];
    if (d === undefined) continue;
    if (d.kind !== "expression") {
      out[axis] = d;
      continue;
    }
    const fn = compileExpr(d.coordinate);
    out[axis] = { kind: "expression", unit: (t: number) => (fn(t, 0) - d.start) / d.length };
  }
  return out;
}

/** A problem found in a case's spacing: the JSON pointer, the field and what is wrong. */
export interface SpacingProblem {
  pointer: string;
  field: string;
  message: string;
  column?: number;
}

/**
 * The per-axis mappings of a case file (uniform axes left out), or the problems found.
 *
 * @param math the engine's mathjs tools
 * @param caseFile the validated case file
 * @param parameters the parameter values in effect
 * @returns the mappings and every problem (empty when fine)
 */
export function caseMappings(
  math: MathTools,
  caseFile: CaseFile,
  parameters: Record<string, number>,
): {
  mappings: Partial<Record<Axis, AxisMapping>>;
  data: Partial<Record<Axis, MappingData>>;
  problems: SpacingProblem[];
} {
  const mappings: Partial<Record<Axis, AxisMapping>> = {};
  const data: Partial<Record<Axis, MappingData>> = {};
  const problems: SpacingProblem[] = [];
  for (const axis of AXES) {
    const spec = caseFile.spacing?.[axis];
    if (spec === undefined || spec.kind === "uniform") continue;
    const pointer = `/spacing/${axis}`;
    if (spec.kind !== "expression") {
      const mapping = spec as Exclude<AxisMapping, { kind: "expression" }>;
      if (spec.kind === "geometric" && spec.ratio === 1) {
        mappings[axis] = data[axis] = { kind: "uniform" };
        continue;
      }
      mappings[axis] = data[axis] = mapping;
      continue;
    }
    const [start, end] = axisRange(caseFile.domain, axis);
    const field = `spacing.${axis}.expression`;
    const compiled = compileCoordinate(math, spec.expression, parameters);
    if (typeof compiled === "string") {
      problems.push({ pointer: `${pointer}/expression`, field, message: compiled });
      continue;
    }
    const length = end - start;
    const unit = (t: number) => (compiled.fn(t) - start) / length;
    const fault = mappingFault(unit);
    if (fault !== null) {
      problems.push({
        pointer: `${pointer}/expression`,
        field,
        message: `the map t ↦ ${axis}(t) = ${spec.expression} on [0, 1] is not a grid map: ` +
          `${fault} (in unit coordinates s = (${axis} − ${start})/${length}); write an ` +
          `expression increasing from ${start} at t = 0 to ${end} at t = 1`,
      });
      continue;
    }
    mappings[axis] = { kind: "expression", unit };
    data[axis] = { kind: "expression", coordinate: compiled.coordinate, start, length };
  }
  return { mappings, data, problems };
}

/** The compiled coordinate t ↦ x(t), or a sentence saying why it cannot be compiled. */
function compileCoordinate(
  math: MathTools,
  text: string,
  parameters: Record<string, number>,
): { fn: (t: number) => number; coordinate: Expr } | string {
  if (Object.hasOwn(parameters, "t")) {
    return `the case has a parameter named "t", the spacing expression's variable; rename it`;
  }
  const { node, problems } = parseExpression(math, text, [...Object.keys(parameters), "t"]);
  if (!node) {
    return `cannot read the expression: ${problems.map((p) => p.message).join("; ")}`;
  }
  let usesPoint = false;
  // the engine's compiler knows x and y only: t becomes x once x and y are known to be absent
  const renamed = node.transform((n: MathNode) => {
    if (n.type !== "SymbolNode") return n;
    const name = (n as unknown as { name: string }).name;
    if (name === "x" || name === "y") usesPoint = true;
    return name === "t" ? math.parse("x") : n;
  });
  if (usesPoint) return "a grid map is a function of t alone; it must not use x or y";
  try {
    const coordinate = toExpr(renamed, parameters);
    const fn = compileExpr(coordinate);
    return { fn: (t: number) => fn(t, 0), coordinate };
  } catch (error) {
    return `cannot compile the expression: ${(error as Error).message}`;
  }
}
