/**
 * The zoo's assembly for the grids of issue 14: a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f with
 * three-point differences on unequal steps (a stretched family's mapped lines) and a periodic
 * west–east pair, on vertex and cell grids, written from the case's point functions (independent
 * of the reference solver's discretization). The exact solution is never read.
 *
 * At a point with neighbours at distances hw (west) and he (east), from the quadratic through the
 * three values (Lagrange; exact for quadratics, common practice):
 *
 *     u_xx ≈ 2/(hw + he)·((u_e − u_c)/he − (u_c − u_w)/hw),
 *     u_x  ≈ (−he²·u_w + (he² − hw²)·u_c + hw²·u_e)/(hw·he·(hw + he)),
 *
 * and the same along y. Vertex grids: the distances are the intervals beside the node; a Neumann
 * or Robin side's ghost node is the mirror of the inner neighbour, u_g = u_inner + 2h(g − α·u)/β
 * (h the side's first interval); Dirichlet nodes hold their data. Cell grids: the distances are
 * those between centres; a ghost cell mirrors the boundary cell (distance its width h): Dirichlet
 * u_g = 2g − u₁, Neumann u_g = u₁ + h·g, Robin α(u₁ + u_g)/2 + β(u_g − u₁)/h = g. A periodic pair
 * wraps: the west neighbour of the first column is the last column inside the period (vertex:
 * node nx − 1, the node nx being the image of node 0 and held equal to it; cell: cell nx − 1),
 * across the seam's own spacing. Periodic south–north pairs, the mixed term and the conservative
 * form are not handled here (the zoo declines them).
 *
 * @module
 */
import { caseGrid, type CompiledCase } from "../../cases/mod.ts";
import type { Side } from "../../reference-solver/mod.ts";
import type { Discretization } from "./defects.ts";
import { addEntry, emptySystem, type LinearSystem } from "./system.ts";

/** Weights of the three-point u'' and u' on distances hw (behind) and he (ahead). */
function threePoint(hw: number, he: number) {
  const s = hw + he;
  return {
    dd: [2 / (hw * s), -2 / (hw * he), 2 / (he * s)],
    d: [-he / (hw * s), (he - hw) / (hw * he), hw / (he * s)],
  };
}

/** Why the zoo cannot assemble a case on this path, or null. */
export function mappedDeclines(c: CompiledCase): string | null {
  if (c.form === "conservative") {
    return "the zoo's stretched and periodic path implements only the non-conservative form";
  }
  if (c.constantCoefficients.m !== 0) {
    return "the zoo's stretched and periodic path has no mixed term (m·u_xy)";
  }
  if (c.boundary.south.kind === "periodic") {
    return "the zoo's banded solve has no periodic south–north pair (its band would be the grid)";
  }
  if (c.singular) return "the zoo solves no singular system (no side fixes u)";
  return null;
}

/** true when a case needs this path: a stretched family or a periodic pair. */
export function needsMapped(c: CompiledCase): boolean {
  const stretched = Object.values(c.mappings ?? {}).some((m) => m.kind !== "uniform");
  return stretched || c.boundary.west.kind === "periodic";
}

/**
 * Assembles the system on the case's grid for the layout (module doc): x fastest; vertex
 * (nx + 1)(ny + 1) unknowns, cell nx·ny.
 *
 * @param c the compiled case (non-conservative, no mixed term; see {@link mappedDeclines})
 * @param nx intervals or cells along x
 * @param ny intervals or cells along y
 * @param disc the scheme, possibly with a seeded defect (`periodicSeam`, `ySpacing`)
 * @param layout vertex or cell
 * @returns the system (bandwidth nx + 1)
 */
