import assert from "node:assert/strict";
import { gridPointsOf, makeGrid } from "../grid/mod.ts";
import { faceCounts, pointCount, sideCount } from "./counts.ts";

const BOX = { x0: 0, x1: 2, y0: -1, y1: 1 };

Deno.test("pointCount() agrees with the points grid/ lays out on both layouts", () => {
  // the outside reference: grid/'s own enumeration of a layout's points
  for (const layout of ["vertex", "cell"] as const) {
    for (const [nx, ny] of [[2, 2], [5, 3], [1, 7]]) {
      const points = gridPointsOf(makeGrid(BOX, layout, { x: nx, y: ny }));
      assert.equal(pointCount(layout, nx, ny), points.x.length, `${layout} ${nx}×${ny}`);
    }
  }
});

Deno.test("faceCounts() and sideCount() count the flux places and side points one by one", () => {
  // exact identity: enumerate the places of the Conductivity doc by their coordinates
  const count = (xs: number, ys: number) => xs * ys;
  for (const [nx, ny] of [[2, 2], [5, 3], [4, 1]]) {
    // vertex: edge midpoints along x at (i + ½, j), i < nx, j ≤ ny; along y at (i, j + ½)
    assert.deepEqual(faceCounts("vertex", nx, ny), {
      x: count(nx, ny + 1),
      y: count(nx + 1, ny),
    });
    // cell: x-faces at (i, j + ½), i ≤ nx, j < ny; y-faces at (i + ½, j)
    assert.deepEqual(faceCounts("cell", nx, ny), { x: count(nx + 1, ny), y: count(nx, ny + 1) });
    assert.equal(sideCount("vertex", "west", nx, ny), ny + 1);
    assert.equal(sideCount("vertex", "north", nx, ny), nx + 1);
    assert.equal(sideCount("cell", "east", nx, ny), ny);
    assert.equal(sideCount("cell", "south", nx, ny), nx);
  }
});
