import assert from "node:assert/strict";
import { assertClose, runGridproof } from "../../testing/mod.ts";
import { InputError } from "./errors.ts";
import { formatRefine, readStudyCsv, type RefineResult, refineStudy } from "./refine_command.ts";

const DATA = new URL("../../testdata/refine/", import.meta.url);
const read = (name: string) => Deno.readTextFileSync(new URL(name, DATA));

const cli = (args: string[]) => runGridproof(args);

// NASA Glenn / NPARC Alliance tutorial "Examining Spatial (Grid) Convergence" (published):
// p = 1.786170, f(h→0) = 0.971300, GCI_12 = 0.103083 % with Fs = 1.25
const NPARC_P = 1.786170;
const NPARC_GCI_125 = 0.00103083;

Deno.test("refineStudy() applies Fs = 3 to the NPARC data when the formal order is 2", () => {
  const result = refineStudy(readStudyCsv(read("nparc.csv"), { file: "nparc.csv" }), {
    formalOrder: 2,
  });
  const q = result.quantities[0];
  assert.equal(q.name, "f");
  assert.equal(q.convergence, "monotone");
  assertClose(q.observedOrder!, NPARC_P, { rel: 1e-6 });
  // derived: |1.786170 − 2|/2 = 0.1069 > 0.1, so Oberkampf & Roy (2010, §8.6; recalled) give
  // Fs = 3 with p = min(max(1.786170, 0.5), 2) = 1.786170
  assert.equal(q.gci!.basis, "observed-far-from-formal");
  assert.equal(q.gci!.safetyFactor, 3);
  assertClose(q.gci!.order, NPARC_P, { rel: 1e-6 });
  // derived from the published GCI: 0.103083 % · 3/1.25 = 0.2473992 %
  assertClose(q.gci!.fine!, NPARC_GCI_125 * 3 / 1.25, { rel: 1e-5 });
  // published: f(h→0) = 0.971300 (the order used is still the observed one)
  assertClose(q.gci!.extrapolated, 0.971300, { rel: 1e-6 });
  // derived: observed/formal = 1.786170/2 = 0.893085
  assertClose(q.orderRatio!, 0.893085, { rel: 1e-6 });
  // derived: (f3 − f2)/(f2 − f1) = (0.961780 − 0.968540)/(0.968540 − 0.970500)
  //   = −0.00676/−0.00196 = 169/49 = 3.448980, against r^p_formal = 2² = 4
  assertClose(q.differenceRatio!, 169 / 49, { rel: 1e-9 });
  assert.equal(q.expectedDifferenceRatio, 4);
  assert.ok(
    q.warnings.some((w) => w.includes("10.7 % below the formal order 2")),
    q.warnings.join(),
  );
  assert.deepEqual(result.divergent, []);
});

Deno.test("refineStudy() keeps Fs = 1.25 and the published NPARC GCI within 10 % of the formal order", () => {
  // a formal order of 1.9 (hypothetical) puts p = 1.786170 within 10 %: |1.786170 − 1.9|/1.9 = 0.0599
  const q = refineStudy(readStudyCsv(read("nparc.csv")), { formalOrder: 1.9 }).quantities[0];
  assert.equal(q.gci!.basis, "observed-near-formal");
  assert.equal(q.gci!.safetyFactor, 1.25);
  // published (NPARC): GCI_12 = 0.103083 %; derived: GCI_23 = 0.356249 %
  assertClose(q.gci!.fine!, NPARC_GCI_125, { rel: 1e-5 });
  assertClose(q.gci!.coarse!, 0.00356249, { rel: 1e-5 });
  assert.deepEqual(q.warnings, []);
});

