/**
 * A hand-built CompiledCase for protocol tests (independent of the case engine):
 * u = exp(x + y/2) on [0, 1] × [0, 2] with a = 1 + x, b = y, c = 1, d = 0.5, e = −1, so
 * f = (a + b + c/4 + d/2 + e)·u (derived: u_x = u_xx = u, u_y = u/2, u_yy = u/4).
 * Boundaries: west Dirichlet, east Neumann (∂u/∂n = u_x = u), south Robin with α = 1, β = 0.5
 * (∂u/∂n = −u_y = −u/2, so g = u − u/4), north Dirichlet (or all Dirichlet with `allDirichlet`).
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import { sampleSide } from "../../cases/mod.ts";
import type { BoundaryCondition, Problem, Side } from "../../reference-solver/mod.ts";
import { SIDES } from "../../reference-solver/mod.ts";

const u = (x: number, y: number) => Math.exp(x + y / 2);
const a = (x: number) => 1 + x;
const b = (_x: number, y: number) => y;

/** Builds the test case. */
export function testCase(options: { allDirichlet?: boolean; id?: string } = {}): CompiledCase {
  const domain = { x0: 0, x1: 1, y0: 0, y1: 2 };
  const source = (x: number, y: number) => (a(x) + b(x, y) + 0.25 + 0.25 - 1) * u(x, y);
  const boundary: CompiledCase["boundary"] = options.allDirichlet
    ? {
      west: { kind: "dirichlet", data: u },
      east: { kind: "dirichlet", data: u },
      south: { kind: "dirichlet", data: u },
      north: { kind: "dirichlet", data: u },
    }
    : {
      west: { kind: "dirichlet", data: u },
      east: { kind: "neumann", data: u },
      south: {
        kind: "robin",
        alpha: () => 1,
        beta: () => 0.5,
        weightsText: { alpha: "1", beta: "0.5" },
        data: (x, y) => 0.75 * u(x, y),
      },
      north: { kind: "dirichlet", data: u },
    };
  const coefficients = {
    a: (x: number, _y: number) => a(x),
    b,
    c: () => 1,
    d: () => 0.5,
    e: () => -1,
  };
  const compiled: CompiledCase = {
    id: options.id ?? "test-exp",
    title: "exp(x + y/2) with variable coefficients",
    motivation: "protocol tests",
    origin: "tests/protocol/_case.ts",
    domain,
    parameters: {},
    expected: { central: { formal: 2 }, upwind: { formal: 1 } },
    tags: [],
    grids: [8, 16, 32],
    intervalRatio: 2,
    exact: u,
    exactDx: u,
    exactDy: (x, y) => 0.5 * u(x, y),
    form: "non-conservative",
    interfaces: { x: [], y: [] },
    gridMisses: () => null,
    coefficients: { ...coefficients, m: () => 0 },
    constantCoefficients: { m: 0, c: 1, d: 0.5, e: -1 },
    source,
    boundary,
    formulas: {
      a: "1 + x",
      b: "y",
      c: "1",
      d: "0.5",
      e: "-1",
      exact: "exp(x + y / 2)",
      source: "(x + y + 0.5) * exp(x + y / 2)",
      boundary: {
        west: "exp(x + y / 2)",
        east: options.allDirichlet ? "exp(x + y / 2)" : "exp(x + y / 2)",
        south: options.allDirichlet ? "exp(x + y / 2)" : "0.75 * exp(x + y / 2)",
        north: "exp(x + y / 2)",
      },
    },
    manufactured: "hand-built for protocol tests",
    get tex() {
      return compiled.formulas;
    },
    gridFor: (n: number) => ({ nx: n, ny: Math.round(n * 2) }),
    sampleExact(nx: number, ny: number): Float64Array {
      const out = new Float64Array((nx + 1) * (ny + 1));
      for (let j = 0; j <= ny; j++) {
        for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = u(i / nx, (2 * j) / ny);
      }
      return out;
    },
    sampleAsync(nx: number, ny: number): Promise<Problem> {
      return Promise.resolve(compiled.sample(nx, ny));
    },
    sample(nx: number, ny: number): Problem {
      const hx = (domain.x1 - domain.x0) / nx;
      const hy = (domain.y1 - domain.y0) / ny;
      const n = (nx + 1) * (ny + 1);
      const arrays = [0, 1, 2, 3, 4, 5].map(() => new Float64Array(n));
      const fns = [coefficients.a, b, coefficients.c, coefficients.d, coefficients.e, source];
      for (let j = 0; j <= ny; j++) {
        for (let i = 0; i <= nx; i++) {
          const x = domain.x0 + i * hx;
          const y = domain.y0 + j * hy;
          for (let m = 0; m < 6; m++) arrays[m][j * (nx + 1) + i] = fns[m](x, y);
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
      const [aa, bb, cc, dd, ee, ff] = arrays;
      return { domain, nx, ny, a: aa, b: bb, c: cc, d: dd, e: ee, f: ff, boundary: bcs };
    },
  };
  return compiled;
}
