/**
 * The zoo's own finite-volume assembly of the conservative form ∇·(K∇u) + β·∇u + σu = f, on cell
 * and vertex grids, written from the mathematics of flux balance (independent of the reference
 * solver's discretization). Each unknown's control volume balances the outward conormal fluxes
 * (K∇u)·n through its faces against ∫(f − β·∇u − σu); K at a face is the case's face value
 * (`faceX` for faces whose flux runs along x, `faceY` along y: harmonic across an interface,
 * arithmetic along it). The exact solution is never read.
 *
 * - Two-point flux k·(u₂ − u₁)/h for the diagonal part; the cross part k12·u_y at an x-face
 *   (k12·u_x at a y-face) from the four neighbouring unknowns around the face, which makes the
 *   nine-point stencil of the full tensor.
 * - Cell layout, boundary faces: Dirichlet through the half-cell distance, k·(g − u₁)/(h/2), the
 *   cross part from the derivative of the data along the side; Neumann: the flux is the data (the
 *   conormal flux); Robin α·u_f + β·q = g with q = k·(u_f − u₁)/(h/2). Rows beyond a Dirichlet side
 *   in the cross part are the quadratic ghost (8g − 6u₁ + u₂)/3.
 * - Vertex layout: Dirichlet nodes hold their data; a node on a Neumann or Robin side owns the half
 *   (a corner the quarter) control volume inside the domain, whose boundary face carries the flux
 *   the condition gives.
 * - β·∇u by central differences, with the face value of the boundary closure on cells and the
 *   normal derivative the condition gives on vertex sides.
 *
 * The cross part is closed at Dirichlet sides only: a case with k12 ≠ 0 and a Neumann or Robin side
 * is declined ({@link conservativeDeclines}).
 *
 * @module
 */
import type { CompiledCase, ConservativeTerms } from "../../cases/mod.ts";
import type { Side } from "../../reference-solver/mod.ts";
import { type Combination, combine, known, unknown } from "./combination.ts";
import type { Discretization } from "./defects.ts";
import { addEntry, emptySystem, type LinearSystem } from "./system.ts";

const SIDES: readonly Side[] = ["west", "east", "south", "north"];

/**
 * Why the zoo's finite-volume scheme does not apply to a case, or null when it does.
 *
 * @example
 * ```ts
 * import { loadCase } from "../../cases/mod.ts";
 * import { conservativeDeclines } from "./assemble_conservative.ts";
 * conservativeDeclines(await loadCase("rotated-anisotropy")); // null
 * ```
 */
export function conservativeDeclines(c: CompiledCase): string | null {
  const terms = c.conservative;
  if (c.form !== "conservative" || !terms) {
    return `the case "${c.id}" is not in the conservative form`;
  }
  if (terms.constant.k12 === 0) return null;
  const flux = SIDES.filter((s) => c.boundary[s].kind !== "dirichlet");
  if (flux.length === 0) return null;
  return `the zoo's finite-volume scheme closes the cross-diffusion term (k12 ≠ 0) only at ` +
    `Dirichlet sides, and "${c.id}" has flux conditions on ${flux.join(", ")}`;
}

/** Adds Σ coef·u + constant to row k (constant to the right side with its sign changed). */
function addTo(
  system: LinearSystem,
  k: number,
  term: Combination,
  weight: number,
  add: (col: number, value: number) => void = (col, value) => addEntry(system, k, col, value),
): void {
  for (const [col, coef] of term.terms) add(col, weight * coef);
  system.rhs[k] -= weight * term.constant;
}

/** K (k11, k12 for x-faces; k22, k12 for y-faces) at a face between two unknowns. */
function faceK(
  terms: ConservativeTerms,
  disc: Discretization,
  axis: "x" | "y",
  face: [number, number],
  ends: [[number, number], [number, number]],
): { normal: number; cross: number } {
  const normal = axis === "x" ? terms.k11 : terms.k22;
  if (disc.faceConductivity === "arithmetic") {
    const [[xa, ya], [xb, yb]] = ends;
    return {
      normal: (normal(xa, ya) + normal(xb, yb)) / 2,
      cross: (terms.k12(xa, ya) + terms.k12(xb, yb)) / 2,
    };
  }
  const [fx, fy] = face;
  return axis === "x"
    ? { normal: terms.faceX.k11(fx, fy), cross: terms.faceX.k12(fx, fy) }
    : { normal: terms.faceY.k22(fx, fy), cross: terms.faceY.k12(fx, fy) };
}