Deno.test("refineStudy() drops the asymptotic ratio, which is f1/f2 for an observed order", () => {
  const result = refineStudy(readStudyCsv(read("nparc.csv")), { formalOrder: 1.9 });
  const q = result.quantities[0];
  // derived: GCI_23/(r^p·GCI_12) = (|f3 − f2|·|f1|)/(r^p·|f2 − f1|·|f2|) and r^p = |f3 − f2|/|f2 − f1|
  // for the observed p, so the ratio is f1/f2 = 0.970500/0.968540 = 1.0020 (published by NPARC,
  // which prints the reciprocal 0.997980) whatever the grids
  const ratio = q.gci!.coarse! / (2 ** q.gci!.order * q.gci!.fine!);
  assertClose(ratio, 0.9705 / 0.96854, { rel: 1e-12 });
  assert.ok(!("asymptoticRatio" in q), "no asymptoticRatio in the result");
  assert.doesNotMatch(formatRefine(result), /GCI_23\/\(r\^p/);
});

Deno.test("refineStudy() follows Celik et al. (2008) and the rule from cell counts in any row order", () => {
  const table = readStudyCsv(read("celik.csv"), { file: "celik.csv", dimension: 2 });
  assert.deepEqual(table.rows.map((r) => r.cells), [4500, 8000, 18000]);
  // a formal order of 1.5 (hypothetical) puts p = 1.53 within 10 %: Fs = 1.25
  const near = refineStudy(table, { formalOrder: 1.5 }).quantities[0];
  // from memory (consistent when recomputed): p = 1.53, φext21 = 6.1685, e_a21 = 1.5 %,
  // e_ext21 = 1.7 %, GCI_fine21 = 2.2 %
  assertClose(near.observedOrder!, 1.53, { abs: 0.005 });
  assertClose(near.gci!.extrapolated, 6.1685, { abs: 5e-5 });
  assertClose(near.celik!.relativeError!, 0.015, { abs: 5e-4 });
  assertClose(near.celik!.extrapolatedRelativeError!, 0.017, { abs: 5e-4 });
  assertClose(near.celik!.gciFine!, 0.022, { abs: 5e-4 });
  assert.equal(near.gci!.safetyFactor, 1.25);
  assertClose(near.gci!.fine!, 0.022, { abs: 5e-4 });
  assert.equal(near.convergence, "monotone");
  // with a formal order of 2: |1.53 − 2|/2 = 0.235 > 0.1 → Fs = 3, p = 1.53, so the GCI is
  // 2.2 % · 3/1.25 = 5.28 % (derived from the value recalled from memory)
  const far = refineStudy(table, { formalOrder: 2 }).quantities[0];
  assert.equal(far.gci!.safetyFactor, 3);
  assertClose(far.gci!.order, near.observedOrder!, { rel: 1e-12 });
  assertClose(far.gci!.fine!, 0.0528, { abs: 0.0012 });
  assertClose(far.gci!.fine!, near.gci!.fine! * 3 / 1.25, { rel: 1e-12 });
});

Deno.test("refineStudy() clips an observed order above the formal order to the formal order", () => {
  // derived: f = 1 + h³ at h = 4, 2, 1 scaled to h = 1, 1/2, 1/4: f = 2, 1.125, 1.015625,
  // p_observed = ln(0.875/0.109375)/ln 2 = ln 8/ln 2 = 3; formal 2 → Fs = 3, p = min(3, 2) = 2;
  // GCI_12 = 3·(0.109375/1.015625)/(2² − 1) = (7/64)/(65/64) = 7/65;
  // f_ext = 65/64 − (7/64)/3 = 47/48; (f3 − f2)/(f2 − f1) = 0.875/0.109375 = 8 against 4
  const csv = "h,f\n1,2\n0.5,1.125\n0.25,1.015625\n";
  const q = refineStudy(readStudyCsv(csv), { formalOrder: 2 }).quantities[0];
  assertClose(q.observedOrder!, 3, { rel: 1e-12 });
  assert.equal(q.gci!.basis, "observed-far-from-formal");
  assert.equal(q.gci!.safetyFactor, 3);
  assert.equal(q.gci!.order, 2);
  assertClose(q.gci!.fine!, 7 / 65, { rel: 1e-12 });
  assertClose(q.gci!.extrapolated, 47 / 48, { rel: 1e-12 });
  assertClose(q.differenceRatio!, 8, { rel: 1e-12 });
  assert.ok(q.warnings.some((w) => w.includes("50.0 % above the formal order 2")));
});

Deno.test("refineStudy() raises an observed order below 0.5 to 0.5 with Fs = 3", () => {
  // derived: f = 1 + h^(1/4) at h = 1, 1/16, 1/256: f = 2, 1.5, 1.25; r = 16;
  // p_observed = ln(0.5/0.25)/ln 16 = 1/4; p = min(max(1/4, 0.5), 2) = 0.5, r^p = 4;
  // GCI_12 = 3·(0.25/1.25)/(4 − 1) = 0.2; f_ext = 1.25 − 0.25/3 = 7/6
  const csv = "h,f\n1,2\n0.0625,1.5\n0.00390625,1.25\n";
  const q = refineStudy(readStudyCsv(csv), { formalOrder: 2 }).quantities[0];
  assertClose(q.observedOrder!, 0.25, { rel: 1e-12 });
  assert.equal(q.gci!.order, 0.5);
  assert.equal(q.gci!.safetyFactor, 3);
  assertClose(q.gci!.fine!, 0.2, { rel: 1e-12 });
  assertClose(q.gci!.extrapolated, 7 / 6, { rel: 1e-12 });
});

Deno.test("refineStudy() uses Fs = 3 and the formal order for a quantity on only two grids", () => {
  // Roache (1998): two grids → Fs = 3 with the formal order. Derived: r = 2, p = 2,
  // GCI_12 = 3·(0.03/1.01)/(2² − 1) = 0.03/1.01; f_ext = 1.01 − 0.03/3 = 1
  const csv = "h,f,g\n4,1,\n2,1.04,1.04\n1,1.01,1.01\n";
  const q = refineStudy(readStudyCsv(csv), { formalOrder: 2 }).quantities[1];
  assert.equal(q.convergence, null);
  assert.equal(q.gci!.basis, "two-grids");
  assert.equal(q.gci!.safetyFactor, 3);
  assert.equal(q.gci!.order, 2);
  assertClose(q.gci!.fine!, 0.03 / 1.01, { rel: 1e-12 });
  assertClose(q.gci!.extrapolated, 1, { rel: 1e-12 });
  assert.match(q.warnings[0], /only 2 grids have a value/);
});

Deno.test("refineStudy() reports oscillatory convergence and does not trust its order", () => {
  // derived: f = 1, 1.2, 1.1 at h = 4, 2, 1: d21 = 1.2 − 1.1 = 0.1, d32 = 1 − 1.2 = −0.2 change
  // sign and shrink → oscillatory; with a constant ratio q(p) = 0, so p = ln 2/ln 2 = 1. Formal 1
  // would be "within 10 %", but oscillatory data take Fs = 3 (our choice, docs/refine.md):
  // GCI_12 = 3·(0.1/1.1)/(2 − 1) = 3/11
  const csv = "h,f\n4,1\n2,1.2\n1,1.1\n";
  const result = refineStudy(readStudyCsv(csv), { formalOrder: 1 });
  const q = result.quantities[0];
  assert.equal(q.convergence, "oscillatory");
  assertClose(q.observedOrder!, 1, { rel: 1e-12 });
  assertClose(q.differenceRatio!, -2, { rel: 1e-12 });
  assert.equal(q.gci!.basis, "oscillatory");
  assert.equal(q.gci!.safetyFactor, 3);
  assertClose(q.gci!.fine!, 3 / 11, { rel: 1e-12 });
  assert.deepEqual(result.divergent, []);
  assert.match(formatRefine(result), /convergence\s+oscillatory/);
});

Deno.test("refineStudy() marks growing differences divergent and gives no GCI", async (t) => {
  const rows: [string, string][] = [
    // derived: |f1 − f2| = |1.3 − 1.1| = 0.2 > |f2 − f3| = 0.1
    ["monotone growth", "h,f\n4,1\n2,1.1\n1,1.3\n"],
    // derived: |0.9 − 1.2| = 0.3 > |1.2 − 1| = 0.2, signs alternate
    ["growing oscillation", "h,f\n4,1\n2,1.2\n1,0.9\n"],
    // derived: the coarse pair agrees (difference 0), the fine pair does not: 0.1 > 0
    ["a change only on the finest grid", "h,f\n4,1\n2,1\n1,1.1\n"],
  ];
  for (const [what, csv] of rows) {
    await t.step(what, () => {
      const result = refineStudy(readStudyCsv(csv), { formalOrder: 2 });
      const q = result.quantities[0];
      assert.equal(q.convergence, "divergent");
      assert.equal(q.gci, null);
      assert.deepEqual(result.divergent, ["f"]);
      assert.ok(q.warnings.some((w) => w.includes("divergent")), q.warnings.join());
      assert.match(formatRefine(result), /Verdict: DIVERGENT: "f" \(exit code 1\)/);
    });
  }
});

Deno.test("refineStudy() gives the least-squares estimate with four grids and honours --fs", () => {
  const table = readStudyCsv(read("four_grids.csv"));
  // derived: drag = 2 − 0.3·h^1.5 and lift = 1 + h² exactly; formal order 1.5 → Fs = 1.25
  const [drag, lift] = refineStudy(table, { formalOrder: 1.5 }).quantities;
  assertClose(drag.observedOrder!, 1.5, { rel: 1e-6 });
  assertClose(drag.gci!.extrapolated, 2, { rel: 1e-9 });
  assertClose(drag.leastSquares!.order!, 1.5, { rel: 1e-5 });
  assertClose(lift.leastSquares!.extrapolated!, 1, { rel: 1e-9 });
  assert.equal(drag.gci!.safetyFactor, 1.25);
  // derived: the GCI scales linearly with the safety factor; the rule's own factor is kept
  const three = refineStudy(table, { formalOrder: 1.5, safetyFactor: 3 }).quantities[0];
  assertClose(three.gci!.fine!, drag.gci!.fine! * 3 / 1.25, { rel: 1e-12 });
  assert.equal(three.gci!.safetyFactor, 3);
  assert.equal(three.gci!.ruleSafetyFactor, 1.25);
});

Deno.test("refineStudy() warns about small refinement ratios", () => {
  const csv = "h,q\n1.0,1.1\n0.9,1.081\n0.8,1.064\n";
  const q = refineStudy(readStudyCsv(csv), { formalOrder: 2 }).quantities[0];
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

Deno.test("gridproof refine prints the NPARC figures, the rule and a JSON object", async () => {
  const args = ["refine", "--data", "testdata/refine/nparc.csv", "--formal-order", "2"];
  const text = await cli(args);
  assert.equal(text.code, 0, text.stderr);
  // published (NPARC): p = 1.786170 → printed to 4 digits; f(h→0) = 0.971300
  assert.match(text.stdout, /observed order p\s+1\.786 \(formal 2; observed\/formal 0\.8931\)/);
  assert.match(text.stdout, /extrapolated value\s+0\.9713003/);
  // derived: 0.103083 % · 3/1.25 = 0.2474 %; 169/49 = 3.449 against 2² = 4
  assert.match(text.stdout, /GCI of the finest grid\s+0\.2474 % \(safety factor 3\)/);
  assert.match(text.stdout, /GCI rule\s+Fs = 3, p = 1\.786: observed order below the formal/);
  assert.match(
    text.stdout,
    /\(f3−f2\)\/\(f2−f1\), 1 finest\s+3\.449 \(the formal order predicts 4\.000\)/,
  );
  assert.match(text.stdout, /Verdict: no quantity diverges/);
  const json = await cli([...args, "--json"]);
  assert.equal(json.code, 0, json.stderr);
  const result = JSON.parse(json.stdout) as RefineResult;
  assert.equal(result.format, "gridproof-refine");
  assert.equal(result.version, 2);
  assert.equal(result.formalOrder, 2);
  assertClose(result.quantities[0].observedOrder!, NPARC_P, { rel: 1e-6 });
  assert.equal(formatRefine(result).split("\n")[0], text.stdout.split("\n")[0]);
});

Deno.test("gridproof refine exits 1 on divergent data, also with --json", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const file = `${dir}/divergent.csv`;
    // derived: |f1 − f2| = 0.2 > |f2 − f3| = 0.1 (grid 1 finest)
    await Deno.writeTextFile(file, "h,f,g\n4,1,1\n2,1.1,1.5\n1,1.3,1.75\n");
    const text = await cli(["refine", "--data", file, "--formal-order", "2"]);
    assert.equal(text.code, 1, text.stderr);
    assert.match(text.stdout, /convergence\s+DIVERGENT/);
    assert.match(text.stdout, /Verdict: DIVERGENT: "f" \(exit code 1\)/);
    const json = await cli(["refine", "--data", file, "--formal-order", "2", "--json"]);
    assert.equal(json.code, 1);
    assert.deepEqual((JSON.parse(json.stdout) as RefineResult).divergent, ["f"]);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("gridproof refine --help names the formal order, the rule and the exit codes", async () => {
  const help = await cli(["refine", "--help"]);
  assert.equal(help.code, 0);
  assert.match(help.stdout, /--formal-order <p>/);
  assert.match(help.stdout, /Fs = 1\.25 with the observed order/);
  assert.match(help.stdout, /1 a quantity diverges, 2 bad input/);
});

Deno.test("gridproof refine exits 2 with a plain message on bad input", async (t) => {
  await t.step("a non-numeric cell", async () => {
    const bad = await cli([
      "refine",
      "--data",
      "testdata/refine/bad_not_a_number.csv",
      "--formal-order",
      "2",
    ]);
    assert.equal(bad.code, 2);
    assert.match(bad.stderr, /bad_not_a_number\.csv: line 3, column "lift": "abc" is not a number/);
    assert.doesNotMatch(bad.stderr, /\bat .*\.ts:\d+/, "no stack trace");
  });
  await t.step("no --formal-order", async () => {
    const missing = await cli(["refine", "--data", "testdata/refine/nparc.csv"]);
    assert.equal(missing.code, 2);
    assert.match(missing.stderr, /--formal-order: missing: give the formal order of accuracy/);
  });
  await t.step("a formal order that is not a positive number", async () => {
    const word = await cli([
      "refine",
      "--data",
      "testdata/refine/nparc.csv",
      "--formal-order",
      "two",
    ]);
    assert.equal(word.code, 2);
    assert.match(word.stderr, /--formal-order: must be a positive number .*got "two"/);
  });
  await t.step("a safety factor that is not a number", async () => {
    const fs = await cli([
      "refine",
      "--data",
      "testdata/refine/nparc.csv",
      "--formal-order",
      "2",
      "--fs",
      "zero",
    ]);
    assert.equal(fs.code, 2);
    assert.match(fs.stderr, /--fs: must be a positive number/);
  });
});
