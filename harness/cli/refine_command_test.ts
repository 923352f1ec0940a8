import assert from "node:assert/strict";
import { assertClose, runGridproof } from "../../testing/mod.ts";
import { InputError } from "./errors.ts";
import { formatRefine, readStudyCsv, type RefineResult, refineStudy } from "./refine_command.ts";

const DATA = new URL("../../testdata/refine/", import.meta.url);
const read = (name: string) => Deno.readTextFileSync(new URL(name, DATA));

const cli = (args: string[]) => runGridproof(args);

Deno.test("refineStudy() reproduces the NASA NPARC tutorial from a CSV", () => {
  const result = refineStudy(readStudyCsv(read("nparc.csv"), { file: "nparc.csv" }));
  const q = result.quantities[0];
  assert.equal(q.name, "f");
  // published (NPARC tutorial): p = 1.786170, f_ext = 0.971300, GCI_12 = 0.103083 % (Fs 1.25)
  assertClose(q.order!, 1.786170, { rel: 1e-6 });
  assertClose(q.extrapolated!, 0.971300, { rel: 1e-6 });
  assertClose(q.gciFine!, 0.00103083, { rel: 1e-5 });
  // derived: GCI_23 = 0.356249 %
  assertClose(q.gciCoarse!, 0.00356249, { rel: 1e-5 });
  // published: GCI_23/(r^p·GCI_12) = 1.0020 (the tutorial's listing prints the reciprocal 0.997980)
  assertClose(q.asymptoticRatio!, 1.0020, { rel: 1e-4 });
  assert.deepEqual(q.warnings, []);
});

Deno.test("refineStudy() reproduces Celik et al. (2008) from cell counts in any row order", () => {
  const table = readStudyCsv(read("celik.csv"), { file: "celik.csv", dimension: 2 });
  assert.deepEqual(table.rows.map((r) => r.cells), [4500, 8000, 18000]);
  const q = refineStudy(table).quantities[0];
  // from memory (consistent when recomputed): p = 1.53, φext21 = 6.1685, e_a21 = 1.5 %,
  // e_ext21 = 1.7 %, GCI_fine21 = 2.2 %
  assertClose(q.order!, 1.53, { abs: 0.005 });
  assertClose(q.extrapolated!, 6.1685, { abs: 5e-5 });
  assertClose(q.celik!.relativeError!, 0.015, { abs: 5e-4 });
  assertClose(q.celik!.extrapolatedRelativeError!, 0.017, { abs: 5e-4 });
  assertClose(q.celik!.gciFine!, 0.022, { abs: 5e-4 });
  assert.equal(q.celik!.convergence, "monotone");
});

Deno.test("refineStudy() gives the least-squares estimate with four grids and honours --fs", () => {
  const table = readStudyCsv(read("four_grids.csv"));
  const [drag, lift] = refineStudy(table).quantities;
  // derived: drag = 2 − 0.3·h^1.5 and lift = 1 + h² exactly
  assertClose(drag.order!, 1.5, { rel: 1e-6 });
  assertClose(drag.extrapolated!, 2, { rel: 1e-9 });
  assertClose(drag.leastSquares!.order!, 1.5, { rel: 1e-5 });
  assertClose(lift.leastSquares!.extrapolated!, 1, { rel: 1e-9 });
  // derived: the GCI scales linearly with the safety factor
  const three = refineStudy(table, { safetyFactor: 3 }).quantities[0];
  assertClose(three.gciFine!, drag.gciFine! * 3 / 1.25, { rel: 1e-12 });
  assert.equal(three.safetyFactor, 3);
});

Deno.test("refineStudy() warns about small refinement ratios", () => {
  const csv = "h,q\n1.0,1.1\n0.9,1.081\n0.8,1.064\n";
  const q = refineStudy(readStudyCsv(csv)).quantities[0];
  assert.ok(q.warnings.some((w) => w.startsWith("refinement ratio below 1.3")), q.warnings.join());
});

Deno.test("readStudyCsv() rejects bad tables with InputError naming line and column", async (t) => {
  const cases: [string, string, RegExp, RegExp][] = [
    ["bad_two_grids.csv", "two grids", /^bad_two_grids\.csv$/, /2 grids given, at least three/],
    [
      "bad_not_a_number.csv",
      "a non-numeric cell",
      /line 3, column "lift"/,
      /"abc" is not a number/,
    ],
    ["bad_no_size_column.csv", "no size column", /line 1/, /no "cells" or "h" column/],
    [
      "bad_grid_twice.csv",
      "a grid given twice",
      /line 4, column "cells"/,
      /the same grid is given twice \(lines 2 and 4, cells = 100\)/,
    ],
  ];
  for (const [file, what, where, message] of cases) {
    await t.step(what, () => {
      assert.throws(
        () => readStudyCsv(read(file), { file }),
        (e: unknown) =>
          e instanceof InputError && where.test(e.where ?? "") && message.test(e.message),
      );
    });
  }
  await t.step("a row with a missing cell", () => {
    assert.throws(() => readStudyCsv("h,q\n1,2\n0.5\n"), /cannot read the CSV/);
  });
  await t.step("both cells and h", () => {
    assert.throws(() => readStudyCsv("h,cells,q\n1,1,1\n"), /keep one of them/);
  });
  await t.step("a repeated quantity name", () => {
    assert.throws(() => readStudyCsv("h,q,Q\n1,1,1\n"), /appears twice \(columns 2 and 3\)/);
  });
  await t.step("a negative spacing", () => {
    assert.throws(() => readStudyCsv("h,q\n-1,1\n"), /"-1" is not a positive number/);
  });
});

Deno.test("gridproof refine prints the NPARC figures and a JSON object", async () => {
  const text = await cli(["refine", "--data", "testdata/refine/nparc.csv"]);
  assert.equal(text.code, 0, text.stderr);
  // published (NPARC): p = 1.786170 → printed to 4 digits; GCI_12 = 0.103083 % → 0.1031 %
  assert.match(text.stdout, /observed order p\s+1\.786/);
  assert.match(text.stdout, /extrapolated value\s+0\.9713003/);
  assert.match(text.stdout, /GCI of the finest grid\s+0\.1031 % \(safety factor 1\.25\)/);
  assert.match(text.stdout, /GCI of the next grid\s+0\.3562 %/);
  const json = await cli(["refine", "--data", "testdata/refine/nparc.csv", "--json"]);
  assert.equal(json.code, 0, json.stderr);
  const result = JSON.parse(json.stdout) as RefineResult;
  assert.equal(result.format, "gridproof-refine");
  assertClose(result.quantities[0].order!, 1.786170, { rel: 1e-6 });
  assertClose(result.quantities[0].asymptoticRatio!, 1.0020, { rel: 1e-4 });
  assert.equal(formatRefine(result).split("\n")[0], text.stdout.split("\n")[0]);
});

Deno.test("gridproof refine exits 2 with a plain message on bad input", async () => {
  const bad = await cli(["refine", "--data", "testdata/refine/bad_not_a_number.csv"]);
  assert.equal(bad.code, 2);
  assert.match(bad.stderr, /bad_not_a_number\.csv: line 3, column "lift": "abc" is not a number/);
  assert.doesNotMatch(bad.stderr, /\bat .*\.ts:\d+/, "no stack trace");
  const fs = await cli(["refine", "--data", "testdata/refine/nparc.csv", "--fs", "zero"]);
  assert.equal(fs.code, 2);
  assert.match(fs.stderr, /--fs: must be a positive number/);
});
