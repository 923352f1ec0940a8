/**
 * Builds small in-memory case files for tests.
 *
 * @module
 */
import type { CaseFile } from "./case_file.ts";

/** A valid case file with the given fields replaced (Dirichlet sides, unit square by default). */
export function testCase(fields: Partial<CaseFile> = {}): CaseFile {
  return {
    id: "test-case",
    title: "test",
    motivation: "test",
    manufactured: "test",
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    coefficients: { a: "1", b: "0", c: "1", d: "0", e: "0" },
    exact: "sin(pi*x)*sin(pi*y)",
    boundary: {
      west: { kind: "dirichlet" },
      east: { kind: "dirichlet" },
      south: { kind: "dirichlet" },
      north: { kind: "dirichlet" },
    },
    expected: { central: { formal: 2 } },
    tags: [],
    grids: [8, 16],
    ...fields,
  };
}
