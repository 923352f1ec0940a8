import assert from "node:assert/strict";
import { assertClose } from "../../testing/mod.ts";
import { residualMetrics } from "./residual_metrics.ts";
import { powerLawExponent } from "./power_law_exponent.ts";
import { scalingRecord, type ScalingSolve } from "./scaling_record.ts";

/** Weighted Jacobi on the 1-D Dirichlet Laplacian tridiag(−1, 2, −1)/h², h = 1/n; residual 2-norms. */
function jacobiHistory(
  n: number,
  omega: number,
  options: { iterations?: number; tol?: number; zeroStart?: boolean },
) {
  const u = new Float64Array(n + 1);
  const f = new Float64Array(n + 1);
  const h = 1 / n;
  for (let i = 1; i < n; i++) {
    // a start that is not the exact solution and excites every mode
    u[i] = options.zeroStart ? 0 : Math.sin(3 * i) + 0.5;
    f[i] = 1;
  }
  const r = new Float64Array(n + 1);
  const history: number[] = [];
  const residual = () => {
    let s = 0;
    for (let i = 1; i < n; i++) {
      r[i] = f[i] - (-u[i - 1] + 2 * u[i] - u[i + 1]) / (h * h);
      s += r[i] * r[i];
    }
    return Math.sqrt(s);
  };
  history.push(residual());
  for (let k = 0; k < (options.iterations ?? 1e7); k++) {
    for (let i = 1; i < n; i++) u[i] += (omega * h * h * r[i]) / 2;
    history.push(residual());
    if (options.tol !== undefined && history[k + 1] <= options.tol * history[0]) break;
  }
  return history;
}

Deno.test("residualMetrics() gives the factors of a geometric history exactly", () => {
  // derived: ‖r_k‖ = 0.3^k has average and asymptotic factor 0.3
  const history = Array.from({ length: 11 }, (_, k) => 0.3 ** k);
  const m = residualMetrics(history, { tolerance: 1e-5 });
  assertClose(m.averageFactor!, 0.3, { rel: 1e-12 });
  assertClose(m.asymptoticFactor!, 0.3, { rel: 1e-12 });
  // derived: 0.3^9 = 1.97e-5 > 1e-5 ≥ 0.3^10 = 5.9e-6
  assert.equal(m.iterationsToTolerance, 10);
  assert.equal(m.stagnated, false);
  assert.equal(m.diverged, false);
});

Deno.test("residualMetrics() finds the spectral radius of weighted Jacobi", () => {
  // derived (docs/check-values.md, "Exact facts of central differences"): weighted Jacobi
  // multiplies mode k by 1 − 2ω·sin²(kπh/2); with
  // ω = 2/3 the slowest mode k = 1 dominates the asymptotic factor
  const n = 16;
  const m = residualMetrics(jacobiHistory(n, 2 / 3, { iterations: 600 }));
  const rho = 1 - (4 / 3) * Math.sin(Math.PI / (2 * n)) ** 2;
  assertClose(m.asymptoticFactor!, rho, { rel: 1e-9 });
});

Deno.test("residualMetrics() detects stagnation and divergence", async (t) => {
  await t.step("stagnation: factor 0.99 at the end without reaching the tolerance", () => {
    const h = [1, 0.1, 0.01, 0.0099, 0.0098, 0.0097, 0.0096, 0.0095];
    assert.equal(residualMetrics(h).stagnated, true);
    assert.equal(residualMetrics(h, { tolerance: 0.05 }).stagnated, false);
  });
  await t.step("divergence: growth beyond the limit or a NaN", () => {
    assert.equal(residualMetrics([1, 10, 1e3, 1e6]).diverged, true);
    assert.equal(residualMetrics([1, NaN]).diverged, true);
    assert.equal(residualMetrics([1, 10, 100]).diverged, false);
  });
  await t.step("empty and single-entry histories give null factors", () => {
    assert.equal(residualMetrics([]).averageFactor, null);
    assert.equal(residualMetrics([2]).averageFactor, null);
  });
});

