/**
 * The interface conditions a manufactured solution must meet for the conservative form: across
 * every interface, u and the normal component of the flux K∇u are continuous (the solution of
 * ∇·(K∇u) = f with K jumping has exactly these two properties). The one-sided values and fluxes
 * come from each region's own expressions (the fluxes derived symbolically); they are compared at
 * {@link CHECK_POINTS} points along each interface segment, to {@link CONTINUITY_TOLERANCE}
 * relative to the size of the compared function over the two regions (sampled on a 9 × 9 lattice
 * of each: on the interface itself both sides may be near zero). Sampling cannot prove an identity for every point, but a violation
 * that survives 257 evenly spread points and both segment ends is not a realistic case.
 *
 * @module
 */
import type { Domain } from "../reference-solver/mod.ts";
import type { Interfaces } from "./regions.ts";
import type { PointFn } from "./types.ts";

/** Points compared along each interface segment, its two ends included. */
export const CHECK_POINTS = 257;
/** Largest accepted |left − right| relative to the compared function's size over both regions. */
export const CONTINUITY_TOLERANCE = 1e-9;

/** What the check needs from each region: u and the flux components. */
export interface RegionFunctions {
  u: PointFn;
  fluxX: PointFn;
  fluxY: PointFn;
}

/** One broken interface condition. */
export interface ContinuityProblem {
  /** The interface, e.g. "x = 0.5". */
  interface: string;
  /** Which condition: the solution or the normal flux. */
  condition: "u" | "normal flux";
  /** Region numbers on either side (west/south first). */
  regions: [number, number];
  /** The point of the largest jump. */
  x: number;
  y: number;
  /** The one-sided values there. */
  before: number;
  after: number;
  message: string;
}

/**
 * Checks continuity of u and of the normal flux across every interface segment.
 *
 * @returns every broken condition (empty when the solution is admissible)
 */
export function checkInterfaceConditions(
  regions: readonly RegionFunctions[],
  interfaces: Interfaces,
  domain: Domain,
): ContinuityProblem[] {
  const problems: ContinuityProblem[] = [];
  const columns = interfaces.x.length + 1;
  const xBounds = [domain.x0, ...interfaces.x, domain.x1];
  const yBounds = [domain.y0, ...interfaces.y, domain.y1];
  // the largest |value| of a region's function on a 9 × 9 lattice of its closed rectangle
  const size = (r: number, pick: (f: RegionFunctions) => PointFn): number => {
    const sx = r % columns, sy = (r - sx) / columns;
    const [ax, bx, ay, by] = [xBounds[sx], xBounds[sx + 1], yBounds[sy], yBounds[sy + 1]];
    let most = 0;
    for (let j = 0; j <= 8; j++) {
      for (let i = 0; i <= 8; i++) {
        const v = Math.abs(pick(regions[r])(ax + (i / 8) * (bx - ax), ay + (j / 8) * (by - ay)));
        if (Number.isFinite(v)) most = Math.max(most, v);
      }
    }
    return most;
  };
  const check = (
    label: string,
    r0: number,
    r1: number,
    point: (t: number) => [number, number],
    normal: "x" | "y",
  ) => {
    const conditions = [
      ["u", (r: RegionFunctions) => r.u],
      ["normal flux", (r: RegionFunctions) => (normal === "x" ? r.fluxX : r.fluxY)],
    ] as const;
    for (const [condition, pick] of conditions) {
      const scale = Math.max(size(r0, pick), size(r1, pick), 1e-300);
      let worst = -1, at = 0, before = 0, after = 0;
      for (let k = 0; k < CHECK_POINTS; k++) {
        const [x, y] = point(k / (CHECK_POINTS - 1));
        const p = pick(regions[r0])(x, y), q = pick(regions[r1])(x, y);
        const gap = Number.isFinite(p) && Number.isFinite(q) ? Math.abs(p - q) : Infinity;
        if (gap > worst) (worst = gap, at = k, before = p, after = q);
      }
      if (worst <= CONTINUITY_TOLERANCE * scale) continue;
      const [x, y] = point(at / (CHECK_POINTS - 1));
      problems.push({
        interface: label,
        condition,
        regions: [r0, r1],
        x,
        y,
        before,
        after,
        message:
          `across the interface ${label}, ${
            condition === "u" ? "the exact solution u" : `the normal flux (K∇u)·e${normal}`
          } jumps between regions ${r0 + 1} and ${r1 + 1}: ${before} on one side, ${after} on ` +
          `the other at (x, y) = (${x}, ${y}); choose regional exact solutions with u and ` +
          `the normal flux continuous there (for example u divided by the region's conductivity ` +
          `times a factor that vanishes on the interface)`,
      });
    }
  };
  interfaces.x.forEach((line, k) => {
    for (let sy = 0; sy < yBounds.length - 1; sy++) {
      const [y0, y1] = [yBounds[sy], yBounds[sy + 1]];
      check(
        `x = ${line}`,
        sy * columns + k,
        sy * columns + k + 1,
        (t) => [line, y0 + t * (y1 - y0)],
        "x",
      );
    }
  });
  interfaces.y.forEach((line, k) => {
    for (let sx = 0; sx < xBounds.length - 1; sx++) {
      const [x0, x1] = [xBounds[sx], xBounds[sx + 1]];
      check(
        `y = ${line}`,
        k * columns + sx,
        (k + 1) * columns + sx,
        (t) => [x0 + t * (x1 - x0), line],
        "y",
      );
    }
  });
  return problems;
}
