/**
 * A solver that replies on its own points, end to end through the campaign: the deno-sor example
 * with `--reply-points` (entry `deno-sor-points` of examples/solvers.json) solves on the vertex
 * grid and replies at the cell centres, each the average of its four nodes, with weights hx·hy.
 * The campaign must measure its errors at those centres, with h = sqrt(area / N), and judge it
 * like any other solver.
 *
 * Grids 32, 64, 128: at 16 the boundary band of the all-Dirichlet case is still pre-asymptotic —
 * its error is the averaging term (hx²·u_xx + hy²·u_yy)/8 = O(h²) plus the nodal error, which
 * vanishes on a Dirichlet side and is O(h³) in a two-layer band (the reference's band order is 3
 * there), so the 16/32 pair shows order 1.9 in the band's L1 norm and the next pairs 1.95, 1.98.
 */
import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import type { CampaignResult } from "../../harness/result/mod.ts";
import {
  createExternalSolver,
  createReferenceSolver,
  loadSolverFile,
} from "../../harness/solvers/mod.ts";

const GRIDS = [32, 64, 128];
/** All Dirichlet; mixed Dirichlet, Neumann and Robin; a 2×1 rectangle (area 2, h ≠ 1/n). */
const CASE_IDS = ["smooth-baseline", "mixed-boundaries", "rectangle-2x1"];

async function pointsSolver() {
  const specs = await loadSolverFile("examples/solvers.json");
  const spec = specs.find((s) => s.name === "deno-sor-points");
  assert.ok(spec, "examples/solvers.json has an entry deno-sor-points");
  assert.equal(spec.layout, "points");
  return createExternalSolver(spec, { solverFileDir: spec.solverFileDir });
}

/** One campaign shared by the tests below (about 3 s: SOR up to 128 × 128, three cases). */
let shared: { result: CampaignResult; cases: CompiledCase[] } | undefined;
async function campaign() {
  if (shared) return shared;
  const cases = await Promise.all(CASE_IDS.map((id) => loadCase(id)));
  const points = await pointsSolver();
  try {
    const result = await runCampaign(cases, [createReferenceSolver(), points], { grids: GRIDS });
    shared = { result, cases };
  } finally {
    await points.close();
  }
  return shared;
}

const area = (c: CompiledCase) => (c.domain.x1 - c.domain.x0) * (c.domain.y1 - c.domain.y0);

Deno.test("a points-replying solver's records count its own points and take h = sqrt(area / N)", async () => {
  const { result, cases } = await campaign();
  for (const kase of cases) {
    const mine = result.solves.filter((r) =>
      r.caseId === kase.id && r.solver === "deno-sor-points"
    );
    assert.deepEqual(mine.map((r) => r.nx), GRIDS);
    for (const r of mine) {
      assert.equal(r.status, "ok", r.reason);
      // docs/protocol.md: N = the number of points replied; here the nx·ny cell centres
      assert.equal(r.unknowns, r.nx * r.ny, `${kase.id} ${r.nx}: unknowns`);
      // docs/protocol.md: "The representative spacing is sqrt(area / N)"
      const h = Math.sqrt(area(kase) / (r.nx * r.ny));
      assert.ok(Math.abs(r.h - h) <= 1e-15 * h, `${kase.id} ${r.nx}: h ${r.h}, expected ${h}`);
      // the structured quantities need a grid; on own points only integral and maximum exist
      assert.deepEqual(Object.keys(r.quantities ?? {}).sort(), ["integral", "maximum"]);
      // the reference comparison is for the vertex layout only
      assert.equal(r.differenceFromReference, undefined);
    }
  }
});

Deno.test("the campaign measures a points reply's errors at the points it names", async () => {
  // Independent recomputation: the reference multigrid's nodal solution on the same 32×32 grid,
  // averaged to the cell centres here, compared with the exact solution at the centres. deno-sor
  // solves the same 5-point system (both to a relative residual of 1e-10), so the two max errors
  // agree far below the error itself (derived). Measuring at any other points (the nodes, say)
  // would change the error by O(h), far more than the 0.1 % allowed.
  const { result, cases } = await campaign();
  const reference = createReferenceSolver();
  for (const kase of cases) {
    const r = result.solves.find((s) =>
      s.caseId === kase.id && s.solver === "deno-sor-points" && s.nx === 32
    )!;
    const o = await reference.solve({
      case: kase,
      nx: r.nx,
      ny: r.ny,
      scheme: "central",
      tolerance: 1e-10,
    });
    assert.equal(o.status, "ok");
    const { x0, x1, y0, y1 } = kase.domain;
    const hx = (x1 - x0) / r.nx, hy = (y1 - y0) / r.ny;
    const row = r.nx + 1;
    let max = 0;
    for (let j = 0; j < r.ny; j++) {
      for (let i = 0; i < r.nx; i++) {
        const k = j * row + i;
        const mean = (o.values[k] + o.values[k + 1] + o.values[k + row] + o.values[k + row + 1]) /
          4;
        const exact = kase.exact(x0 + (i + 0.5) * hx, y0 + (j + 0.5) * hy);
        max = Math.max(max, Math.abs(mean - exact));
      }
    }
    const measured = r.errors!.all.max;
    assert.ok(
      Math.abs(measured - max) <= 1e-3 * max,
      `${kase.id}: measured max error ${measured}, recomputed ${max}`,
    );
  }
  await reference.close();
});

