/**
 * Seeded defects of the grids of issue 14 in the defect zoo (testing/zoo, its own assembly on
 * unequal steps and across a periodic seam: `assemble_mapped.ts`): a periodic seam coupled to the
 * wrong neighbour (vertex: the image node; cell: the wrap-around term dropped) and a stretched
 * scheme that differences one axis with the uniform formula at the mean step. Each runs beside
 * its correct twin on two cases where it acts — a library case and a second problem with other
 * coefficients, sides, domain or map — and on cases where it cannot act. Every defect must fail
 * the order with a reason and a cross-case diagnosis that say where (the periodic sides, the
 * stretched axis); every twin must pass. The comparison is the manufactured exact solution.
 */
import assert from "node:assert/strict";
import { buildCase, loadCase } from "../../cases/mod.ts";
import { testCase } from "../../cases/_test_case.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import type { CampaignResult, Verdict } from "../../harness/result/mod.ts";
import { createZooSolver, type DefectName } from "../../testing/zoo/mod.ts";

/** Periodic west–east with period 2, Dirichlet walls: other sides, domain and coefficients than periodic-channel. */
const periodicWalls = () =>
  buildCase(
    testCase({
      id: "periodic-walls",
      domain: { x0: 0, x1: 2, y0: 0, y1: 1 },
      coefficients: {
        a: "2 + cos(pi*x)",
        b: "0.5*sin(pi*x)",
        c: "1 + 0.5*y",
        d: "0",
        e: "-1",
      },
      exact: "cos(pi*x + 0.5)*exp(0.5*y) + y",
      boundary: {
        west: { kind: "periodic" },
        east: { kind: "periodic" },
        south: { kind: "dirichlet" },
        north: { kind: "dirichlet" },
      },
    }),
    { origin: "test" },
  );

/** Stretched along x only (tanh at both ends), every term of the operator active. */
const stretchedX = () =>
  buildCase(
    testCase({
      id: "stretched-x",
      coefficients: { a: "1 + x", b: "0.5", c: "1 + y", d: "-1", e: "-1" },
      exact: "sin(2*x + 1)*exp(y) + y^2",
      spacing: { x: { kind: "tanh", strength: 2, toward: "both" } },
    }),
    { origin: "test" },
  );

interface Row {
  defect: DefectName;
  layout: "vertex" | "cell";
  /** The cases, built; the first `failing` of them must fail. */
  cases: () => Promise<CompiledCase>[];
  failing: string[];
  says: RegExp;
}

const ROWS: Row[] = [
  {
    defect: "periodic-seam-image",
    layout: "vertex",
    cases: () => [
      loadCase("periodic-channel"),
      periodicWalls(),
      loadCase("neumann-all"),
      loadCase("smooth-baseline"),
    ],
    failing: ["periodic-channel", "periodic-walls"],
    says: /the periodic sides, the seam between west and east/,
  },
  {
    defect: "periodic-seam-dropped",
    layout: "cell",
    cases: () => [
      loadCase("periodic-channel"),
      periodicWalls(),
      loadCase("mixed-boundaries"),
      loadCase("variable-all"),
    ],
    failing: ["periodic-channel", "periodic-walls"],
    says: /the periodic sides, the seam between west and east/,
  },
  {
    defect: "stretched-y-mean-spacing",
    layout: "vertex",
    cases: () => [
      loadCase("stretched-wall-layer"),
      loadCase("geometric-stretch"),
      stretchedX(),
      loadCase("periodic-channel"),
    ],
    failing: ["stretched-wall-layer", "geometric-stretch"],
    says: /a grid stretched along y/,
  },
  {
    defect: "stretched-y-mean-spacing",
    layout: "cell",
    cases: () => [
      loadCase("geometric-stretch"),
      loadCase("stretched-wall-layer"),
      stretchedX(),
      loadCase("variable-all"),
    ],
    failing: ["geometric-stretch", "stretched-wall-layer"],
    says: /a grid stretched along y/,
  },
];

const GRIDS = [16, 32, 64];
const REFINE = { maxAdded: 1, maxUnknowns: 17_000 };

async function run(row: Row, defect?: DefectName): Promise<CampaignResult> {
  const cases = await Promise.all(row.cases());
  const solver = createZooSolver({ layout: row.layout, ...(defect ? { defect } : {}) });
  return await runCampaign(cases, [solver], { grids: GRIDS, refine: REFINE });
}

const show = (vs: Verdict[]) => vs.map((v) => `${v.status} ${v.criterion}: ${v.reason}`).join("\n");

for (const row of ROWS) {
  Deno.test(`zoo: ${row.defect} (${row.layout}) fails on ${row.failing.join(" and ")} naming where; passes elsewhere; its twin passes`, async () => {
    const bad = await run(row, row.defect);
    for (const study of bad.studies) {
      const order = study.verdicts.find((v) => v.criterion === "order" && v.status === "fail");
      if (!row.failing.includes(study.caseId)) {
        assert.equal(order, undefined, `${study.caseId}: ${show(study.verdicts)}`);
        continue;
      }
      assert.ok(order, `${study.caseId}: no failing order\n${show(study.verdicts)}`);
      assert.match(order.reason, row.says, show(study.verdicts));
      assert.match(study.diagnosis ?? "", row.says);
      for (const w of study.verdicts.filter((w) => w.status === "fail")) {
        assert.doesNotMatch(w.reason, /may still be pre-asymptotic|refine further/);
      }
    }
    const twin = await run(row);
    const wrong = twin.studies.flatMap((s) =>
      s.verdicts.filter((v) => v.status === "fail" || v.status === "inconclusive")
    );
    assert.deepEqual(wrong, [], show(wrong));
  });
}
