/**
 * Assembly of the vertex-centred 5-point system as five weight arrays, the same scheme as
 * gridproof's reference solver (see the README for the rules on sides and corners).
 *
 * @module
 */
import type { Boundary, Problem } from "./problem.ts";

/** The assembled system: row k reads cc·u_k + cw·u_W + ce·u_E + cs·u_S + cn·u_N = rhs. */
export interface Stencil {
  nx: number;
  ny: number;
  cc: Float64Array;
  cw: Float64Array;
  ce: Float64Array;
  cs: Float64Array;
  cn: Float64Array;
  rhs: Float64Array;
  /** 1 where the node is a Dirichlet node (identity row), 0 elsewhere. */
  dirichlet: Uint8Array;
}

/**
 * Builds the 5-point weights of a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f at every node, folds the
 * ghost nodes of Neumann/Robin sides into the boundary rows and makes Dirichlet rows identities.
 *
 * @param p the problem (vertex layout, arrays x fastest)
 * @param options `upwind`: first-order upwinding of b·u_x and d·u_y. Default: false (central).
 *   `defect: "one-sided"`: a SEEDED DEFECT for the demo — Neumann/Robin rows become the
 *   first-order one-sided α·u_k + β·(u_k − u_inner)/h = g. Default: none
 * @returns the weights and right-hand side
 */
export function assembleStencil(
  p: Problem,
  options: { upwind?: boolean; defect?: "one-sided" } = {},
): Stencil {
  const { nx, ny } = p;
  const upwind = options.upwind ?? false;
  const hx = (p.domain.x1 - p.domain.x0) / nx;
  const hy = (p.domain.y1 - p.domain.y0) / ny;
  const n = (nx + 1) * (ny + 1);
  const cc = new Float64Array(n), cw = new Float64Array(n), ce = new Float64Array(n);
  const cs = new Float64Array(n), cn = new Float64Array(n);
  const rhs = Float64Array.from(p.f);
  const dirichlet = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const a = p.a[k], b = p.b[k], c = p.c[k], d = p.d[k];
    cw[k] = a / (hx * hx);
    ce[k] = a / (hx * hx);
    cs[k] = c / (hy * hy);
    cn[k] = c / (hy * hy);
    cc[k] = -2 * a / (hx * hx) - 2 * c / (hy * hy) + p.e[k];
    if (!upwind) {
      cw[k] -= b / (2 * hx);
      ce[k] += b / (2 * hx);
      cs[k] -= d / (2 * hy);
      cn[k] += d / (2 * hy);
      continue;
    }
    // One-sided difference that keeps the off-diagonals' sign of a (resp. c).
    if (b * a > 0) {
      ce[k] += b / hx;
      cc[k] -= b / hx;
    } else {
      cw[k] -= b / hx;
      cc[k] += b / hx;
    }
    if (d * c > 0) {
      cn[k] += d / hy;
      cc[k] -= d / hy;
    } else {
      cs[k] -= d / hy;
      cc[k] += d / hy;
    }
  }

  // Ghost nodes of Neumann/Robin sides: ghost = mirror + 2h·(g − α·u)/β (Neumann: α = 0, β = 1).
  const sides = [
    { side: "west", first: 0, step: nx + 1, count: ny + 1, ghost: cw, mirror: ce, h: hx },
    { side: "east", first: nx, step: nx + 1, count: ny + 1, ghost: ce, mirror: cw, h: hx },
    { side: "south", first: 0, step: 1, count: nx + 1, ghost: cs, mirror: cn, h: hy },
    { side: "north", first: ny * (nx + 1), step: 1, count: nx + 1, ghost: cn, mirror: cs, h: hy },
  ] as const;
  const dirichletLike = (bc: Boundary) =>
    bc.kind === "dirichlet" || (bc.kind === "robin" && bc.beta === 0);
  for (const s of sides) {
    const bc = p.boundary[s.side];
    if (dirichletLike(bc)) continue;
    const alpha = bc.kind === "robin" ? bc.alpha : 0;
    const beta = bc.kind === "robin" ? bc.beta : 1;
    for (let t = 0; t < s.count; t++) {
      const k = s.first + t * s.step;
      if (options.defect === "one-sided") {
        cc[k] = alpha + beta / s.h;
        s.mirror[k] = -beta / s.h;
        s.ghost[k] = 0;
        for (const other of [cw, ce, cs, cn]) if (other !== s.mirror) other[k] = 0;
        rhs[k] = bc.values[t];
        continue;
      }
      const w = s.ghost[k];
      s.mirror[k] += w;
      cc[k] -= w * 2 * s.h * alpha / beta;
      rhs[k] -= w * 2 * s.h * bc.values[t] / beta;
      s.ghost[k] = 0;
    }
  }

  // Dirichlet rows, set north, south, east, west so that at a shared corner west wins, then east,
  // then south (the reference solver's order). Robin with β = 0 gives u = g/α.
  const rows = [
    { side: "north", first: ny * (nx + 1), step: 1, count: nx + 1 },
    { side: "south", first: 0, step: 1, count: nx + 1 },
    { side: "east", first: nx, step: nx + 1, count: ny + 1 },
    { side: "west", first: 0, step: nx + 1, count: ny + 1 },
  ] as const;
  for (const s of rows) {
    const bc = p.boundary[s.side];
    if (!dirichletLike(bc)) continue;
    const scale = bc.kind === "robin" ? 1 / bc.alpha : 1;
    for (let t = 0; t < s.count; t++) {
      const k = s.first + t * s.step;
      dirichlet[k] = 1;
      cc[k] = 1;
      cw[k] =
        ce[k] =
        cs[k] =
        cn[k] =
          0;
      rhs[k] = bc.values[t] * scale;
    }
  }
  return { nx, ny, cc, cw, ce, cs, cn, rhs, dirichlet };
}
