/**
 * Turns a solver's outcome into the result's {@link SolveRecord}: error norms per region against
 * the exact solution at the solver's own points, the quantities of interest, residual metrics.
 *
 * @module
 */
import type { CompiledCase } from "../../cases/types.ts";
import { caseGrid } from "../../cases/mod.ts";
import {
  betterOrder,
  errorMap,
  errorNorms,
  imposedDataCheck,
  placeNorms,
  placeOfPoints,
  pointRegionNorms,
  residualMetrics,
  type SideData,
  truncationNorms,
  withoutMean,
} from "../analysis/mod.ts";
import type { NormSet, Place, Region, SideName, SolveRecord } from "../result/mod.ts";
import { PLACES } from "../result/mod.ts";
import type { SolveOutcome } from "../solvers/mod.ts";
import { chosenSpecs, discreteQuantity } from "./chosen_quantities.ts";
import { discreteQuantities } from "./quantities.ts";

/**
 * Measures one outcome. The representative spacing is h = sqrt(area / N) (Celik et al. 2008,
 * published), with N the number of cells of a structured grid or of points of a free point set.
 * For a singular case (`CompiledCase.singular`) the volume-weighted mean (weights: the outcome's
 * point weights) is removed from both the computed and the exact field before anything is
 * measured: norms, places, error map and quantities all see mean-free fields, and the record says
 * `meanRemoved`.
 */
export function measureOutcome(
  kase: CompiledCase,
  solver: string,
  outcome: SolveOutcome,
  tolerance: number,
): SolveRecord {
  const { x0, x1, y0, y1 } = kase.domain;
  const area = (x1 - x0) * (y1 - y0);
  // a solve without values (not applicable, failed) on its own points: the grid asked for
  const cells = outcome.layout === "points" && outcome.values.length > 0
    ? outcome.values.length
    : outcome.nx * outcome.ny;
  const unknowns = outcome.layout === "vertex"
    ? (outcome.nx + 1) * (outcome.ny + 1)
    : outcome.layout === "cell"
    ? outcome.nx * outcome.ny
    : outcome.values.length;
  const metrics = residualMetrics(outcome.residualHistory, { tolerance });
  const record: SolveRecord = {
    caseId: kase.id,
    solver,
    nx: outcome.nx,
    ny: outcome.ny,
    h: Math.sqrt(area / cells),
    unknowns,
    status: outcome.status,
    residualHistory: outcome.residualHistory,
    iterations: outcome.iterations ??
      (outcome.residualHistory.length > 0 ? metrics.iterations : null),
    converged: outcome.converged,
    averageFactor: metrics.averageFactor,
    asymptoticFactor: metrics.asymptoticFactor,
    seconds: outcome.seconds,
    solverSeconds: outcome.solverSeconds,
  };
  if (outcome.reason !== undefined) record.reason = outcome.reason;
  if (outcome.stderrTail) record.stderrTail = outcome.stderrTail;
  if (outcome.description) record.description = outcome.description;
  const stop = outcome.description?.stopReason;
  if (typeof stop === "string") record.stopReason = stop;
  else if (metrics.diverged) record.stopReason = "diverged";
  else if (metrics.stagnated) record.stopReason = "stagnated";
  if (outcome.status !== "ok") return record;

  let exact: Float64Array = new Float64Array(outcome.values.length);
  for (let k = 0; k < exact.length; k++) exact[k] = kase.exact(outcome.x[k], outcome.y[k]);
  if (kase.singular) {
    // fixed up to a constant: compare mean-free fields (weights: the points' control volumes)
    exact = withoutMean(exact, outcome.weights);
    outcome = { ...outcome, values: withoutMean(outcome.values, outcome.weights) };
    record.meanRemoved = true;
  }
  let scale = 0;
  for (let k = 0; k < exact.length; k++) scale = Math.max(scale, Math.abs(exact[k]));
  const band = outcome.boundaryBand ?? new Uint8Array(outcome.values.length);
  record.errors = regionNorms(outcome.values, exact, band, outcome.weights);
  const spacing = outcome.layout === "points"
    ? { hx: record.h, hy: record.h }
    : { hx: (x1 - x0) / outcome.nx, hy: (y1 - y0) / outcome.ny };
  record.places = placeNorms(
    outcome.values,
    exact,
    placeOfPoints(outcome.x, outcome.y, kase.domain, spacing),
    outcome.weights,
  );
  if (outcome.layout !== "points") {
    const [mx, my] = outcome.layout === "vertex"
      ? [outcome.nx + 1, outcome.ny + 1]
      : [outcome.nx, outcome.ny];
    const order = betterOrder(outcome.values, exact, mx, my);
    if (order !== null) record.outputOrder = order;
    record.errorMap = errorMap(outcome.values, exact, mx, my);
  }
  if (
    outcome.layout === "vertex" && outcome.truncation &&
    outcome.truncation.length === outcome.values.length
  ) {
    const norms = truncationNorms(outcome.truncation, outcome.weights, outcome.nx, outcome.ny);
    if (norms) record.truncation = norms;
  }
  if (outcome.layout === "vertex") {
    const data = dirichletData(kase, outcome.nx, outcome.ny);
    if (Object.keys(data).length > 0) {
      record.imposed = imposedDataCheck(outcome.values, outcome, data, scale);
    }
  }
  // a stretched family's rules run on its mapped lines (kase.mappings)
  record.quantities = discreteQuantities(outcome, kase.domain, kase.mappings);
  for (const spec of chosenSpecs(kase)) {
    const value = discreteQuantity(outcome, kase, spec);
    if (value !== null) record.quantities[spec.name] = value;
  }
  return record;
}

