/**
 * Measures the asymptotic convergence factor of a multigrid iteration the usual way: solve the
 * homogeneous problem (f = 0, zero Dirichlet data, exact solution 0) from a random initial error,
 * run many cycles and take the geometric mean of the late per-cycle residual reduction factors. The
 * iterate is the error itself; every few dozen cycles it is rescaled to unit size and the solve is
 * restarted from it (a power iteration), so long runs never reach underflow.
 *
 * @module
 */
import { type Problem, solve, type SolveOptions } from "../../reference-solver/mod.ts";

/** The homogeneous model problem a·u_xx + c·u_yy = 0 on the unit square, zero Dirichlet sides. */
export function homogeneousProblem(n: number, a = 1, c = 1): Problem {
  const count = (n + 1) * (n + 1);
  const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx: n,
    ny: n,
    a: new Float64Array(count).fill(a),
    b: new Float64Array(count),
    c: new Float64Array(count).fill(c),
    d: new Float64Array(count),
    e: new Float64Array(count),
    f: new Float64Array(count),
    boundary: { west: bc, east: bc, south: bc, north: bc },
  };
}

/** Uniform random values in [−½, ½) at interior nodes, zero on the boundary (seeded LCG). */
export function randomInterior(nx: number, ny: number, seed: number): Float64Array {
  let s = seed >>> 0;
  const out = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 1; j < ny; j++) {
    for (let i = 1; i < nx; i++) {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      out[j * (nx + 1) + i] = s / 2 ** 32 - 0.5;
    }
  }
  return out;
}

/** Result of a factor measurement. */
export interface FactorMeasurement {
  /** Geometric mean of the per-cycle factors of the last round. */
  factor: number;
  /** Per-cycle factors of the last round (for messages). */
  lastFactors: number[];
  /** Levels of the hierarchy used. */
  levels: number;
}

/**
 * Asymptotic factor of the iteration `options` on a homogeneous problem.
 *
 * @param problem A problem with f = 0 and zero Dirichlet data (exact solution 0).
 * @param options Solver options (the stop rule is replaced).
 * @param run `rounds` restarts of `cycles` cycles each (default 3 × 40); the factor is the
 * geometric mean over the last `tail` cycles of the last round (default 10).
 */
export function measureFactor(
  problem: Problem,
  options: SolveOptions,
  run: { rounds?: number; cycles?: number; tail?: number; seed?: number } = {},
): FactorMeasurement {
  const rounds = run.rounds ?? 3;
  const cycles = run.cycles ?? 40;
  const tail = run.tail ?? 10;
  let guess = randomInterior(problem.nx, problem.ny, run.seed ?? 12345);
  let factors: number[] = [];
  let levels = 0;
  for (let round = 0; round < rounds; round++) {
    const result = solve(problem, {
      ...options,
      initialGuess: guess,
      // no tolerance can be met before maxCycles for factors above 1e-5 (0.0001^40 ≫ 1e-200)
      stop: { tolerance: 1e-200, maxCycles: cycles },
    });
    const h = result.residualHistory;
    factors = h.slice(1).map((v, k) => v / h[k]);
    levels = result.description.levels.length;
    const scale = result.solution.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
    if (!(scale > 0) || !Number.isFinite(scale)) break;
    guess = result.solution.map((v) => v / scale);
  }
  const late = factors.slice(-tail);
  const factor = Math.exp(late.reduce((s, v) => s + Math.log(v), 0) / late.length);
  return { factor, lastFactors: late, levels };
}
