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
import { isZeroTree } from "./derive.ts";
import { type CaseTrees, caseTrees } from "./case_trees.ts";
import { checkInterfaceConditions } from "./continuity.ts";
import { CONSERVATIVE_TERMS, type DerivedRegion, deriveRegion, GENERAL_TERMS } from "./operator.ts";
import { faceConductivity, gridMisses, piecewiseMean } from "./regions.ts";
import type { DomainCheckOptions, LatticeFill } from "./domain_check.ts";
import { type Expr, involvesNoPoint } from "./expression.ts";
import {
  type Derivation,
  type ReadableFormulas,
  rememberDerivation,
  toDerivation,
} from "./derivation.ts";
import { derivationKey, readCacheEntry, writeCacheEntry } from "./derive_cache.ts";
import { checkOperator, type OperatorFault } from "./operator_check.ts";
import { checkRobinWeights } from "./robin_check.ts";
import { checkSeam, type SeamFunction } from "./periodic_check.ts";
import { COMPATIBILITY_TOLERANCE, compatibilityBalance } from "./compatibility.ts";
import { checkGridSize, sampleProblem, sampleProblemParallel, type SamplerSpec } from "./sample.ts";
import { onLattice, sampleStretched } from "./sample_stretched.ts";
import { caseMappings, mappingsFromData } from "./spacing.ts";
import { makeGrid } from "../grid/mod.ts";
import type {
  CaseBoundary,
  CaseFormulas,
  CompiledCase,
  ConservativeTerms,
  ExpectedOrder,
  PointFn,
  RegionExpressions,
} from "./types.ts";

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
  /**
   * The derivation cache folder (`derive_cache.ts`): a case found there is compiled without mathjs,
   * a case derived anew is stored there with its readable formulas. Default: no cache.
   */
  cacheDir?: string;
}

const SIDES: readonly Side[] = ["west", "east", "south", "north"];

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
 * closed domain (`operator_check.ts`: ellipticity and finite values, between grid nodes too) and,
 * for a case with interfaces, the interface conditions (`continuity.ts`).
 *
 * @throws {InputError} with every expression problem (file, field, line, column, what and fix),
 *   or every field that is not elliptic or not finite somewhere on the domain (with the point),
 *   or every broken interface condition
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
  const key = options.cacheDir === undefined
    ? undefined
    : await derivationKey(caseFile, parameters);
  const hit = key === undefined ? undefined : await readCacheEntry(options.cacheDir!, key);
  if (hit) {
    const built = assemble(
      caseFile,
      options.origin,
      parameters,
      hit.derivation,
      () => hit.formulas,
    );
    // the entry was written after the default checks passed on this very derivation
    if (options.operatorCheck) {
      const faults = checkRegions(built, hit.derivation, caseFile, options);
      if (faults.length) {
        throw collected(
          file,
          faults.map((f) => problemAt(file, options.located, f.pointer, f.field, f.message)),
        );
      }
    }
    rememberDerivation(built.compiled, hit.derivation);
    return built.compiled;
  }
  const math = await loadMath();
  const at = (pointer: string, field: string, message: string, column?: number) =>
    problemAt(file, options.located, pointer, field, message, column);
  const trees = caseTrees(math, caseFile, names);
  if (trees.problems.length) {
    throw collected(
      file,
      trees.problems.map((p) => at(p.pointer, p.field, p.message, p.column)),
    );
  }
  const spacing = caseMappings(math, caseFile, parameters);
  if (spacing.problems.length) {
    throw collected(
      file,
      spacing.problems.map((p) => at(p.pointer, p.field, p.message, p.column)),
    );
  }
  let derived: DerivedRegion[];
  try {
    derived = trees.regions.map((r) => deriveRegion(math, r.op, r.exact, trees.sides));
  } catch (error) {
    throw collected(file, [
      at(
        "/exact",
        "exact",
        `cannot derive the source term: ${error instanceof Error ? error.message : String(error)}`,
      ),
    ]);
  }
  // every side fixes only a derivative and there is no reaction: u is fixed up to a constant
  const singular = SIDES.every((s) => {
    const spec = trees.sides[s];
    return spec.kind === "neumann" || spec.kind === "periodic" ||
      (spec.kind === "robin" && isZeroTree(math, spec.alpha!));
  }) && derived.every((d) => isZeroTree(math, d.expanded.e));
  const derivation = toDerivation(math, trees, derived, parameters);
  if (Object.keys(spacing.data).length) derivation.mappings = spacing.data;
  if (singular) derivation.singular = true;
  // readable formulas need mathjs's simplify (slow): computed on first use only, or at once when
  // they go into the cache
  let shown: ReadableFormulas | undefined;
  const readable = () => shown ??= readableFormulas(math, trees, caseFile);
  const built = assemble(caseFile, options.origin, parameters, derivation, readable);
  const faults = checkRegions(built, derivation, caseFile, options);
  faults.push(...periodicFaults(built.compiled));
  if (faults.length) {
    throw collected(file, faults.map((f) => at(f.pointer, f.field, f.message)));
  }
  if (singular) {
    const balance = compatibilityBalance(built.compiled);
    if (!(balance.relative <= COMPATIBILITY_TOLERANCE)) {
      throw collected(file, [at(
        "/exact",
        "exact",
        `the problem is singular (no side fixes u and there is no reaction term) and its derived ` +
          `data do not balance: ∫ f dA = ${show(balance.source)} but the boundary flux ` +
          `∮ flux·n ds = ${show(balance.flux)} plus the first-order terms' integral ` +
          `${show(balance.volume)}; imbalance ${show(balance.imbalance)} (${
            show(balance.relative)
          } of the integrals' size, at most ${COMPATIBILITY_TOLERANCE} allowed). The exact ` +
          "solution or a coefficient is probably not smooth (a kink the derived source misses); " +
          "make them smooth, or fix u on one side (dirichlet, or robin with alpha ≠ 0)",
      )]);
    }
  }
  if (key !== undefined && !options.operatorCheck) {
    await writeCacheEntry(options.cacheDir!, key, { derivation, formulas: readable() });
  }
  rememberDerivation(built.compiled, derivation);
  return built.compiled;
}

