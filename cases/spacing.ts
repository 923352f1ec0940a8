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
import { parseExpression, toExpr } from "./expression.ts";
import type { CaseFile } from "./case_file.ts";
import { AXES, type Axis, type AxisMapping, axisRange, mappingFault } from "../grid/mod.ts";

/** One axis' spacing as a case file writes it. */
export type AxisSpacingText =
  | { kind: "uniform" }
  | { kind: "tanh"; strength: number; toward: "start" | "end" | "both" }
  | { kind: "geometric"; ratio: number; cells: number }
  | { kind: "expression"; expression: string };

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
): { mappings: Partial<Record<Axis, AxisMapping>>; problems: SpacingProblem[] } {
  const mappings: Partial<Record<Axis, AxisMapping>> = {};
  const problems: SpacingProblem[] = [];
  for (const axis of AXES) {
    const spec = caseFile.spacing?.[axis];
    if (spec === undefined || spec.kind === "uniform") continue;
    const pointer = `/spacing/${axis}`;
    if (spec.kind !== "expression") {
      const mapping = spec as AxisMapping;
      if (spec.kind === "geometric" && spec.ratio === 1) {
        mappings[axis] = { kind: "uniform" };
        continue;
      }
      mappings[axis] = mapping;
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
    const unit = (t: number) => (compiled(t) - start) / length;
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
  }
  return { mappings, problems };
}

/** The compiled coordinate t ↦ x(t), or a sentence saying why it cannot be compiled. */
function compileCoordinate(
  math: MathTools,
  text: string,
  parameters: Record<string, number>,
): ((t: number) => number) | string {
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
    const fn = compileExpr(toExpr(renamed, parameters));
    return (t: number) => fn(t, 0);
  } catch (error) {
    return `cannot compile the expression: ${(error as Error).message}`;
  }
}
