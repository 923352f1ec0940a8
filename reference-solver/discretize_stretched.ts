/**
 * The discretization on stretched (non-uniform) and periodic grids: one row per unknown node,
 * a five-point stencil, boundary nodes included. Used for every problem with `coordinates` or a
 * periodic side (uniform grids without periodic sides keep `discretize.ts`; on a uniform grid the
 * formulas below reduce to those of `discretize.ts` and `discretize_conservative.ts`).
 *
 * Unknowns: node (i, j) with 0 ≤ i < mx, 0 ≤ j < my, where mx = nx on a periodic x-axis (the node
 * i = nx is the image of i = 0 and not an unknown) and nx + 1 otherwise (my alike), stored at
 * k = j·mx + i. Spacings at node i: hw = x[i] − x[i−1] and he = x[i+1] − x[i]; across a periodic
 * seam hw(0) = x[nx] − x[nx−1] and the west neighbour of i = 0 is i = nx − 1 (the east neighbour of
 * i = nx − 1 is i = 0 with he = x[nx] − x[nx−1]); at a non-periodic side the missing spacing is the
 * mirror of the present one (hw(0) = he(0) = x[1] − x[0], hw(nx) = he(nx) = x[nx] − x[nx−1]).
 * hs, hn alike in y.
 *
 * Non-conservative form a·u_xx + c·u_yy + b·u_x + d·u_y + e·u = f (no m: refused by validation):
 *
 *   u_xx ≈ 2·[(u_E − u_P)/he − (u_P − u_W)/hw]/(he + hw)
 *        (W: 2/(hw·(hw + he)), E: 2/(he·(hw + he)), P: −2/(hw·he)),
 *   u_x ≈ [hw²·u_E − he²·u_W + (he² − hw²)·u_P]/(hw·he·(hw + he))
 *        (W: −he/(hw·(hw + he)), E: hw/(he·(hw + he)), P: (he − hw)/(hw·he)),
 *
 * u_yy and u_y alike with hs, hn; e·u and f at the node. Both are exact for quadratics (the
 * three-point interpolating parabola); the truncation error of u_xx is (he − hw)/3·u_xxx + O(h²):
 * first order where the spacing jumps, second order on a smoothly mapped grid
 * (he − hw = O(h²)). With `upwind`, b·u_x is b·(u_E − u_P)/he when a·b > 0 and
 * b·(u_P − u_W)/hw otherwise (d·u_y alike with c).
 *
 * Neumann and Robin sides (α·u + β·∂u/∂n = g, Neumann α = 0, β = 1): the ghost node is the mirror
 * of the first interior node (x0 − (x[1] − x[0]) on the west), the interior formulas are applied
 * at the side node with hw = he = x[1] − x[0], and the ghost value from the central difference of
 * the condition, u_ghost = u_1 + 2·h1·(g − α·u_0)/β, is folded in as in `discretize.ts`: the
 * ghost's coefficient K moves to the opposite neighbour, the centre gains −K·2·h1·α/β and the
 * right-hand side −K·2·h1·g/β (east: h = x[nx] − x[nx−1]; south, north alike).
 *
 * Conservative form ∇·(K∇u) + b·u_x + d·u_y + e·u = f (K diagonal: k11 on x-edges, k22 on
 * y-edges, sampled at the physical edge midpoints; k12 refused by validation): control volume
 * widths wx = δw + δe with δw = hw/2 (0 at a non-periodic west side), δe = he/2 (0 at a
 * non-periodic east side), wy alike; row (i, j) is
 *
 *   [k11(i+½, j)·(u_E − u_P)/he − k11(i−½, j)·(u_P − u_W)/hw]/wx + (same in y)/wy + b·u_x + d·u_y
 *   + e·u = f,
 *
 * where on a periodic seam the edge (−½) is the edge (nx − ½). A boundary face carries the conormal
 * flux φ = (K∇u)·n instead (Neumann φ = g, Robin φ = (g − α·u)/β), adding φ/wx (or φ/wy) to the
 * row, as in `discretize_conservative.ts`. First-order terms as in the non-conservative form at
 * interior and periodic nodes, and the inward one-sided b·(u_1 − u_0)/h1 (west), b·(u_nx −
 * u_{nx−1})/h (east) on Neumann/Robin sides.
 *
 * Dirichlet sides (and Robin with β = 0, u = g/α): identity rows u = g with no couplings; a corner
 * is Dirichlet when either side is Dirichlet-like, taking the west/east value when both are.
 *
 * @module
 */
