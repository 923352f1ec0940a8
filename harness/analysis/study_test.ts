import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import type { NormSet, Region, SolveRecord, Verdict } from "../result/types.ts";
import { buildStudy, type StudySpec } from "./build_study.ts";
import { vertexRegionNorms } from "./region_norms.ts";
import { placeNorms, placeOfPoints } from "./places.ts";

const GRIDS = [16, 32, 64, 128];

type Field = (x: number, y: number, h: number, d: number) => number;

/** A synthetic nodal error field on the unit square: its nodes, values and weights. */
function field(n: number, error: Field) {
  const h = 1 / n;
  const x = new Float64Array((n + 1) ** 2), y = new Float64Array(x.length);
  const values = new Float64Array(x.length), weights = new Float64Array(x.length);
  for (let j = 0; j <= n; j++) {
    for (let i = 0; i <= n; i++) {
      const k = j * (n + 1) + i;
      x[k] = i * h;
      y[k] = j * h;
      values[k] = error(i * h, j * h, h, Math.min(i, n - i, j, n - j));
      weights[k] = h * h * (i === 0 || i === n ? 0.5 : 1) * (j === 0 || j === n ? 0.5 : 1);
    }
  }
  return { x, y, values, weights, h };
}

/** The per-place norms of a synthetic error field. */
function places(n: number, error: Field) {
  const f = field(n, error);
  const code = placeOfPoints(f.x, f.y, { x0: 0, x1: 1, y0: 0, y1: 1 }, { hx: f.h, hy: f.h });
  return placeNorms(f.values, new Float64Array(f.values.length), code, f.weights);
}

/** A solve whose errors are those of a synthetic field, in every region and place. */
function solveOf(n: number, error: Field, extra: Partial<SolveRecord> = {}): SolveRecord {
  return solve(n, norms(n, error), { places: places(n, error), ...extra });
}

/** Error norms of a synthetic nodal error field e(x, y, h, distance-in-nodes) on the unit square. */
function norms(n: number, error: Field) {
  const h = 1 / n;
  const values = new Float64Array((n + 1) ** 2);
  for (let j = 0; j <= n; j++) {
    for (let i = 0; i <= n; i++) {
      const d = Math.min(i, n - i, j, n - j);
      values[j * (n + 1) + i] = error(i * h, j * h, h, d);
    }
  }
  return vertexRegionNorms(values, new Float64Array(values.length), { nx: n, ny: n, hx: h, hy: h });
}

function solve(n: number, errors: Record<Region, NormSet>, extra: Partial<SolveRecord> = {}) {
  const record: SolveRecord = {
    caseId: "case",
    solver: "solver",
    nx: n,
    ny: n,
    h: 1 / n,
    unknowns: (n - 1) ** 2,
    status: "ok",
    errors,
    quantities: {},
    residualHistory: [1, 0.1, 0.01, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9],
    iterations: 9,
    converged: true,
    averageFactor: 0.1,
    asymptoticFactor: 0.1,
    seconds: 1e-6 * n * n,
    ...extra,
  };
  return record;
}

const SPEC: StudySpec = { caseId: "case", solver: "solver", expected: { formal: 2 } };
const smooth = (x: number, y: number, h: number) =>
  h * h * Math.sin(Math.PI * x) * Math.sin(Math.PI * y) * (1 + h);

function byCriterion(verdicts: Verdict[], criterion: string): Verdict[] {
  return verdicts.filter((v) => v.criterion === criterion);
}

const KINDS = {
  boundaryKinds: { west: "dirichlet", east: "neumann", south: "dirichlet", north: "dirichlet" },
};

