/**
 * Per-axis grid mappings from a uniform parameter t ∈ [0, 1] to a unit coordinate s ∈ [0, 1]
 * (then x = x0 + s·(x1 − x0)). A family of grids refines by halving the parameter spacing under
 * one fixed map, never by re-stretching each grid (Roy 2005, "Review of code and solution
 * verification procedures for computational simulation", J. Comput. Phys. 205; refinement must
 * come from one map for the observed order to mean anything).
 *
 * - uniform: s = t.
 * - tanh toward "start": s = 1 + tanh(δ(t − 1))/tanh δ (cells smallest at t = 0); toward "end":
 *   s = tanh(δt)/tanh δ; toward "both": s = ½(1 + tanh(δ(t − ½))/tanh(δ/2)). δ > 0 is the
 *   strength; the ratio of the largest to the smallest cell grows like cosh² of δ (one end) or
 *   δ/2 (both ends).
 * - geometric: neighbouring cells of the `cells`-cell grid grow by `ratio`:
 *   s = (q^t − 1)/(q − 1) with q = ratio^cells; on an n-cell grid of the family the ratio is
 *   q^(1/n).
 * - expression: the caller's own s(t) (the case engine compiles the user's x(t) and rescales it).
 *
 * @module
 */

/** How one axis is mapped (a case file's `spacing.x` or `spacing.y`). */
export type AxisMapping =
  | { kind: "uniform" }
  | { kind: "tanh"; strength: number; toward: "start" | "end" | "both" }
  | { kind: "geometric"; ratio: number; cells: number }
  | { kind: "expression"; unit: (t: number) => number };

/**
 * The unit map s(t) of a mapping (see the module doc for the formulas).
 *
 * @param mapping the axis mapping
 * @returns s as a function of t, with s(0) = 0 and s(1) = 1 exactly
 *
 * @example
 * ```ts
 * import { unitMap } from "./mapping.ts";
 * const s = unitMap({ kind: "tanh", strength: 2, toward: "both" });
 * if (s(0) !== 0 || s(1) !== 1 || Math.abs(s(0.5) - 0.5) > 1e-15) throw new Error("ends");
 * ```
 */
export function unitMap(mapping: AxisMapping): (t: number) => number {
  const ends = (fn: (t: number) => number) => (t: number) => t <= 0 ? 0 : t >= 1 ? 1 : fn(t);
  switch (mapping.kind) {
    case "uniform":
      return ends((t) => t);
    case "tanh": {
      const d = mapping.strength;
      if (mapping.toward === "end") return ends((t) => Math.tanh(d * t) / Math.tanh(d));
      if (mapping.toward === "start") {
        return ends((t) => 1 + Math.tanh(d * (t - 1)) / Math.tanh(d));
      }
      return ends((t) => 0.5 * (1 + Math.tanh(d * (t - 0.5)) / Math.tanh(d / 2)));
    }
    case "geometric": {
      const logQ = mapping.cells * Math.log(mapping.ratio);
      if (logQ === 0) return ends((t) => t);
      // (q^t − 1)/(q − 1) with expm1 for accuracy when q is near 1
      return ends((t) => Math.expm1(logQ * t) / Math.expm1(logQ));
    }
    case "expression":
      return ends(mapping.unit);
  }
}

/**
 * The n + 1 grid lines of one axis of the family: x_i = start + s(i/n)·(end − start), with the
 * ends exact.
 *
 * @param mapping the axis mapping
 * @param start the axis' first coordinate
 * @param end its last (> start)
 * @param n cells along the axis (≥ 1)
 * @returns the lines, strictly increasing for a valid mapping
 *
 * @example
 * ```ts
 * import { axisLines } from "./mapping.ts";
 * const x = axisLines({ kind: "uniform" }, 0, 2, 4);
 * if (x[2] !== 1 || x[4] !== 2) throw new Error("uniform lines");
 * ```
 */
export function axisLines(
  mapping: AxisMapping,
  start: number,
  end: number,
  n: number,
): Float64Array {
  const s = unitMap(mapping);
  const out = new Float64Array(n + 1);
  const length = end - start;
  for (let i = 0; i <= n; i++) out[i] = start + s(i / n) * length;
  out[0] = start, out[n] = end;
  return out;
}

/**
 * Why a unit map is not a valid mapping, or null: s(0) and s(1) must be 0 and 1 within
 * `tolerance`, and s strictly increasing and finite at `samples` + 1 equally spaced parameters
 * (checked at load, so any grid of the family has increasing lines up to that resolution).
 *
 * @param unit the map to check
 * @param options `samples` (default 4096), `tolerance` for the ends (default 1e-12)
 * @returns a sentence saying what is wrong and where, or null
 *
 * @example
 * ```ts
 * import { mappingFault } from "./mapping.ts";
 * mappingFault((t) => t * t); // null
 * mappingFault((t) => 1 - t); // "s(0) = 1, but a map must start at 0…"
 * ```
 */
export function mappingFault(
  unit: (t: number) => number,
  options: { samples?: number; tolerance?: number } = {},
): string | null {
  const samples = options.samples ?? 4096;
  const tolerance = options.tolerance ?? 1e-12;
  const s0 = unit(0), s1 = unit(1);
  if (!(Math.abs(s0) <= tolerance)) {
    return `s(0) = ${s0}, but a map must start at 0 (the domain's first coordinate)`;
  }
  if (!(Math.abs(s1 - 1) <= tolerance)) {
    return `s(1) = ${s1}, but a map must end at 1 (the domain's last coordinate)`;
  }
  let previous = s0;
  for (let k = 1; k <= samples; k++) {
    const t = k / samples;
    const s = unit(t);
    if (!Number.isFinite(s)) return `the map is ${s} at t = ${t}; it must be finite on [0, 1]`;
    if (!(s > previous)) {
      return `the map is not strictly increasing: s(${(k - 1) / samples}) = ${previous} and ` +
        `s(${t}) = ${s}`;
    }
    previous = s;
  }
  return null;
}
