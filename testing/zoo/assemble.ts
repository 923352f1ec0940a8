/**
 * The zoo's own assembly of a·u_xx + m·u_xy + b·u_x + c·u_yy + d·u_y + e·u = f with central
 * differences on vertex and cell grids (five points, nine where m ≠ 0), written from the case's
 * point functions (independent of the reference solver's discretization). The exact solution is
 * never read.
 *
 * @module
 */
import type { CaseBoundary, CompiledCase } from "../../cases/mod.ts";
import type { Side } from "../../reference-solver/mod.ts";
import { type Combination, combine, known, unknown } from "./combination.ts";
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
 * eliminated by the central normal difference u_g = u_opposite + 2h(g − α·u)/β. The mixed term
 * is the four-corner difference inside; on a Neumann or Robin side it is the central difference
 * along the side of the normal derivative the condition gives (u_xy = ∂t(∂u/∂n)·(±1)), which
 * leaves no closure at a corner between two such sides.
 *
 * @param c the compiled case
 * @param nx intervals along x
 * @param ny intervals along y
 * @param disc the scheme, possibly with a seeded defect
 * @returns the system (bandwidth nx + 1, nx + 2 with a mixed term)
 * @throws {RangeError} at a corner between two Neumann or Robin sides where m ≠ 0
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
  const hasMixed = c.constantCoefficients.m !== 0;
  const system = hasMixed ? emptySystem(n, mx + 1, 9) : emptySystem(n, mx);
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
        if (bc.kind === "robin" && bc.beta!(x, y) === 0) {
          fixed[j * mx + i] = bc.data(x, y) / bc.alpha!(x, y);
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
        const alpha = robin ? bc.alpha!(x, y) : 0;
        const beta = robin ? disc.robinBetaSign * bc.beta!(x, y) : 1;
        const g = disc.fluxDataScale * bc.data(x, y);
        const h = dir.di !== 0 ? hx : hy;
        add(k - dir.di - dir.dj * mx, w);
        addEntry(system, k, k, -w * 2 * h * alpha / beta);
        system.rhs[k] -= w * 2 * h * g / beta;
      }
      const mixed = hasMixed ? disc.mixedScale * c.coefficients.m(x, y) : 0;
      if (mixed !== 0) {
        const uxy = vertexMixed(c, disc, { i, j, nx, ny, hx, hy, sides });
        for (const [col, coef] of uxy.terms) add(col, mixed * coef);
        system.rhs[k] -= mixed * uxy.constant;
      }
    }
  }
  return system;
}

/** u_xy at a free vertex node (see {@link assembleVertex}) as a combination of node values. */
function vertexMixed(
  c: CompiledCase,
  disc: Discretization,
  at: { i: number; j: number; nx: number; ny: number; hx: number; hy: number; sides: Side[] },
): Combination {
  const { i, j, nx, hx, hy, sides } = at;
  const { x0, y0 } = c.domain;
  const node = (ii: number, jj: number) => unknown(jj * (nx + 1) + ii);
  if (sides.length === 0) {
    const q = 1 / (4 * hx * hy);
    return combine(
      [node(i + 1, j + 1), node(i - 1, j - 1), node(i - 1, j + 1), node(i + 1, j - 1)],
      [q, q, -q, -q],
    );
  }
  if (sides.length > 1) {
    throw new RangeError(
      `the zoo has no closure of the mixed term at the corner node (${x0 + i * hx}, ` +
        `${y0 + j * hy}) between the ${sides.join(" and ")} sides; make one of them Dirichlet`,
    );
  }
  const side = sides[0];
  const bc = c.boundary[side];
  // ∂u/∂n = s·(u_x or u_y), s = +1 on east and north
  const s = side === "east" || side === "north" ? 1 : -1;
  const normalDerivative = (ii: number, jj: number): Combination => {
    const px = x0 + ii * hx, py = y0 + jj * hy;
    const g = disc.fluxDataScale * bc.data(px, py);
    if (bc.kind === "neumann") return known(s * g);
    // Robin: g = α·u + β·∂u/∂n
    const beta = disc.robinBetaSign * bc.beta!(px, py);
    return combine([known(g), node(ii, jj)], [s / beta, -s * bc.alpha!(px, py) / beta]);
  };
  return side === "south" || side === "north"
    ? combine([normalDerivative(i + 1, j), normalDerivative(i - 1, j)], [
      1 / (2 * hx),
      -1 / (2 * hx),
    ])
    : combine([normalDerivative(i, j + 1), normalDerivative(i, j - 1)], [
      1 / (2 * hy),
      -1 / (2 * hy),
    ]);
}

/**
 * The ghost cell beyond a side as p·u₁ + r (u₁ the cell inside), closed at the face point (fx, fy):
 * Dirichlet u_g = 2g − u₁ (or the face-value defect), Neumann u_g = u₁ + h·g, Robin
 * α(u₁ + u_g)/2 + β(u_g − u₁)/h = g.
 */
