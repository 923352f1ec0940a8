/**
 * The zoo's own assembly of a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f with five-point central
 * differences on vertex and cell grids, written from the case's point functions (independent of
 * the reference solver's discretization). The exact solution is never read.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/mod.ts";
import type { Side } from "../../reference-solver/mod.ts";
import type { Discretization } from "./defects.ts";
import { addEntry, emptySystem, type LinearSystem } from "./system.ts";

/** Weights of the five-point stencil at one point, with the right side. */
interface Row {
  w: number;
  e: number;
  s: number;
  n: number;
  c: number;
  f: number;
}

/** Neighbour directions: the side a missing neighbour lies beyond and the opposite direction. */
const DIRECTIONS = [
  { key: "w", side: "west", di: -1, dj: 0, opposite: "e" },
  { key: "e", side: "east", di: 1, dj: 0, opposite: "w" },
  { key: "s", side: "south", di: 0, dj: -1, opposite: "n" },
  { key: "n", side: "north", di: 0, dj: 1, opposite: "s" },
] as const;

/**
 * The stencil at (x, y): coefficients and source sampled where the discretization says, e·u kept
 * unless `dropReaction`.
 */
function stencil(
  c: CompiledCase,
  disc: Discretization,
  at: { x: number; y: number; hx: number; hy: number; layout: "vertex" | "cell" },
  dropReaction: boolean,
): Row {
  const { x, y, hx, hy } = at;
  const k = c.coefficients;
  const a = k.a(x + disc.aShift[0] * hx, y + disc.aShift[1] * hy);
  const b = disc.convectionXSign * k.b(x, y);
  const cy = k.c(x, y);
  const d = k.d(x, y);
  const e = dropReaction ? 0 : k.e(x, y);
  const shift = disc.sourceShift[at.layout];
  const f = c.source(x + shift[0] * hx, y + shift[1] * hy);
  const ax = a / (hx * hx);
  const hyy = disc.yySpacing === "hx" ? hx : hy;
  const cyy = cy / (hyy * hyy);
  const bx = b / (2 * hx);
  const row: Row = { w: ax - bx, e: ax + bx, s: cyy, n: cyy, c: -2 * ax - 2 * cyy + e, f };
  if (disc.convectionY === "forward") {
    row.n += d / hy;
    row.c -= d / hy;
  } else {
    row.s -= d / (2 * hy);
    row.n += d / (2 * hy);
  }
  return row;
}

/**
 * Assembles the vertex-centred system: (nx+1)(ny+1) nodes, x fastest. Dirichlet nodes (a corner
 * on a Dirichlet side included) hold their data and are eliminated from their neighbours' rows;
 * Neumann and Robin nodes carry the PDE row with the ghost node of each outside neighbour
 * eliminated by the central normal difference u_g = u_opposite + 2h(g − α·u)/β.
 *
 * @param c the compiled case
 * @param nx intervals along x
 * @param ny intervals along y
 * @param disc the scheme, possibly with a seeded defect
 * @returns the system (bandwidth nx + 1)
 */
