/**
 * Plain lexicographic successive over-relaxation on an assembled 5-point {@link Stencil}.
 *
 * Deliberately simple: each sweep costs O(N) and the number of sweeps grows like n (with the
 * near-optimal ω used here) or n² (ω = 1), so the work grows like N^1.5 or N² in the number of
 * unknowns N — the scaling study must show that.
 *
 * @module
 */
import type { Stencil } from "./stencil.ts";

/** Options of {@link sorSolve}. */
export interface SorOptions {
  /** Relaxation factor ω in (0, 2). Default: {@link estimateOmega} (all sides Dirichlet if not given). */
  omega?: number;
  /** Stop when ‖r‖₂/‖r₀‖₂ ≤ tolerance. Default: 1e-10. */
  tolerance?: number;
  /** Largest number of sweeps. Default: 1_000_000. */
  maxSweeps?: number;
  /** Stop (not converged) when the clock passes this `performance.now()` value. Default: none. */
  deadline?: number;
  /**
   * When ‖r‖₂ exceeds this multiple of ‖r₀‖₂: with the default ω, restart from the initial guess
   * with ω halfway to 1 (SOR with ω near 2 can diverge on a non-symmetric system); with a given ω
   * or at ω = 1, stop as diverged. Default: 1e4.
   */
  divergenceFactor?: number;
  /** Which sides are Dirichlet(-like), for the default ω. Default: all. */
  dirichletSides?: { west: boolean; east: boolean; south: boolean; north: boolean };
  /** Initial guess (copied). Default: the Dirichlet values on Dirichlet nodes, zero elsewhere. */
  initialGuess?: Float64Array;
}

/** What {@link sorSolve} returns; non-convergence is data. */
export interface SorResult {
  solution: Float64Array;
  converged: boolean;
  /**
   * "stagnated": below 1e-8·‖r₀‖₂ but no new lowest residual for max(500, 4·(nx + ny)) sweeps (the
   * round-off floor).
   */
  reason: "converged" | "max-sweeps" | "time-limit" | "diverged" | "stagnated";
  sweeps: number;
  /** ‖r‖₂ before the first sweep and after each sweep. */
  residualHistory: number[];
  /** The final relaxation factor. */
  omega: number;
  /** The relaxation factors abandoned because the residual blew up (sweeps stay in the history). */
  restarts: number[];
}

/**
 * The relaxation factor used when none is given: 2/(1 + √(1 − ρ²)) with ρ an estimate of the
 * Jacobi spectral radius from the averaged coefficients of a·u_xx + c·u_yy + e·u, the smoothest
 * mode of each direction being sin-like between two Dirichlet sides (angle π·h/L), a quarter wave
 * with one Dirichlet side (π·h/(2L)) and flat with none. For the Poisson problem on a square with
 * Dirichlet sides this is the classical optimum 2/(1 + sin(π/n)).
 *
 * @param s the assembled system (used for its grid and average diagonal weights)
 * @param dirichletSides which sides are Dirichlet(-like)
 */
export function estimateOmega(
  s: Stencil,
  dirichletSides: { west: boolean; east: boolean; south: boolean; north: boolean },
): number {
  const { nx, ny } = s;
  const angle = (n: number, d1: boolean, d2: boolean) =>
    d1 && d2 ? Math.PI / n : d1 || d2 ? Math.PI / (2 * n) : 0;
  const tx = angle(nx, dirichletSides.west, dirichletSides.east);
  const ty = angle(ny, dirichletSides.south, dirichletSides.north);
  // averages over the non-Dirichlet rows of the x and y neighbour weights and the diagonal
  let ax = 0, cy = 0, diag = 0, count = 0;
  for (let k = 0; k < s.cc.length; k++) {
    if (s.dirichlet[k]) continue;
    ax += Math.abs(s.cw[k] + s.ce[k]) / 2;
    cy += Math.abs(s.cs[k] + s.cn[k]) / 2;
    diag += Math.abs(s.cc[k]);
    count++;
  }
  if (count === 0) return 1;
  const rho = Math.min((2 * ax * Math.cos(tx) + 2 * cy * Math.cos(ty)) / diag, 1 - 1e-12);
  return 2 / (1 + Math.sqrt(1 - rho * rho));
}

