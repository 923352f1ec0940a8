/**
 * The domain check: functions of a case are sampled on a check lattice that does not depend on any
 * study grid and then refined locally between its points, so that a coefficient that turns
 * negative between grid nodes, or a term that is singular between them, is found with its place.
 *
 * Sampled: the (n + 1) × (n + 1) nodes of the rectangle, its boundary included, and the n × n
 * centres of the lattice's cells (n = {@link CHECK_INTERVALS}). Refined: for each function the
 * smallest discrete local minima (when the function must keep a sign; two rounds) and the largest
 * local maxima of |v| (one round), by golden-section searches along x, then y, within one lattice
 * cell of the point; a peak found is then tested for unbounded growth ({@link growsWithoutBound}).
 *
 * Sampling and local refinement prove nothing for an arbitrary expression: a dip or spike narrower
 * than the lattice that leaves no trace at the lattice points (no local extremum next to it) is
 * not seen. What is guaranteed: every lattice point is checked exactly; every point of the domain
 * lies within |Δx|/hx + |Δy|/hy ≤ 1/2 of one, so a region of wrong sign or non-finite values that
 * contains such a diamond contains a lattice point, and so does a band parallel to a side wider
 * than half a cell (the lattice's coordinates are the multiples of half a cell).
 *
 * @module
 */
import {
  goldenMin,
  growsWithoutBound,
  GROWTH_STEPS,
  localMinima,
  type ValueStats,
  valueStats,
} from "./_domain_kernels.ts";
import type { PointFn } from "./types.ts";

