/**
 * The quantity rules on unequal steps, against exact identities on random non-uniform grids
 * (neighbouring widths differing up to tenfold): the trapezoid rule and the midpoint rule with a
 * linear reconstruction integrate bilinear fields exactly; cubic Lagrange interpolation
 * reproduces polynomials of degree 3 in each variable; the one-sided three-point derivative and
 * the three-point tangential derivative are exact for quadratics (all derived in
 * `quantity_rules_mapped.ts`). Then: on equal steps the rules reduce to the uniform ones, and on a
 * stretched family the observed order of every kind of quantity is at least 2 on an exactly
 * sampled smooth field.
 */
import assert from "node:assert/strict";
import { buildCase, type QuantitySpec } from "../../cases/mod.ts";
import { testCase } from "../../cases/_test_case.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { caseGrid } from "../../cases/mod.ts";
import { gridPointsOf } from "../../grid/mod.ts";
import { assertClose, mulberry32 } from "../../testing/mod.ts";
import { discreteQuantity, exactQuantity } from "./chosen_quantities.ts";
import type { DiscreteField } from "./quantities.ts";
import {
  cubicPointValue,
  lineWeights,
  rectangleIntegral,
  sideDerivatives,
  type StructuredField,
} from "./quantity_rules.ts";
import { mappedLineWeights, mappedPositions } from "./quantity_rules_mapped.ts";

const DOMAIN = { x0: -0.5, x1: 1.5, y0: 0.25, y1: 1.25 };

/** n + 1 increasing lines from lo to hi with random widths between 0.2 and 2 (ratio up to 10). */
function randomLines(random: () => number, lo: number, hi: number, n: number): Float64Array {
  const widths = Array.from({ length: n }, () => 0.2 + 1.8 * random());
  const total = widths.reduce((s, w) => s + w, 0);
  const out = new Float64Array(n + 1);
  out[0] = lo;
  for (let k = 0; k < n; k++) out[k + 1] = out[k] + ((hi - lo) * widths[k]) / total;
  out[n] = hi;
  return out;
}

/** A field of u sampled at a random non-uniform grid's nodes or cell centres. */
function randomField(
  layout: "vertex" | "cell",
  u: (x: number, y: number) => number,
  seed: number,
  nx = 11,
  ny = 9,
): StructuredField {
  const random = mulberry32(seed);
  const lines = {
    x: randomLines(random, DOMAIN.x0, DOMAIN.x1, nx),
    y: randomLines(random, DOMAIN.y0, DOMAIN.y1, ny),
  };
  const px = mappedPositions(layout, lines.x), py = mappedPositions(layout, lines.y);
  const values = new Float64Array(px.length * py.length);
  for (let j = 0; j < py.length; j++) {
    for (let i = 0; i < px.length; i++) values[j * px.length + i] = u(px[i], py[j]);
  }
  return { layout, values, ni: px.length, nj: py.length, domain: DOMAIN, lines };
}

for (const layout of ["vertex", "cell"] as const) {
  Deno.test(`${layout} rectangle integrals of a bilinear field are exact on random unequal steps`, () => {
    // derived: ∫∫ (1 + 2x − 3y + 0.5xy) = Δx·Δy + [x²]·Δy − 1.5·Δx·[y²] + 0.125·[x²]·[y²]
    const u = (x: number, y: number) => 1 + 2 * x - 3 * y + 0.5 * x * y;
    const exact = (xa: number, xb: number, ya: number, yb: number) => {
      const dx = xb - xa, dy = yb - ya, sx = xb * xb - xa * xa, sy = yb * yb - ya * ya;
      return dx * dy + sx * dy - 1.5 * dx * sy + 0.125 * sx * sy;
    };
    for (let seed = 1; seed <= 5; seed++) {
      const field = randomField(layout, u, seed);
      const random = mulberry32(100 + seed);
      const boxes = [
        [DOMAIN.x0, DOMAIN.x1, DOMAIN.y0, DOMAIN.y1],
        [field.lines!.x[2], field.lines!.x[7], field.lines!.y[1], field.lines!.y[5]],
      ];
      for (let k = 0; k < 4; k++) {
        const xs = [random(), random()].map((t) => DOMAIN.x0 + 2 * t).sort((a, b) => a - b);
        const ys = [random(), random()].map((t) => DOMAIN.y0 + t).sort((a, b) => a - b);
        boxes.push([xs[0], xs[1], ys[0], ys[1]]);
      }
      for (const [xa, xb, ya, yb] of boxes) {
        assertClose(rectangleIntegral(field, xa, xb, ya, yb), exact(xa, xb, ya, yb), {
          abs: 1e-13,
        });
      }
    }
  });

  Deno.test(`${layout} cubic interpolation reproduces degree-3 polynomials on random unequal steps`, () => {
    // derived: Lagrange interpolation on 4 nodes is exact for cubics; the tensor product for
    // polynomials of degree ≤ 3 in each variable
    const u = (x: number, y: number) =>
      1 + x - 2 * y + x * x * y ** 3 - 0.5 * x ** 3 * y + 0.3 * x ** 3 * y ** 3;
    for (let seed = 1; seed <= 5; seed++) {
      const field = randomField(layout, u, seed);
      const random = mulberry32(200 + seed);
      const points = [[DOMAIN.x0, DOMAIN.y0], [DOMAIN.x1, DOMAIN.y1], [1.49, 0.26]];
      for (let k = 0; k < 6; k++) points.push([DOMAIN.x0 + 2 * random(), DOMAIN.y0 + random()]);
      for (const [x, y] of points) {
        assertClose(cubicPointValue(field, x, y)!, u(x, y), { abs: 1e-12 });
      }
    }
  });

  Deno.test(`${layout} one-sided normal and tangential derivatives are exact for quadratics on random unequal steps`, () => {
    // derived: both come from the quadratic through three values (module doc)
    const u = (x: number, y: number) => 2 + 3 * x - x * x + 0.7 * x * y + 1.5 * y * y - y;
    const ux = (x: number, y: number) => 3 - 2 * x + 0.7 * y;
    const uy = (x: number, y: number) => 0.7 * x + 3 * y - 1;
    for (let seed = 1; seed <= 5; seed++) {
      const field = randomField(layout, u, seed);
      for (const side of ["west", "east", "south", "north"] as const) {
        const d = sideDerivatives(field, side)!;
        const vertical = side === "west" || side === "east";
        const at = side === "west"
          ? DOMAIN.x0
          : side === "east"
          ? DOMAIN.x1
          : side === "south"
          ? DOMAIN.y0
          : DOMAIN.y1;
        const sign = side === "west" || side === "south" ? -1 : 1;
        for (let k = 0; k < d.t.length; k++) {
          const [x, y] = vertical ? [at, d.t[k]] : [d.t[k], at];
          assertClose(d.dn[k], sign * (vertical ? ux(x, y) : uy(x, y)), { abs: 1e-11 });
          assertClose(d.dt[k], vertical ? uy(x, y) : ux(x, y), { abs: 1e-11 });
        }
      }
    }
  });

  Deno.test(`${layout} line weights on equal steps reduce to the uniform rule`, () => {
    // an identity of the rules: on equal steps every formula is the uniform one
    const n = 10, lo = -0.5, h = 0.2;
    const lines = Float64Array.from({ length: n + 1 }, (_, k) => lo + k * h);
    for (const [a, b] of [[-0.5, 1.5], [-0.43, 0.77], [0.1, 0.1], [1.2, 1.5]]) {
      const mapped = mappedLineWeights(layout, lines, a, b);
      const uniform = lineWeights(layout, lo, h, n, a, b);
      for (let k = 0; k < uniform.length; k++) assertClose(mapped[k], uniform[k], { abs: 1e-15 });
    }
  });
}

