/**
 * Samples a compiled case at the points a layout needs for a solve request, into gridproof's one
 * sampled-problem type (`problem/`): grid nodes (vertex layout: the case's own `sample`, as it
 * is) or cell centres with boundary data at the centres of the boundary faces (cell layout, built
 * here in the same shape). The mixed term u_xy and the conservative form's K at the flux faces
 * (from the case's own face values) come along for protocol version 2; the request writer maps
 * the problem to the wire.
 *
 * @module
 */
import type { CompiledCase, ConservativeTerms, PointFn } from "../../cases/types.ts";
import { caseGrid, isStretchedCase } from "../../cases/mod.ts";
import {
  type BoundaryCondition,
  type Conductivity,
  type SampledProblem,
  type Side,
  SIDES,
} from "../../problem/mod.ts";
import type { ExpressionTexts } from "../protocol/mod.ts";

/**
 * Samples a case for a request on the given layout.
 *
 * @param compiled the case
 * @param nx intervals (vertex) or cells (cell) along x
 * @param ny intervals or cells along y
 * @param layout "vertex" (nodes, boundary data at the side's nodes) or "cell" (centres, boundary
 *   data at face centres)
 * @returns the arrays of a request, x fastest
 * @throws RangeError when the case is not elliptic or not finite at a point (naming the point)
 *
 * @example
 * ```ts ignore
 * import { sampleCase } from "./sample.ts";
 * const p = sampleCase(myCase, 8, 8, "cell");
 * p.f.length; // 64
 * ```
 */
export function sampleCase(
  compiled: CompiledCase,
  nx: number,
  ny: number,
  layout: "vertex" | "cell",
): SampledProblem {
  const misses = compiled.gridMisses(nx, ny);
  if (misses !== null) {
    throw new RangeError(
      `case ${compiled.id}: the ${nx}×${ny} grid does not suit the case: ${misses}; ` +
        `choose grids that put every interface on a grid line`,
    );
  }
  // the vertex layout: the case's own sample as it is, stated as such
  const problem: SampledProblem = layout === "vertex"
    ? { ...compiled.sample(nx, ny), layout: "vertex" }
    : sampleCells(compiled, nx, ny);
  if (compiled.form === "conservative") {
    problem.form = "conservative";
    problem.interfaces = { x: [...compiled.interfaces.x], y: [...compiled.interfaces.y] };
    // the case's constants are those of the expanded operator, not of K, β and σ
    problem.constantCoefficients = {};
  } else {
    problem.form = "non-conservative";
    problem.constantCoefficients = { ...compiled.constantCoefficients };
  }
  if (compiled.singular) problem.singular = true;
  return problem;
}

/**
 * Why a solver that speaks protocol 1 cannot be sent the case (the conservative form, a mixed
 * term), or undefined when it can.
 *
 * @param compiled the case
 * @returns the reason, naming the way out, or undefined
 */
export function version1Refusal(compiled: CompiledCase): string | undefined {
  const varying = SIDES.find((s) => compiled.boundary[s].weightsVary === true);
  const periodic = SIDES.find((s) => compiled.boundary[s].kind === "periodic");
  const missing = compiled.form === "conservative"
    ? "no conservative form"
    : isStretchedCase(compiled)
    ? "no stretched grids (grid coordinates)"
    : periodic !== undefined
    ? `no periodic sides (${periodic})`
    : !noMixedTerm(compiled)
    ? "no mixed term (u_xy)"
    : varying !== undefined
    ? `no Robin weights that vary along a side (${varying})`
    : undefined;
  if (missing === undefined) return undefined;
  return `the solver speaks protocol 1, which has ${missing}; see docs/protocol.md, ` +
    `"Moving to version 2"`;
}

/** true when the case's mixed term is 0 everywhere. */
function noMixedTerm(compiled: CompiledCase): boolean {
  return compiled.constantCoefficients.m === 0 ||
    (compiled.formulas.m === undefined && compiled.constantCoefficients.m === undefined);
}

/** Values of `fn` at the points of a layout, x fastest. */
function atPoints(
  fn: PointFn,
  compiled: CompiledCase,
  nx: number,
  ny: number,
  layout: "vertex" | "cell",
): Float64Array {
  const at = axesOf(compiled, nx, ny);
  return layout === "cell"
    ? lattice(fn, compiled, at.cx, at.cy, "cell point")
    : lattice(fn, compiled, at.fx, at.fy, "vertex point");
}

/**
 * The coordinates of one axis' lines (faces, nodes: `fx`, `fy`) and cell centres (`cx`, `cy`):
 * x0 + i·hx and x0 + (i + ½)·hx on uniform grids, the mapped lines and the midpoints of
 * neighbouring lines on a stretched family.
 */