/** A rectangle [x0, x1] × [y0, y1]; x0 = x1 or y0 = y1 makes it a segment (a side). */
export interface Region {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** One function to check. */
export interface CheckedFunction {
  /** Its name in faults, e.g. `coefficients.a`. */
  name: string;
  /** The compiled point function. */
  at: PointFn;
  /** The sign its values must have: 1 for > 0, −1 for < 0, 0 for any finite value. */
  sign: 1 | -1 | 0;
}

/**
 * Fills `outputs[k]` with function k's values at x0 + i·hx, y0 + j·hy (0 ≤ i ≤ nx, 0 ≤ j ≤ ny), x
 * fastest: a fast path for the lattices (a compiled row sampler).
 */
export type LatticeFill = (
  x0: number,
  hx: number,
  nx: number,
  y0: number,
  hy: number,
  ny: number,
  outputs: Float64Array[],
) => void;

/**
 * What is wrong: `sign` (zero or the wrong sign), `vanishes` (the right sign but below
 * {@link ROUND_OFF_ZERO} of the function's largest magnitude, zero to round-off), `non-finite`
 * (NaN or ±Infinity) or `unbounded` (grows without bound towards the point).
 */
export type FaultKind = "sign" | "vanishes" | "non-finite" | "unbounded";

/** A function that fails the check, with the point and value that show it. */
export interface DomainFault {
  /** The function's name. */
  name: string;
  kind: FaultKind;
  x: number;
  y: number;
  /** The function's value at (x, y). */
  value: number;
  /** The largest |value| at the lattice points (the scale `vanishes` compares with). */
  scale: number;
  /** `lattice` for a point of the check lattice, `refinement` for a point between them. */
  found: "lattice" | "refinement";
}

/** Options of {@link checkDomain}. */
export interface DomainCheckOptions {
  /** Intervals of the check lattice along each direction. Default: {@link CHECK_INTERVALS}. */
  intervals?: number;
  /** Local extrema refined per function and kind (minima, peaks). Default: 8. */
  refinements?: number;
  /** Fast lattice sampler for all functions at once. Default: a loop over the point functions. */
  fill?: LatticeFill;
}

/** Intervals of the check lattice along each direction (129 × 129 nodes on a rectangle). */
export const CHECK_INTERVALS = 128;

/** A value of the right sign below this fraction of the function's largest magnitude counts as 0. */
export const ROUND_OFF_ZERO = 1e-12;

interface Lattice {
  x0: number;
  hx: number;
  nx: number;
  y0: number;
  hy: number;
  ny: number;
}

/** The node lattice (offset 0) or the cell-centre lattice (offset 1/2) of a region. */
function lattice(r: Region, n: number, offset: number): Lattice {
  const along = (a: number, b: number) => {
    if (b === a) return { o: a, h: 0, m: 0 };
    const h = (b - a) / n;
    return offset === 0 ? { o: a, h, m: n } : { o: a + offset * h, h, m: n - 1 };
  };
  const x = along(r.x0, r.x1);
  const y = along(r.y0, r.y1);
  return { x0: x.o, hx: x.h, nx: x.m, y0: y.o, hy: y.h, ny: y.m };
}

function pointFill(functions: readonly CheckedFunction[]): LatticeFill {
  return (x0, hx, nx, y0, hy, ny, outputs) => {
    for (let j = 0; j <= ny; j++) {
      const y = y0 + j * hy;
      for (let i = 0; i <= nx; i++) {
        const x = x0 + i * hx;
        functions.forEach((f, k) => outputs[k][j * (nx + 1) + i] = f.at(x, y));
      }
    }
  };
}

interface Sampled {
  grid: Lattice;
  values: Float64Array;
}

/**
 * Checks functions on a region: finite everywhere, and of their required sign (and not zero to
 * round-off), at the lattice points and at the local extrema refined between them. One fault per
 * failing function, the first one found.
 *
 * @param region the closed rectangle (or side) to check
 * @param functions what to check and the sign each must keep
 * @returns the faults, in the order of `functions`; empty when every function passes
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { checkDomain } from "./domain_check.ts";
 * const [fault] = checkDomain({ x0: 0, x1: 1, y0: 0, y1: 1 }, [
 *   { name: "a", at: (x) => (x - 0.3337) ** 2 - 1e-8, sign: 1 },
 * ]);
 * // negative only for |x − 0.3337| < 1e-4, between the lattice points
 * assert.equal(fault.kind, "sign");
 * assert.equal(fault.found, "refinement");
 * assert.ok(Math.abs(fault.x - 0.3337) < 1e-4);
 * ```
 */
export function checkDomain(
  region: Region,
  functions: readonly CheckedFunction[],
  options: DomainCheckOptions = {},
): DomainFault[] {
  const n = options.intervals ?? CHECK_INTERVALS;
  if (!Number.isInteger(n) || n < 2) {
    throw new RangeError(`intervals must be an integer of at least 2, found ${n}`);
  }
  const fill = options.fill ?? pointFill(functions);
  const sampled = [lattice(region, n, 0), lattice(region, n, 0.5)].map((grid) => {
    const outputs = functions.map(() => new Float64Array((grid.nx + 1) * (grid.ny + 1)));
    fill(grid.x0, grid.hx, grid.nx, grid.y0, grid.hy, grid.ny, outputs);
    return outputs.map((values): Sampled => ({ grid, values }));
  });
  const faults: DomainFault[] = [];
  functions.forEach((f, k) => {
    const sets = sampled.map((s) => s[k]);
    const stats = sets.map((s) => valueStats(s.values, f.sign));
    const scale = Math.max(...stats.map((s) => s.maxAbs));
    const fault = latticeFault(f, sets, stats, scale) ??
      (stats[0].constant
        ? undefined
        : refinedFault(f, region, sets[0], options.refinements ?? 8, scale));
    if (fault) faults.push(fault);
  });
  return faults;
}

function pointOf(s: Sampled, k: number): { x: number; y: number } {
  const i = k % (s.grid.nx + 1);
  const j = (k - i) / (s.grid.nx + 1);
  return { x: s.grid.x0 + i * s.grid.hx, y: s.grid.y0 + j * s.grid.hy };
}

function latticeFault(
  f: CheckedFunction,
  sets: readonly Sampled[],
  stats: readonly ValueStats[],
  scale: number,
): DomainFault | undefined {
  const at = (s: Sampled, k: number, kind: FaultKind): DomainFault => ({
    name: f.name,
    kind,
    ...pointOf(s, k),
    value: s.values[k],
    scale,
    found: "lattice",
  });
  const bad = stats.findIndex((s) => s.firstBad >= 0);
  if (bad >= 0) return at(sets[bad], stats[bad].firstBad, "non-finite");
  if (f.sign === 0) return undefined;
  const lowest = (m: number) => f.sign * sets[m].values[stats[m].lowest];
  const m = lowest(0) <= lowest(1) ? 0 : 1;
  const kind = signFault(lowest(m), scale);
  return kind && at(sets[m], stats[m].lowest, kind);
}

/** The fault of a signed value (value × required sign), or undefined when it is fine. */
function signFault(signed: number, scale: number): FaultKind | undefined {
  if (!(signed > 0)) return "sign";
  return signed <= ROUND_OFF_ZERO * scale ? "vanishes" : undefined;
}

/** Refines the local minima (sign rule) and the peaks of |v| between the lattice points. */
function refinedFault(
  f: CheckedFunction,
  region: Region,
  nodes: Sampled,
  limit: number,
  scale: number,
): DomainFault | undefined {
  const { values, grid } = nodes;
  const fault = (kind: FaultKind, x: number, y: number, value: number): DomainFault => ({
    name: f.name,
    kind,
    x,
    y,
    value,
    scale,
    found: "refinement",
  });
  // the first non-finite value any evaluation meets
  const seen: { bad?: { x: number; y: number; value: number } } = {};
  const probe = (x: number, y: number) => {
    const v = f.at(x, y);
    if (!Number.isFinite(v) && !seen.bad) seen.bad = { x, y, value: v };
    return v;
  };
  // dips of sign·v (two rounds: a narrow valley across the axes needs the second), then peaks
  // of |v| (one round reaches a pole, a singular line or a singular point)
  const searches: { sign: number; rounds: number }[] = [];
  if (f.sign !== 0) searches.push({ sign: f.sign, rounds: 2 });
  searches.push({ sign: 0, rounds: 1 });
  for (const { sign, rounds } of searches) {
    const phi = (x: number, y: number) => {
      const v = probe(x, y);
      // a non-finite value is the best a search can find: it is reported
      if (v - v !== 0) return -Infinity;
      return sign === 0 ? -Math.abs(v) : sign * v;
    };
    for (const k of localMinima(values, grid.nx, grid.ny, sign, limit)) {
      const start = pointOf(nodes, k);
      const box: Region = {
        x0: Math.max(region.x0, start.x - grid.hx),
        x1: Math.min(region.x1, start.x + grid.hx),
        y0: Math.max(region.y0, start.y - grid.hy),
        y1: Math.min(region.y1, start.y + grid.hy),
      };
      const p = descend(phi, start, box, rounds);
      const grows = sign === 0 && growsAt(probe, p, region);
      if (seen.bad) return fault("non-finite", seen.bad.x, seen.bad.y, seen.bad.value);
      if (grows) return fault("unbounded", p.x, p.y, f.at(p.x, p.y));
      const kind = sign === 0 ? undefined : signFault(p.value, scale);
      if (kind) return fault(kind, p.x, p.y, sign * p.value);
    }
  }
  return undefined;
}

/** Golden-section searches along x then y, `rounds` times, within the box. */
function descend(
  phi: (x: number, y: number) => number,
  start: { x: number; y: number },
  box: Region,
  rounds: number,
): { x: number; y: number; value: number } {
  let { x, y } = start;
  let value = phi(x, y);
  const tol = (lo: number, hi: number) =>
    1e-13 * (hi - lo) + 4 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi));
  for (let round = 0; round < rounds; round++) {
    if (box.x1 > box.x0) {
      const r = goldenMin((t) => phi(t, y), box.x0, box.x1, tol(box.x0, box.x1), x);
      x = r.t;
      value = r.value;
    }
    if (box.y1 > box.y0) {
      const r = goldenMin((t) => phi(x, t), box.y0, box.y1, tol(box.y0, box.y1), y);
      y = r.t;
      value = r.value;
    }
  }
  return { x, y, value };
}

/** Whether |v| grows without bound towards p along x or along y (within the region). */
function growsAt(
  probe: (x: number, y: number) => number,
  p: { x: number; y: number },
  region: Region,
): boolean {
  for (const axis of ["x", "y"] as const) {
    const lo = axis === "x" ? region.x0 : region.y0;
    const hi = axis === "x" ? region.x1 : region.y1;
    if (!(hi > lo)) continue;
    const at = axis === "x" ? p.x : p.y;
    const g = GROWTH_STEPS.map((step) => {
      let m = 0;
      for (const side of [-1, 1]) {
        const q = at + side * step * (hi - lo);
        if (q < lo || q > hi) continue;
        m = Math.max(m, Math.abs(axis === "x" ? probe(q, p.y) : probe(p.x, q)));
      }
      return m;
    }) as [number, number, number];
    if (growsWithoutBound(g)) return true;
  }
  return false;
}
