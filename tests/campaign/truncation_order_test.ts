/**
 * Truncation and solution order reported apart (issue 14 item 3). The reference solver's local
 * truncation error τ = A·u − f (the residual of the exact solution in its discrete operator) is
 * checked against outside references:
 *
 * - uniform grid, 5-point Laplacian, u = sin(πx)·sin(πy): Taylor expansion of the central second
 *   difference, (u(x+h) − 2u(x) + u(x−h))/h² = u'' + (h²/12)·u'''' + (h⁴/360)·u⁽⁶⁾ + …, so
 *   τ = (h²/12)(u_xxxx + u_yyyy) + O(h⁴) = (h²/12)·2π⁴·u (a derived identity);
 * - a stretched family whose map has a kink (x(t) = t + 0.6(|t − ½| − ½), slopes 0.4 and 1.6): at
 *   the kink node the three-point u_xx has the truncation error (he − hw)/3·u_xxx = O(h), so the
 *   max-norm truncation order is 1, while the solution error stays second order
 *   (supraconvergence; Manteuffel & White, Math. Comp. 47, 1986);
 * - a smooth geometric map (library case `geometric-stretch`): he − hw = O(h²), so both orders
 *   are 2 and the report adds no supraconvergence paragraph (the same expansion).
 */
import assert from "node:assert/strict";
import { buildCase, loadCase } from "../../cases/mod.ts";
import { testCase } from "../../cases/_test_case.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import { measureOutcome } from "../../harness/campaign/measure.ts";
import { createReferenceSolver } from "../../harness/solvers/mod.ts";
import { renderHtml, renderMarkdown, renderText } from "../../harness/report/mod.ts";

Deno.test("uniform grid: the reference's truncation error is (h²/12)(u_xxxx + u_yyyy) to O(h⁴)", async () => {
  const kase = await buildCase(testCase(), { origin: "test" }); // u = sin(πx)·sin(πy), Δu = f
  const solver = createReferenceSolver();
  const max: number[] = [];
  for (const n of [16, 32]) {
    const outcome = await solver.solve({
      case: kase,
      nx: n,
      ny: n,
      scheme: "central",
      tolerance: 1e-10,
    });
    assert.ok(outcome.truncation, "the reference solver gives τ");
    const h = 1 / n, pi4 = Math.PI ** 4, pi6 = Math.PI ** 6;
    // next term of the expansion: (h⁴/360)(u_6x + u_6y), |u_6x| ≤ π⁶
    const bound = 2 * (h ** 4 / 360) * 2 * pi6;
    let lead = 0;
    for (let j = 1; j < n; j++) {
      for (let i = 1; i < n; i++) {
        const k = j * (n + 1) + i;
        const u = Math.sin(Math.PI * outcome.x[k]) * Math.sin(Math.PI * outcome.y[k]);
        const expected = (h * h / 12) * 2 * pi4 * u;
        lead = Math.max(lead, Math.abs(expected));
        assert.ok(
          Math.abs(outcome.truncation[k] - expected) <= bound,
          `n=${n} node (${i}, ${j}): τ = ${outcome.truncation[k]}, leading term ${expected}`,
        );
      }
    }
    const record = measureOutcome(kase, "reference", outcome, 1e-10);
    assert.ok(Math.abs(record.truncation!.max - lead) <= bound);
    max.push(record.truncation!.max);
  }
  assert.ok(Math.abs(Math.log2(max[0] / max[1]) - 2) < 0.02, `pairwise order of max τ: ${max}`);
});

Deno.test("kinked stretched map: truncation order 1 beside solution order 2, with the supraconvergence paragraph", async () => {
  const kase = await buildCase(
    testCase({
      id: "kinked-map",
      exact: "sin(3*x) * exp(y)",
      spacing: { x: { kind: "expression", expression: "t + 0.6*(abs(t - 0.5) - 0.5)" } },
      grids: [16, 32, 64],
    }),
    { origin: "test" },
  );
  const result = await runCampaign([kase], [createReferenceSolver()], { grids: [16, 32, 64] });
  const study = result.studies[0];
  const tmax = study.truncationOrders?.find((o) => o.norm === "max")?.fitted.order;
  const emax = study.orders.find((o) => o.region === "all" && o.norm === "max")?.fitted.order;
  assert.ok(tmax !== undefined && tmax !== null && Math.abs(tmax - 1) < 0.15, `truncation ${tmax}`);
  assert.ok(emax !== undefined && emax !== null && Math.abs(emax - 2) < 0.1, `solution ${emax}`);
  assert.equal(study.verdicts.find((v) => v.criterion === "order")?.status, "pass");
  for (const text of [renderText(result), renderMarkdown(result), await renderHtml(result)]) {
    assert.match(text, /truncation error order/);
    assert.match(text, /supraconvergence[^]*Manteuffel &(amp;)? White/);
  }
});

Deno.test("smooth geometric map (geometric-stretch): both orders 2, no supraconvergence paragraph", async () => {
  const kase = await loadCase("geometric-stretch");
  const result = await runCampaign([kase], [createReferenceSolver()], { grids: [16, 32, 64] });
  const study = result.studies[0];
  const tmax = study.truncationOrders?.find((o) => o.norm === "max")?.fitted.order;
  assert.ok(tmax !== undefined && tmax !== null && Math.abs(tmax - 2) < 0.15, `truncation ${tmax}`);
  const text = renderText(result);
  assert.match(text, /truncation error order/);
  assert.doesNotMatch(text, /supraconvergence/);
});