/**
 * Assembles the cell-centred finite-volume system: nx·ny cells, x fastest (see the module doc).
 *
 * @param c the compiled case (conservative form, not declined by {@link conservativeDeclines})
 * @param nx cells along x
 * @param ny cells along y
 * @param disc the scheme, possibly with a seeded defect
 * @returns the system (five-point, bandwidth nx; nine-point, bandwidth nx + 1, with k12)
 */
export function assembleConservativeCell(
  c: CompiledCase,
  nx: number,
  ny: number,
  disc: Discretization,
): LinearSystem {
  const t = c.conservative!;
  const { x0, x1, y0, y1 } = c.domain;
  const hx = (x1 - x0) / nx;
  const hy = (y1 - y0) / ny;
  const cross = t.constant.k12 !== 0;
  const system = cross ? emptySystem(nx * ny, nx + 1, 9) : emptySystem(nx * ny, nx);
  const xc = (i: number) => x0 + (i + 0.5) * hx;
  const yc = (j: number) => y0 + (j + 0.5) * hy;
  const cell = (i: number, j: number) => unknown(j * nx + i);
  // a value beyond a (Dirichlet) side: the quadratic ghost through the face value
  const value = (i: number, j: number): Combination => {
    if (i >= 0 && i < nx && j >= 0 && j < ny) return cell(i, j);
    if (j < 0 || j >= ny) {
      const south = j < 0;
      const g = c.boundary[south ? "south" : "north"].data(xc(i), south ? y0 : y1);
      const [inner, next] = south ? [0, 1] : [ny - 1, ny - 2];
      return combine([known(g), cell(i, inner), cell(i, next)], [8 / 3, -2, 1 / 3]);
    }
    const west = i < 0;
    const g = c.boundary[west ? "west" : "east"].data(west ? x0 : x1, yc(j));
    const [inner, next] = west ? [0, 1] : [nx - 1, nx - 2];
    return combine([known(g), cell(inner, j), cell(next, j)], [8 / 3, -2, 1 / 3]);
  };
  // +x flux through the face between cells (i, j) and (i + 1, j)
  const fluxX = (i: number, j: number): Combination => {
    const k = faceK(t, disc, "x", [x0 + (i + 1) * hx, yc(j)], [[xc(i), yc(j)], [xc(i + 1), yc(j)]]);
    const parts = [cell(i + 1, j), cell(i, j)];
    const weights = [k.normal / hx, -k.normal / hx];
    if (cross && k.cross !== 0) {
      const q = disc.crossSign * k.cross / (4 * hy);
      parts.push(value(i, j + 1), value(i + 1, j + 1), value(i, j - 1), value(i + 1, j - 1));
      weights.push(q, q, -q, -q);
    }
    return combine(parts, weights);
  };
  // +y flux through the face between cells (i, j) and (i, j + 1)
  const fluxY = (i: number, j: number): Combination => {
    const k = faceK(t, disc, "y", [xc(i), y0 + (j + 1) * hy], [[xc(i), yc(j)], [xc(i), yc(j + 1)]]);
    const parts = [cell(i, j + 1), cell(i, j)];
    const weights = [k.normal / hy, -k.normal / hy];
    if (cross && k.cross !== 0) {
      const q = disc.crossSign * k.cross / (4 * hx);
      parts.push(value(i + 1, j), value(i + 1, j + 1), value(i - 1, j), value(i - 1, j + 1));
      weights.push(q, q, -q, -q);
    }
    return combine(parts, weights);
  };
  // the outward conormal flux through a boundary face of cell (i, j), and the face value
  const boundaryFace = (side: Side, i: number, j: number) => {
    const bc = c.boundary[side];
    const alongX = side === "west" || side === "east";
    const outward = side === "east" || side === "north" ? 1 : -1;
    const fx = alongX ? (side === "west" ? x0 : x1) : xc(i);
    const fy = alongX ? yc(j) : (side === "south" ? y0 : y1);
    const h = alongX ? hx : hy;
    const knn = alongX ? t.faceX.k11(fx, fy) : t.faceY.k22(fx, fy);
    const u1 = cell(i, j);
    const g = bc.data(fx, fy);
    if (bc.kind === "dirichlet") {
      const along = alongX
        ? (bc.data(fx, fy + hy / 2) - bc.data(fx, fy - hy / 2)) / hy
        : (bc.data(fx + hx / 2, fy) - bc.data(fx - hx / 2, fy)) / hx;
      const k12 = alongX ? t.faceX.k12(fx, fy) : t.faceY.k12(fx, fy);
      const crossFlux = outward * disc.crossSign * k12 * along;
      return {
        flux: combine([known(g), u1, known(crossFlux)], [2 * knn / h, -2 * knn / h, 1]),
        value: known(g),
      };
    }
    let flux: Combination;
    if (bc.kind === "neumann") {
      flux = known(disc.neumannData === "gradient" ? knn * g : g);
    } else {
      // α·u_f + β·q = g and q = k·(u_f − u₁)/(h/2), solved for q
      const alpha = bc.alpha!(fx, fy);
      const a = (2 * knn / h) / (alpha + 2 * bc.beta!(fx, fy) * knn / h);
      flux = combine([known(g), u1], [a, -a * alpha]);
    }
    return { flux, value: combine([u1, flux], [1, h / (2 * knn)]) };
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const x = xc(i);
      const y = yc(j);
      // Σ outward flux / width, from the four faces
      const east = i < nx - 1 ? fluxX(i, j) : boundaryFace("east", i, j).flux;
      const west = i > 0 ? combine([fluxX(i - 1, j)], [-1]) : boundaryFace("west", i, j).flux;
      const north = j < ny - 1 ? fluxY(i, j) : boundaryFace("north", i, j).flux;
      const south = j > 0 ? combine([fluxY(i, j - 1)], [-1]) : boundaryFace("south", i, j).flux;
      addTo(system, k, east, 1 / hx);
      addTo(system, k, west, 1 / hx);
      addTo(system, k, north, 1 / hy);
      addTo(system, k, south, 1 / hy);
      // β·∇u: a neighbour beyond a side is the ghost 2·u_f − u₁ through the face value
      const bx = t.bx(x, y);
      const by = t.by(x, y);
      const beyond = (side: Side) => combine([boundaryFace(side, i, j).value, cell(i, j)], [2, -1]);
      if (bx !== 0) {
        const e = i < nx - 1 ? cell(i + 1, j) : beyond("east");
        const w = i > 0 ? cell(i - 1, j) : beyond("west");
        addTo(system, k, combine([e, w], [1, -1]), bx / (2 * hx));
      }
      if (by !== 0) {
        const n = j < ny - 1 ? cell(i, j + 1) : beyond("north");
        const s = j > 0 ? cell(i, j - 1) : beyond("south");
        addTo(system, k, combine([n, s], [1, -1]), by / (2 * hy));
      }
      addEntry(system, k, k, t.sigma(x, y));
      system.rhs[k] += c.source(x, y);
    }
  }
  return system;
}