function cellGhost(
  bc: CaseBoundary,
  fx: number,
  fy: number,
  h: number,
  disc: Discretization,
): [p: number, r: number] {
  if (bc.kind === "dirichlet") {
    const g = bc.data(fx, fy);
    return disc.cellDirichlet === "reflect" ? [-1, 2 * g] : [0, g];
  }
  if (bc.kind === "neumann") {
    const factor = disc.neumann === "one-sided" ? 2 : 1;
    return [1, factor * h * disc.fluxDataScale * bc.data(fx, fy)];
  }
  const alpha = bc.alpha!(fx, fy);
  const beta = disc.robinBetaSign * bc.beta!(fx, fy);
  const den = alpha / 2 + beta / h;
  return [-(alpha / 2 - beta / h) / den, disc.fluxDataScale * bc.data(fx, fy) / den];
}

/**
 * u_xy at cell (i, j) as (U_e − U_w)/hx, U = u_y at the x-faces: inside, the mean of the two
 * columns' central differences, with a row beyond the south or north side taken from that side
 * (Dirichlet: the quadratic ghost (8g − 6u₁ + u₂)/3, which keeps u_y second order; otherwise the
 * closure's ghost); on a west or east face, the derivative of the Dirichlet data along the side, or
 * the difference of the face values (u₁ + u_g)/2 of a Neumann or Robin closure (one-sided in the
 * corner cells).
 */
function cellMixed(
  c: CompiledCase,
  disc: Discretization,
  at: { i: number; j: number; nx: number; ny: number; hx: number; hy: number },
): Combination {
  const { i, j, nx, ny, hx, hy } = at;
  const { x0, x1, y0, y1 } = c.domain;
  const cell = (ii: number, jj: number) => unknown(jj * nx + ii);
  const value = (ii: number, jj: number): Combination => {
    if (jj >= 0 && jj < ny) return cell(ii, jj);
    const south = jj < 0;
    const bc = c.boundary[south ? "south" : "north"];
    const inner = south ? 0 : ny - 1;
    const next = south ? 1 : ny - 2;
    const fx = x0 + (ii + 0.5) * hx;
    const fy = south ? y0 : y1;
    if (bc.kind === "dirichlet") {
      return combine([known(bc.data(fx, fy)), cell(ii, inner), cell(ii, next)], [8 / 3, -2, 1 / 3]);
    }
    const [p, r] = cellGhost(bc, fx, fy, hy, disc);
    return combine([cell(ii, inner), known(r)], [p, 1]);
  };
  const uyAtXFace = (ii: number): Combination => {
    if (ii >= 0 && ii + 1 < nx) {
      const q = 1 / (4 * hy);
      return combine(
        [value(ii, j + 1), value(ii + 1, j + 1), value(ii, j - 1), value(ii + 1, j - 1)],
        [q, q, -q, -q],
      );
    }
    const west = ii < 0;
    const bc = c.boundary[west ? "west" : "east"];
    const fx = west ? x0 : x1;
    const column = west ? 0 : nx - 1;
    const yj = y0 + (j + 0.5) * hy;
    if (bc.kind === "dirichlet") {
      return known((bc.data(fx, yj + hy / 2) - bc.data(fx, yj - hy / 2)) / hy);
    }
    const faceValue = (jj: number) => {
      const [p, r] = cellGhost(bc, fx, y0 + (jj + 0.5) * hy, hx, disc);
      return combine([cell(column, jj), known(r)], [(1 + p) / 2, 0.5]);
    };
    const lo = Math.max(j - 1, 0);
    const hi = Math.min(j + 1, ny - 1);
    if (hi === lo) return known(0);
    const w = 1 / ((hi - lo) * hy);
    return combine([faceValue(hi), faceValue(lo)], [w, -w]);
  };
  return combine([uyAtXFace(i), uyAtXFace(i - 1)], [1 / hx, -1 / hx]);
}

/**
 * Assembles the cell-centred system: nx·ny cells, x fastest, coefficients and source at the
 * centres. A neighbour beyond a side is a ghost cell closed at the face centre: Dirichlet
 * u_g = 2g − u₁, Neumann u_g = u₁ + h·g, Robin α(u₁ + u_g)/2 + β(u_g − u₁)/h = g (outward normal).
 * The mixed term m·u_xy is the nine-point difference described at `cellMixed`.
 *
 * @param c the compiled case
 * @param nx cells along x
 * @param ny cells along y
 * @param disc the scheme, possibly with a seeded defect
 * @returns the system (bandwidth nx, nx + 1 with a mixed term)
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
  const hasMixed = c.constantCoefficients.m !== 0;
  const system = hasMixed ? emptySystem(nx * ny, nx + 1, 9) : emptySystem(nx * ny, nx);
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
        const [p, r] = cellGhost(bc, fx, fy, h, disc);
        addEntry(system, k, k, w * p);
        system.rhs[k] -= w * r;
      }
      const mixed = hasMixed ? disc.mixedScale * c.coefficients.m(x, y) : 0;
      if (mixed !== 0) {
        const uxy = cellMixed(c, disc, { i, j, nx, ny, hx, hy });
        for (const [col, coef] of uxy.terms) addEntry(system, k, col, mixed * coef);
        system.rhs[k] -= mixed * uxy.constant;
      }
    }
  }
  return system;
}
