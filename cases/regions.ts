/**
 * Material interfaces: straight lines x = const and y = const that split the rectangle into
 * regions, each with its own coefficients and exact solution. Regions are numbered west to east,
 * then south to north (x fastest), the order a case file lists them in.
 *
 * A value sampled on an interface belongs to more than one region. The rules, which follow from
 * what a flux-balance scheme integrates over the control volume or face around the point:
 * - point values (source, coefficients, boundary data): the mean of the one-sided values;
 * - a conductivity at a face whose flux crosses the interface: the harmonic mean of the one-sided
 *   values (two conductors in series, each over half the distance between the points the face
 *   joins);
 * - a conductivity at a face whose flux runs along the interface: the arithmetic mean (two
 *   conductors side by side, each over half the face).
 *
 * @module
 */
import type { Domain } from "../reference-solver/mod.ts";
import type { PointFn } from "./types.ts";

/** Interface positions, each strictly inside the domain, increasing. */
export interface Interfaces {
  x: readonly number[];
  y: readonly number[];
}

/** No interfaces: one region. */
export const NO_INTERFACES: Interfaces = { x: [], y: [] };

/** Number of regions the interfaces make. */
export function regionCount(interfaces: Interfaces): number {
  return (interfaces.x.length + 1) * (interfaces.y.length + 1);
}

/** Whether there are interfaces at all. */
export function hasInterfaces(interfaces: Interfaces): boolean {
  return interfaces.x.length > 0 || interfaces.y.length > 0;
}

/** Relative distance under which a coordinate counts as lying on an interface. */
export const ON_LINE = 1e-9;

/**
 * The strips along one axis whose closure holds coordinate t: one strip inside, two on a line.
 *
 * @param lines interface positions along the axis, increasing
 * @param t the coordinate
 * @param scale the domain's extent along the axis (for the tolerance {@link ON_LINE})
 */
export function stripsAt(lines: readonly number[], t: number, scale: number): number[] {
  let strip = 0;
  while (strip < lines.length && t > lines[strip]) strip++;
  // t ≤ lines[strip] here (or strip = lines.length): check both neighbouring lines
  if (strip < lines.length && Math.abs(t - lines[strip]) <= ON_LINE * scale) {
    return [strip, strip + 1];
  }
  if (strip > 0 && Math.abs(t - lines[strip - 1]) <= ON_LINE * scale) return [strip - 1, strip];
  return [strip];
}

/** The regions whose closure holds the point (1, 2 or 4 region numbers). */
export function regionsAt(interfaces: Interfaces, domain: Domain, x: number, y: number): number[] {
  const xs = stripsAt(interfaces.x, x, domain.x1 - domain.x0);
  const ys = stripsAt(interfaces.y, y, domain.y1 - domain.y0);
  const columns = interfaces.x.length + 1;
  const out: number[] = [];
  for (const sy of ys) for (const sx of xs) out.push(sy * columns + sx);
  return out;
}

/**
 * A piecewise point function: inside a region its own function, on an interface the mean of the
 * one-sided values. With one region it is that region's function itself.
 */
export function piecewiseMean(
  fns: readonly PointFn[],
  interfaces: Interfaces,
  domain: Domain,
): PointFn {
  if (fns.length === 1) return fns[0];
  return (x, y) => {
    const regions = regionsAt(interfaces, domain, x, y);
    let total = 0;
    for (const r of regions) total += fns[r](x, y);
    return total / regions.length;
  };
}

/**
 * A conductivity component at a face: inside a region its own value; on an interface the harmonic
 * mean of the one-sided values when the face's flux crosses that interface, the arithmetic mean
 * when it runs along it (see the module doc).
 *
 * @param across "x" when the face's flux runs along x (it crosses x-interfaces and runs along
 *   y-interfaces), "y" for the other faces
 */
export function faceConductivity(
  fns: readonly PointFn[],
  interfaces: Interfaces,
  domain: Domain,
  across: "x" | "y",
): PointFn {
  if (fns.length === 1) return fns[0];
  const columns = interfaces.x.length + 1;
  return (x, y) => {
    const xs = stripsAt(interfaces.x, x, domain.x1 - domain.x0);
    const ys = stripsAt(interfaces.y, y, domain.y1 - domain.y0);
    // along the flux: series (harmonic); across the flux: side by side (arithmetic)
    const [series, parallel] = across === "x" ? [xs, ys] : [ys, xs];
    let arithmetic = 0;
    for (const p of parallel) {
      let reciprocal = 0;
      for (const s of series) {
        const [sx, sy] = across === "x" ? [s, p] : [p, s];
        reciprocal += 1 / fns[sy * columns + sx](x, y);
      }
      arithmetic += series.length / reciprocal;
    }
    return arithmetic / parallel.length;
  };
}

/**
 * Why an nx × ny grid does not put every interface on a grid line, or null when it does.
 *
 * @example
 * ```ts
 * import { gridMisses } from "./regions.ts";
 * const domain = { x0: 0, x1: 1, y0: 0, y1: 1 };
 * if (gridMisses({ x: [0.5], y: [] }, domain, 16, 16) !== null) throw new Error("0.5 is a line of 16");
 * if (gridMisses({ x: [0.5], y: [] }, domain, 15, 15) === null) throw new Error("not of 15");
 * ```
 */
export function gridMisses(
  interfaces: Interfaces,
  domain: Domain,
  nx: number,
  ny: number,
): string | null {
  const axes = [
    ["x", interfaces.x, domain.x0, domain.x1, nx],
    ["y", interfaces.y, domain.y0, domain.y1, ny],
  ] as const;
  for (const [axis, lines, start, end, n] of axes) {
    for (const line of lines) {
      const steps = ((line - start) / (end - start)) * n;
      if (Math.abs(steps - Math.round(steps)) > 1e-7 * Math.max(1, n)) {
        return `the interface ${axis} = ${line} falls between grid lines of the ${nx}×${ny} grid ` +
          `(${axis === "x" ? "nx" : "ny"} = ${n} puts it at line ${
            steps.toPrecision(6)
          }); choose ` +
          `grids on which every interface is a grid line`;
      }
    }
  }
  return null;
}