function show(v: number): string {
  return Number(v.toPrecision(4)).toString();
}

/** Faults of the periodic pairs: every function that must repeat across a seam and does not. */
function periodicFaults(compiled: CompiledCase): OperatorFault[] {
  const faults: OperatorFault[] = [];
  const c = compiled.coefficients, K = compiled.conservative;
  const terms: SeamFunction[] = K !== undefined
    ? (["k11", "k12", "k22", "bx", "by", "sigma"] as const).map((k) => {
      const field = k === "sigma" ? "reaction" : k.startsWith("b") ? "advection" : "conductivity";
      return { name: `the conservative term ${k}`, pointer: `/${field}`, field, fn: K[k] };
    })
    : (["a", "b", "c", "d", "e", "m"] as const).map((k) => ({
      name: `coefficients.${k}`,
      pointer: `/coefficients/${k}`,
      field: `coefficients.${k}`,
      fn: c[k],
    }));
  for (const axis of ["x", "y"] as const) {
    if (compiled.boundary[axis === "x" ? "west" : "south"].kind !== "periodic") continue;
    faults.push(...checkSeam(compiled.domain, axis, [
      { name: "the exact solution u", pointer: "/exact", field: "exact", fn: compiled.exact },
      {
        name: `the normal derivative ∂u/∂${axis}`,
        pointer: "/exact",
        field: "exact",
        fn: axis === "x" ? compiled.exactDx : compiled.exactDy,
      },
      ...terms,
      { name: "the derived source f", pointer: "/exact", field: "exact", fn: compiled.source },
    ]));
  }
  return faults;
}

