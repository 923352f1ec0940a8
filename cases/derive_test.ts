import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { buildCase } from "./engine.ts";
import { loadLibrary } from "./load.ts";
import { mulberry32 } from "../testing/mod.ts";
import { testCase } from "./_test_case.ts";
import type { PointFn } from "./types.ts";

/** Richardson-extrapolated central differences (fourth order) of a point function. */
function differences(u: PointFn, x: number, y: number, h: number) {
  const d1 = (s: number, dx: number, dy: number) =>
    (u(x + s * dx, y + s * dy) - u(x - s * dx, y - s * dy)) / (2 * s);
  const d2 = (s: number, dx: number, dy: number) =>
    (u(x + s * dx, y + s * dy) - 2 * u(x, y) + u(x - s * dx, y - s * dy)) / (s * s);
  const rich = (f: (s: number) => number) => (4 * f(h / 2) - f(h)) / 3;
  return {
    ux: rich((s) => d1(s, 1, 0)),
    uy: rich((s) => d1(s, 0, 1)),
    uxx: rich((s) => d2(s, 1, 0)),
    uyy: rich((s) => d2(s, 0, 1)),
  };
}

Deno.test("derived source terms and boundary data agree with finite differences of the compiled exact solution", async (t) => {
  // Common practice: central finite differences of the exact solution at random points are an
  // independent check of symbolic derivatives (docs/check-values.md, "Independent libraries").
  const random = mulberry32(7);
  for (const c of await loadLibrary()) {
    await t.step(c.id, () => {
      const { x0, x1, y0, y1 } = c.domain;
      const h = 1e-3 * Math.min(x1 - x0, y1 - y0);
      for (let k = 0; k < 25; k++) {
        const x = x0 + (0.05 + 0.9 * random()) * (x1 - x0);
        const y = y0 + (0.05 + 0.9 * random()) * (y1 - y0);
        // a finite-difference stencil must not straddle an interface (u has a kink there)
        const nearLine = (lines: readonly number[], t: number) =>
          lines.some((l) => Math.abs(t - l) < 4 * h);
        if (nearLine(c.interfaces.x, x) || nearLine(c.interfaces.y, y)) continue;
        const D = differences(c.exact, x, y, h);
        const uxy = (differences(c.exact, x + h, y, h).uy - differences(c.exact, x - h, y, h).uy) /
          (2 * h);
        const co = c.coefficients;
        const k = c.conservative;
        // the conservative form: f = ∂x(K∇u)_x + ∂y(K∇u)_y + β·∇u + σu, the fluxes differenced
        // as a whole (independent of the engine's expansion and of its product rule)
        const flux = (px: number, py: number) => {
          const d = differences(c.exact, px, py, h / 4);
          return {
            x: k!.k11(px, py) * d.ux + k!.k12(px, py) * d.uy,
            y: k!.k12(px, py) * d.ux + k!.k22(px, py) * d.uy,
          };
        };
        // central differences of the fluxes, Richardson-extrapolated like `differences`
        const outer = (f: (s: number) => number) => (4 * f(h / 2) - f(h)) / 3;
        const terms = k
          ? [
            outer((s) => (flux(x + s, y).x - flux(x - s, y).x) / (2 * s)),
            outer((s) => (flux(x, y + s).y - flux(x, y - s).y) / (2 * s)),
            k.bx(x, y) * D.ux,
            k.by(x, y) * D.uy,
            k.sigma(x, y) * c.exact(x, y),
          ]
          : [
            co.a(x, y) * D.uxx,
            co.b(x, y) * D.ux,
            co.c(x, y) * D.uyy,
            co.d(x, y) * D.uy,
            co.e(x, y) * c.exact(x, y),
            co.m(x, y) * uxy,
          ];
        const scale = terms.reduce((s, v) => s + Math.abs(v), 0) + 1;
        const fd = terms.reduce((s, v) => s + v, 0);
        assertClose(c.source(x, y), fd, { abs: 2e-6 * scale }, `source at (${x}, ${y})`);
        assertClose(c.exactDx(x, y), D.ux, { abs: 1e-7 * (Math.abs(D.ux) + 1) }, "u_x");
        assertClose(c.exactDy(x, y), D.uy, { abs: 1e-7 * (Math.abs(D.uy) + 1) }, "u_y");
        // Neumann and Robin data: ∂u/∂n, or the conormal flux (K∇u)·n for the conservative form
        const q = k ? flux(x, y) : { x: D.ux, y: D.uy };
        const normal = { west: -q.x, east: q.x, south: -q.y, north: q.y };
        for (const side of ["west", "east", "south", "north"] as const) {
          const b = c.boundary[side];
          if (b.kind === "periodic") continue; // no data: the seam joins the opposite side
          const want = b.kind === "dirichlet"
            ? c.exact(x, y)
            : b.kind === "neumann"
            ? normal[side]
            : b.alpha!(x, y) * c.exact(x, y) + b.beta!(x, y) * normal[side];
          assertClose(b.data(x, y), want, { abs: 1e-7 * (Math.abs(want) + 1) }, `${side} data`);
        }
      }
    });
  }
});

