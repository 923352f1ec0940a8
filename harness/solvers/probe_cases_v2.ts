/**
 * Two tiny cases for probing solvers that speak protocol version 2, built from case files in code
 * by the case engine (so their source and boundary data are derived, never typed in):
 *
 * - `conservative`: ∇·(K∇u) = f on [0, 1] × [0, 2] with one interface x = ½, K = 1 + y/4 to its
 *   west and 4·(1 + y/4) to its east (so K varies from face to face and jumps fourfold), and
 *   u = sin(2πx)·sin(πy/2)/k + y with k = 1 and 4: u is continuous (sin(2πx) vanishes on the
 *   interface) and so is the flux K·u_x = (1 + y/4)·2π·cos(2πx)·sin(πy/2). East Neumann (the
 *   conormal flux), other sides Dirichlet.
 * - `mixed`: u_xx + 0.5·u_xy + u_yy = f, u = exp(x + y/2), Neumann on west and east.
 *
 * @module
 */
import { buildCase, type CaseFile, type CompiledCase, validateCaseText } from "../../cases/mod.ts";

/** The version 2 probe cases. */
export type ProbeFormCase = "conservative" | "mixed" | "robin-varying";

const COMMON = {
  domain: { x0: 0, x1: 1, y0: 0, y1: 2 },
  expected: { central: { formal: 2 } },
  tags: ["probe"],
  grids: [8, 16],
};

const FILES: Record<ProbeFormCase, Record<string, unknown>> = {
  conservative: {
    id: "probe-conservative",
    title: "probe: conservative form, K varying and jumping fourfold across x = 1/2",
    motivation: "a tiny version 2 request with K at the faces and one interface",
    manufactured:
      "u = sin(2πx)·sin(πy/2)/k + y per region: continuous, with a continuous flux K·u_x",
    ...COMMON,
    form: "conservative",
    interfaces: { x: [0.5] },
    regions: [
      { conductivity: "1 + 0.25*y", exact: "sin(2*pi*x)*sin(pi*y/2)/1 + y" },
      { conductivity: "4*(1 + 0.25*y)", exact: "sin(2*pi*x)*sin(pi*y/2)/4 + y" },
    ],
    boundary: {
      west: { kind: "dirichlet" },
      east: { kind: "neumann" },
      south: { kind: "dirichlet" },
      north: { kind: "dirichlet" },
    },
  },
  mixed: {
    id: "probe-mixed",
    title: "probe: mixed derivative u_xy",
    motivation: "a tiny version 2 request with the mixed term",
    manufactured: "u = exp(x + y/2), every derivative non-zero",
    ...COMMON,
    coefficients: { a: "1", b: "0", c: "1", d: "0", e: "0", m: "0.5" },
    exact: "exp(x + y/2)",
    boundary: {
      west: { kind: "neumann" },
      east: { kind: "neumann" },
      south: { kind: "dirichlet" },
      north: { kind: "dirichlet" },
    },
  },
  "robin-varying": {
    id: "probe-robin-varying",
    title: "probe: Robin weights varying along the east and north sides",
    motivation: "a tiny version 2 request whose Robin alpha and beta are arrays",
    manufactured: "u = exp(x + y/2), every derivative non-zero; α and β vary along their sides",
    ...COMMON,
    coefficients: { a: "1", b: "0", c: "1", d: "0", e: "0" },
    exact: "exp(x + y/2)",
    boundary: {
      west: { kind: "dirichlet" },
      east: { kind: "robin", alpha: "1 + y", beta: "0.5 + 0.25*y" },
      south: { kind: "dirichlet" },
      north: { kind: "robin", alpha: "2 - x", beta: 1 },
    },
  },
};

const built = new Map<ProbeFormCase, Promise<CompiledCase>>();

/**
 * Builds (once) the version 2 probe case of one kind.
 *
 * @param kind "conservative" or "mixed"
 * @returns the compiled case
 * @throws TypeError if the built-in file is refused by the case engine (a bug here)
 *
 * @example
 * ```ts ignore
 * import { probeFormCase } from "./probe_cases_v2.ts";
 * (await probeFormCase("mixed")).form; // "non-conservative"
 * ```
 */
export function probeFormCase(kind: ProbeFormCase): Promise<CompiledCase> {
  let found = built.get(kind);
  if (!found) {
    const file = `probe_cases_v2.ts (${kind})`;
    const { value, problems } = validateCaseText(JSON.stringify(FILES[kind]), file);
    if (!value) {
      throw new TypeError(
        `the probe case ${kind} is refused: ${problems.map((p) => p.message).join("; ")}`,
      );
    }
    found = buildCase(value as CaseFile, { origin: "gridproof probe", file });
    built.set(kind, found);
  }
  return found;
}
