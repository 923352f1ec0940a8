/**
 * Samples conductivities onto the edge midpoints of the reference solver's grid (the layout of
 * `Conductivity` in `reference-solver/problem.ts`), and builds the jumping-coefficient problems of
 * the multigrid tests and `bench/jump_bench.ts`.
 *
 * Piecewise-constant K with interfaces on grid lines: an edge midpoint never lies on an interface
 * crossing the edge, but an edge may lie along an interface. Each entry is therefore taken as the
 * arithmetic mean over the two sides normal to the edge (a flux along an interface sees both
 * materials, half the face in each) of the harmonic mean over the two halves of the edge (a flux
 * across an interface sees them in series) — which is the effective value of the `Conductivity`
 * contract, and just the point value where K is smooth. The one-sided values are read a quarter
 * mesh width away from the midpoint.
 *
 * @module
 */
import type { Conductivity, Domain, Problem } from "../../reference-solver/mod.ts";

/** A scalar function of (x, y). */
export type Fn = (x: number, y: number) => number;

/** K as point functions; an absent k12 is zero. */
export interface TensorFns {
  k11: Fn;
  k12?: Fn;
  k22: Fn;
}

function effective(
  fn: Fn,
  x: number,
  y: number,
  along: [number, number],
  normal: [number, number],
) {
  const harmonic = (px: number, py: number) => {
    const a = fn(px - along[0], py - along[1]), b = fn(px + along[0], py + along[1]);
    return a === b ? a : 2 / (1 / a + 1 / b);
  };
  const l = harmonic(x - normal[0], y - normal[1]), r = harmonic(x + normal[0], y + normal[1]);
  return l === r ? l : 0.5 * (l + r);
}

/**
 * Samples K at the edge midpoints with the interface rule of the module doc.
 *
 * @param K Point functions of k11, k12 (optional) and k22.
 * @param grid Domain and counts.
 * @param interfaces Whether to apply the one-sided means (default true); false samples the point
 * values at the midpoints (smooth K).
 */
export function sampleConductivity(
  K: TensorFns,
  grid: { domain: Domain; nx: number; ny: number },
  interfaces = true,
): Conductivity {
  const { domain, nx, ny } = grid;
  const hx = (domain.x1 - domain.x0) / nx, hy = (domain.y1 - domain.y0) / ny;
  const qx = interfaces ? hx / 4 : 0, qy = interfaces ? hy / 4 : 0;
  const k11 = new Float64Array(nx * (ny + 1)), k22 = new Float64Array((nx + 1) * ny);
  const x12 = K.k12 === undefined ? undefined : new Float64Array(nx * (ny + 1));
  const y12 = K.k12 === undefined ? undefined : new Float64Array((nx + 1) * ny);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i < nx; i++) {
      const x = domain.x0 + (i + 0.5) * hx, y = domain.y0 + j * hy;
      k11[j * nx + i] = effective(K.k11, x, y, [qx, 0], [0, qy]);
      if (x12) x12[j * nx + i] = effective(K.k12!, x, y, [qx, 0], [0, qy]);
    }
  }
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const x = domain.x0 + i * hx, y = domain.y0 + (j + 0.5) * hy;
      k22[j * (nx + 1) + i] = effective(K.k22, x, y, [0, qy], [qx, 0]);
      if (y12) y12[j * (nx + 1) + i] = effective(K.k12!, x, y, [0, qy], [qx, 0]);
    }
  }
  return {
    alongX: x12 === undefined ? { k11 } : { k11, k12: x12 },
    alongY: y12 === undefined ? { k22 } : { k22, k12: y12 },
  };
}

/** Where a scalar conductivity takes its large value. */
export type JumpPattern = "half" | "checkerboard";

/**
 * k = 1 except `ratio` on x > ½ ("half") or on the quadrants x > ½ xor y > ½ ("checkerboard").
 */
export function jumpFunction(ratio: number, pattern: JumpPattern): Fn {
  return pattern === "half"
    ? (x) => (x > 0.5 ? ratio : 1)
    : (x, y) => ((x > 0.5) !== (y > 0.5) ? ratio : 1);
}

/**
 * The homogeneous problem ∇·(k∇u) = 0 with zero Dirichlet sides on the unit square (exact solution
 * 0), k a scalar jump of the given pattern and ratio: the problem on which the multigrid
 * convergence factor is measured from a random initial error (`_factor.ts`).
 */
export function jumpProblem(n: number, ratio: number, pattern: JumpPattern): Problem {
  const count = (n + 1) * (n + 1);
  const domain = { x0: 0, x1: 1, y0: 0, y1: 1 };
  const k = jumpFunction(ratio, pattern);
  const bc = { kind: "dirichlet" as const, values: new Float64Array(n + 1) };
  const zero = new Float64Array(count);
  return {
    domain,
    nx: n,
    ny: n,
    a: zero,
    b: zero,
    c: zero,
    d: zero,
    e: zero,
    f: zero,
    boundary: { west: bc, east: bc, south: bc, north: bc },
    conductivity: sampleConductivity({ k11: k, k22: k }, { domain, nx: n, ny: n }),
  };
}