import type { Problem, Side, ValuedCondition } from "./problem.ts";
import { isDirichletLike, isSingular } from "./validate.ts";
import { axisWeights, nodeCoordinates } from "./stretched_grid.ts";

/** A five-point operator on a stretched or periodic grid (layout in the module doc). */
export interface StretchedOperator {
  /** Intervals along x and y. */
  nx: number;
  ny: number;
  /** Periodic axes. */
  px: boolean;
  py: boolean;
  /** Unknowns per row and per column: nx (periodic) or nx + 1; ny alike. */
  mx: number;
  my: number;
  /** Node coordinates (nx + 1 and ny + 1 values, images included). */
  x: Float64Array;
  y: Float64Array;
  /** Stencil coefficients per unknown (zero where a neighbour does not exist). */
  W: Float64Array;
  E: Float64Array;
  S: Float64Array;
  N: Float64Array;
  C: Float64Array;
  /** 1 on Dirichlet rows (identity rows, no couplings). */
  dirichlet: Uint8Array;
  /** Volume weight of each unknown (periodic trapezoid weights on a periodic axis). */
  weights: Float64Array;
  /** Whether constants solve the homogeneous problem. */
  singular: boolean;
}

/** Spacings hw, he per unknown of one axis (module doc). */
function spacings(x: Float64Array, periodic: boolean): { hw: Float64Array; he: Float64Array } {
  const n = x.length - 1, m = periodic ? n : n + 1;
  const hw = new Float64Array(m), he = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    he[i] = i < n ? x[i + 1] - x[i] : x[n] - x[n - 1];
    hw[i] = i > 0 ? x[i] - x[i - 1] : periodic ? x[n] - x[n - 1] : x[1] - x[0];
  }
  return { hw, he };
}

/** Volume weights of the unknowns: trapezoid, periodic on a periodic axis (module doc). */
export function unknownWeights(x: Float64Array, periodic: boolean): Float64Array {
  const w = axisWeights(x);
  if (!periodic) return w;
  const n = x.length - 1, out = w.slice(0, n);
  out[0] += w[n];
  return out;
}

/** α and β of a side at its position k (Neumann: α = 0, β = 1). */
const sideAB = (bc: ValuedCondition, k: number) =>
  bc.kind === "robin" ? { al: bc.alpha[k], be: bc.beta[k] } : { al: 0, be: 1 };

/**
 * Builds the operator and right-hand side of a (validated) problem on its stretched or periodic
 * grid, per the module doc.
 *
 * @param problem The problem, already checked by `validateProblem`.
 * @param upwind First-order upwinding of b·u_x and d·u_y (default false).
 * @returns The operator and the right-hand side per unknown.
 *
 * @example
 * ```ts
 * import { discretizeStretched } from "./discretize_stretched.ts";
 * const n = 9, one = new Float64Array(n).fill(1), zero = new Float64Array(n);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const { op } = discretizeStretched({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: 2, ny: 2, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 *   coordinates: { x: Float64Array.of(0, 0.25, 1), y: Float64Array.of(0, 0.5, 1) },
 * });
 * // u_xx at x = 0.25: W = 2/(0.25·1) = 8, E = 2/(0.75·1) = 8/3.
 * if (op.W[4] !== 8 || Math.abs(op.E[4] - 8 / 3) > 1e-12) throw new Error("3-point weights");
 * ```
 */
