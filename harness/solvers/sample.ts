/**
 * Samples a compiled case at the points a layout needs for a solve request: grid nodes (vertex
 * layout, through the case's own `sample`) or cell centres with boundary data at the centres of
 * the boundary faces (cell layout).
 *
 * @module
 */
import type { CompiledCase, PointFn } from "../../cases/types.ts";
import { SIDES } from "../../reference-solver/mod.ts";
import type { ExpressionTexts, SampledProblem, SampledSide, SideName } from "../protocol/mod.ts";

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
 * p.source.length; // 64
 * ```
 */
/** The constant coefficients among the five a request carries (the mixed term m is not one). */
function protocolConstants(compiled: CompiledCase): SampledProblem["constantCoefficients"] {
  const { m: _m, ...five } = compiled.constantCoefficients;
  return five;
}

export function sampleCase(
  compiled: CompiledCase,
  nx: number,
  ny: number,
  layout: "vertex" | "cell",
): SampledProblem {
  if (layout === "vertex") {
    const p = compiled.sample(nx, ny);
    const boundary = {} as Record<SideName, SampledSide>;
    for (const side of SIDES) boundary[side] = { ...p.boundary[side] };
    return {
      domain: { ...p.domain },
      nx: p.nx,
      ny: p.ny,
      layout,
      coefficients: { a: p.a, b: p.b, c: p.c, d: p.d, e: p.e },
      source: p.f,
      boundary,
      constantCoefficients: protocolConstants(compiled),
    };
  }
  return sampleCells(compiled, nx, ny);
}

function sampleCells(compiled: CompiledCase, nx: number, ny: number): SampledProblem {
  if (!(Number.isInteger(nx) && Number.isInteger(ny) && nx >= 1 && ny >= 1)) {
    throw new RangeError(`cell grid must have whole numbers of cells ≥ 1, got ${nx}×${ny}`);
  }
  const { x0, x1, y0, y1 } = compiled.domain;
  const hx = (x1 - x0) / nx;
  const hy = (y1 - y0) / ny;
  const n = nx * ny;
  const k = compiled.coefficients;
  const fns: [string, PointFn][] = [["a", k.a], ["b", k.b], ["c", k.c], ["d", k.d], ["e", k.e], [
    "f",
    compiled.source,
  ]];
  const arrays = fns.map(() => new Float64Array(n));
  for (let j = 0; j < ny; j++) {
    const y = y0 + (j + 0.5) * hy;
    for (let i = 0; i < nx; i++) {
      const x = x0 + (i + 0.5) * hx;
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
  const boundary = {} as Record<SideName, SampledSide>;
  for (const side of SIDES) {
    const bc = compiled.boundary[side];
    const vertical = side === "west" || side === "east";
    const count = vertical ? ny : nx;
    const values = new Float64Array(count);
    for (let m = 0; m < count; m++) {
      const x = vertical ? (side === "west" ? x0 : x1) : x0 + (m + 0.5) * hx;
      const y = vertical ? y0 + (m + 0.5) * hy : (side === "south" ? y0 : y1);
      const v = bc.data(x, y);
      if (!Number.isFinite(v)) {
        throw new RangeError(
          `case ${compiled.id}: boundary data on ${side} is ${v} at face centre (${x}, ${y})`,
        );
      }
      values[m] = v;
    }
    boundary[side] = bc.kind === "robin"
      ? { kind: "robin", alpha: bc.alpha, beta: bc.beta, values }
      : { kind: bc.kind, values };
  }
  const [a, b, c, d, e, f] = arrays;
  return {
    domain: { x0, x1, y0, y1 },
    nx,
    ny,
    layout: "cell",
    coefficients: { a, b, c, d, e },
    source: f,
    boundary,
    constantCoefficients: protocolConstants(compiled),
  };
}

/**
 * The expressions a request carries for solvers that evaluate them: the operator, the source and
 * the boundary data — never the exact solution (docs/protocol.md).
 *
 * @param formulas a compiled case's formulas
 * @returns the expression texts of a solve request
 */
export function expressionTexts(formulas: CompiledCase["formulas"]): ExpressionTexts {
  const { a, b, c, d, e, source } = formulas;
  return { a, b, c, d, e, source, boundary: { ...formulas.boundary } };
}
