/**
 * Three tiny manufactured cases for `gridproof probe`, one per boundary kind, built directly as
 * compiled cases (no case files needed): u = exp(x + y/2) on [0, 1] × [0, 2] with
 * a = 1 + x/2, b = 0, c = 1, d = 0, e = 0, so f = (a + 1/4)·u (derived: u_xx = u, u_yy = u/4).
 * Outward normal derivatives: west −u_x = −u, east u_x = u, south −u_y = −u/2, north u_y = u/2.
 *
 * @module
 */
import type { CaseBoundary, CompiledCase, PointFn } from "../../cases/types.ts";
import { sampleSide } from "../../cases/mod.ts";
import type { BoundaryCondition, Problem, Side } from "../../reference-solver/mod.ts";
import { SIDES } from "../../reference-solver/mod.ts";

const u: PointFn = (x, y) => Math.exp(x + y / 2);
/** Outward normal derivative of u per side, as a multiple of u. */
const NORMAL: Record<Side, number> = { west: -1, east: 1, south: -0.5, north: 0.5 };
const NORMAL_TEXT: Record<Side, string> = { west: "-1", east: "1", south: "-0.5", north: "0.5" };

function boundaryFor(kind: "dirichlet" | "neumann" | "robin", side: Side): CaseBoundary {
  if (kind === "dirichlet") return { kind, data: u };
  if (kind === "neumann") return { kind, data: (x, y) => NORMAL[side] * u(x, y) };
  return {
    kind,
    alpha: () => 1,
    beta: () => 0.5,
    weightsText: { alpha: "1", beta: "0.5" },
    data: (x, y) => (1 + 0.5 * NORMAL[side]) * u(x, y),
  };
}

function boundaryText(kind: "dirichlet" | "neumann" | "robin", side: Side): string {
  if (kind === "dirichlet") return "exp(x + y / 2)";
  if (kind === "neumann") return `${NORMAL_TEXT[side]} * exp(x + y / 2)`;
  return `${1 + 0.5 * NORMAL[side]} * exp(x + y / 2)`;
}

/** Which kind each side gets in a probe case. */
export type ProbeBoundarySet = "dirichlet" | "neumann" | "robin";

/**
 * Builds the probe case for one boundary set: all Dirichlet; Neumann on west and east with
 * Dirichlet on south and north; or Robin (α = 1, β = 1/2) on every side.
 *
 * @param set which boundary kinds
 * @returns a compiled case usable by every solver backend
 *
 * @example
 * ```ts
 * import { probeCase } from "./probe_cases.ts";
 * probeCase("robin").boundary.north.kind; // "robin"
 * ```
 */
export function probeCase(set: ProbeBoundarySet): CompiledCase {
  const domain = { x0: 0, x1: 1, y0: 0, y1: 2 };
  const kinds: Record<Side, "dirichlet" | "neumann" | "robin"> = set === "neumann"
    ? { west: "neumann", east: "neumann", south: "dirichlet", north: "dirichlet" }
    : { west: set, east: set, south: set, north: set };
  const boundary = {} as Record<Side, CaseBoundary>;
  const boundaryTexts = {} as Record<Side, string>;
  for (const side of SIDES) {
    boundary[side] = boundaryFor(kinds[side], side);
    boundaryTexts[side] = boundaryText(kinds[side], side);
  }
  const coefficients = {
    a: (x: number) => 1 + 0.5 * x,
    b: () => 0,
    c: () => 1,
    d: () => 0,
    e: () => 0,
  };
  const source: PointFn = (x, y) => (1.25 + 0.5 * x) * u(x, y);
  const formulas = {
    a: "1 + 0.5 * x",
    b: "0",
    c: "1",
    d: "0",
    e: "0",
    exact: "exp(x + y / 2)",
    source: "(1.25 + 0.5 * x) * exp(x + y / 2)",
    boundary: boundaryTexts,
  };
  const sample = (nx: number, ny: number): Problem => {
    const hx = (domain.x1 - domain.x0) / nx;
    const hy = (domain.y1 - domain.y0) / ny;
    const n = (nx + 1) * (ny + 1);
    const a = new Float64Array(n);
    const f = new Float64Array(n);
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) {
        const x = domain.x0 + i * hx;
        const y = domain.y0 + j * hy;
        a[j * (nx + 1) + i] = coefficients.a(x);
        f[j * (nx + 1) + i] = source(x, y);
      }
    }
    const bcs = {} as Record<Side, BoundaryCondition>;
    for (const side of SIDES) {
      const bc = boundary[side];
      const values = sampleSide(bc.data, side, domain, nx, ny);
      bcs[side] = bc.kind === "robin"
        ? {
          kind: "robin",
          alpha: sampleSide(bc.alpha!, side, domain, nx, ny),
          beta: sampleSide(bc.beta!, side, domain, nx, ny),
          values,
        }
        : { kind: bc.kind, values };
    }
    return {
      domain,
      nx,
      ny,
      a,
      b: new Float64Array(n),
      c: new Float64Array(n).fill(1),
      d: new Float64Array(n),
      e: new Float64Array(n),
      f,
      boundary: bcs,
    };
  };
  const compiled: CompiledCase = {
    id: `probe-${set}`,
    title: `probe: exp(x + y/2), ${set} boundaries`,
    motivation: "a tiny request to check an adapter",
    origin: "gridproof probe",
    domain,
    parameters: {},
    expected: { central: { formal: 2 }, upwind: { formal: 1 } },
    tags: ["probe"],
    grids: [8, 16],
    intervalRatio: 2,
    exact: u,
    exactDx: u,
    exactDy: (x, y) => 0.5 * u(x, y),
    form: "non-conservative",
    interfaces: { x: [], y: [] },
    gridMisses: () => null,
    coefficients: { ...coefficients, m: () => 0 },
    constantCoefficients: { m: 0, b: 0, c: 1, d: 0, e: 0 },
    source,
    boundary,
    formulas,
    manufactured: "closed-form derivatives of exp(x + y/2)",
    tex: formulas,
    gridFor: (n: number) => ({ nx: n, ny: 2 * n }),
    sampleExact(nx: number, ny: number): Float64Array {
      const out = new Float64Array((nx + 1) * (ny + 1));
      for (let j = 0; j <= ny; j++) {
        for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = u(i / nx, (2 * j) / ny);
      }
      return out;
    },
    sample,
    sampleAsync: (nx: number, ny: number) => Promise.resolve(sample(nx, ny)),
  };
  return compiled;
}
