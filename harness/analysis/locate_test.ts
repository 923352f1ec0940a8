import assert from "node:assert/strict";
import { locateDefect, type PlaceEvidence } from "./locate.ts";

const KINDS = { west: "dirichlet", east: "neumann", south: "robin", north: "dirichlet" };
const at = (
  entries: [PlaceEvidence["place"], number, number][],
): PlaceEvidence[] => entries.map(([place, error, order]) => ({ place, error, order }));

// Rows built from the rules of docs/verdicts.md ("Where the defect is: places"); the figures are
// invented for the rule, not measured.
Deno.test("locateDefect() blames a place only with a margin", async (t) => {
  await t.step("a band whose order is half an order or more below the interior's", () => {
    const l = locateDefect(
      at([["east", 1e-3, 1.0], ["west", 4e-4, 2.0], ["interior", 8e-4, 1.9]]),
      KINDS,
      2,
      0.1,
    );
    assert.deepEqual(l.blamed, ["east"]);
    assert.match(l.text, /the Neumann side east/);
  });
  await t.step("a band whose error is four times the interior's while its order is low", () => {
    const l = locateDefect(
      at([["south", 4e-3, 1.7], ["interior", 9e-4, 1.8], ["north", 1e-4, 2]]),
      KINDS,
      2,
      0.1,
    );
    assert.deepEqual(l.blamed, ["south"]);
    assert.match(l.text, /the Robin side south/);
  });
  await t.step("a band whose largest error merely equals the interior's is not blamed", () => {
    // a global first-order defect: the maximum reaches the Neumann side, as the interior's does
    const l = locateDefect(
      at([["east", 1e-3, 1.0], ["interior", 1e-3, 1.0], ["west", 3e-4, 1.0]]),
      KINDS,
      2,
      0.1,
    );
    assert.deepEqual(l.blamed, []);
    assert.match(l.text, /the defect is global/);
    assert.match(l.text, /make the Neumann side east, the Robin side south Dirichlet/);
  });
  await t.step("an interior that alone holds the error", () => {
    const l = locateDefect(
      at([["interior", 7e-2, 0.0], ["west", 9e-3, 0.9], ["corners", 1e-3, 1.6]]),
      KINDS,
      2,
      0.1,
    );
    assert.deepEqual(l.blamed, ["interior"]);
    assert.match(l.text, /interior discretization/);
  });
  await t.step("an all-Dirichlet case rules out derivative-side closures", () => {
    const l = locateDefect(
      at([["east", 1e-3, 1.0], ["interior", 1e-3, 1.0]]),
      { west: "dirichlet", east: "dirichlet", south: "dirichlet", north: "dirichlet" },
      2,
      0.1,
    );
    assert.match(l.text, /every side is Dirichlet/);
  });
});
