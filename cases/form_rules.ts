/**
 * The rules of a case file's operator form that a schema cannot say: which fields each form takes,
 * where interfaces may lie, how many regions they make, and that every region ends up with an
 * exact solution (and, for the conservative form, a conductivity).
 *
 * @module
 */
import type { CaseFile } from "./case_file.ts";

const MISSING_EXACT = 'missing field "exact" (The manufactured exact solution u(x, y), from ' +
  "which the source term and the boundary data are derived): add it";

const CONSERVATIVE_ONLY = [
  "conductivity",
  "advection",
  "reaction",
  "interfaces",
  "regions",
] as const;

/**
 * Every broken form rule of a (schema-valid) case file, as JSON pointer and message.
 *
 * @example
 * ```ts
 * import { formProblems } from "./form_rules.ts";
 * const [[pointer]] = formProblems({ conductivity: "1" } as never);
 * if (pointer !== "/conductivity") throw new Error(pointer);
 * ```
 */
export function formProblems(c: CaseFile): [string, string, string?][] {
  const out: [string, string, string?][] = [];
  const conservative = c.form === "conservative";
  if (!conservative) {
    for (const field of CONSERVATIVE_ONLY) {
      if (c[field] === undefined) continue;
      out.push([
        `/${field}`,
        `${field} belongs to the conservative form ∇·(K∇u) + β·∇u + σ·u = f; add ` +
        `"form": "conservative" (and drop coefficients), or remove ${field}`,
      ]);
    }
    if (c.coefficients === undefined) {
      out.push([
        "",
        'missing field "coefficients": the non-conservative form (the default) needs ' +
        '"coefficients" {a, b, c, d, e}; for ∇·(K∇u) + β·∇u + σ·u = f write "form": ' +
        '"conservative" and give "conductivity"',
        "coefficients",
      ]);
    }
    if (c.exact === undefined) out.push(["", MISSING_EXACT, "exact"]);
    return out;
  }
  if (c.coefficients !== undefined) {
    out.push([
      "/coefficients",
      "the conservative form takes conductivity (K), advection (β) and reaction (σ) instead of " +
      'coefficients; write them that way, or use "form": "non-conservative"',
    ]);
  }
  const lines = { x: c.interfaces?.x ?? [], y: c.interfaces?.y ?? [] };
  const bounds = {
    x: [c.domain.x0, c.domain.x1],
    y: [c.domain.y0, c.domain.y1],
  } as const;
  for (const axis of ["x", "y"] as const) {
    const [lo, hi] = bounds[axis];
    lines[axis].forEach((at, k) => {
      if (!(at > lo && at < hi)) {
        out.push([
          `/interfaces/${axis}/${k}`,
          `the interface ${axis} = ${at} is not strictly inside the domain (${lo} < ${axis} < ${hi}); ` +
          "move it inside, or remove it",
        ]);
      } else if (k > 0 && !(at > lines[axis][k - 1])) {
        out.push([
          `/interfaces/${axis}/${k}`,
          `interfaces must increase: ${axis} = ${at} comes after ${axis} = ${lines[axis][k - 1]}`,
        ]);
      }
    });
  }
  const count = (lines.x.length + 1) * (lines.y.length + 1);
  const regions = c.regions;
  if (count > 1 && regions === undefined) {
    out.push([
      "/interfaces",
      `the interfaces make ${count} regions, so "regions" must list ${count} entries (west to ` +
      "east, then south to north), each with what differs in that region",
    ]);
  }
  if (regions !== undefined && regions.length !== count) {
    out.push([
      "/regions",
      count === 1
        ? 'regions are given but there are no interfaces: add "interfaces", or remove regions'
        : `the interfaces make ${count} regions (${lines.x.length + 1} across × ` +
          `${
            lines.y.length + 1
          } up), but ${regions.length} are listed; list one entry per region, ` +
          "west to east, then south to north",
    ]);
  }
  const everyRegion = (field: "exact" | "conductivity") =>
    regions !== undefined && regions.length === count &&
    regions.every((r) => r[field] !== undefined);
  if (c.exact === undefined && !everyRegion("exact")) {
    out.push(["", `${MISSING_EXACT}, or give one in every region`, "exact"]);
  }
  if (c.conductivity === undefined && !everyRegion("conductivity")) {
    out.push([
      "",
      'missing field "conductivity": the conservative form needs the conductivity K, at the top ' +
      "level or in every region",
      "conductivity",
    ]);
  }
  return out;
}
