import assert from "node:assert/strict";
import {
  errorMapPlot,
  errorPlot,
  placesPlot,
  renderSvg,
  reportPlots,
  residualPlot,
} from "./plots.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";
import { assertClose } from "../../testing/mod.ts";

function layerValues(spec: unknown, layer: number): Record<string, number | string>[] {
  // deno-lint-ignore no-explicit-any
  return (spec as any).layer[layer].data.values;
}

Deno.test("errorPlot() draws the reference line with the slope of the expected order", () => {
  const plot = errorPlot(makeFixtureResult(), "poisson-sine")!;
  const [a, b] = layerValues(plot.spec, 0);
  // derived: on log–log axes the slope is ln(E_b/E_a)/ln(h_b/h_a)
  const slope = Math.log((b.error as number) / (a.error as number)) /
    Math.log((b.h as number) / (a.h as number));
  assertClose(slope, 2, { rel: 1e-12 });
  // every norm of every ok solve is a point: 2 solvers × 4 grids × 3 norms
  assert.equal(layerValues(plot.spec, 1).length, 24);
  // the line lies below every data point, so it hides none
  const lowest = Math.min(...layerValues(plot.spec, 1).map((r) => r.error as number));
  assert.ok((a.error as number) < lowest);
});

Deno.test("residualPlot() thins long histories to at most about 400 points per grid", () => {
  const result = makeFixtureResult();
  const long = result.solves.find((s) => s.residualHistory.length > 3000)!;
  // deno-lint-ignore no-explicit-any
  const values = (residualPlot(result, long.caseId, long.solver)!.spec as any).data.values as {
    grid: string;
    iteration: number;
  }[];
  const mine = values.filter((v) => v.grid === `${long.nx}×${long.ny}`);
  assert.ok(mine.length <= 401, String(mine.length));
  assert.equal(mine[mine.length - 1].iteration, long.residualHistory.length - 1, "last point kept");
});

Deno.test("reportPlots() gives each case an error plot, a residual plot per solver and a cost plot", () => {
  const kinds = reportPlots(makeFixtureResult()).map((p) =>
    `${p.caseId}:${p.kind}:${p.solver ?? ""}`
  );
  assert.deepEqual(kinds, [
    "poisson-sine:errors:",
    "poisson-sine:residuals:reference",
    "poisson-sine:residuals:team-gs",
    "poisson-sine:cost:",
    "robin-variable:errors:",
    "robin-variable:residuals:reference",
    "robin-variable:residuals:team-gs",
    "robin-variable:cost:",
  ]);
});

