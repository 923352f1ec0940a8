import assert from "node:assert/strict";
import { validateProblem } from "./validate.ts";
import type { Problem } from "./problem.ts";

function base(kinds: { west?: "dirichlet" | "neumann"; south?: "dirichlet" | "neumann" } = {}) {
  const nx = 4, ny = 2, n = (nx + 1) * (ny + 1), one = new Float64Array(n).fill(1);
  const side = (kind: "dirichlet" | "neumann", len: number) => ({
    kind,
    values: new Float64Array(len + 1),
  });
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx,
    ny,
    a: one,
    b: new Float64Array(n),
    c: one,
    d: new Float64Array(n),
    e: one,
    f: one,
    boundary: {
      west: side(kinds.west ?? "dirichlet", ny),
      east: side("dirichlet", ny),
      south: side(kinds.south ?? "dirichlet", nx),
      north: side("dirichlet", nx),
    },
  } satisfies Problem;
}

function refuses(p: Problem, pattern: RegExp): void {
  assert.throws(
    () => validateProblem(p),
    (e: unknown) => e instanceof RangeError && pattern.test(e.message) && !e.message.endsWith("."),
  );
}

const K = (over: Record<string, unknown> = {}) => ({
  alongX: { k11: new Float64Array(4 * 3).fill(1) },
  alongY: { k22: new Float64Array(5 * 2).fill(1) },
  ...over,
});

Deno.test("validateProblem() checks the mixed coefficient m", async (t) => {
  await t.step("length", () => {
    refuses({ ...base(), m: new Float64Array(3) }, /problem\.m.*15 values.*length 3/);
  });
  await t.step("finite values, with the node and its coordinates", () => {
    const m = new Float64Array(15);
    m[6] = NaN;
    refuses({ ...base(), m }, /problem\.m at node \(1, 1\) at \(x, y\) = \(0\.25, 0\.5\).*NaN/);
  });
  await t.step("ellipticity 4ac − m² > 0 (a = c = 1, m = 2 gives 0)", () => {
    const m = new Float64Array(15);
    m[7] = 2;
    refuses(
      { ...base(), m },
      /not elliptic at node \(2, 1\).*4ac − m² = 0 must be > 0.*smaller than 2·√\(a·c\)/,
    );
  });
  await t.step("m ≠ 0 at a corner between two Neumann/Robin sides", () => {
    const m = new Float64Array(15).fill(0.5);
    refuses(
      { ...base({ west: "neumann", south: "neumann" }), m },
      /m·u_xy at the corner node \(0, 0\).*west and south.*must be 0.*one of those sides Dirichlet/,
    );
    // accepted when the corner value is zero, or when one side is Dirichlet
    m[0] = 0;
    validateProblem({ ...base({ west: "neumann", south: "neumann" }), m });
    validateProblem({ ...base({ west: "neumann" }), m: new Float64Array(15).fill(0.5) });
  });
});

Deno.test("validateProblem() checks the conductivity", async (t) => {
  await t.step("lengths of the edge arrays", () => {
    refuses(
      { ...base(), conductivity: K({ alongX: { k11: new Float64Array(15) } }) },
      /conductivity\.alongX\.k11.*nx·\(ny\+1\) = 12 values.*length 15/,
    );
    refuses(
      {
        ...base(),
        conductivity: K({ alongY: { k22: new Float64Array(10), k12: new Float64Array(2) } }),
      },
      /conductivity\.alongY\.k12.*\(nx\+1\)·ny = 10 values.*length 2/,
    );
  });
  await t.step("k11 > 0 at the x-edge midpoints, named by index and (x, y)", () => {
    const k11 = new Float64Array(12).fill(1);
    k11[5] = -2;
    refuses(
      { ...base(), conductivity: K({ alongX: { k11 } }) },
      /alongX\.k11 at the x-edge midpoint \(i \+ ½, j\) = \(1\.5, 1\) at \(x, y\) = \(0\.375, 0\.5\): value -2 must be > 0/,
    );
  });
  await t.step("positive definiteness where k12 is given", () => {
    const k12 = new Float64Array(12);
    k12[0] = 1.5; // k11 = k22 = 1: 1 − 2.25 < 0
    refuses(
      { ...base(), conductivity: K({ alongX: { k11: new Float64Array(12).fill(1), k12 } }) },
      /not positive definite at the x-edge midpoint \(i \+ ½, j\) = \(0\.5, 0\).*k11·k22 − k12² = -1\.25 must be > 0/,
    );
  });
  await t.step("a and c are not checked for ellipticity in the conservative form", () => {
    const zero = new Float64Array(15);
    validateProblem({ ...base(), a: zero, c: zero, conductivity: K() });
  });
});