Deno.test("buildStudy() passes a second-order study and records every region, place and norm", () => {
  // derived: e = h²(1 + h)·sin(πx)sin(πy) converges at order 2 in every norm
  const study = buildStudy(GRIDS.map((n) => solveOf(n, smooth)).reverse(), SPEC);
  assert.deepEqual(study.grids, GRIDS);
  assert.equal(study.orders.length, 9);
  assert.deepEqual(study.places!.map((p) => p.place), [
    "west",
    "east",
    "south",
    "north",
    "corners",
    "interior",
  ]);
  for (const norm of ["max", "l2", "l1"] as const) {
    const o = study.orders.find((o) => o.region === "all" && o.norm === norm)!;
    assertClose(o.pairwise[o.pairwise.length - 1]!, 2, { abs: 0.02 });
  }
  const failed = study.verdicts.filter((v) => v.status !== "pass" && v.status !== "not-applicable");
  assert.deepEqual(failed, []);
  assert.equal(byCriterion(study.verdicts, "order").length, 3);
});

Deno.test("buildStudy() fails a first-order band along one side and names that side", () => {
  // derived: e = h²·sin·sin + 0.5·h in the two node layers along x = 1 only: the band is first
  // order, the interior second order; the global max norm shows order 1 from the first pair
  const error: Field = (x, y, h) =>
    smooth(x, y, h) + (x >= 1 - 1.5 * h ? 0.5 * h * Math.sin(Math.PI * y) : 0);
  const study = buildStudy(GRIDS.map((n) => solveOf(n, error)), { ...SPEC, ...KINDS });
  const max = byCriterion(study.verdicts, "order")[0];
  assert.equal(max.status, "fail");
  assert.match(max.reason, /settled below 2/);
  assert.match(max.reason, /the defect sits at the Neumann side east/);
  assert.deepEqual((max.details!.location as { blamed: string[] }).blamed, ["east"]);
});

Deno.test("buildStudy() calls a defect that lowers the order everywhere global and says how to tell", () => {
  // derived: e = h·x·sin(πy) (a first-order defect everywhere, largest where the solution is,
  // here at the Neumann side x = 1): the side's band merely holds the maximum of a global error
  // and must not be blamed
  const error: Field = (x, y, h) => h * x * Math.sin(Math.PI * y);
  const study = buildStudy(GRIDS.map((n) => solveOf(n, error)), { ...SPEC, ...KINDS });
  const max = byCriterion(study.verdicts, "order")[0];
  assert.equal(max.status, "fail");
  assert.match(max.reason, /the defect is global/);
  assert.match(max.reason, /make the Neumann side east Dirichlet/);
});

Deno.test("buildStudy() fails an order that moves away from 2 and names the order it heads to", () => {
  // derived: E = 0.05·h + 3·h² — pairwise orders 1.86, 1.75, 1.59 on 16…128 fall away from 2
  // toward 1; the two-term model E = A·h^q + B·h² fitted through the finest three gives q = 1
  const error: Field = (x, y, h) =>
    (0.05 * h + 3 * h * h) * Math.sin(Math.PI * x) * Math.sin(Math.PI * y);
  const study = buildStudy(GRIDS.map((n) => solveOf(n, error)), SPEC);
  const max = byCriterion(study.verdicts, "order")[0];
  assert.equal(max.status, "fail");
  assert.match(max.reason, /moving away from 2/);
  assertClose(max.details!.heading as number, 1, { abs: 0.05 });
});

Deno.test("buildStudy() leaves an order that approaches 2 from below undecided, never failed", async (t) => {
  // derived: E = h²(1 − 4h) on 8, 16, 32 gives pairwise orders 1.42, 1.78: the gap shrinks to
  // 0.38 of the previous one, faster than the settle ratio 2^(−1/2)
  const error: Field = (x, y, h) =>
    h * h * (1 - 4 * h) * Math.sin(Math.PI * x) * Math.sin(Math.PI * y);
  await t.step("three grids: inconclusive", () => {
    const study = buildStudy([8, 16, 32].map((n) => solveOf(n, error)), SPEC);
    const max = byCriterion(study.verdicts, "order")[0];
    assert.equal(max.status, "inconclusive");
    assert.match(max.reason, /rising toward it/);
  });
  await t.step("two grids below the order never fail", () => {
    const study = buildStudy([8, 16].map((n) => solveOf(n, error)), SPEC);
    const max = byCriterion(study.verdicts, "order")[0];
    assert.equal(max.status, "inconclusive");
    assert.match(max.reason, /two grids never decide a failure/);
  });
});

