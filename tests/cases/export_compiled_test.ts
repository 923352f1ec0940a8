/**
 * `cases export` output, compiled and run: for every built-in case and every language, the exported
 * functions evaluated at a few hundred points must agree with the harness's own compiled point
 * functions to 1e-12 relative. The harness's functions are the source of truth here; they are in
 * turn checked against mathjs's own evaluator in `cases/compile_test.ts`. Points lie inside the
 * domain, away from interfaces by more than 1e-6, plus points exactly on each interface and within
 * its 1e-9 tolerance, where both must give the mean of the one-sided values.
 */
import assert from "node:assert/strict";
import { type CompiledCase, loadLibrary } from "../../cases/mod.ts";
import {
  caseIdentifier,
  caseQuantities,
  EXPORT_LANGUAGES,
  exportCase,
} from "../../cases/export/mod.ts";
import { mulberry32 } from "../../testing/mod.ts";
import { evaluateExported, toolchainFor } from "./_compile_export.ts";

/** Relative agreement asked of every value. */
const REL = 1e-12;
/** Absolute floor, relative to the largest magnitude of the quantity over the points. */
const FLOOR = 1e-14;
const RANDOM_POINTS = 300;

/** Random interior points away from interfaces, then points on and next to each interface. */
function pointsFor(c: CompiledCase, seed: number): [number, number][] {
  const random = mulberry32(seed);
  const { x0, x1, y0, y1 } = c.domain;
  const wx = x1 - x0, wy = y1 - y0;
  const near = (lines: readonly number[], t: number, w: number) =>
    lines.some((line) => Math.abs(t - line) <= 1e-6 * w);
  const points: [number, number][] = [];
  while (points.length < RANDOM_POINTS) {
    // inside: the weak-singularity case's derivatives are unbounded at x = x0
    const x = x0 + (0.001 + 0.998 * random()) * wx;
    const y = y0 + (0.001 + 0.998 * random()) * wy;
    if (!near(c.interfaces.x, x, wx) && !near(c.interfaces.y, y, wy)) points.push([x, y]);
  }
  const shifts = [0, 0.5e-9, -0.5e-9];
  for (const line of c.interfaces.x) {
    for (const s of shifts) {
      for (let k = 0; k < 5; k++) points.push([line + s * wx, y0 + (0.05 + 0.9 * random()) * wy]);
    }
    for (const yl of c.interfaces.y) points.push([line, yl]);
  }
  for (const line of c.interfaces.y) {
    for (const s of shifts) {
      for (let k = 0; k < 5; k++) points.push([x0 + (0.05 + 0.9 * random()) * wx, line + s * wy]);
    }
  }
  return points;
}

const library = await loadLibrary();

for (const language of Object.keys(EXPORT_LANGUAGES)) {
  const toolchain = await toolchainFor(language);
  const missing = "missing" in toolchain ? toolchain.missing : undefined;
  Deno.test({
    name: `every built-in case exported as ${language} agrees with the harness's compiled ` +
      `functions to ${REL} relative${missing ? ` (skipped: ${missing})` : ""}`,
    ignore: missing !== undefined,
    fn: async (t) => {
      assert.ok(library.length >= 20, `expected the 20 built-in cases, found ${library.length}`);
      // every case's program runs at once (they are independent); the steps then compare
      const runs = library.map((c, n) => {
        const quantities = caseQuantities(c);
        const points = pointsFor(c, 9001 + n);
        const values = evaluateExported({
          language,
          toolchain: "command" in toolchain ? toolchain.command : "",
          text: exportCase(c, language, { version: "test" }),
          ident: caseIdentifier(c.id),
          names: quantities.map((q) => q.name),
          points,
        });
        // a failure is reported by its case's step
        values.catch(() => {});
        return { quantities, points, values };
      });
      let worst = 0;
      for (const [n, c] of library.entries()) {
        await t.step(c.id, async () => {
          const { quantities, points } = runs[n];
          const values = await runs[n].values;
          quantities.forEach((q, j) => {
            const want = points.map(([x, y]) => q.harness(x, y));
            const scale = Math.max(0, ...want.filter(Number.isFinite).map(Math.abs));
            want.forEach((w, k) => {
              const got = values[k * quantities.length + j];
              const where = `${c.id} ${q.name} at (${points[k][0]}, ${points[k][1]})`;
              if (!Number.isFinite(w)) {
                assert.ok(Object.is(got, w) || (Number.isNaN(got) && Number.isNaN(w)), where);
                return;
              }
              const difference = Math.abs(got - w);
              if (w !== 0) worst = Math.max(worst, difference / Math.abs(w));
              assert.ok(
                difference <= REL * Math.abs(w) + FLOOR * scale,
                `${where}: ${language} gives ${got}, the harness ${w}`,
              );
            });
          });
        });
      }
      assert.ok(worst <= REL, `largest relative difference ${worst}`);
    },
  });
}