Deno.test("powerLawExponent() recovers exponents of exact power laws", () => {
  // derived
  assertClose(powerLawExponent([10, 40, 160, 640], [3, 6, 12, 24])!, 0.5, { rel: 1e-12 });
  assert.equal(powerLawExponent([10], [1]), null);
  assert.equal(powerLawExponent([10, 20], [0, null]), null);
});

Deno.test("scalingRecord() sees Jacobi's iterations grow like h⁻² with the 1-D unknowns", () => {
  // derived: from u = 0 with f = 1 the smooth mode k = 1 dominates, so iterations to a fixed
  // reduction are about C/(−ln ρ_n) with ρ_n = 1 − (4/3)·sin²(π/2n) (ω = 2/3); the expected
  // exponent is the log–log slope of 1/(−ln ρ_n) against the unknowns n − 1 (close to 2)
  const ns = [16, 32, 64];
  const solves: ScalingSolve[] = ns.map((n) => {
    const history = jacobiHistory(n, 2 / 3, { tol: 1e-6, zeroStart: true });
    return {
      nx: n,
      ny: 1,
      unknowns: n - 1,
      status: "ok",
      residualHistory: history,
      iterations: history.length - 1,
      converged: true,
      averageFactor: residualMetrics(history).averageFactor,
      seconds: 1,
    };
  });
  const expected = powerLawExponent(
    ns.map((n) => n - 1),
    ns.map((n) => -1 / Math.log(1 - (4 / 3) * Math.sin(Math.PI / (2 * n)) ** 2)),
  )!;
  // 1-D grids are small: fit from the smallest one (the default skips grids below 900 unknowns)
  const s = scalingRecord(solves, { minUnknowns: 1 });
  assertClose(s.iterationsExponent!, expected, { abs: 0.03 });
  assert.equal(s.gridIndependent, false);
  assertClose(s.timeExponent!, 0, { abs: 1e-12 });
  assert.deepEqual(s.problems, []);
});

Deno.test("scalingRecord() lists failed, unconverged and stagnating solves", () => {
  const base = {
    ny: 8,
    unknowns: 49,
    residualHistory: [] as number[],
    iterations: 10,
    averageFactor: 0.1,
    seconds: 0.01,
  };
  const s = scalingRecord([
    { ...base, nx: 8, status: "failed", reason: "exit code 3", converged: null },
    { ...base, nx: 16, status: "ok", converged: false, stopReason: "max-iterations" },
    {
      ...base,
      nx: 32,
      status: "ok",
      converged: false,
      residualHistory: [1, 0.5, 0.49, 0.485, 0.48, 0.476, 0.472],
    },
  ]);
  assert.deepEqual(s.problems, [
    "8×8: failed (exit code 3)",
    "16×8: stopped without converging (max-iterations)",
    "32×8: the residual stagnated (factor near 1 for several iterations)",
  ]);
});

Deno.test("scalingRecord() treats a one-iteration spread on the finest grids as grid-independent", () => {
  // Iteration counts are whole numbers: 3, 3, 4 over 16× more unknowns fits N^0.1 (exactly
  // log(4/3)/log(16) ≈ 0.104, derived) but is no trend; 4, 6, 9 is growth (N^0.29).
  const s = (n: number, it: number) => ({
    nx: n,
    ny: n,
    unknowns: (n + 1) ** 2,
    status: "ok" as const,
    residualHistory: [],
    iterations: it,
    converged: true,
    averageFactor: 0.1,
    seconds: 0.01,
  });
  assert.equal(scalingRecord([s(16, 2), s(32, 3), s(64, 3), s(128, 4)]).gridIndependent, true);
  assert.equal(scalingRecord([s(32, 4), s(64, 6), s(128, 9)]).gridIndependent, false);
});
