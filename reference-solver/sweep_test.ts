import assert from "node:assert/strict";
import { solve } from "./solve.ts";
import { SMOOTHERS } from "./smoothers.ts";
import { RESTRICTIONS } from "./transfer.ts";
import { CYCLES } from "./cycle.ts";
import { ALL_DIRICHLET, manufactured, SMOOTH } from "./_test_problems.ts";
import type { CycleName, RestrictionName, SmootherName } from "./options.ts";

// Reference problem: 32×32 unit square, Dirichlet sides, a = 1 + 0.3·sin(2x + y),
// c = 1 + 0.2·cos(xy), e = −(1 + xy): Poisson-like with variable coefficients. Cycles V(2,1).
const COEF = {
  a: (x: number, y: number) => 1 + 0.3 * Math.sin(2 * x + y),
  b: () => 0,
  c: (x: number, y: number) => 1 + 0.2 * Math.cos(x * y),
  d: () => 0,
  e: (x: number, y: number) => -(1 + x * y),
};

// Bound per smoother = 1.5 × an LFA estimate for ν = ν1 + ν2 = 3 sweeps (docs/check-values.md,
// "Multigrid behaviour", Trottenberg et al. / Briggs et al.): smoothing factor μ cubed (common
// practice: ρ ≈ μ^ν) for Jacobi ω = 4/5 (μ = 0.6, published), lexicographic Gauss–Seidel
// (μ = 0.5, published) and x- or y-line Gauss–Seidel (μ = 1/√5, from memory, re-derived by LFA);
// the two-grid factor 0.053 for red–black with ν = 3 (from memory, re-derived by LFA); 0.048 per
// alternating zebra sweep (from memory). The margin 1.5 covers variable coefficients, V/F-cycles
// vs two-grid, and 32×32.
const BOUND: Record<SmootherName, number> = {
  "jacobi": 1.5 * 0.6 ** 3,
  "gauss-seidel": 1.5 * 0.5 ** 3,
  "red-black": 1.5 * 0.053,
  "line-x": 1.5 * (1 / Math.sqrt(5)) ** 3,
  "line-y": 1.5 * (1 / Math.sqrt(5)) ** 3,
  "alternating-line": 1.5 * 0.048,
};

// Combinations that do not converge usefully, and why. After a red–black sweep the residual is
// zero on black nodes, so full weighting at a (red) coarse node is about half the red residual;
// plain injection passes the whole of it, doubling the coarse correction of smooth error, which is
// then not reduced at all (derived; the usual remedy is "half injection"). The same holds after a
// zebra line pass for injection. Half weighting after alternating zebra lines is observed (not
// derived) to fail for V-cycles and FMG here while W and F converge slowly.
const POOR: Partial<Record<`${SmootherName}/${RestrictionName}/${CycleName}`, string>> = {
  "red-black/injection/V": "injection after red-black",
  "red-black/injection/W": "injection after red-black",
  "red-black/injection/F": "injection after red-black",
  "red-black/injection/fmg": "injection after red-black",
  "alternating-line/injection/V": "injection after zebra lines",
  "alternating-line/injection/W": "injection after zebra lines",
  "alternating-line/injection/F": "injection after zebra lines",
  "alternating-line/injection/fmg": "injection after zebra lines",
  "alternating-line/half-weighting/V": "observed",
  "alternating-line/half-weighting/fmg": "observed",
};
// Slow but convergent (observed): alternating zebra lines with half weighting, W and F cycles.
const SLOW: Partial<Record<string, number>> = {
  "alternating-line/half-weighting/W": 0.5,
  "alternating-line/half-weighting/F": 0.5,
};

Deno.test("every smoother × restriction × cycle contracts on the 32×32 reference problem", async (t) => {
  const p = manufactured(COEF, SMOOTH, { nx: 32, ny: 32 }, ALL_DIRICHLET);
  for (const smoother of Object.keys(SMOOTHERS) as SmootherName[]) {
    for (const restriction of Object.keys(RESTRICTIONS) as RestrictionName[]) {
      for (const type of Object.keys(CYCLES) as CycleName[]) {
        const key = `${smoother}/${restriction}/${type}` as const;
        await t.step(key, () => {
          const r = solve(p, {
            smoother: { name: smoother },
            transfer: { restriction },
            cycle: { type },
            coarse: { maxDirectUnknowns: 25 },
            stop: { tolerance: 1e-8, maxCycles: 40 },
          });
          assert.equal(r.description.levels.length, 4);
          if (POOR[key] !== undefined) {
            assert.ok(
              !(r.averageFactor < 0.5),
              `${key} was expected to be poor: ${r.averageFactor}`,
            );
            return;
          }
          const bound = SLOW[key] ?? BOUND[smoother];
          assert.ok(r.converged, `${key}: ${r.reason}`);
          assert.ok(r.averageFactor <= bound, `${key}: factor ${r.averageFactor} > ${bound}`);
        });
      }
    }
  }
});