/** The exact solution sampled on the case's (stretched) grid: the rule's error is all there is. */
function sampled(kase: CompiledCase, layout: "vertex" | "cell", n: number): DiscreteField {
  const points = gridPointsOf(caseGrid(kase, n, n, layout));
  const values = points.x.map((x, k) => kase.exact(x, points.y[k]));
  return { layout, nx: n, ny: n, ...points, values };
}

const STRETCHED_SPECS: QuantitySpec[] = [
  { name: "whole-east", kind: "flux", side: "east" },
  { name: "part-north", kind: "flux", side: "north", segment: [0.13, 0.71] },
  { name: "part-west", kind: "flux", side: "west", segment: [0.2, 0.9] },
  { name: "whole-south", kind: "flux", side: "south" },
  { name: "box", kind: "integral", x: [0.11, 0.58], y: [0.03, 0.93] },
  { name: "off-node", kind: "point", x: 0.31, y: 0.67 },
  { name: "near-wall", kind: "point", x: 0.98, y: 0.02 },
];

const MAPS = [
  ["tanh toward the south, geometric along x", {
    x: { kind: "geometric", ratio: 1.15, cells: 16 },
    y: { kind: "tanh", strength: 2.5, toward: "start" },
  }],
  ["tanh at both ends of x, expression along y", {
    x: { kind: "tanh", strength: 2, toward: "both" },
    y: { kind: "expression", expression: "t + 0.15*sin(2*pi*t)" },
  }],
] as const;

for (const layout of ["vertex", "cell"] as const) {
  for (const [what, spacing] of MAPS) {
    Deno.test(`${layout} rules are second order on a stretched family (${what}, full tensor K)`, async () => {
      const kase = await buildCase(
        testCase({
          form: "conservative",
          coefficients: undefined,
          conductivity: { k11: "2 + y", k12: "0.5", k22: "1" },
          exact: "exp(0.7*x)*cos(1.3*y) + x^3*sin(2*y)",
          spacing: structuredClone(spacing) as never,
        }),
        { origin: "test.json" },
      );
      const grids = [32, 64, 128, 256];
      for (const spec of STRETCHED_SPECS) {
        const exact = exactQuantity(kase, spec);
        const errors = grids.map((n) =>
          Math.abs(discreteQuantity(sampled(kase, layout, n), kase, spec)! - exact)
        );
        const orders = errors.slice(1).map((e, k) => Math.log2(errors[k] / e));
        const what = `${layout} ${spec.name}: orders ${orders.map((o) => o.toFixed(3))} ` +
          `(errors ${errors.join(", ")})`;
        // second order (common practice for reading an order): the two finest halvings read
        // above 1.75; a first-order rule reads about 1. The O(h³) of cells [a, b] covers in part
        // (module doc) is still visible on the coarse grids of a stretched family (the cell
        // box's order at 32 → 64 reads −1.3 and 1.7 on the two maps, measured), so the coarsest
        // pair is left out. A rule of higher order (cubic interpolation, O(h⁴)) may read any
        // order once its error is below h²/1000, where it no longer shows in a study
        for (const k of [2, 3]) {
          assert.ok(orders[k - 1] > 1.75 || errors[k] < 1e-3 / grids[k] ** 2, what);
        }
      }
    });
  }
}