export function discretizeStretched(
  problem: Problem,
  upwind = false,
): { op: StretchedOperator; rhs: Float64Array } {
  const { nx, ny, boundary } = problem;
  const px = boundary.west.kind === "periodic", py = boundary.south.kind === "periodic";
  const { x, y } = nodeCoordinates(problem);
  const mx = px ? nx : nx + 1, my = py ? ny : ny + 1, n = mx * my;
  const sx = spacings(x, px), sy = spacings(y, py);
  const W = new Float64Array(n), E = new Float64Array(n), S = new Float64Array(n);
  const N = new Float64Array(n), C = new Float64Array(n), rhs = new Float64Array(n);
  const dirichlet = new Uint8Array(n);
  const side = (s: Side) =>
    boundary[s].kind === "periodic" ? undefined : boundary[s] as ValuedCondition;
  const west = side("west"), east = side("east"), south = side("south"), north = side("north");
  const dW = west !== undefined && isDirichletLike(west);
  const dE = east !== undefined && isDirichletLike(east);
  const dS = south !== undefined && isDirichletLike(south);
  const dN = north !== undefined && isDirichletLike(north);
  const dval = (bc: ValuedCondition, k: number) =>
    bc.kind === "robin" ? bc.values[k] / bc.alpha[k] : bc.values[k];
  const { a, b, c, d, e, f } = problem;
  const K = problem.conductivity;
  for (let j = 0; j < my; j++) {
    for (let i = 0; i < mx; i++) {
      const k = j * mx + i, q = j * (nx + 1) + i;
      const onW = !px && i === 0,
        onE = !px && i === nx,
        onS = !py && j === 0,
        onN = !py && j === ny;
      if ((onW && dW) || (onE && dE) || (onS && dS) || (onN && dN)) {
        C[k] = 1, dirichlet[k] = 1;
        rhs[k] = onW && dW
          ? dval(west!, j)
          : onE && dE
          ? dval(east!, j)
          : onS && dS
          ? dval(south!, i)
          : dval(north!, i);
        continue;
      }
      const hw = sx.hw[i], he = sx.he[i], hs = sy.hw[j], hn = sy.he[j];
      let w = 0, ea = 0, s = 0, nn = 0, cen = e[q], r = f[q];
      // First-order terms: one-sided inward on a Neumann/Robin side (conservative form only).
      const firstOrder = (
        coef: number,
        diff: number,
        h0: number,
        h1: number,
        low: boolean,
        high: boolean,
        oneSided: boolean,
      ): [number, number, number] => {
        if (coef === 0) return [0, 0, 0];
        if (oneSided && low) return [0, coef / h1, -coef / h1];
        if (oneSided && high) return [-coef / h0, 0, coef / h0];
        if (upwind) {
          return coef * diff > 0 ? [0, coef / h1, -coef / h1] : [-coef / h0, 0, coef / h0];
        }
        const t = h0 + h1;
        return [-coef * h1 / (h0 * t), coef * h0 / (h1 * t), coef * (h1 - h0) / (h0 * h1)];
      };
      if (K === undefined) {
        const ax = a[q], cy = c[q];
        w = 2 * ax / (hw * (hw + he)), ea = 2 * ax / (he * (hw + he)), cen -= 2 * ax / (hw * he);
        s = 2 * cy / (hs * (hs + hn)), nn = 2 * cy / (hn * (hs + hn)), cen -= 2 * cy / (hs * hn);
        const [bw, be, bc] = firstOrder(b[q], ax, hw, he, onW, onE, false);
        const [ds, dn, dc] = firstOrder(d[q], cy, hs, hn, onS, onN, false);
        w += bw, ea += be, cen += bc, s += ds, nn += dn, cen += dc;
        // Ghost elimination (module doc): u_ghost = u_opposite + (2h/β)·(g − α·u).
        if (onW) {
          const { al, be: bt } = sideAB(west!, j), g = 2 * he / bt;
          ea += w, cen -= w * g * al, r -= w * g * west!.values[j], w = 0;
        } else if (onE) {
          const { al, be: bt } = sideAB(east!, j), g = 2 * hw / bt;
          w += ea, cen -= ea * g * al, r -= ea * g * east!.values[j], ea = 0;
        }
        if (onS) {
          const { al, be: bt } = sideAB(south!, i), g = 2 * hn / bt;
          nn += s, cen -= s * g * al, r -= s * g * south!.values[i], s = 0;
        } else if (onN) {
          const { al, be: bt } = sideAB(north!, i), g = 2 * hs / bt;
          s += nn, cen -= nn * g * al, r -= nn * g * north!.values[i], nn = 0;
        }
      } else {
        const k11 = K.alongX.k11, k22 = K.alongY.k22;
        const wx = (onW ? 0 : hw / 2) + (onE ? 0 : he / 2);
        const wy = (onS ? 0 : hs / 2) + (onN ? 0 : hn / 2);
        // Boundary face with outward conormal flux φ adds φ/width to the row.
        const face = (bc: ValuedCondition, pos: number, width: number) => {
          const { al, be: bt } = sideAB(bc, pos);
          cen -= al / (bt * width), r -= bc.values[pos] / (bt * width);
        };
        if (onE) face(east!, j, wx);
        else {
          const t = k11[j * nx + i] / (he * wx);
          ea += t, cen -= t;
        }
        if (onW) face(west!, j, wx);
        else {
          const t = k11[j * nx + (i > 0 ? i - 1 : nx - 1)] / (hw * wx);
          w += t, cen -= t;
        }
        if (onN) face(north!, i, wy);
        else {
          const t = k22[j * (nx + 1) + i] / (hn * wy);
          nn += t, cen -= t;
        }
        if (onS) face(south!, i, wy);
        else {
          const t = k22[(j > 0 ? j - 1 : ny - 1) * (nx + 1) + i] / (hs * wy);
          s += t, cen -= t;
        }
        const [bw, be, bc] = firstOrder(b[q], 1, hw, he, onW, onE, true);
        const [ds, dn, dc] = firstOrder(d[q], 1, hs, hn, onS, onN, true);
        w += bw, ea += be, cen += bc, s += ds, nn += dn, cen += dc;
      }
      W[k] = w, E[k] = ea, S[k] = s, N[k] = nn, C[k] = cen, rhs[k] = r;
    }
  }
  const wx = unknownWeights(x, px), wy = unknownWeights(y, py);
  const weights = new Float64Array(n);
  for (let j = 0; j < my; j++) for (let i = 0; i < mx; i++) weights[j * mx + i] = wx[i] * wy[j];
  const op: StretchedOperator = {
    nx,
    ny,
    px,
    py,
    mx,
    my,
    x,
    y,
    W,
    E,
    S,
    N,
    C,
    dirichlet,
    weights,
    singular: isSingular(problem),
  };
  return { op, rhs };
}