/** The operator check of every region, and the interface conditions between them. */
function checkRegions(
  built: Assembled,
  trees: Pick<Derivation, "interfaces" | "form">,
  caseFile: CaseFile,
  options: BuildOptions,
): OperatorFault[] {
  const { compiled, regions, fill } = built;
  const faults: OperatorFault[] = [];
  for (const side of SIDES) {
    const b = regions[0].boundary[side];
    if (b.kind === "robin") {
      faults.push(...checkRobinWeights(compiled.domain, side, b.alpha!, b.beta!));
    }
  }
  const { x0, x1, y0, y1 } = compiled.domain;
  const xs = [x0, ...trees.interfaces.x, x1], ys = [y0, ...trees.interfaces.y, y1];
  const columns = xs.length - 1;
  regions.forEach((r, k) => {
    const sx = k % columns, sy = (k - sx) / columns;
    const rect = { x0: xs[sx], x1: xs[sx + 1], y0: ys[sy], y1: ys[sy + 1] };
    // a side of the region is checked as boundary data only where it lies on the domain's side
    const sides = SIDES.filter((s) =>
      s === "west"
        ? sx === 0
        : s === "east"
        ? sx === columns - 1
        : s === "south"
        ? sy === 0
        : sy === ys.length - 2
    );
    // named fields, not a spread: a spread would run the lazy `formulas` getter (mathjs simplify)
    const found = checkOperator({
      domain: rect,
      // the mixed term only where there is one: 4ac − m² > 0 is then a·c > 0
      coefficients: r.mixedZero ? { ...r.coefficients, m: undefined } : r.coefficients,
      source: r.source,
      exact: r.exact,
      boundary: r.boundary,
      sides,
      parameters: compiled.parameters,
      form: trees.form,
      ...(regions.length > 1 ? { region: k } : {}),
      ...(fill && regions.length === 1 ? { fill } : {}),
    }, options.operatorCheck);
    faults.push(...found);
  });
  if (regions.length > 1) {
    const broken = checkInterfaceConditions(
      regions.map((r) => ({ u: r.exact, fluxX: r.fluxX, fluxY: r.fluxY })),
      trees.interfaces,
      compiled.domain,
    );
    for (const p of broken) {
      const r = p.regions[1];
      const own = caseFile.regions?.[r]?.exact !== undefined;
      faults.push({
        pointer: own ? `/regions/${r}/exact` : "/exact",
        field: own ? `regions[${r}].exact` : "exact",
        message: p.message,
      });
    }
  }
  return faults;
}

function collected(file: string, problems: CaseProblem[]): InputError {
  return new InputError(
    `${problems.length} problem${problems.length === 1 ? "" : "s"} in the case file`,
    { where: file, problems: problems.map(formatProblem) },
  );
}

/** One region's compiled functions. */
interface RegionFunctions {
  coefficients: CompiledCase["coefficients"];
  /** Whether the coefficient of u_xy is the constant 0. */
  mixedZero: boolean;
  source: PointFn;
  exact: PointFn;
  ux: PointFn;
  uy: PointFn;
  fluxX: PointFn;
  fluxY: PointFn;
  boundary: Record<Side, CaseBoundary>;
  conservative?: Record<(typeof CONSERVATIVE_TERMS)[number], PointFn>;
}

/** A compiled case with what the checks need. */
interface Assembled {
  compiled: CompiledCase;
  regions: RegionFunctions[];
  /** The fused lattice sampler (one region, non-conservative form only). */
  fill?: LatticeFill;
}

/**
 * Compiles a derivation into a case (no mathjs: the readable formulas come from `readable`, called
 * on first use of `formulas` or `tex`).
 */