Deno.test("the derived Laplacian of sin(kπx)·sin(lπy) is −(k² + l²)π² times itself", async () => {
  // Derived: ∂²/∂x² sin(kπx) = −k²π² sin(kπx), likewise in y.
  const random = mulberry32(11);
  for (const [k, l] of [[1, 1], [2, 3], [5, 1], [4, 4]]) {
    const c = await buildCase(testCase({ exact: `sin(${k}*pi*x)*sin(${l}*pi*y)` }), {
      origin: "test",
    });
    for (let n = 0; n < 10; n++) {
      const x = random(), y = random();
      const u = Math.sin(k * Math.PI * x) * Math.sin(l * Math.PI * y);
      assertClose(c.source(x, y), -(k * k + l * l) * Math.PI * Math.PI * u, {
        rel: 1e-12,
        abs: 1e-12,
      });
    }
  }
});

Deno.test("outward normals: ∂u/∂n of u = x + 2y is −1, 1, −2, 2 on west, east, south, north", async () => {
  // Derived: ∇u = (1, 2); outward normals (−1, 0), (1, 0), (0, −1), (0, 1).
  const neumann = { kind: "neumann" as const };
  const c = await buildCase(
    testCase({
      exact: "x + 2*y",
      coefficients: { a: "1", b: "0", c: "1", d: "0", e: "-1" },
      boundary: { west: neumann, east: neumann, south: neumann, north: neumann },
    }),
    { origin: "test" },
  );
  assert.deepEqual(
    (["west", "east", "south", "north"] as const).map((s) => c.boundary[s].data(0.3, 0.6)),
    [-1, 1, -2, 2],
  );
});

Deno.test("atan2, hypot, min and max in an exact solution are differentiated through equal forms", async () => {
  // Derived: atan2(y, x) has gradient (−y, x)/r²; hypot(x, y) has gradient (x, y)/r;
  // max(x, y) has gradient (1, 0) where x > y. The domain keeps away from (0, 0), where the
  // second derivatives of hypot are unbounded, and from x = y, where those of max are not
  // defined: the case is refused at build otherwise (the source term is not finite there).
  const c1 = await buildCase(
    testCase({
      exact: "atan2(y, x + 1) + hypot(x, y) + max(x, y)",
      domain: { x0: 0.5, x1: 1, y0: 0, y1: 0.4 },
    }),
    { origin: "test" },
  );
  const x = 0.7, y = 0.2, r2 = (x + 1) ** 2 + y * y, r = Math.hypot(x, y);
  assertClose(c1.exactDx(x, y), -y / r2 + x / r + 1, { rel: 1e-12 });
  assertClose(c1.exactDy(x, y), (x + 1) / r2 + y / r, { rel: 1e-12 });
});

Deno.test("a parameter is a constant in derivatives and can be overridden at load", async () => {
  const file = testCase({ exact: "exp(k*x)", parameters: { k: 2 } });
  const c = await buildCase(file, { origin: "test", parameters: { k: 3 } });
  // derived: (exp(kx))'' = k² exp(kx) with k = 3
  assertClose(c.source(0.5, 0.5), 9 * Math.exp(1.5), { rel: 1e-13 });
  await assert.rejects(
    buildCase(file, { origin: "test", parameters: { q: 1 } }),
    (e: unknown) =>
      e instanceof RangeError && /no parameter "q"; valid parameters: k/.test(e.message),
  );
});
