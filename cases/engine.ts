/**
 * The case engine: from a validated case file to a {@link CompiledCase}. Parses every expression
 * with mathjs and checks it against the whitelist (collecting every problem before failing),
 * derives the source term and boundary data symbolically, and compiles everything to plain
 * JavaScript point functions and a fused grid sampler.
 *
 * @module
 */
import type { MathNode } from "mathjs";
import type { Side } from "../reference-solver/mod.ts";
import { InputError } from "../errors/mod.ts";
import { loadMath, type MathTools } from "./_mathjs.ts";
import type { LocatedJson } from "./_json.ts";
import type { CaseFile, CaseProblem } from "./case_file.ts";
import { formatProblem } from "./case_file.ts";
import { compileExpr, compileRowSampler } from "./compile.ts";
import { deriveTrees, isZeroTree } from "./derive.ts";
import type { DomainCheckOptions, LatticeFill } from "./domain_check.ts";
import { type Expr, involvesNoPoint, parseExpression, pointAt, toExpr } from "./expression.ts";
import { checkOperator } from "./operator_check.ts";
import { checkGridSize, sampleProblem, sampleProblemParallel, type SamplerSpec } from "./sample.ts";
import type { CaseBoundary, CaseFormulas, CompiledCase, ExpectedOrder } from "./types.ts";

/** Options of {@link buildCase}. */
export interface BuildOptions {
  /** "library" or the file's path, stored as the case's origin. */
  origin: string;
  /** The file name used in messages. Default: origin. */
  file?: string;
  /** Positions of the file's values, for messages. */
  located?: LocatedJson;
  /** Parameter values overriding the file's defaults. Default: none. */
  parameters?: Record<string, number>;
  /**
   * The operator check's lattice and refinement budget (`operator_check.ts`). Default: 128
   * intervals per direction, 8 refinements per function and kind.
   */
  operatorCheck?: Pick<DomainCheckOptions, "intervals" | "refinements">;
}

const SIDES: readonly Side[] = ["west", "east", "south", "north"];
const COEFFICIENTS = ["a", "b", "c", "d", "e"] as const;

function problemAt(
  file: string,
  located: LocatedJson | undefined,
  pointer: string,
  field: string,
  message: string,
  column?: number,
): CaseProblem {
  const pos = located?.positions.get(pointer);
  if (!pos) return { file, field, message };
  // the expression's column inside the file: just after the opening quote
  const fileColumn = column === undefined ? pos.column : pos.column + column;
  return { file, field, line: pos.line, column: fileColumn, message };
}

/** Checks the parameter overrides and merges them with the defaults. */
export function mergeParameters(
  defaults: Record<string, number>,
  overrides: Record<string, number> | undefined,
  label: string,
): Record<string, number> {
  const merged = { ...defaults };
  for (const [name, value] of Object.entries(overrides ?? {})) {
    if (!Object.hasOwn(defaults, name)) {
      const valid = Object.keys(defaults);
      throw new RangeError(
        `${label} has no parameter "${name}"; ${
          valid.length ? `valid parameters: ${valid.join(", ")}` : "it has no parameters"
        }`,
      );
    }
    if (typeof value !== "number" || !Number.isFinite(value)) {
      throw new RangeError(`parameter ${name} of ${label} must be a finite number, found ${value}`);
    }
    merged[name] = value;
  }
  return merged;
}

/**
 * Parses, checks, derives and compiles a validated case file, then checks the operator on the whole
 * closed domain (`operator_check.ts`: a·c > 0 and finite values, between grid nodes too).
 *
 * @throws {InputError} with every expression problem (file, field, line, column, what and fix),
 *   or every field that is not elliptic or not finite somewhere on the domain (with the point)
 * @throws {RangeError} for unknown parameter overrides
 */