function assemble(
  caseFile: CaseFile,
  origin: string,
  parameters: Record<string, number>,
  derivation: Derivation,
  readable: () => ReadableFormulas,
): Assembled {
  const domain = { ...caseFile.domain };
  const { interfaces, form } = derivation;
  const conservative = form === "conservative";
  const grid = { mappings: mappingsFromData(derivation.mappings ?? {}) };
  const regionExprs = derivation.regions;
  const expressions: RegionExpressions[] = regionExprs.map((e) => ({
    exact: e.exact,
    ux: e.ux,
    uy: e.uy,
    source: e.source,
    coefficients: Object.fromEntries(
      GENERAL_TERMS.map((k, n) => [k, e.coefficients[n]]),
    ) as RegionExpressions["coefficients"],
    ...(conservative
      ? {
        conservative: Object.fromEntries(
          CONSERVATIVE_TERMS.map((k, n) => [k, e.conservative[n]]),
        ) as NonNullable<RegionExpressions["conservative"]>,
      }
      : {}),
    boundary: e.boundary,
    robin: derivation.robin,
  }));
  const regions: RegionFunctions[] = regionExprs.map((e) => {
    const [a, b, c, dd, ee, m] = e.coefficients.map(compileExpr);
    const boundary = {} as Record<Side, CaseBoundary>;
    for (const side of SIDES) {
      const spec = caseFile.boundary[side];
      const data = compileExpr(e.boundary[side]);
      const weights = derivation.robin[side];
      boundary[side] = spec.kind === "robin" && weights
        ? {
          kind: "robin",
          alpha: compileExpr(weights.alpha),
          beta: compileExpr(weights.beta),
          weightsText: { alpha: String(spec.alpha ?? 0), beta: String(spec.beta ?? 0) },
          weightsVary: !involvesNoPoint(weights.alpha) || !involvesNoPoint(weights.beta),
          data,
        }
        : { kind: spec.kind, data };
    }
    const mExpr = e.coefficients[5];
    const own: RegionFunctions = {
      coefficients: { a, b, c, d: dd, e: ee, m },
      mixedZero: involvesNoPoint(mExpr) && m(0, 0) === 0,
      source: compileExpr(e.source),
      exact: compileExpr(e.exact),
      ux: compileExpr(e.ux),
      uy: compileExpr(e.uy),
      fluxX: compileExpr(e.fluxX),
      fluxY: compileExpr(e.fluxY),
      boundary,
    };
    if (conservative) {
      const fns = e.conservative.map(compileExpr);
      own.conservative = Object.fromEntries(
        CONSERVATIVE_TERMS.map((k, n) => [k, fns[n]]),
      ) as Record<
        (typeof CONSERVATIVE_TERMS)[number],
        PointFn
      >;
    }
    return own;
  });
  const piece = (pick: (r: RegionFunctions) => PointFn) =>
    piecewiseMean(regions.map(pick), interfaces, domain);
  const coefficients = {
    a: piece((r) => r.coefficients.a),
    b: piece((r) => r.coefficients.b),
    c: piece((r) => r.coefficients.c),
    d: piece((r) => r.coefficients.d),
    e: piece((r) => r.coefficients.e),
    m: piece((r) => r.coefficients.m),
  };
  const constantIn = (exprs: Expr[], fns: PointFn[]): number | undefined => {
    if (!exprs.every(involvesNoPoint)) return undefined;
    const values = fns.map((f) => f(0, 0));
    return values.every((v) => v === values[0]) ? values[0] : undefined;
  };
  const constantCoefficients: CompiledCase["constantCoefficients"] = {};
  GENERAL_TERMS.forEach((name, k) => {
    const value = constantIn(
      regionExprs.map((e) => e.coefficients[k]),
      regions.map((r) => r.coefficients[name]),
    );
    if (value !== undefined) constantCoefficients[name] = value;
  });
  const boundary = {} as Record<Side, CaseBoundary>;
  for (const side of SIDES) {
    const first = regions[0].boundary[side];
    boundary[side] = { ...first, data: piece((r) => r.boundary[side].data) };
  }
  let conservativeTerms: ConservativeTerms | undefined;
  if (conservative) {
    const term = (k: (typeof CONSERVATIVE_TERMS)[number]) => regions.map((r) => r.conservative![k]);
    const constant: ConservativeTerms["constant"] = {};
    CONSERVATIVE_TERMS.forEach((name, k) => {
      const value = constantIn(regionExprs.map((e) => e.conservative[k]), term(name));
      if (value !== undefined) constant[name] = value;
    });
    conservativeTerms = {
      k11: piece((r) => r.conservative!.k11),
      k12: piece((r) => r.conservative!.k12),
      k22: piece((r) => r.conservative!.k22),
      bx: piece((r) => r.conservative!.bx),
      by: piece((r) => r.conservative!.by),
      sigma: piece((r) => r.conservative!.sigma),
      faceX: {
        k11: faceConductivity(term("k11"), interfaces, domain, "x"),
        k12: piece((r) => r.conservative!.k12),
      },
      faceY: {
        k12: piece((r) => r.conservative!.k12),
        k22: faceConductivity(term("k22"), interfaces, domain, "y"),
      },
      constant,
    };
  }
  const source = piece((r) => r.source);
  const exact = piece((r) => r.exact);
  const mixedZero = constantCoefficients.m === 0;
  // The fused row sampler: one region of the non-conservative form without the mixed term (every
  // case before the forms existed) keeps the fast path, workers included.
  const fused = regions.length === 1 && !conservative;
  const problemSampler = fused
    ? compileRowSampler([...regionExprs[0].coefficients.slice(0, 5), regionExprs[0].source])
    : undefined;
  const exactSampler = fused ? compileRowSampler([regionExprs[0].exact]) : undefined;
  const spec: SamplerSpec = {
    id: caseFile.id,
    origin,
    domain,
    ...(problemSampler ? { problemSampler } : {}),
    pointFunctions: conservativeTerms
      ? {
        a: conservativeTerms.k11,
        b: conservativeTerms.bx,
        c: conservativeTerms.k22,
        d: conservativeTerms.by,
        e: conservativeTerms.sigma,
        f: source,
      }
      : { ...coefficients, f: source },
    ...(mixedZero && !conservative ? {} : conservative ? {} : { mixed: coefficients.m }),
    ...(conservativeTerms
      ? {
        mixed: conservativeTerms.constant.k12 === 0
          ? undefined
          : ((x: number, y: number) => 2 * conservativeTerms!.k12(x, y)),
        conductivity: {
          faceX: conservativeTerms.faceX,
          faceY: conservativeTerms.faceY,
          tensor: conservativeTerms.constant.k12 !== 0,
        },
      }
      : {}),
    boundary,
  };
  if (spec.mixed === undefined) delete spec.mixed;
  const intervalRatio = caseFile.intervalRatio ?? 1;
  // Without convection (b ≡ d ≡ 0) upwinding changes nothing: the upwind scheme is the central
  // scheme, so it is expected to behave exactly like it (exact identity of the stencils).
  const noConvection = derivation.noConvection;
  const expected: Record<"central" | "upwind", ExpectedOrder> = {
    central: caseFile.expected.central,
    upwind: noConvection
      ? { ...caseFile.expected.central }
      : caseFile.expected.upwind ?? { formal: 1 },
  };
  // a stretched family samples at the mapped nodes, point by point (sample_stretched.ts)
  const stretched = Object.values(grid.mappings).some((m) => m.kind !== "uniform");
  const compiled: CompiledCase = {
    ...(derivation.singular ? { singular: true } : {}),
    ...(stretched ? { mappings: { ...grid.mappings } } : {}),
    id: caseFile.id,
    title: caseFile.title,
    motivation: caseFile.motivation,
    manufactured: caseFile.manufactured,
    file: structuredClone(caseFile),
    origin,
    form,
    interfaces: { x: [...interfaces.x], y: [...interfaces.y] },
    domain: { ...domain },
    parameters,
    expected,
    tags: [...caseFile.tags],
    grids: [...caseFile.grids],
    intervalRatio,
    exact,
    exactDx: piece((r) => r.ux),
    exactDy: piece((r) => r.uy),
    coefficients,
    constantCoefficients,
    ...(conservativeTerms ? { conservative: conservativeTerms } : {}),
    expressions,
    source,
    boundary,
    get formulas() {
      return readable().text;
    },
    get tex() {
      return readable().tex;
    },
    gridMisses: (nx: number, ny: number) => gridMisses(interfaces, domain, nx, ny),
    gridFor: (n: number) => ({ nx: n, ny: Math.max(2, Math.round(n * intervalRatio)) }),
    sample: (nx: number, ny: number) =>
      stretched
        ? sampleStretched(spec, makeGrid(domain, "vertex", { x: nx, y: ny }, grid.mappings))
        : sampleProblem(spec, nx, ny),
    sampleAsync: (nx: number, ny: number, opts?: { threads?: number; minNodes?: number }) =>
      stretched
        ? Promise.resolve(compiled.sample(nx, ny))
        : sampleProblemParallel(spec, nx, ny, opts),
    sampleExact: (nx: number, ny: number) => {
      checkGridSize(nx, ny);
      if (stretched) {
        const lines = makeGrid(domain, "vertex", { x: nx, y: ny }, grid.mappings).lines;
        return onLattice(exact, lines.x, lines.y);
      }
      const out = new Float64Array((nx + 1) * (ny + 1));
      const hx = (domain.x1 - domain.x0) / nx;
      const hy = (domain.y1 - domain.y0) / ny;
      if (exactSampler) exactSampler.run(domain.x0, hx, nx, domain.y0, hy, 0, ny + 1, [out]);
      else {
        for (let j = 0, k = 0; j <= ny; j++) {
          for (let i = 0; i <= nx; i++, k++) out[k] = exact(domain.x0 + i * hx, domain.y0 + j * hy);
        }
      }
      return out;
    },
  };
  if (caseFile.solver) compiled.solver = { ...caseFile.solver };
  if (!problemSampler || !exactSampler) return { compiled, regions };
  // the check lattices are sampled by the same compiled samplers as the study grids
  const fill: LatticeFill = (x0, hx, nx, y0, hy, ny, outputs) => {
    problemSampler.run(x0, hx, nx, y0, hy, 0, ny + 1, outputs.slice(0, 6));
    exactSampler.run(x0, hx, nx, y0, hy, 0, ny + 1, [outputs[6]]);
  };
  return { compiled, regions, fill };
}