Deno.test("buildStudy() fails a solver that claims a convergence its residuals do not show", () => {
  // a record that fell by 1e-3 while 1e-10 was requested, with converged: true
  const solves = GRIDS.map((n) =>
    solveOf(n, smooth, { residualHistory: [1, 0.1, 0.01, 1e-3], converged: true })
  );
  const study = buildStudy(solves, SPEC);
  const c = byCriterion(study.verdicts, "convergence")[0];
  assert.equal(c.status, "fail");
  assert.match(c.reason, /reports converged, but its residual fell by 1\.0e-3 where 1\.0e-10 was/);
});

Deno.test("buildStudy() makes the order undecided, not failed, while a precondition fails", () => {
  // first-order errors from a loose solve: the order would fail, but convergence is to blame
  const error: Field = (x, y, h) => h * Math.sin(Math.PI * x) * Math.sin(Math.PI * y);
  const solves = GRIDS.map((n) =>
    solveOf(n, error, { residualHistory: [1, 1e-2], converged: false })
  );
  const study = buildStudy(solves, SPEC);
  assert.equal(byCriterion(study.verdicts, "convergence")[0].status, "fail");
  const max = byCriterion(study.verdicts, "order")[0];
  assert.equal(max.status, "inconclusive");
  assert.match(max.reason, /not judged, because not every grid converged/);
});

Deno.test("buildStudy() fails an iterative error that is not well below the discretization error", () => {
  // requested 1e-4 and reached: convergence passes, but 1e-4 > 5 % of h² ≈ 6e-5 at n = 128
  const solves = GRIDS.map((n) => solveOf(n, smooth, { residualHistory: [1, 1e-4] }));
  const study = buildStudy(solves, { ...SPEC, requestedTolerance: 1e-4 });
  assert.equal(byCriterion(study.verdicts, "convergence")[0].status, "pass");
  const v = byCriterion(study.verdicts, "iterative-error")[0];
  assert.equal(v.status, "fail");
  assert.match(v.reason, /128×128/);
});

Deno.test("buildStudy() fails imposed data that do not come back and names the reordering", () => {
  const solves = GRIDS.map((n) =>
    solveOf(n, smooth, {
      imposed: { sides: { west: 0.3, south: 0 }, reordering: "the values come y-fastest" },
    })
  );
  const study = buildStudy(solves, { ...SPEC, ...KINDS });
  const v = byCriterion(study.verdicts, "imposed-data")[0];
  assert.equal(v.status, "fail");
  assert.match(v.reason, /the Dirichlet side west/);
  assert.match(v.reason, /wrong point order/);
});

Deno.test("buildStudy() judges exactness by round-off errors, not by order", async (t) => {
  const spec: StudySpec = {
    ...SPEC,
    expected: { formal: 2, exactToRoundOff: true },
    solutionScale: 2,
  };
  await t.step("round-off errors pass", () => {
    const study = buildStudy(GRIDS.map((n) => solveOf(n, () => 1e-13)), spec);
    assert.equal(byCriterion(study.verdicts, "exactness")[0].status, "pass");
    assert.equal(byCriterion(study.verdicts, "order")[0].status, "not-applicable");
  });
  await t.step("truncation-sized errors fail, naming the grid and the bound", () => {
    const study = buildStudy(GRIDS.map((n) => solveOf(n, smooth)), spec);
    const v = byCriterion(study.verdicts, "exactness")[0];
    assert.equal(v.status, "fail");
    // bound: max(1e-9, 1e3 × the record's reduction 1e-9) × max|u| 2 = 2e-6 (docs/verdicts.md)
    assert.match(v.reason, /on the 16×16 grid exceeds the round-off bound 2\.0e-6/);
  });
});

