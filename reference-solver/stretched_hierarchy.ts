/**
 * The level hierarchy of the stretched path: every coarse level rediscretized (by
 * `discretize_stretched.ts`) on the grid that keeps every other node of the finer one, with the
 * coefficients and boundary data injected (taken at the kept nodes) and a conductivity combined
 * edge by edge in series: a coarse x-edge made of fine edges of lengths h1, h2 gets
 * k11 = (h1 + h2)/(h1/k11₁ + h2/k11₂) (k22 alike along y).
 *
 * Coarsening: an axis is halved when its interval count is even and ≥ 4; both axes when both can,
 * else the one that can; the coarsest level (neither can, `coarse.maxLevels` reached, or at most
 * `coarse.maxDirectUnknowns` unknowns) is solved by dense LU with partial pivoting — of the
 * bordered system [A 1; wᵀ 0] for a singular problem (w the volume weights: the coarse solve fixes
 * the volume-weighted mean of the correction at zero).
 *
 * @module
 */
import type { Problem, ValuedCondition } from "./problem.ts";
import { discretizeStretched, type StretchedOperator } from "./discretize_stretched.ts";
import { nodeCoordinates } from "./stretched_grid.ts";
import { createStretchedSmoother, type StretchedSmoother } from "./stretched_smoothers.ts";
import { createStretchedTransfer, type StretchedTransfer } from "./stretched_transfer.ts";
import type { ResolvedSolveOptions } from "./resolve_options.ts";

/** Largest coarsest level the dense LU accepts (its cost grows as the cube). */
export const MAX_DENSE_UNKNOWNS = 1600;

/** One stretched level with its work vectors (reduced layout of `discretize_stretched.ts`). */
export interface StretchedLevel {
  op: StretchedOperator;
  u: Float64Array;
  f: Float64Array;
  r: Float64Array;
  coarsening: "both" | "x" | "y" | "direct";
  smoother?: StretchedSmoother;
  transfer?: StretchedTransfer;
  /** Coarsest level only: solves A·u = f (bordered when singular) into u. */
  direct?: (f: Float64Array, u: Float64Array) => void;
}

/** The problem on the grid that keeps every other node along the coarsened axes. */
export function coarsenStretched(p: Problem, cx: 1 | 2, cy: 1 | 2): Problem {
  const nx = p.nx / cx, ny = p.ny / cy;
  const { x, y } = nodeCoordinates(p);
  const inject = (v: Float64Array) => {
    const out = new Float64Array((nx + 1) * (ny + 1));
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = v[cy * j * (p.nx + 1) + cx * i];
    }
    return out;
  };
  const every = (v: Float64Array, c: number, n: number) =>
    Float64Array.from({ length: n + 1 }, (_, k) => v[c * k]);
  const side = (bc: Problem["boundary"]["west"], c: number, n: number) =>
    bc.kind === "periodic" ? bc : { ...bc, values: every((bc as ValuedCondition).values, c, n) };
  const out: Problem = {
    domain: p.domain,
    nx,
    ny,
    a: inject(p.a),
    b: inject(p.b),
    c: inject(p.c),
    d: inject(p.d),
    e: inject(p.e),
    f: inject(p.f),
    boundary: {
      west: side(p.boundary.west, cy, ny),
      east: side(p.boundary.east, cy, ny),
      south: side(p.boundary.south, cx, nx),
      north: side(p.boundary.north, cx, nx),
    },
    coordinates: { x: every(x, cx, nx), y: every(y, cy, ny) },
  };
  const K = p.conductivity;
  if (K !== undefined) {
    const k11 = new Float64Array(nx * (ny + 1)), k22 = new Float64Array((nx + 1) * ny);
    for (let J = 0; J <= ny; J++) {
      for (let I = 0; I < nx; I++) {
        const q = cy * J * p.nx + cx * I;
        if (cx === 1) k11[J * nx + I] = K.alongX.k11[q];
        else {
          const h1 = x[2 * I + 1] - x[2 * I], h2 = x[2 * I + 2] - x[2 * I + 1];
          k11[J * nx + I] = (h1 + h2) / (h1 / K.alongX.k11[q] + h2 / K.alongX.k11[q + 1]);
        }
      }
    }
    for (let J = 0; J < ny; J++) {
      for (let I = 0; I <= nx; I++) {
        const q = cy * J * (p.nx + 1) + cx * I;
        if (cy === 1) k22[J * (nx + 1) + I] = K.alongY.k22[q];
        else {
          const h1 = y[2 * J + 1] - y[2 * J], h2 = y[2 * J + 2] - y[2 * J + 1];
          k22[J * (nx + 1) + I] = (h1 + h2) /
            (h1 / K.alongY.k22[q] + h2 / K.alongY.k22[q + p.nx + 1]);
        }
      }
    }
    out.conductivity = { alongX: { k11 }, alongY: { k22 } };
  }
  return out;
}