function axesOf(compiled: CompiledCase, nx: number, ny: number) {
  if (isStretchedCase(compiled)) {
    const { x, y } = caseGrid(compiled, nx, ny, "cell").lines;
    const mid = (l: Float64Array) =>
      Float64Array.from({ length: l.length - 1 }, (_, i) => (l[i] + l[i + 1]) / 2);
    return { fx: x, fy: y, cx: mid(x), cy: mid(y) };
  }
  const { x0, x1, y0, y1 } = compiled.domain;
  const hx = (x1 - x0) / nx;
  const hy = (y1 - y0) / ny;
  const at = (o: number, h: number, shift: number, n: number) =>
    Float64Array.from({ length: n }, (_, i) => o + (i + shift) * h);
  return {
    fx: at(x0, hx, 0, nx + 1),
    fy: at(y0, hy, 0, ny + 1),
    cx: at(x0, hx, 0.5, nx),
    cy: at(y0, hy, 0.5, ny),
  };
}

/**
 * Values of `fn` at (xs[i], ys[j]) (x fastest); a value that is not finite is an error naming
 * the point.
 */
function lattice(
  fn: PointFn,
  compiled: CompiledCase,
  xs: Float64Array,
  ys: Float64Array,
  what: string,
): Float64Array {
  const out = new Float64Array(xs.length * ys.length);
  for (let j = 0, k = 0; j < ys.length; j++) {
    const y = ys[j];
    for (let i = 0; i < xs.length; i++, k++) {
      const x = xs[i];
      const v = fn(x, y);
      if (!Number.isFinite(v)) {
        throw new RangeError(
          `case ${compiled.id}: a coefficient is ${v} at the ${what} (${x}, ${y}); ` +
            `the case must be finite on the domain`,
        );
      }
      out[k] = v;
    }
  }
  return out;
}

/**
 * The conservative form on the cell layout: K at the cell centres (k11, k22 and m = 2·k12), K at
 * the x-faces ((nx + 1) × ny, at x_i, y_{j+½}: `alongX`) and the y-faces (nx × (ny + 1), at
 * x_{i+½}, y_j: `alongY`), taken from the case's face values (the effective value on an
 * interface). Checks that K is positive definite at every centre.
 */
function cellConductivity(
  compiled: CompiledCase,
  terms: ConservativeTerms,
  nx: number,
  ny: number,
): { k11: Float64Array; k22: Float64Array; m?: Float64Array; conductivity: Conductivity } {
  const centres = (fn: PointFn) => atPoints(fn, compiled, nx, ny, "cell");
  const at = axesOf(compiled, nx, ny);
  const xFaces = (fn: PointFn) => lattice(fn, compiled, at.fx, at.cy, "x-face");
  const yFaces = (fn: PointFn) => lattice(fn, compiled, at.cx, at.fy, "y-face");
  // k12 ≡ 0 (found symbolically): a diagonal K, no k12 arrays (absent means zero), as the vertex
  // sample does
  const tensor = terms.constant.k12 !== 0;
  const points = {
    k11: centres(terms.k11),
    k12: tensor ? centres(terms.k12) : new Float64Array(nx * ny),
    k22: centres(terms.k22),
  };
  const conductivity: Conductivity = {
    alongX: {
      k11: xFaces(terms.faceX.k11),
      ...(tensor ? { k12: xFaces(terms.faceX.k12) } : {}),
    },
    alongY: {
      ...(tensor ? { k12: yFaces(terms.faceY.k12) } : {}),
      k22: yFaces(terms.faceY.k22),
    },
  };
  for (let k = 0; k < points.k11.length; k++) {
    const k11 = points.k11[k];
    const k22 = points.k22[k];
    const k12 = points.k12[k];
    if (!(k11 > 0 && k11 * k22 - k12 * k12 > 0)) {
      throw new RangeError(
        `case ${compiled.id}: K is not positive definite at cell ${k % nx}, ` +
          `${Math.floor(k / nx)} (k11 = ${k11}, k12 = ${k12}, k22 = ${k22})`,
      );
    }
  }
  return {
    k11: points.k11,
    k22: points.k22,
    // m = 2·k12 at the centres, as the case's own vertex sample (halved exactly on the wire)
    ...(tensor ? { m: points.k12.map((v) => 2 * v) } : {}),
    conductivity,
  };
}