/**
 * Assembles the vertex-centred finite-volume system: (nx+1)(ny+1) nodes, x fastest (see the
 * module doc). Dirichlet nodes (a corner on a Dirichlet side included) hold their data.
 *
 * @param c the compiled case (conservative form, not declined by {@link conservativeDeclines})
 * @param nx intervals along x
 * @param ny intervals along y
 * @param disc the scheme, possibly with a seeded defect
 * @returns the system (five-point, bandwidth nx + 1; nine-point, bandwidth nx + 2, with k12)
 */
export function assembleConservativeVertex(
  c: CompiledCase,
  nx: number,
  ny: number,
  disc: Discretization,
): LinearSystem {
  const t = c.conservative!;
  const { x0, x1, y0, y1 } = c.domain;
  const hx = (x1 - x0) / nx;
  const hy = (y1 - y0) / ny;
  const mx = nx + 1;
  const n = mx * (ny + 1);
  const cross = t.constant.k12 !== 0;
  const system = cross ? emptySystem(n, mx + 1, 9) : emptySystem(n, mx);
  const xn = (i: number) => x0 + i * hx;
  const yn = (j: number) => y0 + j * hy;
  const node = (i: number, j: number) => unknown(j * mx + i);
  const sidesAt = (i: number, j: number): Side[] => {
    const sides: Side[] = [];
    if (i === 0) sides.push("west");
    if (i === nx) sides.push("east");
    if (j === 0) sides.push("south");
    if (j === ny) sides.push("north");
    return sides;
  };
  const fixed = new Float64Array(n).fill(NaN);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      for (const side of sidesAt(i, j)) {
        const bc = c.boundary[side];
        if (bc.kind === "dirichlet") {
          fixed[j * mx + i] = bc.data(xn(i), yn(j));
          break;
        }
        if (bc.kind === "robin" && bc.beta!(xn(i), yn(j)) === 0) {
          fixed[j * mx + i] = bc.data(xn(i), yn(j)) / bc.alpha!(xn(i), yn(j));
          break;
        }
      }
    }
  }
  // +x flux along the edge from node (i, j) to (i + 1, j), at its midpoint
  const fluxX = (i: number, j: number): Combination => {
    const k = faceK(t, disc, "x", [xn(i) + hx / 2, yn(j)], [[xn(i), yn(j)], [xn(i + 1), yn(j)]]);
    const parts = [node(i + 1, j), node(i, j)];
    const weights = [k.normal / hx, -k.normal / hx];
    if (cross && k.cross !== 0) {
      const q = disc.crossSign * k.cross / (4 * hy);
      parts.push(node(i, j + 1), node(i + 1, j + 1), node(i, j - 1), node(i + 1, j - 1));
      weights.push(q, q, -q, -q);
    }
    return combine(parts, weights);
  };
  const fluxY = (i: number, j: number): Combination => {
    const k = faceK(t, disc, "y", [xn(i), yn(j) + hy / 2], [[xn(i), yn(j)], [xn(i), yn(j + 1)]]);
    const parts = [node(i, j + 1), node(i, j)];
    const weights = [k.normal / hy, -k.normal / hy];
    if (cross && k.cross !== 0) {
      const q = disc.crossSign * k.cross / (4 * hx);
      parts.push(node(i + 1, j), node(i + 1, j + 1), node(i - 1, j), node(i - 1, j + 1));
      weights.push(q, q, -q, -q);
    }
    return combine(parts, weights);
  };
  // the outward conormal flux a Neumann or Robin side gives at node (i, j)
  const sideFlux = (side: Side, i: number, j: number): Combination => {
    const bc = c.boundary[side];
    const g = bc.data(xn(i), yn(j));
    if (bc.kind === "neumann") {
      const knn = side === "west" || side === "east" ? t.k11 : t.k22;
      return known(disc.neumannData === "gradient" ? knn(xn(i), yn(j)) * g : g);
    }
    // Robin α·u + β·q = g
    const alpha = bc.alpha!(xn(i), yn(j)), beta = bc.beta!(xn(i), yn(j));
    return combine([known(g), node(i, j)], [1 / beta, -alpha / beta]);
  };
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = j * mx + i;
      if (!Number.isNaN(fixed[k])) {
        addEntry(system, k, k, 1);
        system.rhs[k] = fixed[k];
        continue;
      }
      const add = (col: number, v: number) => {
        if (Number.isNaN(fixed[col])) addEntry(system, k, col, v);
        else system.rhs[k] -= v * fixed[col];
      };
      const x = xn(i);
      const y = yn(j);
      // Σ outward flux / width of the (half or quarter) control volume
      const wx = i === 0 || i === nx ? hx / 2 : hx;
      const wy = j === 0 || j === ny ? hy / 2 : hy;
      const east = i < nx ? fluxX(i, j) : sideFlux("east", i, j);
      const west = i > 0 ? combine([fluxX(i - 1, j)], [-1]) : sideFlux("west", i, j);
      const north = j < ny ? fluxY(i, j) : sideFlux("north", i, j);
      const south = j > 0 ? combine([fluxY(i, j - 1)], [-1]) : sideFlux("south", i, j);
      addTo(system, k, east, 1 / wx, add);
      addTo(system, k, west, 1 / wx, add);
      addTo(system, k, north, 1 / wy, add);
      addTo(system, k, south, 1 / wy, add);
      // β·∇u: central inside; on a side the normal derivative q/k the condition gives
      const bx = t.bx(x, y);
      const by = t.by(x, y);
      if (bx !== 0) {
        const ux = 0 < i && i < nx
          ? combine([node(i + 1, j), node(i - 1, j)], [1 / (2 * hx), -1 / (2 * hx)])
          : combine([sideFlux(i === 0 ? "west" : "east", i, j)], [
            (i === 0 ? -1 : 1) / t.k11(x, y),
          ]);
        addTo(system, k, ux, bx, add);
      }
      if (by !== 0) {
        const uy = 0 < j && j < ny
          ? combine([node(i, j + 1), node(i, j - 1)], [1 / (2 * hy), -1 / (2 * hy)])
          : combine([sideFlux(j === 0 ? "south" : "north", i, j)], [
            (j === 0 ? -1 : 1) / t.k22(x, y),
          ]);
        addTo(system, k, uy, by, add);
      }
      add(k, t.sigma(x, y));
      system.rhs[k] += c.source(x, y);
    }
  }
  return system;
}
