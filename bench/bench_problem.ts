/**
 * The benchmark problem of the reference solver (issue 2, "Speed"), sampled by hand because the
 * case engine is not used here: unit square, Dirichlet sides,
 * a = 1 + 0.5·sin(2πx)·sin(2πy), b = d = 0, c = 1 + 0.25·cos(πxy), e = −(1 + xy),
 * exact u = sin(πx)·sin(πy)·exp(xy), f = a·u_xx + c·u_yy + e·u with, by hand (E = exp(xy)):
 *
 *   u_xx = E·sin(πy)·(−π²·sin(πx) + 2πy·cos(πx) + y²·sin(πx))
 *   u_yy = E·sin(πx)·(−π²·sin(πy) + 2πx·cos(πy) + x²·sin(πy))
 *
 * (checked against central finite differences of u in `bench_problem_test.ts`).
 *
 * @module
 */
import type { Problem } from "../reference-solver/mod.ts";

const PI = Math.PI;

/** The exact solution u(x, y). */
export function exactU(x: number, y: number): number {
  return Math.sin(PI * x) * Math.sin(PI * y) * Math.exp(x * y);
}

/** The coefficients (a, c, e) at (x, y). */
export function coefficients(x: number, y: number): { a: number; c: number; e: number } {
  return {
    a: 1 + 0.5 * Math.sin(2 * PI * x) * Math.sin(2 * PI * y),
    c: 1 + 0.25 * Math.cos(PI * x * y),
    e: -(1 + x * y),
  };
}

/** u_xx and u_yy of the exact solution, derived by hand (module doc). */
export function secondDerivatives(x: number, y: number): { uxx: number; uyy: number } {
  const E = Math.exp(x * y);
  const sx = Math.sin(PI * x), sy = Math.sin(PI * y), cx = Math.cos(PI * x), cy = Math.cos(PI * y);
  return {
    uxx: E * sy * (-PI * PI * sx + 2 * PI * y * cx + y * y * sx),
    uyy: E * sx * (-PI * PI * sy + 2 * PI * x * cy + x * x * sy),
  };
}

/** f = L u at (x, y). */
export function source(x: number, y: number): number {
  const { a, c, e } = coefficients(x, y);
  const { uxx, uyy } = secondDerivatives(x, y);
  return a * uxx + c * uyy + e * exactU(x, y);
}

/**
 * Samples the benchmark problem on an n × n grid of the unit square.
 *
 * @example
 * ```ts
 * import { benchProblem } from "./bench_problem.ts";
 * const { problem, exact } = benchProblem(8);
 * if (problem.a.length !== 81 || exact.length !== 81) throw new Error("sizes");
 * ```
 */
export function benchProblem(n: number): { problem: Problem; exact: Float64Array } {
  const N = (n + 1) * (n + 1);
  const a = new Float64Array(N), c = new Float64Array(N), e = new Float64Array(N);
  const f = new Float64Array(N), exact = new Float64Array(N);
  for (let j = 0; j <= n; j++) {
    const y = j / n;
    for (let i = 0; i <= n; i++) {
      const x = i / n, q = j * (n + 1) + i;
      const co = coefficients(x, y);
      a[q] = co.a, c[q] = co.c, e[q] = co.e;
      f[q] = source(x, y);
      exact[q] = exactU(x, y);
    }
  }
  const zeros = () => ({ kind: "dirichlet" as const, values: new Float64Array(n + 1) });
  return {
    problem: {
      domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
      nx: n,
      ny: n,
      a,
      b: new Float64Array(N),
      c,
      d: new Float64Array(N),
      e,
      f,
      boundary: { west: zeros(), east: zeros(), south: zeros(), north: zeros() },
    },
    exact,
  };
}
