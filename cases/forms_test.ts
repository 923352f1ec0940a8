/**
 * The operator forms and material interfaces as the engine builds them from case files: what it
 * refuses (with the field and the reason) and what it samples on interfaces.
 */
import assert from "node:assert/strict";
import { assertClose } from "../testing/mod.ts";
import { InputError } from "../errors/mod.ts";
import { validateCaseText } from "./validate.ts";
import { buildCase } from "./engine.ts";
import { testCase } from "./_test_case.ts";
import type { CaseFile } from "./case_file.ts";

/** A two-layer conservative case: k = 1 for x < ½, `k2` for x > ½, u given per region. */
function layered(k2: number, exact: [string, string]): CaseFile {
  const file = testCase({
    form: "conservative",
    interfaces: { x: [0.5] },
    regions: [{ conductivity: "1", exact: exact[0] }, {
      conductivity: String(k2),
      exact: exact[1],
    }],
  });
  delete file.coefficients;
  delete file.exact;
  return file;
}

function problemsOf(error: unknown): string[] {
  assert.ok(error instanceof InputError, String(error));
  return error.problems;
}

Deno.test("a flux-continuous layered solution builds; the same u in both layers is refused", async () => {
  // Derived: u = sin(2πx)·sin(πy)/k keeps u (sin(2π·½) = 0) and k·u_x = 2π·cos(2πx)·sin(πy)
  // continuous across x = ½; u = sin(πx)·sin(πy) + x in both layers keeps u, but its flux
  // k·u_x = k·(π·cos(πx)·sin(πy) + 1) = k at x = ½ jumps from 1 to 100.
  const good = await buildCase(
    layered(100, ["sin(2*pi*x)*sin(pi*y)", "sin(2*pi*x)*sin(pi*y)/100"]),
    { origin: "test" },
  );
  assert.equal(good.form, "conservative");
  assert.deepEqual(good.interfaces, { x: [0.5], y: [] });
  await assert.rejects(
    () =>
      buildCase(layered(100, ["sin(pi*x)*sin(pi*y) + x", "sin(pi*x)*sin(pi*y) + x"]), {
        origin: "test",
      }),
    (e) => {
      const [p] = problemsOf(e);
      assert.match(p, /regions\[1\]\.exact: across the interface x = 0\.5, the normal flux/);
      return true;
    },
  );
  await assert.rejects(
    () => buildCase(layered(100, ["x", "x + 1"]), { origin: "test" }),
    (e) => problemsOf(e).some((p) => /the exact solution u jumps between regions 1 and 2/.test(p)),
  );
});

Deno.test("K on an interface: harmonic across it, arithmetic along it; the source is the mean", async () => {
  // Two conductors in series over equal lengths: 2·k1·k2/(k1 + k2); side by side: (k1 + k2)/2.
  const c = await buildCase(
    layered(100, ["sin(2*pi*x)*sin(pi*y)", "sin(2*pi*x)*sin(pi*y)/100"]),
    { origin: "test" },
  );
  const k = c.conservative!;
  assertClose(k.faceX.k11(0.5, 0.3), 200 / 101, { rel: 1e-14 });
  assertClose(k.faceY.k22(0.5, 0.3), 50.5, { rel: 1e-14 });
  assert.equal(k.faceX.k11(0.25, 0.3), 1);
  // f = k·Δu: on the left −5π²·sin(2πx)·sin(πy), on the right the same (k cancels): derived
  const f = (x: number, y: number) =>
    -5 * Math.PI ** 2 * Math.sin(2 * Math.PI * x) * Math.sin(Math.PI * y);
  assertClose(c.source(0.3, 0.7), f(0.3, 0.7), { rel: 1e-12 });
  assertClose(c.source(0.8, 0.7), f(0.8, 0.7), { rel: 1e-12 });
  // the sampled problem carries K at the edge midpoints: on a 4×4 grid the y-edges on x = ½
  // (i = 2) run along the interface and hold the arithmetic mean
  const p = c.sample(4, 4);
  assert.equal(p.conductivity!.alongY.k22[0 * 5 + 2], 50.5);
  assert.equal(p.conductivity!.alongX.k11[0 * 4 + 1], 1);
  assert.equal(p.conductivity!.alongX.k11[0 * 4 + 2], 100);
});

Deno.test("grids that put an interface between grid lines are named", async () => {
  const c = await buildCase(
    layered(100, ["sin(2*pi*x)*sin(pi*y)", "sin(2*pi*x)*sin(pi*y)/100"]),
    { origin: "test" },
  );
  assert.equal(c.gridMisses(16, 16), null);
  assert.match(c.gridMisses(15, 16)!, /x = 0\.5 falls between grid lines of the 15×16 grid/);
});

Deno.test("a conductivity tensor that is not positive definite is refused with the place", async () => {
  // k11·k22 − k12² = 1 − (0.5 + x)² < 0 for x > ½
  const file = testCase({
    form: "conservative",
    conductivity: { k11: "1", k12: "0.5 + x", k22: "1" },
  });
  delete file.coefficients;
  await assert.rejects(() => buildCase(file, { origin: "test" }), (e) => {
    const [p] = problemsOf(e);
    assert.match(p, /conductivity: k11·k22 − k12² = -?[0-9.e-]+ at \(x, y\) = \(/);
    assert.match(p, /make K positive definite/);
    return true;
  });
});

Deno.test("the mixed term must keep 4ac − m² > 0", async () => {
  const file = testCase({ coefficients: { a: "1", b: "0", c: "1", d: "0", e: "0", m: "2.5*x" } });
  await assert.rejects(() => buildCase(file, { origin: "test" }), (e) => {
    const [p] = problemsOf(e);
    assert.match(p, /coefficients\.m: 4ac − m² = .* make \|m\| smaller than 2·√\(a·c\)/);
    return true;
  });
});

Deno.test("form rules: each form's fields, interface positions and the region count", () => {
  const text = (fields: Record<string, unknown>, drop: string[] = []) => {
    const file: Record<string, unknown> = { ...testCase(), ...fields };
    for (const k of drop) delete file[k];
    return JSON.stringify(file, null, 1);
  };
  const messages = (t: string) => validateCaseText(t, "my.json").problems.map((p) => p.message);
  assert.match(
    messages(text({ conductivity: "1" }))[0],
    /conductivity belongs to the conservative form/,
  );
  assert.match(
    messages(text({ form: "conservative", conductivity: "1" }))[0],
    /the conservative form takes conductivity \(K\), advection \(β\) and reaction \(σ\) instead/,
  );
  assert.match(
    messages(text({ form: "conservative", conductivity: "1", interfaces: { x: [0.5] } }, [
      "coefficients",
    ]))[0],
    /the interfaces make 2 regions, so "regions" must list 2 entries/,
  );
  assert.match(
    messages(text({
      form: "conservative",
      conductivity: "1",
      interfaces: { x: [1.5] },
      regions: [{}, {}],
    }, ["coefficients"]))[0],
    /the interface x = 1\.5 is not strictly inside the domain/,
  );
  assert.match(
    messages(text({ form: "conservative" }, ["coefficients"]))[0],
    /missing field "conductivity"/,
  );
  assert.deepEqual(
    messages(text({ form: "conservative", conductivity: { k11: "2", k12: "1", k22: "2" } }, [
      "coefficients",
    ])),
    [],
  );
});