export async function buildCase(caseFile: CaseFile, options: BuildOptions): Promise<CompiledCase> {
  const file = options.file ?? options.origin;
  const label = options.origin === "library"
    ? `case "${caseFile.id}"`
    : `case "${caseFile.id}" (${file})`;
  const defaults = caseFile.parameters ?? {};
  const parameters = mergeParameters(defaults, options.parameters, label);
  const names = Object.keys(defaults);
  const math = await loadMath();
  const problems: CaseProblem[] = [];
  const trees: Record<string, MathNode> = {};
  const fields: [string, string, string | number][] = [
    ...COEFFICIENTS.map((k) =>
      [k, `/coefficients/${k}`, caseFile.coefficients[k]] as [string, string, string | number]
    ),
    ["exact", "/exact", caseFile.exact],
  ];
  for (const [key, pointer, raw] of fields) {
    const text = String(raw);
    const field = key === "exact" ? "exact" : `coefficients.${key}`;
    const result = parseExpression(math, text, names);
    for (const p of result.problems) {
      const shown = p.column === undefined ? `\n    ${text}` : `\n${pointAt(text, p.column)}`;
      const place = p.column === undefined ? "" : `column ${p.column} of the expression: `;
      problems.push(
        problemAt(
          file,
          options.located,
          pointer,
          field,
          `${place}${p.message}${shown}`,
          typeof raw === "string" ? p.column : undefined,
        ),
      );
    }
    if (result.node) trees[key] = result.node;
  }
  if (problems.length) throw collected(file, problems);
  let derived;
  try {
    derived = deriveTrees(
      math,
      trees as Parameters<typeof deriveTrees>[1],
      caseFile.boundary,
    );
  } catch (error) {
    throw collected(file, [
      problemAt(
        file,
        options.located,
        "/exact",
        "exact",
        `cannot derive the source term: ${error instanceof Error ? error.message : String(error)}`,
      ),
    ]);
  }
  const pureNeumann = SIDES.every((s) => {
    const spec = caseFile.boundary[s];
    return spec.kind === "neumann" || (spec.kind === "robin" && spec.alpha === 0);
  });
  if (pureNeumann && isZeroTree(math, trees.e)) {
    throw collected(file, [
      problemAt(
        file,
        options.located,
        "/boundary",
        "boundary",
        "every side is neumann and the reaction coefficient e is 0, so the problem is singular " +
          "(its solution is fixed only up to a constant); make one side dirichlet or robin, or " +
          "give coefficients.e a non-zero value",
      ),
    ]);
  }
  const { compiled, fill } = assemble(math, caseFile, options.origin, parameters, trees, derived);
  // named fields, not a spread: a spread would run the lazy `formulas` getter (mathjs simplify)
  const faults = checkOperator({
    domain: compiled.domain,
    coefficients: compiled.coefficients,
    source: compiled.source,
    exact: compiled.exact,
    boundary: compiled.boundary,
    parameters: compiled.parameters,
    fill,
  }, options.operatorCheck);
  if (faults.length) {
    throw collected(
      file,
      faults.map((f) => problemAt(file, options.located, f.pointer, f.field, f.message)),
    );
  }
  return compiled;
}

function collected(file: string, problems: CaseProblem[]): InputError {
  return new InputError(
    `${problems.length} problem${problems.length === 1 ? "" : "s"} in the case file`,
    { where: file, problems: problems.map(formatProblem) },
  );
}