Deno.test("a points-replying solver shows order 2 on the finest pair over all points and in the boundary band", async () => {
  // Source: derived — the 5-point central scheme has formal order 2 and the four-node average
  // adds (hx²·u_xx + hy²·u_yy)/8 + O(h⁴), also order 2 (examples/deno-sor/cell_points.ts).
  // The interior region (points more than 2h from the boundary) grows as h shrinks, which leaves
  // an O(h) drift in its observed order — the reference shows it too (mixed-boundaries, interior
  // max norm: 1.76, 1.89 over 32/64/128) — so there the pairwise orders must rise towards 2.
  const { result } = await campaign();
  for (const kase of CASE_IDS) {
    const study = result.studies.find((s) => s.caseId === kase && s.solver === "deno-sor-points")!;
    assert.deepEqual(study.grids, GRIDS);
    assert.equal(study.orders.length, 9, "3 regions × 3 norms");
    for (const o of study.orders) {
      const [first, last] = o.pairwise;
      const what = `${kase} ${o.region} ${o.norm}: orders ${o.pairwise}`;
      assert.ok(first !== null && last !== null, what);
      if (o.region === "interior") assert.ok(first < last && last < 2 + 0.1, what);
      else assert.ok(Math.abs(last - 2) <= 0.1, what);
    }
  }
});

Deno.test("the integral of a points reply converges at order 2 and equals the trapezoid integral of the nodes", async () => {
  // Source: derived — Σ hx·hy·(four-node average) is the trapezoid rule on the node values (an
  // interior node lies in four cells, a side node in two, a corner in one), so it equals the
  // reference's trapezoid integral on the same grid up to the two solvers' iterative tolerance
  const { result, cases } = await campaign();
  for (const kase of cases) {
    const study = result.studies.find((s) =>
      s.caseId === kase.id && s.solver === "deno-sor-points"
    )!;
    const integral = study.quantities.find((q) => q.name === "integral")!;
    assert.ok(Math.abs(integral.order! - 2) <= 0.1, `${kase.id}: integral order ${integral.order}`);
    const errors = integral.values.map((v) => Math.abs(v! - integral.exact!));
    assert.ok(errors[0] > errors[1] && errors[1] > errors[2], `${kase.id}: errors ${errors}`);
    for (const n of GRIDS) {
      const pick = (solver: string) =>
        result.solves.find((r) => r.caseId === kase.id && r.solver === solver && r.nx === n)!
          .quantities!.integral;
      const mine = pick("deno-sor-points"), ref = pick("reference");
      assert.ok(
        Math.abs(mine - ref) <= 1e-8 * Math.abs(ref),
        `${kase.id} ${n}: ${mine} vs ${ref}`,
      );
    }
  }
});

Deno.test("the verdicts of a points-replying solver pass, its SOR growth as declared", async () => {
  // Source: common practice — SOR with a near-optimal ω needs O(n) sweeps on an n×n grid, so its
  // iteration count grows like N^0.5; the solver file declares "iterationGrowth": 0.5, so the
  // flat-iterations verdict passes
  const { result } = await campaign();
  for (const kase of CASE_IDS) {
    const study = result.studies.find((s) => s.caseId === kase && s.solver === "deno-sor-points")!;
    const verdicts = Object.fromEntries(study.verdicts.map((v) => [v.criterion, v]));
    for (const v of study.verdicts) {
      if (v.criterion === "asymptotic-range") continue; // advice on quantities, may warn
      assert.equal(v.status, "pass", `${kase} ${v.criterion}: ${v.reason}`);
    }
    for (const criterion of ["order", "convergence", "iterative-error", "flat-iterations"]) {
      assert.ok(verdicts[criterion], `${kase}: a ${criterion} verdict exists`);
    }
    assert.equal(verdicts["agreement-with-reference"], undefined);
  }
  assert.equal(result.summary.fail, 0, JSON.stringify(result.summary));
  assert.equal(result.summary.exitCode, 0);
});