/** The data of each Dirichlet side at its nodes (increasing coordinate, corners included). */
function dirichletData(kase: CompiledCase, nx: number, ny: number): SideData {
  const { x0, x1, y0, y1 } = kase.domain;
  // the nodes of a stretched family are the mapped ones
  const lines = caseGrid(kase, nx, ny, "vertex").lines;
  const out: SideData = {};
  for (const side of ["west", "east", "south", "north"] as SideName[]) {
    const b = kase.boundary?.[side];
    if (b?.kind !== "dirichlet") continue;
    const vertical = side === "west" || side === "east";
    const m = vertical ? ny : nx;
    const g = new Float64Array(m + 1);
    for (let k = 0; k <= m; k++) {
      g[k] = vertical
        ? b.data(side === "west" ? x0 : x1, lines.y[k])
        : b.data(lines.x[k], side === "south" ? y0 : y1);
    }
    out[side] = g;
  }
  return out;
}

/**
 * Error norms per region. A region without points has no error to measure: every point lies in
 * the boundary band on a vertex grid with nx or ny below 4, on a cell grid below 4, or for a
 * solver's own points when few (all within 2·sqrt(area/N) of the boundary); none does for own
 * points that all stay far inside. Its norms are recorded as 0 — the schema has no null here, and
 * the analysis computes no order from a zero error — instead of failing the whole campaign, and
 * the other region then holds every point.
 */
function regionNorms(
  values: Float64Array,
  exact: Float64Array,
  band: Uint8Array,
  weights: Float64Array,
): Record<Region, NormSet> {
  let inBand = 0;
  for (let k = 0; k < band.length; k++) if (band[k]) inBand++;
  if (inBand > 0 && inBand < values.length) {
    return pointRegionNorms(values, exact, { band, weights });
  }
  const all = errorNorms(values, exact, { weights });
  const none = { max: 0, l2: 0, l1: 0 };
  return inBand === 0
    ? { all, interior: { ...all }, boundary: none }
    : { all, interior: none, boundary: { ...all } };
}

/**
 * Max-norm difference of two solutions on the same vertex grid, relative to the reference's
 * max |u|, and where it is largest (the node and its place).
 */
export function relativeDifference(
  values: Float64Array,
  reference: Float64Array,
  grid: { domain: { x0: number; x1: number; y0: number; y1: number }; nx: number; ny: number },
): { difference: number; at: { x: number; y: number; place: Place } } | null {
  if (values.length !== reference.length || values.length === 0) return null;
  let diff = -1, scale = 0, worst = 0;
  for (let k = 0; k < values.length; k++) {
    const d = Math.abs(values[k] - reference[k]);
    if (!(d <= diff)) {
      diff = d;
      worst = k;
    }
    scale = Math.max(scale, Math.abs(reference[k]));
  }
  const { domain, nx, ny } = grid;
  const hx = (domain.x1 - domain.x0) / nx, hy = (domain.y1 - domain.y0) / ny;
  const x = domain.x0 + (worst % (nx + 1)) * hx;
  const y = domain.y0 + Math.floor(worst / (nx + 1)) * hy;
  const place = PLACES[placeOfPoints([x], [y], domain, { hx, hy })[0]];
  return { difference: scale > 0 ? diff / scale : diff, at: { x, y, place } };
}