function assemble(
  math: MathTools,
  caseFile: CaseFile,
  origin: string,
  parameters: Record<string, number>,
  trees: Record<string, MathNode>,
  derived: ReturnType<typeof deriveTrees>,
): { compiled: CompiledCase; fill: LatticeFill } {
  const expr = (node: MathNode): Expr => toExpr(node, parameters);
  const coefficientExprs = COEFFICIENTS.map((k) => expr(trees[k]));
  const sourceExpr = expr(derived.source);
  const exactExpr = expr(trees.exact);
  const problemSampler = compileRowSampler([...coefficientExprs, sourceExpr]);
  const exactSampler = compileRowSampler([exactExpr]);
  const [a, b, c, d, e] = coefficientExprs.map(compileExpr);
  const constantCoefficients: CompiledCase["constantCoefficients"] = {};
  COEFFICIENTS.forEach((name, k) => {
    if (involvesNoPoint(coefficientExprs[k])) {
      constantCoefficients[name] = [a, b, c, d, e][k](0, 0);
    }
  });
  const boundary = {} as Record<Side, CaseBoundary>;
  for (const side of SIDES) {
    const spec = caseFile.boundary[side];
    const data = compileExpr(expr(derived.boundary[side]));
    boundary[side] = spec.kind === "robin"
      ? { kind: "robin", alpha: spec.alpha, beta: spec.beta, data }
      : { kind: spec.kind, data };
  }
  const formulasOf = (
    simple: ReturnType<typeof deriveTrees>,
    render: (n: MathNode) => string,
  ): CaseFormulas => ({
    a: render(trees.a),
    b: render(trees.b),
    c: render(trees.c),
    d: render(trees.d),
    e: render(trees.e),
    exact: render(trees.exact),
    source: render(simple.source),
    boundary: {
      west: render(simple.boundary.west),
      east: render(simple.boundary.east),
      south: render(simple.boundary.south),
      north: render(simple.boundary.north),
    },
  });
  // readable formulas need mathjs's simplify (slow): computed on first use only
  let shown: { text: CaseFormulas; tex: CaseFormulas } | undefined;
  const readable = () => {
    if (!shown) {
      const simple = deriveTrees(
        math,
        trees as Parameters<typeof deriveTrees>[1],
        caseFile.boundary,
        { simplify: true },
      );
      shown = {
        text: formulasOf(simple, (n) => n.toString()),
        tex: formulasOf(simple, (n) => n.toTex()),
      };
    }
    return shown;
  };
  const aspect = caseFile.aspect ?? 1;
  // Without convection (b ≡ d ≡ 0) upwinding changes nothing: the upwind scheme is the central
  // scheme, so it is expected to behave exactly like it (exact identity of the stencils).
  const noConvection = isZeroTree(math, trees.b) && isZeroTree(math, trees.d);
  const expected: Record<"central" | "upwind", ExpectedOrder> = {
    central: caseFile.expected.central,
    upwind: noConvection
      ? { ...caseFile.expected.central }
      : caseFile.expected.upwind ?? { formal: 1 },
  };
  const spec: SamplerSpec = {
    id: caseFile.id,
    origin,
    domain: { ...caseFile.domain },
    problemSampler,
    boundary,
  };
  const compiled: CompiledCase = {
    id: caseFile.id,
    title: caseFile.title,
    motivation: caseFile.motivation,
    manufactured: caseFile.manufactured,
    file: structuredClone(caseFile),
    origin,
    domain: { ...caseFile.domain },
    parameters,
    expected,
    tags: [...caseFile.tags],
    grids: [...caseFile.grids],
    aspect,
    exact: compileExpr(exactExpr),
    exactDx: compileExpr(expr(derived.ux)),
    exactDy: compileExpr(expr(derived.uy)),
    coefficients: { a, b, c, d, e },
    constantCoefficients,
    source: compileExpr(sourceExpr),
    boundary,
    get formulas() {
      return readable().text;
    },
    get tex() {
      return readable().tex;
    },
    gridFor: (n: number) => ({ nx: n, ny: Math.max(2, Math.round(n * aspect)) }),
    sample: (nx: number, ny: number) => sampleProblem(spec, nx, ny),
    sampleAsync: (nx: number, ny: number, opts?: { threads?: number; minNodes?: number }) =>
      sampleProblemParallel(spec, nx, ny, opts),
    sampleExact: (nx: number, ny: number) => {
      checkGridSize(nx, ny);
      const out = new Float64Array((nx + 1) * (ny + 1));
      const hx = (spec.domain.x1 - spec.domain.x0) / nx;
      const hy = (spec.domain.y1 - spec.domain.y0) / ny;
      exactSampler.run(spec.domain.x0, hx, nx, spec.domain.y0, hy, 0, ny + 1, [out]);
      return out;
    },
  };
  if (caseFile.solver) compiled.solver = { ...caseFile.solver };
  // the check lattices are sampled by the same compiled samplers as the study grids
  const fill: LatticeFill = (x0, hx, nx, y0, hy, ny, outputs) => {
    problemSampler.run(x0, hx, nx, y0, hy, 0, ny + 1, outputs.slice(0, 6));
    exactSampler.run(x0, hx, nx, y0, hy, 0, ny + 1, [outputs[6]]);
  };
  return { compiled, fill };
}
