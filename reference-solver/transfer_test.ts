import assert from "node:assert/strict";
import { createTransfer, RESTRICTIONS } from "./transfer.ts";
import { levelLayout, type LevelOperator } from "./level.ts";
import type { RestrictionName } from "./options.ts";

function level(nx: number, ny: number, dirichlet: number[] = []): LevelOperator {
  return { ...levelLayout(nx, ny), dirichlet: Int32Array.from(dirichlet) } as never;
}

function sample(l: LevelOperator, fn: (i: number, j: number) => number): Float64Array {
  const v = l.vector();
  for (let j = 0; j <= l.ny; j++) for (let i = 0; i <= l.nx; i++) v[l.index(i, j)] = fn(i, j);
  return v;
}

const GRIDS: [number, number, number, number][] = [[8, 6, 4, 3], [8, 5, 4, 5], [3, 6, 3, 3]];

Deno.test("every restriction maps a constant to the same constant on every coarse node, boundary included", async (t) => {
  // Derived: the weights are rescaled to sum to one wherever some fall outside the grid.
  for (const name of Object.keys(RESTRICTIONS) as RestrictionName[]) {
    for (const [fnx, fny, cnx, cny] of GRIDS) {
      await t.step(`${name}, ${fnx}×${fny} → ${cnx}×${cny}`, () => {
        const F = level(fnx, fny), C = level(cnx, cny);
        const out = C.vector();
        createTransfer(name, F, C).restrict(sample(F, () => 2.5), out);
        for (let J = 0; J <= cny; J++) {
          for (let I = 0; I <= cnx; I++) assert.ok(Math.abs(out[C.index(I, J)] - 2.5) < 1e-14);
        }
      });
    }
  }
});

Deno.test("full and half weighting reproduce a bilinear function at interior coarse nodes", () => {
  // Derived: symmetric weights summing to one are exact for functions linear in x and in y.
  for (const name of ["full-weighting", "half-weighting"] as const) {
    const F = level(8, 8), C = level(4, 4), out = C.vector();
    const fn = (i: number, j: number) => 1 + 0.5 * i - 0.25 * j + 0.125 * i * j;
    createTransfer(name, F, C).restrict(sample(F, fn), out);
    for (let J = 1; J < 4; J++) {
      for (let I = 1; I < 4; I++) {
        assert.ok(Math.abs(out[C.index(I, J)] - fn(2 * I, 2 * J)) < 1e-13, `${name} (${I}, ${J})`);
      }
    }
  }
});

Deno.test("bilinear interpolation reproduces a bilinear function on every fine node", async (t) => {
  // Derived: bilinear interpolation is exact for a + b·x + c·y + d·x·y.
  for (const [fnx, fny, cnx, cny] of GRIDS) {
    await t.step(`${cnx}×${cny} → ${fnx}×${fny}`, () => {
      const F = level(fnx, fny), C = level(cnx, cny);
      const cx = fnx / cnx, cy = fny / cny;
      const fn = (x: number, y: number) => 2 - 0.75 * x + 0.5 * y + 0.3 * x * y;
      const coarse = sample(C, (I, J) => fn(cx * I, cy * J));
      const t1 = createTransfer("full-weighting", F, C);
      const fine = sample(F, () => 1);
      t1.interpolateAdd(coarse, fine);
      const set = F.vector();
      t1.interpolate(coarse, set);
      for (let j = 0; j <= fny; j++) {
        for (let i = 0; i <= fnx; i++) {
          assert.ok(Math.abs(fine[F.index(i, j)] - 1 - fn(i, j)) < 1e-13);
          assert.ok(Math.abs(set[F.index(i, j)] - fn(i, j)) < 1e-13);
        }
      }
      // The halo stays zero.
      assert.equal(set[0], 0);
      assert.equal(set[set.length - 1], 0);
    });
  }
});

Deno.test("restriction writes zero on coarse Dirichlet rows", () => {
  const C = level(4, 4);
  const dir = [C.index(0, 2), C.index(4, 4)];
  const Cd = level(4, 4, dir), F = level(8, 8), out = Cd.vector();
  createTransfer("injection", F, Cd).restrict(sample(F, () => 1), out);
  for (const k of dir) assert.equal(out[k], 0);
  assert.equal(out[C.index(2, 2)], 1);
});

Deno.test("createTransfer() refuses an unknown restriction and grids that do not nest", () => {
  assert.throws(
    () => createTransfer("cubic" as never, level(4, 4), level(2, 2)),
    (e: unknown) =>
      e instanceof RangeError && /injection, half-weighting, full-weighting/.test(e.message),
  );
  assert.throws(
    () => createTransfer("injection", level(6, 4), level(2, 2)),
    (e: unknown) => e instanceof RangeError && /counts must halve or stay/.test(e.message),
  );
});
