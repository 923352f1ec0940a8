import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { checkInterfaceConditions, type RegionFunctions } from "./continuity.ts";
import { faceConductivity, gridMisses, piecewiseMean, regionsAt } from "./regions.ts";

const unit = { x0: 0, x1: 1, y0: 0, y1: 1 };

Deno.test("regionsAt() finds one region inside, two on an interface, four where two cross", () => {
  const cross = { x: [0.5], y: [0.25] };
  assert.deepEqual(regionsAt(cross, unit, 0.2, 0.1), [0]);
  assert.deepEqual(regionsAt(cross, unit, 0.7, 0.9), [3]);
  assert.deepEqual(regionsAt(cross, unit, 0.5, 0.1), [0, 1]);
  assert.deepEqual(regionsAt(cross, unit, 0.2, 0.25), [0, 2]);
  assert.deepEqual(regionsAt(cross, unit, 0.5, 0.25), [0, 1, 2, 3]);
  // a grid node computed as x0 + i·h lands on the line up to rounding
  assert.deepEqual(regionsAt({ x: [0.3], y: [] }, unit, 3 * 0.1, 0.5), [0, 1]);
});

Deno.test("face conductivities on an interface: conductors in series and side by side", () => {
  // Two conductors k1, k2 over equal lengths in series conduct like 2·k1·k2/(k1 + k2); side by
  // side over equal widths like (k1 + k2)/2 (Ohm's law; common practice in finite volumes).
  const k = [() => 1, () => 100];
  const lines = { x: [0.5], y: [] };
  assertClose(faceConductivity(k, lines, unit, "x")(0.5, 0.3), 200 / 101, { rel: 1e-15 });
  assertClose(faceConductivity(k, lines, unit, "y")(0.5, 0.3), 50.5, { rel: 1e-15 });
  assert.equal(faceConductivity(k, lines, unit, "x")(0.75, 0.3), 100);
  assert.equal(piecewiseMean(k, lines, unit)(0.5, 0.9), 50.5);
  assert.equal(piecewiseMean(k, lines, unit)(0.25, 0.9), 1);
});

Deno.test("gridMisses() accepts grids that put every interface on a grid line", () => {
  assert.equal(gridMisses({ x: [0.5], y: [0.25] }, unit, 16, 32), null);
  assert.match(gridMisses({ x: [0.5], y: [0.25] }, unit, 16, 18)!, /y = 0\.25 falls between/);
  assert.match(gridMisses({ x: [1 / 3], y: [] }, unit, 16, 16)!, /x = 0\.333/);
  assert.equal(gridMisses({ x: [1 / 3], y: [] }, unit, 48, 16), null);
});

Deno.test("interface conditions: a flux-continuous solution passes, a flux jump and a u jump are named", () => {
  // Derived: u = sin(2πx)·sin(πy)/k with k = 1 (x < ½), 100 (x > ½). sin(2π·½) = 0, so u = 0 on
  // both sides of x = ½; k·u_x = 2π·cos(2πx)·sin(πy) is the same expression on both sides.
  const region = (k: number): RegionFunctions => ({
    u: (x, y) => Math.sin(2 * Math.PI * x) * Math.sin(Math.PI * y) / k,
    fluxX: (x, y) => 2 * Math.PI * Math.cos(2 * Math.PI * x) * Math.sin(Math.PI * y),
    fluxY: (x, y) => Math.PI * Math.sin(2 * Math.PI * x) * Math.cos(Math.PI * y),
  });
  const lines = { x: [0.5], y: [] };
  assert.deepEqual(checkInterfaceConditions([region(1), region(100)], lines, unit), []);
  // the same u on both sides with k jumping: u is continuous, k·u_x jumps by a factor of 100
  const same = (k: number): RegionFunctions => ({
    u: (x, y) => Math.sin(Math.PI * x) * Math.sin(Math.PI * y) + x,
    fluxX: (x, y) => k * (Math.PI * Math.cos(Math.PI * x) * Math.sin(Math.PI * y) + 1),
    fluxY: (x, y) => k * Math.PI * Math.sin(Math.PI * x) * Math.cos(Math.PI * y),
  });
  const flux = checkInterfaceConditions([same(1), same(100)], lines, unit);
  assert.deepEqual(flux.map((p) => [p.interface, p.condition, p.regions]), [
    ["x = 0.5", "normal flux", [0, 1]],
  ]);
  assert.match(flux[0].message, /between regions 1 and 2/);
  // a u that jumps by 1 on a y-interface
  const shifted = (c: number): RegionFunctions => ({
    u: (x, y) => x * y + c,
    fluxX: (_x, y) => y,
    fluxY: (x) => x,
  });
  const jump = checkInterfaceConditions([shifted(0), shifted(1)], { x: [], y: [0.5] }, unit);
  assert.deepEqual(jump.map((p) => [p.interface, p.condition]), [["y = 0.5", "u"]]);
});