function formulasOf(
  math: MathTools,
  trees: CaseTrees,
  simple: DerivedRegion[],
  render: (n: MathNode) => string,
): CaseFormulas {
  const d0 = simple[0];
  const out: CaseFormulas = {
    a: render(d0.expanded.a),
    b: render(d0.expanded.b),
    c: render(d0.expanded.c),
    d: render(d0.expanded.d),
    e: render(d0.expanded.e),
    exact: render(trees.regions[0].exact),
    source: render(d0.source),
    boundary: {
      west: render(d0.boundary.west),
      east: render(d0.boundary.east),
      south: render(d0.boundary.south),
      north: render(d0.boundary.north),
    },
  };
  if (!isZeroTree(math, d0.expanded.m)) out.m = render(d0.expanded.m);
  const op0 = trees.regions[0].op;
  if (op0.form === "conservative") {
    out.conservative = {
      k11: render(op0.k11),
      k12: render(op0.k12),
      k22: render(op0.k22),
      bx: render(op0.bx),
      by: render(op0.by),
      sigma: render(op0.sigma),
    };
  }
  if (simple.length > 1) {
    out.regions = simple.map((d, r) => {
      const op = trees.regions[r].op;
      return {
        exact: render(trees.regions[r].exact),
        source: render(d.source),
        ...(op.form === "conservative"
          ? { k11: render(op.k11), k12: render(op.k12), k22: render(op.k22) }
          : {}),
      };
    });
  }
  return out;
}

