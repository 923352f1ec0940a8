import assert from "node:assert/strict";
import {
  type AxisMapping,
  gridPointsOf,
  makeGrid,
  mappingFault,
  stretchRatio,
  unitMap,
} from "./mod.ts";

// Exact identities (common practice): a map's ends, monotonicity, the control volumes summing to
// the domain's area, and the trapezoid / midpoint rules integrating linear functions exactly.
const MAPS: [string, AxisMapping][] = [
  ["tanh toward the start", { kind: "tanh", strength: 2.5, toward: "start" }],
  ["tanh toward the end", { kind: "tanh", strength: 3, toward: "end" }],
  ["tanh toward both ends", { kind: "tanh", strength: 4, toward: "both" }],
  ["geometric growing", { kind: "geometric", ratio: 1.1, cells: 16 }],
  ["geometric shrinking", { kind: "geometric", ratio: 0.92, cells: 16 }],
  ["expression", { kind: "expression", unit: (t) => (Math.exp(2 * t) - 1) / (Math.exp(2) - 1) }],
];
const close = (actual: number, expected: number, tolerance: number, label = "") =>
  assert.ok(Math.abs(actual - expected) <= tolerance, `${label}: ${actual} vs ${expected}`);
const BOX = { x0: -1, x1: 2, y0: 0.5, y1: 1.75 };

Deno.test("every grid map starts at 0, ends at 1 exactly and increases strictly", () => {
  for (const [name, mapping] of MAPS) {
    const s = unitMap(mapping);
    assert.deepStrictEqual([s(0), s(1)], [0, 1], name);
    assert.deepStrictEqual(mappingFault(s), null, name);
  }
});

Deno.test("a stretched family keeps its map: every line of a grid is a line of the twice finer grid", () => {
  for (const [name, mapping] of MAPS) {
    const coarse = makeGrid(BOX, "vertex", { x: 16, y: 8 }, { x: mapping, y: mapping });
    const fine = makeGrid(BOX, "vertex", { x: 32, y: 16 }, { x: mapping, y: mapping });
    for (let i = 0; i <= 16; i++) {
      assert.deepStrictEqual(fine.lines.x[2 * i], coarse.lines.x[i], name);
    }
    assert.deepStrictEqual([coarse.lines.x[0], coarse.lines.x[16]], [BOX.x0, BOX.x1], name);
  }
});

Deno.test("control volumes sum to the area and integrate a linear function exactly on both layouts", () => {
  const area = (BOX.x1 - BOX.x0) * (BOX.y1 - BOX.y0);
  // ∫∫ (3 + 2x − 5y) over the box, by hand
  const mx = (BOX.x0 + BOX.x1) / 2, my = (BOX.y0 + BOX.y1) / 2;
  const exact = area * (3 + 2 * mx - 5 * my);
  for (const [name, mapping] of MAPS) {
    for (const layout of ["vertex", "cell"] as const) {
      const p = gridPointsOf(makeGrid(BOX, layout, { x: 12, y: 7 }, { x: mapping, y: mapping }));
      let sum = 0, integral = 0;
      for (let k = 0; k < p.weights.length; k++) {
        sum += p.weights[k];
        integral += p.weights[k] * (3 + 2 * p.x[k] - 5 * p.y[k]);
      }
      close(sum, area, 1e-13, `${name}, ${layout}`);
      close(integral, exact, 1e-12, `${name}, ${layout}`);
    }
  }
});

Deno.test("mappingFault() names a map that runs backwards, misses an end or is not finite", () => {
  assert(mappingFault((t) => 1 - t)?.includes("s(0) = 1"));
  assert(mappingFault((t) => 0.9 * t)?.includes("must end at 1"));
  assert(
    mappingFault((t) => t + 0.2 * Math.sin(6 * Math.PI * t))?.includes("not strictly increasing"),
  );
});

Deno.test("the geometric map gives the declared neighbour ratio on its own grid", () => {
  const g = makeGrid(BOX, "cell", { x: 16, y: 2 }, {
    x: { kind: "geometric", ratio: 1.1, cells: 16 },
  });
  const x = g.lines.x;
  for (let i = 1; i < 16; i++) {
    close((x[i + 1] - x[i]) / (x[i] - x[i - 1]), 1.1, 1e-12);
  }
  close(stretchRatio(g), 1.1 ** 15, 1e-9);
});