function sampleCells(compiled: CompiledCase, nx: number, ny: number): SampledProblem {
  if (!(Number.isInteger(nx) && Number.isInteger(ny) && nx >= 1 && ny >= 1)) {
    throw new RangeError(`cell grid must have whole numbers of cells ≥ 1, got ${nx}×${ny}`);
  }
  const terms = compiled.conservative;
  if (compiled.form === "conservative" && terms) {
    const k = cellConductivity(compiled, terms, nx, ny);
    const centres = (fn: PointFn) => atPoints(fn, compiled, nx, ny, "cell");
    return {
      domain: { ...compiled.domain },
      nx,
      ny,
      layout: "cell",
      a: k.k11,
      b: centres(terms.bx),
      c: k.k22,
      d: centres(terms.by),
      e: centres(terms.sigma),
      f: centres(compiled.source),
      ...(k.m ? { m: k.m } : {}),
      boundary: cellBoundary(compiled, nx, ny),
      conductivity: k.conductivity,
      ...(isStretchedCase(compiled) ? { coordinates: { ...linesOf(compiled, nx, ny) } } : {}),
    };
  }
  const { x0, x1, y0, y1 } = compiled.domain;
  const at = axesOf(compiled, nx, ny);
  const n = nx * ny;
  const k = compiled.coefficients;
  const fns: [string, PointFn][] = [["a", k.a], ["b", k.b], ["c", k.c], ["d", k.d], ["e", k.e], [
    "f",
    compiled.source,
  ]];
  const arrays = fns.map(() => new Float64Array(n));
  for (let j = 0; j < ny; j++) {
    const y = at.cy[j];
    for (let i = 0; i < nx; i++) {
      const x = at.cx[i];
      const idx = j * nx + i;
      for (let m = 0; m < fns.length; m++) {
        const v = fns[m][1](x, y);
        if (!Number.isFinite(v)) {
          throw new RangeError(
            `case ${compiled.id}: ${fns[m][0]} is ${v} at cell centre (${x}, ${y}); ` +
              `the case must be finite on the domain`,
          );
        }
        arrays[m][idx] = v;
      }
      if (!(arrays[0][idx] * arrays[2][idx] > 0)) {
        throw new RangeError(
          `case ${compiled.id}: not elliptic at cell centre (${x}, ${y}): a·c = ` +
            `${arrays[0][idx] * arrays[2][idx]} must be > 0`,
        );
      }
    }
  }
  const m = noMixedTerm(compiled)
    ? undefined
    : atPoints(compiled.coefficients.m, compiled, nx, ny, "cell");
  if (m) {
    for (let idx = 0; idx < m.length; idx++) {
      const det = 4 * arrays[0][idx] * arrays[2][idx] - m[idx] * m[idx];
      if (!(det > 0)) {
        throw new RangeError(
          `case ${compiled.id}: not elliptic at cell ${idx % nx}, ${Math.floor(idx / nx)}: ` +
            `4ac − m² = ${det} must be > 0`,
        );
      }
    }
  }
  const [a, b, c, d, e, f] = arrays;
  return {
    domain: { x0, x1, y0, y1 },
    nx,
    ny,
    layout: "cell",
    a,
    b,
    c,
    d,
    e,
    f,
    boundary: cellBoundary(compiled, nx, ny),
    ...(m ? { m } : {}),
    ...(isStretchedCase(compiled) ? { coordinates: { x: at.fx, y: at.fy } } : {}),
  };
}

/** The face lines of a stretched cell grid. */
function linesOf(compiled: CompiledCase, nx: number, ny: number) {
  const { fx, fy } = axesOf(compiled, nx, ny);
  return { x: fx, y: fy };
}

/** Boundary data at the centres of the boundary faces (the cell layout's). */
function cellBoundary(
  compiled: CompiledCase,
  nx: number,
  ny: number,
): Record<Side, BoundaryCondition> {
  const { x0, x1, y0, y1 } = compiled.domain;
  const at = axesOf(compiled, nx, ny);
  const boundary = {} as Record<Side, BoundaryCondition>;
  for (const side of SIDES) {
    const bc = compiled.boundary[side];
    if (bc.kind === "periodic") {
      boundary[side] = { kind: "periodic" };
      continue;
    }
    const vertical = side === "west" || side === "east";
    const count = vertical ? ny : nx;
    const robin = bc.kind === "robin";
    const values = new Float64Array(count);
    const alpha = new Float64Array(robin ? count : 0), beta = new Float64Array(robin ? count : 0);
    for (let m = 0; m < count; m++) {
      const x = vertical ? (side === "west" ? x0 : x1) : at.cx[m];
      const y = vertical ? at.cy[m] : (side === "south" ? y0 : y1);
      const v = bc.data(x, y);
      if (!Number.isFinite(v)) {
        throw new RangeError(
          `case ${compiled.id}: boundary data on ${side} is ${v} at face centre (${x}, ${y})`,
        );
      }
      values[m] = v;
      if (robin) alpha[m] = bc.alpha!(x, y), beta[m] = bc.beta!(x, y);
    }
    boundary[side] = robin
      ? { kind: "robin", alpha, beta, values }
      : { kind: bc.kind as "dirichlet" | "neumann", values };
  }
  return boundary;
}

/**
 * The expressions a request carries for solvers that evaluate them: the operator, the source and
 * the boundary data — never the exact solution (docs/protocol.md). `m` comes when the case has
 * a mixed term; the conservative terms when the case has them and no interfaces (with
 * interfaces a term is piecewise, and only the sampled arrays describe it).
 *
 * @param formulas a compiled case's formulas
 * @returns the expression texts of a solve request
 */
export function expressionTexts(formulas: CompiledCase["formulas"]): ExpressionTexts {
  const { a, b, c, d, e, source } = formulas;
  const texts: ExpressionTexts = { a, b, c, d, e, source, boundary: { ...formulas.boundary } };
  if (formulas.m !== undefined) texts.m = formulas.m;
  // one text per term holds only without interfaces (the formulas show the first region)
  if (formulas.conservative && !formulas.regions) {
    texts.conservative = { ...formulas.conservative };
  }
  return texts;
}
