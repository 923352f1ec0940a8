import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { richardsonExtrapolate, roacheGci } from "./richardson.ts";
import { celikThreeGrid } from "./celik.ts";
import { quantityRecord } from "./quantity_record.ts";
import { leastSquaresUncertainty } from "./least_squares_uncertainty.ts";
import { studyWarnings } from "./study_warnings.ts";

// NASA Glenn / NPARC Alliance tutorial "Examining Spatial (Grid) Convergence": h = 1, 2, 4
const NPARC = { h: [4, 2, 1], f: [0.96178, 0.96854, 0.9705] };

Deno.test("quantityRecord() reproduces the NASA NPARC tutorial example", () => {
  const q = quantityRecord(NPARC.h, NPARC.f);
  // published (NPARC tutorial): p = 1.786170, f(h→0) = 0.971300, GCI_12 = 0.103083 % (Fs 1.25);
  // double-precision values agree at 1e-6 relative
  assertClose(q.order!, 1.786170, { rel: 1e-6 });
  assertClose(q.extrapolated!, 0.971300, { rel: 1e-6 });
  assertClose(q.gciFine!, 0.00103083, { rel: 1e-5 });
  assert.equal(q.safetyFactor, 1.25);
  // derived: GCI_23 = 1.25·|(f3 − f2)/f2|/(r^p − 1) = 0.356249 %
  assertClose(q.gciCoarse!, 0.00356249, { rel: 1e-5 });
  // published: our convention GCI_23/(r^p·GCI_12) = 1.0020; the tutorial's listing prints the
  // reciprocal 0.997980 (compare at 1e-4 against the single-precision listing)
  assertClose(q.asymptoticRatio!, 1.0020, { rel: 1e-4 });
  assertClose(1 / q.asymptoticRatio!, 0.997980, { rel: 1e-4 });
  // derived: for exact-p three-grid data the ratio is exactly f1/f2
  assertClose(q.asymptoticRatio!, 0.9705 / 0.96854, { rel: 1e-12 });
  assert.equal(q.celik!.convergence, "monotone");
  assert.equal(q.leastSquares, null);
});

Deno.test("roacheGci() and richardsonExtrapolate() give the NPARC figures directly", () => {
  const p = Math.log((0.96178 - 0.96854) / (0.96854 - 0.9705)) / Math.log(2);
  // published (NPARC): p = 1.786170, f_ext = 0.971300, GCI_12 = 0.103083 %
  assertClose(p, 1.786170, { rel: 1e-6 });
  assertClose(richardsonExtrapolate(0.9705, 0.96854, 2, p), 0.971300, { rel: 1e-6 });
  const g = roacheGci(0.9705, 0.96854, { ratio: 2, order: p });
  assertClose(g.fine, 0.00103083, { rel: 1e-5 });
  // derived: GCI_coarse = r^p·GCI_fine for the same pair
  assertClose(g.coarse, 2 ** p * g.fine, { rel: 1e-14 });
  // published (Roache 1994): Fs = 3 for two grids scales the band by 3/1.25
  assertClose(
    roacheGci(0.9705, 0.96854, { ratio: 2, order: p, safetyFactor: 3 }).fine,
    g.fine * 2.4,
  );
});

Deno.test("celikThreeGrid() reproduces the worked example of Celik et al. (2008)", () => {
  // from memory (consistent when recomputed): first column of the worked example,
  // N = 18000, 8000, 4500 cells, 2-D h = (1/N)^(1/2), φ = 6.063, 5.972, 5.863 →
  // p = 1.53, φext21 = 6.1685, e_a21 = 1.5 %, e_ext21 = 1.7 %, GCI_fine21 = 2.2 %
  const c = celikThreeGrid({
    fine: { h: (1 / 18000) ** 0.5, value: 6.063 },
    medium: { h: (1 / 8000) ** 0.5, value: 5.972 },
    coarse: { h: (1 / 4500) ** 0.5, value: 5.863 },
  });
  assertClose(c.r21, 1.5, { rel: 1e-12 });
  assertClose(c.r32, 4 / 3, { rel: 1e-12 }); // sqrt(8000/4500) = 1.333
  assertClose(c.order!, 1.53, { abs: 0.005 });
  assertClose(c.extrapolated!, 6.1685, { abs: 5e-5 });
  assertClose(c.relativeError!, 0.015, { abs: 5e-4 });
  assertClose(c.extrapolatedRelativeError!, 0.017, { abs: 5e-4 });
  assertClose(c.gciFine!, 0.022, { abs: 5e-4 });
  assert.equal(c.convergence, "monotone");
  assert.ok(c.settled);
});

