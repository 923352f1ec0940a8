import assert from "node:assert/strict";
import { parse } from "csv-parse/sync";
import { CSV_COLUMNS, renderCsv } from "./csv.ts";
import { makeFixtureResult } from "../../testdata/report/fixture.ts";
import { assertClose } from "../../testing/mod.ts";

type Row = Record<(typeof CSV_COLUMNS)[number], string>;

Deno.test("renderCsv() parses back with csv-parse to one row per case × solver × grid × region × norm", () => {
  const result = makeFixtureResult();
  const rows = parse(renderCsv(result), { columns: true }) as Row[];
  assert.deepEqual(Object.keys(rows[0]), [...CSV_COLUMNS]);
  assert.equal(rows.length, result.solves.length * 3 * 3);
  const keys = new Set(rows.map((r) => [r.case, r.solver, r.nx, r.region, r.norm].join("/")));
  assert.equal(keys.size, rows.length, "every row is a distinct case/solver/grid/region/norm");
  for (const s of result.solves) {
    for (const region of ["all", "interior", "boundary"] as const) {
      for (const norm of ["max", "l2", "l1"] as const) {
        const row = rows.find((r) =>
          r.case === s.caseId && r.solver === s.solver && Number(r.nx) === s.nx &&
          r.region === region && r.norm === norm
        )!;
        assert.equal(row.status, s.status);
        // numbers round-trip exactly (shortest round-trip decimal form)
        assert.equal(row.error === "" ? undefined : Number(row.error), s.errors?.[region][norm]);
        assert.equal(Number(row.h), s.h);
        assert.equal(Number(row.seconds), s.seconds);
      }
    }
  }
});

Deno.test("renderCsv() gives each grid the observed order against the next coarser grid", () => {
  const result = makeFixtureResult();
  const rows = parse(renderCsv(result), { columns: true }) as Row[];
  const series = rows.filter((r) =>
    r.case === "poisson-sine" && r.solver === "reference" && r.region === "interior" &&
    r.norm === "l2"
  );
  assert.equal(series[0].observed_order, "", "the coarsest grid has no order");
  for (let k = 1; k < series.length; k++) {
    // derived: p = ln(E_{k-1}/E_k) / ln(h_{k-1}/h_k), computed here from the CSV's own columns
    const p = Math.log(Number(series[k - 1].error) / Number(series[k].error)) /
      Math.log(Number(series[k - 1].h) / Number(series[k].h));
    assertClose(Number(series[k].observed_order), p, { rel: 1e-12 });
  }
});

Deno.test("renderCsv() keeps a failed solve's rows with an empty error and its reason", () => {
  const result = makeFixtureResult();
  const failed = result.solves.find((s) => s.status === "failed")!;
  failed.reason = 'stopped, said "no", then\na newline';
  const rows = parse(renderCsv(result), { columns: true }) as Row[];
  const mine = rows.filter((r) =>
    r.solver === failed.solver && r.case === failed.caseId &&
    Number(r.nx) === failed.nx
  );
  assert.equal(mine.length, 9);
  for (const r of mine) {
    assert.equal(r.error, "");
    assert.equal(r.observed_order, "");
    assert.equal(r.status, "failed");
    assert.equal(r.reason, failed.reason, "commas, quotes and newlines survive quoting");
    assert.equal(r.converged, "false");
  }
});

Deno.test("renderCsv() guards cells a spreadsheet would read as formulas (issue 12, item 14)", () => {
  const result = makeFixtureResult();
  const failed = result.solves.find((s) => s.status === "failed") ?? result.solves[0];
  failed.status = "failed";
  failed.reason = '=HYPERLINK("http://example.invalid")';
  const rows = parse(renderCsv(result), { columns: true }) as Record<string, string>[];
  const cell = rows.find((r) => r.reason.includes("HYPERLINK"))!.reason;
  // OWASP's guard against CSV injection (common practice): a leading apostrophe
  assert.equal(cell, `'=HYPERLINK("http://example.invalid")`);
  // numbers, even negative ones, stay numbers
  assert.ok(rows.every((r) => r.h === "" || Number.isFinite(Number(r.h))));
});