/** Dense LU with partial pivoting of the level (bordered when singular); returns the solver. */
function denseSolver(op: StretchedOperator): (f: Float64Array, u: Float64Array) => void {
  const n = op.mx * op.my, m = op.singular ? n + 1 : n;
  if (n > MAX_DENSE_UNKNOWNS) {
    throw new RangeError(
      `The coarsest stretched level has ${n} unknowns (${op.nx}×${op.ny} intervals), more than the dense solve accepts (${MAX_DENSE_UNKNOWNS}); use interval counts with more factors of 2 (e.g. multiples of 8 or 16)`,
    );
  }
  const A = new Float64Array(m * m);
  const { mx, my, px, py } = op;
  for (let j = 0; j < my; j++) {
    const js = j > 0 ? j - 1 : py ? my - 1 : j, jn = j < my - 1 ? j + 1 : py ? 0 : j;
    for (let i = 0; i < mx; i++) {
      const iw = i > 0 ? i - 1 : px ? mx - 1 : i, ie = i < mx - 1 ? i + 1 : px ? 0 : i;
      const k = j * mx + i, row = k * m;
      A[row + k] += op.C[k];
      A[row + j * mx + iw] += op.W[k];
      A[row + j * mx + ie] += op.E[k];
      A[row + js * mx + i] += op.S[k];
      A[row + jn * mx + i] += op.N[k];
      if (op.singular) A[row + n] = 1, A[n * m + k] = op.weights[k];
    }
  }
  const piv = new Int32Array(m);
  for (let c = 0; c < m; c++) {
    let p = c, best = Math.abs(A[c * m + c]);
    for (let r = c + 1; r < m; r++) {
      const v = Math.abs(A[r * m + c]);
      if (v > best) best = v, p = r;
    }
    if (best === 0) {
      throw new RangeError(
        `The coarsest stretched level (${op.nx}×${op.ny}) is singular; a problem whose only sides are Neumann or periodic needs singular: "mean-zero"`,
      );
    }
    piv[c] = p;
    if (p !== c) {
      for (let t = 0; t < m; t++) {
        const s = A[c * m + t];
        A[c * m + t] = A[p * m + t], A[p * m + t] = s;
      }
    }
    const d = A[c * m + c];
    for (let r = c + 1; r < m; r++) {
      const l = (A[r * m + c] /= d);
      if (l !== 0) { for (let t = c + 1; t < m; t++) A[r * m + t] -= l * A[c * m + t]; }
    }
  }
  const b = new Float64Array(m);
  return (f, u) => {
    b.fill(0), b.set(f.subarray(0, n));
    // Whole rows were swapped (multipliers included): all swaps first, then L, then U.
    for (let c = 0; c < m; c++) {
      const p = piv[c];
      if (p !== c) {
        const s = b[c];
        b[c] = b[p], b[p] = s;
      }
    }
    for (let c = 0; c < m; c++) {
      for (let r = c + 1; r < m; r++) b[r] -= A[r * m + c] * b[c];
    }
    for (let c = m - 1; c >= 0; c--) {
      let s = b[c];
      for (let t = c + 1; t < m; t++) s -= A[c * m + t] * b[t];
      b[c] = s / A[c * m + c];
    }
    u.set(b.subarray(0, n));
  };
}

/** Builds the levels of a validated stretched or periodic problem, finest first. */
export function buildStretchedLevels(
  problem: Problem,
  o: ResolvedSolveOptions,
): { levels: StretchedLevel[]; rhs: Float64Array } {
  const levels: StretchedLevel[] = [];
  let p = problem, rhs0: Float64Array | undefined;
  for (let depth = 0;; depth++) {
    const { op, rhs } = discretizeStretched(p, o.scheme.upwind);
    rhs0 ??= rhs;
    const n = op.mx * op.my;
    const canX = p.nx % 2 === 0 && p.nx >= 4, canY = p.ny % 2 === 0 && p.ny >= 4;
    const last = depth + 1 >= o.coarse.maxLevels || n <= o.coarse.maxDirectUnknowns ||
      (!canX && !canY);
    const coarsening = last ? "direct" : canX && canY ? "both" : canX ? "x" : "y";
    const level: StretchedLevel = {
      op,
      u: new Float64Array(n),
      f: depth === 0 ? rhs.slice() : new Float64Array(n),
      r: new Float64Array(n),
      coarsening,
    };
    levels.push(level);
    if (last) {
      level.direct = denseSolver(op);
      break;
    }
    level.smoother = createStretchedSmoother(op, o.smoother.name);
    p = coarsenStretched(p, coarsening === "y" ? 1 : 2, coarsening === "x" ? 1 : 2);
  }
  for (let l = 0; l + 1 < levels.length; l++) {
    levels[l].transfer = createStretchedTransfer(levels[l].op, levels[l + 1].op);
  }
  return { levels, rhs: rhs0! };
}