Deno.test("buildStudy() fails iterations that grow like N unless the solver declares it", () => {
  // iterations ∝ N (Gauss–Seidel-like): exponent 1 over the grids with ≥ 900 unknowns
  const solves = GRIDS.map((n) => solveOf(n, smooth, { iterations: n * n }));
  const flat = byCriterion(buildStudy(solves, SPEC).verdicts, "flat-iterations")[0];
  assert.equal(flat.status, "fail");
  assert.match(flat.reason, /beyond the allowed N\^0\.50/);
  const declared = buildStudy(solves, { ...SPEC, iterationGrowth: 1 });
  assert.equal(byCriterion(declared.verdicts, "flat-iterations")[0].status, "pass");
  const advice = buildStudy(solves, { ...SPEC, workStrictness: "warn" });
  assert.equal(byCriterion(advice.verdicts, "flat-iterations")[0].status, "warn");
});

Deno.test("buildStudy() honours a per-norm expected order with its reason", () => {
  const first = (x: number, y: number, h: number) =>
    h * Math.sin(Math.PI * x) * Math.sin(Math.PI * y);
  const study = buildStudy(GRIDS.map((n) => solve(n, norms(n, first))), {
    ...SPEC,
    expected: {
      formal: 2,
      achievable: {
        max: { order: 1, reason: "corner singularity" },
        l2: { order: 1, reason: "corner singularity" },
        l1: { order: 1, reason: "corner singularity" },
      },
    },
  });
  const order = byCriterion(study.verdicts, "order");
  assert.ok(order.every((v) => v.status === "pass"), order.map((v) => v.reason).join("\n"));
  assert.match(order[0].reason, /the case expects 1 here: corner singularity/);
});

Deno.test("buildStudy() studies quantities, their coverage and the asymptotic range", () => {
  // derived: q1 = 1 + h² is in the asymptotic range and covered; q2 = 1 + h + 30h² is not yet:
  // its observed order moves from 1.66 (grids 16, 32, 64) to 1.50 (32, 64, 128), and its GCI
  // band misses the true error
  const solves = GRIDS.map((n) =>
    solve(n, norms(n, smooth), {
      quantities: { q1: 1 + n ** -2, q2: 1 + 1 / n + 30 / n ** 2 },
    })
  );
  const study = buildStudy(solves, {
    ...SPEC,
    quantities: { q1: { label: "first", exact: 1 }, q2: { exact: 1 } },
  });
  assert.deepEqual(study.quantities.map((q) => q.name), ["q1", "q2"]);
  const [q1, q2] = study.quantities;
  assert.equal(q1.label, "first");
  assertClose(q1.order!, 2, { rel: 1e-8 });
  assert.equal(q1.covered, true);
  assert.ok(q1.leastSquares !== null);
  assert.equal(q2.covered, false);
  const v = byCriterion(study.verdicts, "asymptotic-range")[0];
  assert.equal(v.status, "warn");
  assert.match(v.reason, /the observed order still moves .* for q2 \(1\.66 → 1\.50\)/);
  assert.equal(study.coverage, 0.5);
});

Deno.test("buildStudy() rejects two solves of the same grid and foreign solves", () => {
  const a = solve(16, norms(16, smooth));
  assert.throws(() => buildStudy([a, a], SPEC), /two solves share h = 0.0625/);
  assert.throws(() => buildStudy([{ ...a, solver: "other" }], SPEC), /belongs to case × other/);
});

Deno.test("buildStudy() only warns when a short residual reduction cannot move an order", () => {
  // requested 1e-10, reached 1e-7: beyond the slack of 100, but 1e-7 is under 1 % of the
  // discretization error h² ≥ 6e-5 of every grid (derived)
  const solves = GRIDS.map((n) => solveOf(n, smooth, { residualHistory: [1, 1e-7] }));
  const study = buildStudy(solves, SPEC);
  const c = byCriterion(study.verdicts, "convergence")[0];
  assert.equal(c.status, "warn");
  assert.match(c.reason, /too small to move an order/);
  assert.ok(byCriterion(study.verdicts, "order").every((v) => v.status === "pass"));
});