export function assembleVertex(
  c: CompiledCase,
  nx: number,
  ny: number,
  disc: Discretization,
): LinearSystem {
  const { x0, x1, y0, y1 } = c.domain;
  const hx = (x1 - x0) / nx;
  const hy = (y1 - y0) / ny;
  const mx = nx + 1;
  const n = mx * (ny + 1);
  const system = emptySystem(n, mx);
  const sidesAt = (i: number, j: number): Side[] => {
    const sides: Side[] = [];
    if (i === 0) sides.push("west");
    if (i === nx) sides.push("east");
    if (j === 0) sides.push("south");
    if (j === ny) sides.push("north");
    return sides;
  };
  // Dirichlet values (NaN where the node is an unknown); the first Dirichlet side wins at corners
  const fixed = new Float64Array(n).fill(NaN);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const x = x0 + i * hx;
      const y = y0 + j * hy;
      for (const side of sidesAt(i, j)) {
        const bc = c.boundary[side];
        if (bc.kind === "dirichlet") {
          const shift = disc.dirichletShift[side] ?? [0, 0];
          fixed[j * mx + i] = bc.data(x + shift[0] * hx, y + shift[1] * hy);
          break;
        }
        if (bc.kind === "robin" && bc.beta === 0) {
          fixed[j * mx + i] = bc.data(x, y) / bc.alpha!;
          break;
        }
      }
    }
  }
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = j * mx + i;
      if (!Number.isNaN(fixed[k])) {
        addEntry(system, k, k, 1);
        system.rhs[k] = fixed[k];
        continue;
      }
      const x = x0 + i * hx;
      const y = y0 + j * hy;
      const add = (col: number, value: number) => {
        if (Number.isNaN(fixed[col])) addEntry(system, k, col, value);
        else system.rhs[k] -= value * fixed[col];
      };
      const sides = sidesAt(i, j);
      const oneSided = disc.neumann === "one-sided"
        ? sides.find((s) => c.boundary[s].kind === "neumann")
        : undefined;
      if (oneSided !== undefined) {
        // the defect: (u_boundary − u_inner)/h = g, first order
        const dir = DIRECTIONS.find((d) => d.side === oneSided)!;
        const h = dir.di !== 0 ? hx : hy;
        addEntry(system, k, k, 1 / h);
        add(k - dir.di - dir.dj * mx, -1 / h);
        system.rhs[k] += disc.fluxDataScale * c.boundary[oneSided].data(x, y);
        continue;
      }
      const firstLayer = i === 1 || i === nx - 1 || j === 1 || j === ny - 1;
      const row = stencil(
        c,
        disc,
        { x, y, hx, hy, layout: "vertex" },
        !disc.reactionNearBoundary && firstLayer,
      );
      addEntry(system, k, k, row.c);
      system.rhs[k] += row.f;
      for (const dir of DIRECTIONS) {
        const ii = i + dir.di;
        const jj = j + dir.dj;
        const w = row[dir.key];
        if (ii >= 0 && ii <= nx && jj >= 0 && jj <= ny) {
          add(jj * mx + ii, w);
          continue;
        }
        const bc = c.boundary[dir.side];
        const robin = bc.kind === "robin";
        const alpha = robin ? bc.alpha! : 0;
        const beta = robin ? disc.robinBetaSign * bc.beta! : 1;
        const g = disc.fluxDataScale * bc.data(x, y);
        const h = dir.di !== 0 ? hx : hy;
        add(k - dir.di - dir.dj * mx, w);
        addEntry(system, k, k, -w * 2 * h * alpha / beta);
        system.rhs[k] -= w * 2 * h * g / beta;
      }
    }
  }
  return system;
}

/**
 * Assembles the cell-centred system: nx·ny cells, x fastest, coefficients and source at the
 * centres. A neighbour beyond a side is a ghost cell closed at the face centre: Dirichlet
 * u_g = 2g − u₁, Neumann u_g = u₁ + h·g, Robin α(u₁ + u_g)/2 + β(u_g − u₁)/h = g (outward normal).
 *
 * @param c the compiled case
 * @param nx cells along x
 * @param ny cells along y
 * @param disc the scheme, possibly with a seeded defect
 * @returns the system (bandwidth nx)
 */
export function assembleCell(
  c: CompiledCase,
  nx: number,
  ny: number,
  disc: Discretization,
): LinearSystem {
  const { x0, x1, y0, y1 } = c.domain;
  const hx = (x1 - x0) / nx;
  const hy = (y1 - y0) / ny;
  const system = emptySystem(nx * ny, nx);
  const face: Record<Side, (x: number, y: number) => [number, number]> = {
    west: (_x, y) => [x0, y],
    east: (_x, y) => [x1, y],
    south: (x) => [x, y0],
    north: (x) => [x, y1],
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const x = x0 + (i + 0.5) * hx;
      const y = y0 + (j + 0.5) * hy;
      const firstLayer = i === 0 || i === nx - 1 || j === 0 || j === ny - 1;
      const row = stencil(
        c,
        disc,
        { x, y, hx, hy, layout: "cell" },
        !disc.reactionNearBoundary && firstLayer,
      );
      addEntry(system, k, k, row.c);
      system.rhs[k] = row.f;
      for (const dir of DIRECTIONS) {
        const ii = i + dir.di;
        const jj = j + dir.dj;
        const w = row[dir.key];
        if (ii >= 0 && ii < nx && jj >= 0 && jj < ny) {
          addEntry(system, k, jj * nx + ii, w);
          continue;
        }
        const bc = c.boundary[dir.side];
        const [fx, fy] = face[dir.side](x, y);
        const h = dir.di !== 0 ? hx : hy;
        // the ghost as p·u₁ + r
        let p: number;
        let r: number;
        if (bc.kind === "dirichlet") {
          const g = bc.data(fx, fy);
          [p, r] = disc.cellDirichlet === "reflect" ? [-1, 2 * g] : [0, g];
        } else if (bc.kind === "neumann") {
          const factor = disc.neumann === "one-sided" ? 2 : 1;
          [p, r] = [1, factor * h * disc.fluxDataScale * bc.data(fx, fy)];
        } else {
          const alpha = bc.alpha!;
          const beta = disc.robinBetaSign * bc.beta!;
          const den = alpha / 2 + beta / h;
          [p, r] = [-(alpha / 2 - beta / h) / den, disc.fluxDataScale * bc.data(fx, fy) / den];
        }
        addEntry(system, k, k, w * p);
        system.rhs[k] -= w * r;
      }
    }
  }
  return system;
}
