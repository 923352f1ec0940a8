import { assertClose } from "../testing/mod.ts";
import { coefficients, exactU, secondDerivatives, source } from "./bench_problem.ts";

Deno.test("the benchmark's hand-derived u_xx, u_yy and f agree with central finite differences of u", () => {
  // Common practice (docs/check-values.md, "Independent libraries"): central differences of the
  // exact solution at scattered points, step 1e-4, truncation error ~1e-8 relative, round-off
  // ~1e-8.
  const h = 1e-4;
  let seed = 5;
  const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  for (let k = 0; k < 25; k++) {
    const x = 0.05 + 0.9 * rnd(), y = 0.05 + 0.9 * rnd();
    const u0 = exactU(x, y);
    const uxx = (exactU(x + h, y) - 2 * u0 + exactU(x - h, y)) / (h * h);
    const uyy = (exactU(x, y + h) - 2 * u0 + exactU(x, y - h)) / (h * h);
    const d = secondDerivatives(x, y);
    assertClose(d.uxx, uxx, { abs: 2e-5 });
    assertClose(d.uyy, uyy, { abs: 2e-5 });
    const { a, c, e } = coefficients(x, y);
    assertClose(source(x, y), a * uxx + c * uyy + e * u0, { abs: 5e-5 });
  }
});