export function assembleMapped(
  c: CompiledCase,
  nx: number,
  ny: number,
  disc: Discretization,
  layout: "vertex" | "cell",
): LinearSystem {
  const vertex = layout === "vertex";
  const grid = caseGrid(c, nx, ny, layout);
  const lx = grid.lines.x, ly = grid.lines.y;
  const mid = (l: Float64Array, k: number) => (l[k] + l[k + 1]) / 2;
  const px = vertex ? lx : Float64Array.from({ length: nx }, (_, i) => mid(lx, i));
  const py = vertex ? ly : Float64Array.from({ length: ny }, (_, j) => mid(ly, j));
  const mx = px.length, my = py.length;
  const periodic = c.boundary.west.kind === "periodic";
  const system = emptySystem(mx * my, mx);
  const { x0, x1, y0, y1 } = c.domain;
  const period = x1 - x0;
  const meanY = (y1 - y0) / ny;
  // vertex: the data of nodes on a Dirichlet side (NaN where the node is an unknown)
  const fixed = new Float64Array(mx * my).fill(NaN);
  if (vertex) {
    for (let j = 0; j < my; j++) {
      for (let i = 0; i < mx; i++) {
        const sides: Side[] = [];
        if (i === 0 && !periodic) sides.push("west");
        if (i === nx && !periodic) sides.push("east");
        if (j === 0) sides.push("south");
        if (j === ny) sides.push("north");
        const side = sides.find((s) => c.boundary[s].kind === "dirichlet");
        if (side !== undefined) fixed[j * mx + i] = c.boundary[side].data(px[i], py[j]);
      }
    }
  }
  for (let j = 0; j < my; j++) {
    for (let i = 0; i < mx; i++) {
      const k = j * mx + i;
      const x = px[i], y = py[j];
      if (!Number.isNaN(fixed[k])) {
        addEntry(system, k, k, 1);
        system.rhs[k] = fixed[k];
        continue;
      }
      if (vertex && periodic && i === nx) {
        // the image of node 0 across the seam
        addEntry(system, k, k, 1);
        addEntry(system, k, k - nx, -1);
        continue;
      }
      const add = (col: number, value: number) => {
        if (Number.isNaN(fixed[col])) addEntry(system, k, col, value);
        else system.rhs[k] -= value * fixed[col];
      };
      const a = c.coefficients.a(x, y), b = disc.convectionXSign * c.coefficients.b(x, y);
      const cy = c.coefficients.c(x, y), d = c.coefficients.d(x, y), e = c.coefficients.e(x, y);
      addEntry(system, k, k, e);
      system.rhs[k] += c.source(x, y);
      // along x: the neighbours' columns and distances, with the seam and the sides
      const x3 = axisNeighbours(i, mx, px, lx, vertex, periodic, disc.periodicSeam, period);
      const tx = threePoint(x3.hw, x3.he);
      const y3 = axisNeighbours(j, my, py, ly, vertex, false, "wrap", 0);
      const ty = disc.ySpacing === "mean" ? threePoint(meanY, meanY) : threePoint(y3.hw, y3.he);
      const rows = [
        { at: x3, w: [0, 1, 2].map((q) => a * tx.dd[q] + b * tx.d[q]), step: 1, sideLo: "west" },
        { at: y3, w: [0, 1, 2].map((q) => cy * ty.dd[q] + d * ty.d[q]), step: mx, sideLo: "south" },
      ] as const;
      for (const { at, w, step, sideLo } of rows) {
        addEntry(system, k, k, w[1]);
        const sideHi = sideLo === "west" ? "east" : "north";
        for (
          const [q, index, outside, side] of [
            [0, at.lo, at.loOutside, sideLo],
            [2, at.hi, at.hiOutside, sideHi],
          ] as const
        ) {
          const col = k + (index - (step === 1 ? i : j)) * step;
          if (!outside) {
            add(col, w[q]);
            continue;
          }
          // a ghost beyond a side (module doc)
          const bc = c.boundary[side];
          const h = at.ghostDistance;
          const [fx, fy] = side === "west"
            ? [x0, y]
            : side === "east"
            ? [x1, y]
            : side === "south"
            ? [x, y0]
            : [x, y1];
          if (vertex) {
            const alpha = bc.kind === "robin" ? bc.alpha!(x, y) : 0;
            const beta = bc.kind === "robin" ? disc.robinBetaSign * bc.beta!(x, y) : 1;
            const g = disc.fluxDataScale * bc.data(x, y);
            add(k + (q === 0 ? 1 : -1) * step, w[q]);
            addEntry(system, k, k, -w[q] * 2 * h * alpha / beta);
            system.rhs[k] -= w[q] * 2 * h * g / beta;
            continue;
          }
          const [p, r] = cellGhost(bc, fx, fy, h, disc);
          addEntry(system, k, k, w[q] * p);
          system.rhs[k] -= w[q] * r;
        }
      }
    }
  }
  return system;
}

/**
 * The two neighbours of point `i` of an axis: their indices (`lo`, `hi`), distances (`hw`, `he`),
 * whether each lies beyond a side (a ghost, at the mirror distance `ghostDistance`), and on a
 * periodic axis the wrap across the seam — or the seeded defect's wrong wrap ("image": vertex
 * node 0 takes node nx, its own image, as west neighbour; "dropped": the wrap-around term is left
 * out, as if the seam were a zero-gradient side).
 */
function axisNeighbours(
  i: number,
  m: number,
  p: Float64Array,
  lines: Float64Array,
  vertex: boolean,
  periodic: boolean,
  seam: Discretization["periodicSeam"],
  period: number,
) {
  const n = lines.length - 1;
  const last = vertex ? n - 1 : m - 1; // the last point inside the period
  let lo = i - 1, hi = i + 1, loOutside = false, hiOutside = false;
  let hw = i > 0 ? p[i] - p[i - 1] : NaN, he = i < m - 1 ? p[i + 1] - p[i] : NaN;
  let ghostDistance = NaN;
  if (i === 0) {
    if (periodic) {
      lo = last;
      hw = p[0] - (p[last] - period);
      if (seam === "image" && vertex) lo = n;
      if (seam === "dropped" && !vertex) lo = 0;
    } else {
      loOutside = true;
      ghostDistance = lines[1] - lines[0];
      hw = ghostDistance;
    }
  }
  if (i === m - 1) {
    if (periodic && !vertex) {
      hi = 0;
      he = p[0] + period - p[i];
      if (seam === "dropped") hi = i;
    } else if (!periodic) {
      hiOutside = true;
      ghostDistance = lines[n] - lines[n - 1];
      he = ghostDistance;
    }
  }
  return { lo, hi, hw, he, loOutside, hiOutside, ghostDistance };
}

/** The ghost cell beyond a side as p·u₁ + r, closed at the face point (module doc). */
function cellGhost(
  bc: CompiledCase["boundary"][Side],
  fx: number,
  fy: number,
  h: number,
  disc: Discretization,
): [p: number, r: number] {
  if (bc.kind === "dirichlet") return [-1, 2 * bc.data(fx, fy)];
  if (bc.kind === "neumann") return [1, h * disc.fluxDataScale * bc.data(fx, fy)];
  const alpha = bc.alpha!(fx, fy);
  const beta = disc.robinBetaSign * bc.beta!(fx, fy);
  const den = alpha / 2 + beta / h;
  return [-(alpha / 2 - beta / h) / den, disc.fluxDataScale * bc.data(fx, fy) / den];
}