Deno.test("celikThreeGrid() at the converged p gives φext21 = φext32 for monotone data", () => {
  // derived: with s = +1 the fixed point p satisfies ε32/ε21 = r21^p (r32^p − 1)/(r21^p − 1),
  // which is exactly φext21 = φext32
  for (
    const [hs, f] of [
      [[1, 1.5, 2], [6.063, 5.972, 5.863]],
      [[1, 1.7, 2.2], [1.0, 1.3, 1.5]],
    ] as const
  ) {
    const c = celikThreeGrid({
      fine: { h: hs[0], value: f[0] },
      medium: { h: hs[1], value: f[1] },
      coarse: { h: hs[2], value: f[2] },
    });
    assert.equal(c.sign, 1);
    assertClose(c.extrapolated!, c.extrapolatedCoarse!, { rel: 1e-12 });
  }
});

Deno.test("celikThreeGrid() recovers p and the limit from exact data with non-constant ratios", () => {
  // derived: φ = 2 − 0.3·h^1.7 exactly
  const g = (h: number) => ({ h, value: 2 - 0.3 * h ** 1.7 });
  const c = celikThreeGrid({ fine: g(0.1), medium: g(0.13), coarse: g(0.2) });
  assertClose(c.order!, 1.7, { rel: 1e-10 });
  assertClose(c.extrapolated!, 2, { rel: 1e-12 });
});

Deno.test("celikThreeGrid() classifies oscillatory and divergent data", async (t) => {
  await t.step("oscillatory: differences change sign and shrink", () => {
    const c = celikThreeGrid({
      fine: { h: 1, value: 1.001 },
      medium: { h: 2, value: 0.996 },
      coarse: { h: 4, value: 1.02 },
    });
    assert.equal(c.sign, -1);
    assert.equal(c.convergence, "oscillatory");
  });
  await t.step("divergent: differences grow", () => {
    const c = celikThreeGrid({
      fine: { h: 1, value: 1.3 },
      medium: { h: 2, value: 1.1 },
      coarse: { h: 4, value: 1.0 },
    });
    assert.equal(c.convergence, "divergent");
    assert.equal(c.order, null);
  });
  await t.step("identical values: unknown", () => {
    const c = celikThreeGrid({
      fine: { h: 1, value: 1 },
      medium: { h: 2, value: 1 },
      coarse: { h: 4, value: 1 },
    });
    assert.equal(c.convergence, "unknown");
  });
  await t.step("wrong grid order is a RangeError", () => {
    assert.throws(
      () =>
        celikThreeGrid({
          fine: { h: 2, value: 1 },
          medium: { h: 1, value: 1 },
          coarse: { h: 4, value: 1 },
        }),
      /spacings must grow from fine to coarse/,
    );
  });
});

Deno.test("quantityRecord() on exact φ = φ0 + C·h^p (+ an h^(p+1) term) recovers p and φ0", () => {
  const h = [0.2, 0.1, 0.05, 0.025];
  // derived: a pure power law is extrapolated exactly and its GCI band contains the error
  const pure = quantityRecord(h, h.map((x) => 1.5 + 0.7 * x ** 2), { exact: 1.5 });
  assertClose(pure.order!, 2, { rel: 1e-10 });
  assertClose(pure.extrapolated!, 1.5, { rel: 1e-13 });
  assertClose(pure.asymptoticRatio!, pure.values[3]! / pure.values[2]!, { rel: 1e-10 }); // = f1/f2
  assert.equal(pure.covered, true);
  // derived: the least-squares free-p fit finds the same law
  assertClose(pure.leastSquares!.order!, 2, { rel: 1e-6 });
  assertClose(pure.leastSquares!.extrapolated!, 1.5, { rel: 1e-9 });
  // derived: with an h³ term the observed order tends to 2 and the extrapolation error falls at
  // third order — halving every h divides it by about 2³
  const f = (x: number) => 1.5 + 0.7 * x ** 2 + 2 * x ** 3;
  const errs = [1, 0.5, 0.25].map((s) => {
    const hs = [0.04, 0.02, 0.01, 0.005].map((x) => x * s);
    const q = quantityRecord(hs, hs.map(f), { exact: 1.5 });
    assert.ok(Math.abs(q.order! - 2) < 0.05 * s, `order ${q.order} at scale ${s}`);
    return q.extrapolated! - 1.5;
  });
  assertClose(Math.log2(errs[1] / errs[2]), 3, { abs: 0.1 });
});