/** r ← f − A·u on every unknown (Dirichlet rows included: f − u). */
export function stretchedResidual(
  op: StretchedOperator,
  u: Float64Array,
  f: Float64Array,
  r: Float64Array,
): void {
  const { mx, my, px, py, W, E, S, N, C } = op;
  for (let j = 0; j < my; j++) {
    const js = j > 0 ? j - 1 : py ? my - 1 : j, jn = j < my - 1 ? j + 1 : py ? 0 : j;
    for (let i = 0; i < mx; i++) {
      const iw = i > 0 ? i - 1 : px ? mx - 1 : i, ie = i < mx - 1 ? i + 1 : px ? 0 : i;
      const k = j * mx + i;
      r[k] = f[k] - C[k] * u[k] - W[k] * u[j * mx + iw] - E[k] * u[j * mx + ie] -
        S[k] * u[js * mx + i] - N[k] * u[jn * mx + i];
    }
  }
}

/** Unknowns (reduced layout) from the public layout: drops the periodic images. */
export function toUnknowns(op: StretchedOperator, v: Float64Array): Float64Array {
  const out = new Float64Array(op.mx * op.my);
  for (let j = 0; j < op.my; j++) {
    for (let i = 0; i < op.mx; i++) out[j * op.mx + i] = v[j * (op.nx + 1) + i];
  }
  return out;
}

/** The public layout from unknowns: the periodic images get the values of their originals. */
export function toNodes(op: StretchedOperator, v: Float64Array): Float64Array {
  const { nx, ny, mx, my } = op;
  const out = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = v[(j % my) * mx + (i % mx)];
  }
  return out;
}