/** The readable formulas of a case: its trees derived again and simplified by mathjs (slow). */
function readableFormulas(
  math: MathTools,
  trees: CaseTrees,
  _caseFile: CaseFile,
): ReadableFormulas {
  const simple = trees.regions.map((r) =>
    deriveRegion(math, r.op, r.exact, trees.sides, { simplify: true })
  );
  return {
    text: formulasOf(math, trees, simple, (n) => n.toString()),
    tex: formulasOf(math, trees, simple, (n) => n.toTex()),
  };
}

/**
 * Compiles a case from a derivation made (and checked) by {@link buildCase} in another thread,
 * without mathjs and without checking again: the pool workers' way to a case. The readable
 * formulas are not available there (asking for them throws an Error).
 *
 * @param caseFile the case's validated file (`CompiledCase.file`)
 * @param derivation the case's derivation (`derivationOf` of the built case)
 * @param options the case's origin and its merged parameter values (`CompiledCase.parameters`)
 */
export function compileDerivation(
  caseFile: CaseFile,
  derivation: Derivation,
  options: { origin: string; parameters: Record<string, number> },
): CompiledCase {
  const { compiled } = assemble(caseFile, options.origin, options.parameters, derivation, () => {
    throw new Error(
      `the readable formulas of case "${caseFile.id}" are made in the main thread, not in a worker`,
    );
  });
  rememberDerivation(compiled, derivation);
  return compiled;
}