Deno.test("quantityRecord() falls back to the formal order with Fs = 3 on two grids", () => {
  const q = quantityRecord([0.2, 0.1], [1.04, 1.01], { formalOrder: 2, exact: 1 });
  assert.equal(q.order, null);
  assert.equal(q.safetyFactor, 3);
  // derived: f_ext = 1.01 + (1.01 − 1.04)/3 = 1; GCI = 3·|0.03/1.01|/3
  assertClose(q.extrapolated!, 1, { rel: 1e-14 });
  assertClose(q.gciFine!, 0.03 / 1.01, { rel: 1e-12 });
  assert.equal(q.covered, true);
  assert.equal(q.celik, null);
});

Deno.test("quantityRecord() reports an uncovered band when the true error exceeds the GCI", () => {
  // pre-asymptotic data whose three finest grids look converged but whose exact value is far off
  const q = quantityRecord([0.4, 0.2, 0.1], [1.1, 1.05, 1.04], { exact: 0.9 });
  assert.equal(q.covered, false);
});

Deno.test("leastSquaresUncertainty() equals GCI_fine·|φ1| on clean power-law data", () => {
  // derived: for exact φ = φ0 + α h^p with constant r, the fit is exact (U_s = 0, miss = 0) and
  // U = 1.25·|φ1 − φ0| = 1.25·|φ1 − φ2|/(r^p − 1) = GCI_fine·|φ1| — "reduces to the GCI"
  // (Eça & Hoekstra 2014, in outline)
  const h = [0.4, 0.2, 0.1, 0.05, 0.025];
  const phi = h.map((x) => 0.8 - 0.25 * x ** 1.6);
  const ls = leastSquaresUncertainty(h, phi);
  assert.equal(ls.chosen.fit, "power");
  assert.equal(ls.safetyFactor, 1.25);
  assertClose(ls.chosen.order!, 1.6, { rel: 1e-6 });
  const g = roacheGci(phi[4], phi[3], { ratio: 2, order: 1.6 });
  assertClose(ls.uncertainty, g.fine * Math.abs(phi[4]), { rel: 1e-6 });
  assertClose(ls.relativeUncertainty!, g.fine, { rel: 1e-6 });
});

Deno.test("leastSquaresUncertainty() turns to fixed-exponent fits with Fs = 3 when p is out of range", async (t) => {
  const h = [0.4, 0.2, 0.1, 0.05];
  await t.step("p = 3 > 2.1 uses the second-order fit", () => {
    const ls = leastSquaresUncertainty(h, h.map((x) => 1 + x ** 3));
    assert.equal(ls.chosen.order, 2);
    assert.equal(ls.safetyFactor, 3);
  });
  await t.step("p = 0.3 < 0.5 uses the best of h, h², h + h²", () => {
    const ls = leastSquaresUncertainty(h, h.map((x) => 1 + x ** 0.3));
    assert.ok(["linear", "quadratic", "linear+quadratic"].includes(ls.chosen.fit));
    assert.equal(ls.safetyFactor, 3);
  });
  await t.step("fewer than four grids is a RangeError", () => {
    assert.throws(() => leastSquaresUncertainty([1, 2, 3], [1, 2, 3]), /needs four or more/);
  });
});

Deno.test("studyWarnings() flags small ratios, oscillation and the asymptotic range", () => {
  const w = studyWarnings([1.2, 1.1, 1], quantityRecord([1.2, 1.1, 1], [1.44, 1.21, 1]));
  assert.ok(w.some((s) => s.includes("below 1.3")), w.join("\n"));
  const osc = quantityRecord([4, 2, 1], [1.02, 0.996, 1.001]);
  assert.ok(studyWarnings([4, 2, 1], osc).some((s) => s.startsWith("oscillatory")));
  const pre = quantityRecord([4, 2, 1], [0.5, 0.9, 0.99]);
  assert.ok(studyWarnings([4, 2, 1], pre).some((s) => s.startsWith("outside the asymptotic")));
  assert.deepEqual(studyWarnings(NPARC.h, quantityRecord(NPARC.h, NPARC.f)), []);
});
