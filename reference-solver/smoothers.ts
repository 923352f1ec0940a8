/**
 * The smoother registry: each entry is a factory that does its setup once for a level and returns
 * a plain object `{ smooth(u, f, sweeps), describe() }` working in place on padded vectors.
 *
 * @module
 */
import { isNinePoint, type LevelOperator } from "./level.ts";
import type { SmootherName } from "./options.ts";
import {
  gaussSeidelSweep,
  jacobiSweep,
  lineFactors,
  lineXSweep,
  lineYSweep,
  redBlackSweep,
} from "./_kernels.ts";
import { redBlackSweeps } from "./_kernels_pipelined.ts";

/** A smoother bound to one level. */
export interface Smoother {
  /** Applies `sweeps` sweeps in place to u for the equations A·u = f (padded vectors). */
  smooth(u: Float64Array, f: Float64Array, sweeps: number): void;
  /** Plain JSON record of the smoother and its parameters. */
  describe(): Record<string, unknown>;
}

/** Parameters a smoother may use. */
export interface SmootherParams {
  /** Weight of weighted Jacobi. Default: 0.8. */
  omega?: number;
}

/** Builds a smoother for a level. */
export type SmootherFactory = (level: LevelOperator, params: SmootherParams) => Smoother;

/**
 * Registered smoothers, by the names used in options, on the command line and in reports:
 * - `jacobi`: weighted Jacobi u ← u + ω·D⁻¹(f − A·u);
 * - `gauss-seidel`: lexicographic point Gauss–Seidel (x fastest);
 * - `red-black`: red–black point Gauss–Seidel, red (i + j even) first; on a nine-point level
 *   (corner couplings) a four-colour Gauss–Seidel with the colours (i mod 2, j mod 2), since two
 *   colours no longer decouple;
 * - `line-x` / `line-y`: lexicographic line Gauss–Seidel, each x-line (row) / y-line (column)
 *   solved exactly by the Thomas algorithm;
 * - `alternating-line`: zebra x-lines (even rows, then odd) followed by zebra y-lines (even
 *   columns, then odd) — one sweep does both directions.
 *
 * Every smoother works on five- and nine-point levels alike: the point smoothers use the whole
 * stencil, the line smoothers solve the tridiagonal part along the line and take the other
 * couplings (including the corners) with the current values.
 */
export const SMOOTHERS = {
  "jacobi": (level, params) => {
    const omega = params.omega ?? 0.8;
    const tmp = level.vector();
    return {
      smooth(u, f, sweeps) {
        for (let s = 0; s < sweeps; s++) jacobiSweep(level, u, f, omega, tmp);
      },
      describe: () => ({ name: "jacobi", omega }),
    };
  },
  "gauss-seidel": (level) => ({
    smooth(u, f, sweeps) {
      for (let s = 0; s < sweeps; s++) gaussSeidelSweep(level, u, f);
    },
    describe: () => ({ name: "gauss-seidel", order: "lexicographic" }),
  }),
  "red-black": (level) => ({
    smooth(u, f, sweeps) {
      // Five-point: all sweeps in one pass over memory (`_kernels_pipelined.ts`, same result).
      if (!isNinePoint(level)) return redBlackSweeps(level, u, f, sweeps);
      for (let s = 0; s < sweeps; s++) redBlackSweep(level, u, f);
    },
    describe: () =>
      isNinePoint(level)
        ? { name: "red-black", order: "four colours (i mod 2, j mod 2) on this nine-point level" }
        : { name: "red-black", order: "red (i+j even) first" },
  }),
  "line-x": (level) => {
    const fac = lineFactors(level, "x");
    return {
      smooth(u, f, sweeps) {
        for (let s = 0; s < sweeps; s++) lineXSweep(level, u, f, fac, 0, 1);
      },
      describe: () => ({ name: "line-x", order: "lexicographic rows" }),
    };
  },
  "line-y": (level) => {
    const fac = lineFactors(level, "y");
    return {
      smooth(u, f, sweeps) {
        for (let s = 0; s < sweeps; s++) lineYSweep(level, u, f, fac, 0, 1);
      },
      describe: () => ({ name: "line-y", order: "lexicographic columns" }),
    };
  },
  "alternating-line": (level) => {
    const fx = lineFactors(level, "x"), fy = lineFactors(level, "y");
    return {
      smooth(u, f, sweeps) {
        for (let s = 0; s < sweeps; s++) {
          lineXSweep(level, u, f, fx, 0, 2);
          lineXSweep(level, u, f, fx, 1, 2);
          lineYSweep(level, u, f, fy, 0, 2);
          lineYSweep(level, u, f, fy, 1, 2);
        }
      },
      describe: () => ({ name: "alternating-line", order: "zebra x-lines, then zebra y-lines" }),
    };
  },
} satisfies Record<SmootherName, SmootherFactory>;

/**
 * Builds the named smoother for a level.
 *
 * @param name A key of {@link SMOOTHERS}.
 * @param level The level operator (e.g. from `buildLevel`).
 * @param params Smoother parameters (`omega` for Jacobi, default 0.8).
 * @returns The smoother, set up once.
 * @throws {RangeError} For an unknown name, listing the valid ones.
 *
 * @example
 * ```ts
 * import { createSmoother } from "./smoothers.ts";
 * import { buildLevel } from "./hierarchy.ts";
 * const n = 8, N = (n + 1) ** 2, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
 * const level = buildLevel({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * const u = level.vector();
 * createSmoother("red-black", level).smooth(u, level.vector(), 1);
 * ```
 */
export function createSmoother(
  name: SmootherName,
  level: LevelOperator,
  params: SmootherParams = {},
): Smoother {
  const factory = (SMOOTHERS as Record<string, SmootherFactory>)[name];
  if (factory === undefined) {
    throw new RangeError(
      `Unknown smoother ${JSON.stringify(name)}: valid names are ${
        Object.keys(SMOOTHERS).join(", ")
      }`,
    );
  }
  return factory(level, params);
}