Deno.test("renderSvg() gives every plot its own element ids", async () => {
  // clipped marks make Vega emit clip-path ids from a counter shared by the whole process
  const spec = {
    data: { values: [{ x: 1, y: 1 }, { x: 2, y: 4 }] },
    hconcat: [1, 2].map(() => ({
      mark: { type: "line" as const, clip: true },
      encoding: {
        x: { field: "x", type: "quantitative" as const },
        y: { field: "y", type: "quantitative" as const },
      },
    })),
  };
  const one = await renderSvg(spec, "p1");
  const two = await renderSvg(spec, "p2");
  assert.match(one, /^<svg /);
  const ids = (svg: string) => [...svg.matchAll(/\sid="([^"]+)"/g)].map((m) => m[1]);
  assert.ok(ids(one).length > 0);
  assert.ok(ids(one).every((id) => id.startsWith("p1-")));
  assert.ok(ids(two).every((id) => id.startsWith("p2-")));
  // every url(#…) reference points at an id of the same SVG
  for (const m of one.matchAll(/url\(#([^)]+)\)/g)) assert.ok(ids(one).includes(m[1]), m[1]);
  assert.equal(one.replaceAll("p1-", "p2-"), two, "rendering is deterministic");
});

Deno.test("errorMapPlot() draws the kept error map of a failing study with the sides named", async () => {
  const result = makeFixtureResult();
  const solve = result.solves.find((s) => s.status === "ok")!;
  // a 2 × 2 map whose largest error sits in the north-east block
  solve.errorMap = { columns: 2, rows: 2, values: [1e-4, 2e-4, 3e-4, 9e-3] };
  const plot = errorMapPlot(result, solve.caseId, solve.solver)!;
  assert.equal(plot.kind, "error-map");
  const values =
    (plot.spec as { data: { values: { column: number; row: number; error: number }[] } })
      .data.values;
  assert.deepEqual(values[3], { column: 1, row: 1, error: 9e-3 });
  assert.ok(reportPlots(result).some((p) => p.kind === "error-map"));
  const svg = await renderSvg(plot.spec, "map");
  assert.match(svg, /west ← x → east/);
  assert.match(svg, /south ← y → north/);
});

Deno.test("errorPlot() explains every mark: guides for the expected order and order 1, a tick at every h", async () => {
  const result = makeFixtureResult();
  const plot = errorPlot(result, "robin-variable")!;
  const guides = layerValues(plot.spec, 0);
  // derived: the order-1 guide rises by the ratio of the spacings, the expected one by its square
  const one = guides.filter((g) => g.guide === "slope 1");
  assert.equal(one.length, 2);
  assertClose(
    Math.log((one[1].error as number) / (one[0].error as number)) /
      Math.log((one[1].h as number) / (one[0].h as number)),
    1,
    { rel: 1e-12 },
  );
  const svg = await renderSvg(plot.spec, "e");
  const texts = [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
  for (
    const label of ["slope 2 (expected)", "slope 1", "solver (colour)", "norm (line and mark)"]
  ) {
    assert.ok(texts.includes(label), `shows "${label}"`);
  }
  // the guides are labelled on the plot, not listed among the solvers
  assert.ok(!texts.some((t) => /expected order/.test(t)));
  // one tick label per grid spacing of the fixture (h = 1/8, 1/16, 1/32, 1/64), three figures
  for (const h of ["0.125", "0.0625", "0.0313", "0.0156"]) assert.ok(texts.includes(h), h);
  // every error-axis label in one form: a power of ten as 1e-5
  const yLabels = texts.filter((t) => /^\d(\.\d+)?e[-+]\d+$/.test(t));
  assert.ok(yLabels.length >= 2, texts.join(" | "));
  assert.ok(!texts.some((t) => /^0\.0000/.test(t)), "no long decimals beside powers");
});

Deno.test("placesPlot() draws each place's error and marks the place the failing verdict blames", () => {
  const result = makeFixtureResult();
  const study = result.studies.find((s) =>
    s.solver === "team-gs" && s.caseId === "robin-variable"
  )!;
  // invented: the band along the north side converges at order 1, everything else at order 2
  study.places = [
    { place: "north", errors: [4e-2, 2e-2, 1e-2, 5e-3], order: 1 },
    { place: "interior", errors: [4e-3, 1e-3, 2.5e-4, 6.25e-5], order: 2 },
  ];
  const order = study.verdicts.find((v) => v.criterion === "order" && v.status === "fail")!;
  order.details = { ...order.details, location: { blamed: ["north"], largest: "north" } };
  const plot = placesPlot(result, "robin-variable", "team-gs")!;
  assert.equal(plot.kind, "places");
  // deno-lint-ignore no-explicit-any
  const rows = (plot.spec as any).data.values as { place: string; marked: string }[];
  assert.equal(rows.length, 8);
  assert.ok(rows.filter((r) => r.place.startsWith("north")).every((r) => r.marked === "yes"));
  assert.ok(rows.filter((r) => r.place.startsWith("interior")).every((r) => r.marked === "no"));
  assert.match(plot.caption, /thick line is where the verdict locates the defect \(north\)/);
  // a passing study gets no such plot
  assert.equal(placesPlot(result, "poisson-sine", "reference"), undefined);
});

Deno.test("errorPlot() says when one solver's lines hide another's", () => {
  const result = makeFixtureResult();
  // make team-gs's errors on poisson-sine equal to the reference's (0.01 % apart)
  const ref = result.solves.filter((s) => s.caseId === "poisson-sine" && s.solver === "reference");
  for (
    const s of result.solves.filter((s) => s.caseId === "poisson-sine" && s.solver === "team-gs")
  ) {
    const twin = ref.find((r) => r.nx === s.nx)!;
    s.status = "ok";
    s.errors = structuredClone(twin.errors!);
    s.errors.all.max *= 1.0001;
  }
  assert.match(
    errorPlot(result, "poisson-sine")!.caption,
    /reference's lines lie under team-gs's \(the same errors to 0\.1 %\)/,
  );
  assert.doesNotMatch(errorPlot(result, "robin-variable")!.caption, /lie under/);
});
