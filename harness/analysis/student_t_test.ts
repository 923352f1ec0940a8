import assert from "node:assert/strict";
import { assertClose, findScipyPython } from "../../testing/mod.ts";
import { studentTCdf, studentTQuantile } from "./student_t.ts";

Deno.test("studentTQuantile() matches printed t-table values at p = 0.975", () => {
  // published: two-sided 95 % critical values of Student's t, as printed in standard tables
  // (e.g. NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2), three decimals
  const table: [number, number][] = [
    [1, 12.706],
    [2, 4.303],
    [3, 3.182],
    [4, 2.776],
    [5, 2.571],
    [10, 2.228],
    [20, 2.086],
    [30, 2.042],
  ];
  for (const [dof, t] of table) {
    assertClose(studentTQuantile(0.975, dof), t, { abs: 5e-4 }, `dof ${dof}`);
  }
  // published: the normal limit z_{0.975} = 1.959964 (same tables, ν = ∞)
  assertClose(studentTQuantile(0.975, 1e7), 1.959964, { abs: 1e-6 });
});

Deno.test("studentTQuantile() agrees with the closed forms for one and two degrees of freedom", () => {
  // derived: ν = 1 is the Cauchy distribution, t_p = tan(π(p − ½));
  // ν = 2 has t_p = (2p − 1)/sqrt(2p(1 − p))
  for (const p of [0.6, 0.9, 0.975, 0.995, 0.9999, 0.01]) {
    assertClose(studentTQuantile(p, 1), Math.tan(Math.PI * (p - 0.5)), { rel: 1e-12 });
    assertClose(studentTQuantile(p, 2), (2 * p - 1) / Math.sqrt(2 * p * (1 - p)), { rel: 1e-12 });
  }
});

Deno.test("studentTCdf() inverts studentTQuantile() and is symmetric", () => {
  // derived: F(F⁻¹(p)) = p and F(−t) = 1 − F(t)
  for (const dof of [1, 2.5, 7, 40]) {
    for (const p of [0.55, 0.8, 0.975, 0.999]) {
      assertClose(studentTCdf(studentTQuantile(p, dof), dof), p, { rel: 1e-12 });
    }
    assertClose(studentTCdf(-1.3, dof), 1 - studentTCdf(1.3, dof), { rel: 1e-12 });
  }
});

Deno.test("studentTCdf() and studentTQuantile() agree with SciPy", async (t) => {
  const python = await findScipyPython();
  if (python === undefined) {
    console.log("skipped: Debian python3 with SciPy not found");
    return;
  }
  // independent library: scipy.stats.t.cdf and t.ppf. SciPy's ppf is itself only good to about
  // 1e-9 relative (its own t.sf at its ppf(0.975, 6) gives 0.02500000008), so the quantile is
  // compared at 1e-8 and the CDF, which both compute from the incomplete beta function, at 1e-12.
  const cases: [number, number][] = [[0.975, 1], [0.975, 6], [0.95, 3.5], [0.999, 12], [0.7, 100]];
  const points: [number, number][] = [[0.3, 1], [2.447, 6], [-1.7, 3.5], [4.2, 12], [0.01, 100]];
  const script =
    `from scipy.stats import t\nimport json\nprint(json.dumps([[t.ppf(p, d) for p, d in ${
      JSON.stringify(cases)
    }], [t.cdf(x, d) for x, d in ${JSON.stringify(points)}]]))`;
  const out = await new Deno.Command(python, { args: ["-c", script], stdout: "piped" }).output();
  const [ppf, cdf] = JSON.parse(new TextDecoder().decode(out.stdout)) as number[][];
  for (let i = 0; i < cases.length; i++) {
    await t.step(`quantile at p = ${cases[i][0]}, ν = ${cases[i][1]}`, () => {
      assertClose(studentTQuantile(cases[i][0], cases[i][1]), ppf[i], { rel: 1e-8 });
    });
    await t.step(`CDF at t = ${points[i][0]}, ν = ${points[i][1]}`, () => {
      assertClose(studentTCdf(points[i][0], points[i][1]), cdf[i], { rel: 1e-12 });
    });
  }
});

Deno.test("studentTQuantile() rejects a probability outside (0, 1) and a bad dof", () => {
  assert.throws(() => studentTQuantile(1, 3), RangeError);
  assert.throws(() => studentTQuantile(0.9, 0), /degrees of freedom must be a positive number/);
});