/** ‖rhs − A·u‖₂ of the stencil system. */
export function residualNorm(s: Stencil, u: Float64Array): number {
  const { nx, ny, cc, cw, ce, cs, cn, rhs } = s;
  const w = nx + 1;
  let sum = 0;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = j * w + i;
      let au = cc[k] * u[k];
      if (i > 0) au += cw[k] * u[k - 1];
      if (i < nx) au += ce[k] * u[k + 1];
      if (j > 0) au += cs[k] * u[k - w];
      if (j < ny) au += cn[k] * u[k + w];
      const r = rhs[k] - au;
      sum += r * r;
    }
  }
  return Math.sqrt(sum);
}

/**
 * Solves the stencil system by SOR sweeps in x-fastest order until the relative residual reaches
 * the tolerance, the sweep limit or the deadline passes, or the residual blows up.
 *
 * @example
 * ```ts
 * import { assembleStencil } from "./stencil.ts";
 * import { sorSolve } from "./sor.ts";
 * // u_xx + u_yy = 0 on a 4×4 grid with u = 1 on every side: the solution is u ≡ 1
 * const n = 25, one = () => new Float64Array(n).fill(1), zero = () => new Float64Array(n);
 * const side = { kind: "dirichlet" as const, values: new Float64Array(5).fill(1) };
 * const s = assembleStencil({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 4, ny: 4,
 *   a: one(), b: zero(), c: one(), d: zero(), e: zero(), f: zero(),
 *   boundary: { west: side, east: side, south: side, north: side },
 * });
 * const r = sorSolve(s);
 * if (!r.converged || Math.abs(r.solution[12] - 1) > 1e-9) throw new Error("SOR failed");
 * ```
 */
export function sorSolve(s: Stencil, options: SorOptions = {}): SorResult {
  const { nx, ny, cc, cw, ce, cs, cn, rhs, dirichlet } = s;
  let omega = options.omega ??
    estimateOmega(
      s,
      options.dirichletSides ?? { west: true, east: true, south: true, north: true },
    );
  const tolerance = options.tolerance ?? 1e-10;
  const maxSweeps = options.maxSweeps ?? 1_000_000;
  const divergence = options.divergenceFactor ?? 1e4;
  const w = nx + 1;
  const start = () => {
    const v = options.initialGuess
      ? Float64Array.from(options.initialGuess)
      : new Float64Array(rhs.length);
    if (!options.initialGuess) {
      for (let k = 0; k < v.length; k++) if (dirichlet[k]) v[k] = rhs[k];
    }
    return v;
  };
  let u = start();
  const r0 = residualNorm(s, u);
  const history = [r0];
  const restarts: number[] = [];
  const result = (converged: boolean, reason: SorResult["reason"]): SorResult => ({
    solution: u,
    converged,
    reason,
    sweeps: history.length - 1,
    residualHistory: history,
    omega,
    restarts,
  });
  if (r0 === 0) return result(true, "converged");
  const patience = Math.max(500, 4 * (nx + ny));
  let best = r0, bestSweep = 0;
  for (let sweep = 1; sweep <= maxSweeps; sweep++) {
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) {
        const k = j * w + i;
        if (dirichlet[k]) continue;
        let sum = rhs[k];
        if (i > 0) sum -= cw[k] * u[k - 1];
        if (i < nx) sum -= ce[k] * u[k + 1];
        if (j > 0) sum -= cs[k] * u[k - w];
        if (j < ny) sum -= cn[k] * u[k + w];
        u[k] += omega * (sum / cc[k] - u[k]);
      }
    }
    const r = residualNorm(s, u);
    history.push(r);
    if (!(r <= divergence * r0)) {
      // ω too large for this (non-symmetric) system: restart closer to Gauss–Seidel, unless the
      // caller fixed ω or it is already 1.
      if (options.omega !== undefined || omega <= 1) return result(false, "diverged");
      restarts.push(omega);
      omega = omega - 1 < 0.05 ? 1 : 1 + (omega - 1) / 2;
      u = start();
      (best = r0, bestSweep = sweep);
      continue;
    }
    if (r <= tolerance * r0) return result(true, "converged");
    if (r < best) (best = r, bestSweep = sweep);
    else if (sweep - bestSweep > patience && best < 1e-8 * r0) return result(false, "stagnated");
    if (options.deadline !== undefined && performance.now() > options.deadline) {
      return result(false, "time-limit");
    }
  }
  return result(false, "max-sweeps");
}
