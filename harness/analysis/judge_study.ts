import type {
  NormSet,
  OrderRecord,
  QuantityRecord,
  Region,
  ScalingRecord,
  SolveStatus,
  Verdict,
  VerdictStatus,
} from "../result/types.ts";
import { celikThreeGrid } from "./celik.ts";

/** Error norms by name. */
export type NormName = keyof NormSet;

/**
 * The order a case expects (same shape as `cases/types.ts` ExpectedOrder, restated here because
 * the analysis imports no other part).
 */
export interface OrderExpectation {
  /** Formal order of the scheme. */
  formal: number;
  /** Norms where theory says the observed order is lower, with the order and the reason. */
  observed?: Partial<Record<NormName, { order: number; reason: string }>>;
  /** The scheme reproduces the exact solution to round-off: judge exactness, not order. */
  exact?: boolean;
}

/** What {@link judgeStudy} looks at: one case × solver over its grids, coarsest first. */
export interface StudyInput {
  caseId: string;
  solver: string;
  /** Per grid, coarsest first: its size, status and convergence flag. */
  solves: {
    nx: number;
    ny: number;
    status: SolveStatus;
    reason?: string;
    converged: boolean | null;
    stopReason?: string;
  }[];
  /** Error norms per grid, aligned with `solves` (null where the solve failed). */
  errors: (Record<Region, NormSet> | null | undefined)[];
  orders: OrderRecord[];
  quantities: QuantityRecord[];
  scaling: ScalingRecord;
  /** Spacing per grid, aligned with `solves`; lets the asymptotic-range check compare the
   * quantities' orders over successive grid triples. */
  h?: number[];
}

/** How strictly an optional criterion is judged. */
export type Strictness = "off" | "warn" | "fail";

/** Options of {@link judgeStudy}, with defaults. */
export interface JudgeOptions {
  expected: OrderExpectation;
  /** Allowed |observed − expected| order (default 0.1). */
  tolerance?: number;
  /** Grid-independence of the iteration count (default "warn"). */
  gridIndependence?: Strictness;
  /** GCI asymptotic-range check (default "warn"). */
  asymptoticRange?: Strictness;
  /** Allowed |GCI_23/(r^p·GCI_12) − 1| (default 0.1). */
  asymptoticTolerance?: number;
  /** Allowed change of a quantity's observed order between the finest and the next grid triple (default 0.1). */
  settleTolerance?: number;
  /** max |u_exact| over the domain, the scale of the exactness bound (default 1). */
  solutionScale?: number;
  /** Exactness bound max error ≤ rel·solutionScale + abs (default rel 1e-9, abs 1e-12). */
  exactTolerance?: { rel?: number; abs?: number };
}

const NORMS: NormName[] = ["max", "l2", "l1"];
const NORM_LABEL: Record<NormName, string> = { max: "max norm", l2: "L2 norm", l1: "L1 norm" };

/**
 * Verdicts for one case × solver, each with a reason in plain words a reviewer can act on.
 *
 * Criteria:
 * - "order" (one per norm, all nodes): the finest-pair and the fitted order both within
 *   `tolerance` of the expected order (the case's per-norm override, else the formal order).
 *   Roache attributes acceptance within about 5 % of the formal order (J. Fluids Eng. 133, 2011
 *   discussion, second hand); the default ±0.1 is that for order 2. Exact cases get
 *   "not-applicable" here and are judged by "exactness".
 * - "boundary-order": whether the boundary band (a fixed number of node layers) converges at the
 *   expected order; fails naming the band when the band is low and the interior is not, or when
 *   both are low and the largest errors sit in the band (the boundary pollutes the interior);
 *   warns when both are low but the interior holds the largest errors.
 * - "convergence": every grid solved and converged; failures, stops, stagnation and divergence are
 *   named per grid; a solver that does not say whether it converged gives a warning.
 * - "grid-independence" (optional): iteration count exponent against unknowns ≤ 0.1.
 * - "asymptotic-range" (optional, warns by default): |GCI_23/(r^p·GCI_12) − 1| ≤ 0.1 for every
 *   quantity (Roache 1994: the ratio is 1 in the asymptotic range), and, with four or more grids
 *   and `h` given, the quantity's observed order from the finest three grids and from the next
 *   three differ by at most 0.1. The second test is needed because, with p observed from the same
 *   three grids and a constant ratio, the GCI ratio equals |f1/f2| identically (derived) and only
 *   flags large changes between grids.
 * - "exactness" (exact cases): max error on every grid ≤ 1e-9·max|u| + 1e-12 — a solver stopped
 *   at a relative residual of about 1e-10 leaves algebraic errors well under this, while any
 *   truncation error of a smooth non-polynomial term on practical grids is far above it (our
 *   choice of bound, documented in the verdict details).
 *
 * @param input The study's figures.
 * @param options Expected order and judgement options (see {@link JudgeOptions}).
 * @returns The verdicts, in the order of the criteria above.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { judgeStudy } from "./judge_study.ts";
 * import { orderRecord } from "./order_record.ts";
 * const h = [0.25, 0.125, 0.0625];
 * const e = (p: number) => h.map((x) => x ** p);
 * const orders = (["all", "interior", "boundary"] as const).flatMap((region) =>
 *   (["max", "l2", "l1"] as const).map((norm) =>
 *     orderRecord(region, norm, h, region === "boundary" ? e(1) : e(2))
 *   )
 * );
 * const v = judgeStudy({
 *   caseId: "demo", solver: "mine", errors: [], quantities: [],
 *   solves: h.map(() => ({ nx: 8, ny: 8, status: "ok" as const, converged: true })),
 *   orders, scaling: { iterationsExponent: 0, factorExponent: 0, timeExponent: 1,
 *     gridIndependent: true, problems: [] },
 * }, { expected: { formal: 2 } });
 * assert.ok(v.find((x) => x.criterion === "boundary-order")!.reason.includes("first-order"));
 * ```
 */
export function judgeStudy(input: StudyInput, options: JudgeOptions): Verdict[] {
  const tol = options.tolerance ?? 0.1;
  const out: Verdict[] = [];
  const verdict = (
    criterion: string,
    status: VerdictStatus,
    reason: string,
    details?: Record<string, unknown>,
  ) => out.push({ caseId: input.caseId, solver: input.solver, criterion, status, reason, details });
  const expectedFor = (norm: NormName) =>
    options.expected.observed?.[norm]?.order ?? options.expected.formal;

  if (options.expected.exact) {
    verdict(
      "order",
      "not-applicable",
      "exact case: errors should stay at round-off, so the order is not judged",
    );
    judgeExactness(input, options, verdict);
  } else {
    for (const norm of NORMS) judgeOrder(input, norm, expectedFor(norm), tol, options, verdict);
    judgeBoundary(input, expectedFor, tol, verdict);
  }
  judgeConvergence(input, verdict);
  const gi = options.gridIndependence ?? "warn";
  if (gi !== "off") judgeGridIndependence(input.scaling, gi, verdict);
  const ar = options.asymptoticRange ?? "warn";
  if (ar !== "off") {
    if (options.expected.exact) {
      verdict(
        "asymptotic-range",
        "not-applicable",
        "exact case: quantities converge to round-off, the GCI does not apply",
      );
    } else {
      judgeAsymptotic(input, ar, {
        ratio: options.asymptoticTolerance ?? 0.1,
        settle: options.settleTolerance ?? 0.1,
      }, verdict);
    }
  }
  return out;
}

type Emit = (
  criterion: string,
  status: VerdictStatus,
  reason: string,
  details?: Record<string, unknown>,
) => void;

function find(orders: OrderRecord[], region: Region, norm: NormName): OrderRecord | undefined {
  return orders.find((o) => o.region === region && o.norm === norm);
}

/** The finest pairwise order, or the fitted one when the finest pair has none. */
function finest(o: OrderRecord | undefined): number | null {
  if (!o) return null;
  const last = o.pairwise.length > 0 ? o.pairwise[o.pairwise.length - 1] : null;
  return last ?? o.fitted.order;
}

function f2(x: number | null): string {
  return x === null ? "n/a" : x.toFixed(2);
}

function describeOrder(p: number, expected?: number): string {
  if (p < 0.5) return "looks inconsistent (its error hardly shrinks)";
  const n = Math.round(p);
  if (expected !== undefined && n >= expected) {
    // close to the expected order but outside the tolerance: name the shortfall, not the order
    return `falls short of order ${expected} (${p.toFixed(2)}): it may still be pre-asymptotic — ` +
      `refine further before calling it a defect`;
  }
  const words = ["zeroth", "first", "second", "third", "fourth"];
  if (Math.abs(p - n) <= 0.2 && n < words.length) return `looks ${words[n]}-order`;
  return `looks of order about ${p.toFixed(1)}`;
}

function judgeOrder(
  input: StudyInput,
  norm: NormName,
  expected: number,
  tol: number,
  options: JudgeOptions,
  emit: Emit,
): void {
  const rec = find(input.orders, "all", norm);
  const pair = rec
    ? (rec.pairwise.length > 0 ? rec.pairwise[rec.pairwise.length - 1] : null)
    : null;
  const fit = rec?.fitted.order ?? null;
  const override = options.expected.observed?.[norm];
  const details = {
    norm,
    region: "all",
    expected,
    tolerance: tol,
    finestPair: pair,
    fitted: fit,
    interval: rec ? [rec.fitted.low, rec.fitted.high] : null,
    asymptotic: rec?.asymptotic ?? false,
  };
  const why = override ? ` (the case expects ${expected} here: ${override.reason})` : "";
  if (pair === null) {
    emit(
      "order",
      "fail",
      `no observed order in the ${NORM_LABEL[norm]} on the finest pair of grids: the errors are ` +
        `missing, zero or not finite — check that the finest two solves succeeded`,
      details,
    );
    return;
  }
  const interval = rec && rec.fitted.low !== null
    ? `, 95 % interval ${f2(rec.fitted.low)}–${f2(rec.fitted.high)}`
    : "";
  const observed = `observed order ${f2(pair)} on the finest pair and ${f2(fit)} fitted over ` +
    `${rec?.fitted.points ?? 0} grids${interval} in the ${
      NORM_LABEL[norm]
    }, expected ${expected} ± ${tol}${why}`;
  const ok = Math.abs(pair - expected) <= tol && (fit === null || Math.abs(fit - expected) <= tol);
  if (ok) {
    emit("order", "pass", observed, details);
    return;
  }
  const worst = Math.abs(pair - expected) >= Math.abs((fit ?? pair) - expected) ? pair : fit!;
  let hint: string;
  const band = finest(find(input.orders, "boundary", norm));
  const inner = finest(find(input.orders, "interior", norm));
  if (worst > expected + tol) {
    hint = "higher than expected: the case's expected order may be wrong, or the errors are " +
      "still pre-asymptotic — refine further";
  } else if (band !== null && inner !== null && band < expected - tol && inner >= expected - tol) {
    hint = `the boundary band converges at ${f2(band)} while the interior shows ${f2(inner)}: ` +
      `the boundary treatment ${describeOrder(band, expected)}`;
  } else if (rec && !rec.asymptotic) {
    hint = `the pairwise orders (${rec.pairwise.map(f2).join(", ")}) have not settled: refine ` +
      `further, or look for a singularity or a coarse-grid effect`;
  } else {
    hint =
      `the discretization ${describeOrder(worst, expected)}; compare the interior (${
        f2(inner)
      }) and ` +
      `boundary-band (${f2(band)}) orders to locate the defect`;
  }
  emit("order", "fail", `${observed}: ${hint}`, details);
}

function judgeBoundary(
  input: StudyInput,
  expectedFor: (n: NormName) => number,
  tol: number,
  emit: Emit,
): void {
  const rows = NORMS.map((norm) => ({
    norm,
    expected: expectedFor(norm),
    band: finest(find(input.orders, "boundary", norm)),
    inner: finest(find(input.orders, "interior", norm)),
  }));
  const details = { tolerance: tol, orders: rows };
  const known = rows.filter((r) => r.band !== null);
  if (known.length === 0) {
    emit(
      "boundary-order",
      "not-applicable",
      "no order could be computed in the boundary band (errors missing or zero there)",
      details,
    );
    return;
  }
  const low = known.filter((r) => r.band! < r.expected - tol);
  if (low.length === 0) {
    emit(
      "boundary-order",
      "pass",
      `the boundary band converges at the expected order (${
        known.map((r) => `${NORM_LABEL[r.norm]} ${f2(r.band)}`).join(", ")
      })`,
      details,
    );
    return;
  }
  // the worst norm names the defect
  const w = low.reduce((a, r) => (r.band! - r.expected < a.band! - a.expected ? r : a));
  const head = `observed order ${f2(w.band)} in the boundary band (${NORM_LABEL[w.norm]}), ` +
    `expected ${w.expected} ± ${tol}`;
  if (w.inner === null || w.inner >= w.expected - tol) {
    emit(
      "boundary-order",
      "fail",
      `${head}, while the interior shows ${f2(w.inner)}: the boundary treatment ${
        describeOrder(w.band!, w.expected)
      }`,
      details,
    );
    return;
  }
  // both low: where do the largest errors sit on the finest grid?
  let bandMax: number | null = null;
  let innerMax: number | null = null;
  for (let i = input.errors.length - 1; i >= 0; i--) {
    const e = input.errors[i];
    if (e) {
      bandMax = e.boundary.max;
      innerMax = e.interior.max;
      break;
    }
  }
  if (bandMax !== null && innerMax !== null && bandMax >= innerMax) {
    emit(
      "boundary-order",
      "fail",
      `${head}, and ${f2(w.inner)} in the interior; the largest errors sit in the boundary band ` +
        `(${bandMax.toExponential(2)} against ${innerMax.toExponential(2)} inside): the boundary ` +
        `treatment ${describeOrder(w.band!, w.expected)} and pollutes the interior`,
      { ...details, finestMaxError: { boundary: bandMax, interior: innerMax } },
    );
    return;
  }
  emit(
    "boundary-order",
    "warn",
    `${head}, and ${f2(w.inner)} in the interior, where the largest errors sit: the interior ` +
      `discretization is the more likely cause`,
    { ...details, finestMaxError: { boundary: bandMax, interior: innerMax } },
  );
}

function judgeExactness(input: StudyInput, options: JudgeOptions, emit: Emit): void {
  const rel = options.exactTolerance?.rel ?? 1e-9;
  const abs = options.exactTolerance?.abs ?? 1e-12;
  const scale = options.solutionScale ?? 1;
  const bound = rel * scale + abs;
  const details: Record<string, unknown> = { bound, rel, abs, solutionScale: scale };
  let worst = -1;
  let worstAt = -1;
  for (let i = 0; i < input.errors.length; i++) {
    const e = input.errors[i];
    if (e && !(e.all.max <= worst)) {
      worst = e.all.max;
      worstAt = i;
    }
  }
  if (worstAt < 0) {
    emit("exactness", "fail", "no grid produced errors to check: every solve failed", details);
    return;
  }
  const e = input.errors[worstAt]!;
  const g = input.solves[worstAt];
  details.maxError = worst;
  details.grid = g ? `${g.nx}×${g.ny}` : null;
  if (worst <= bound) {
    emit(
      "exactness",
      "pass",
      `errors stay at round-off: largest max error ${worst.toExponential(2)} ≤ ` +
        `${bound.toExponential(2)} (1e-9·max|u| + 1e-12)`,
      details,
    );
    return;
  }
  const where = e.boundary.max > 10 * e.interior.max
    ? "; the error sits in the boundary band, so look at the boundary treatment"
    : "";
  emit(
    "exactness",
    "fail",
    `max error ${worst.toExponential(2)} on the ${details.grid} grid exceeds the round-off bound ` +
      `${
        bound.toExponential(2)
      }: the scheme should reproduce this solution exactly, so a stencil ` +
      `or boundary term is wrong or the solve stopped too early${where}`,
    details,
  );
}

function judgeConvergence(input: StudyInput, emit: Emit): void {
  const relevant = input.solves.filter((s) => s.status !== "not-applicable");
  if (relevant.length === 0) {
    emit("convergence", "not-applicable", "no solve applies to this case and solver");
    return;
  }
  const bad: string[] = [];
  const silent: string[] = [];
  for (const s of relevant) {
    const where = `${s.nx}×${s.ny}`;
    if (s.status === "failed") bad.push(`${where} failed${s.reason ? ` (${s.reason})` : ""}`);
    else if (s.converged === false) {
      bad.push(`${where} stopped without converging${s.stopReason ? ` (${s.stopReason})` : ""}`);
    } else if (s.converged === null) silent.push(where);
  }
  for (const p of input.scaling.problems) {
    if (p.includes("stagnated") || p.includes("diverged")) bad.push(p);
  }
  const details = { problems: bad, unreported: silent };
  if (bad.length > 0) {
    emit(
      "convergence",
      "fail",
      `not every grid converged: ${bad.join("; ")} — results on these grids cannot be trusted; ` +
        `raise the iteration limit or fix the solver`,
      details,
    );
  } else if (silent.length > 0) {
    emit(
      "convergence",
      "warn",
      `the solver did not say whether it converged on ${silent.join(", ")}`,
      details,
    );
  } else {
    emit("convergence", "pass", `every grid converged (${relevant.length} grids)`, details);
  }
}

function judgeGridIndependence(s: ScalingRecord, strict: Strictness, emit: Emit): void {
  const details = {
    iterationsExponent: s.iterationsExponent,
    factorExponent: s.factorExponent,
    timeExponent: s.timeExponent,
  };
  if (s.iterationsExponent === null || s.gridIndependent === null) {
    emit(
      "grid-independence",
      "not-applicable",
      "fewer than two grids reported iteration counts",
      details,
    );
    return;
  }
  const growth = `iterations grow like N^${s.iterationsExponent.toFixed(2)} with the number of ` +
    `unknowns N`;
  if (s.gridIndependent) {
    emit("grid-independence", "pass", `${growth}: grid-independent convergence`, details);
  } else {
    emit(
      "grid-independence",
      strict === "fail" ? "fail" : "warn",
      `${growth} (limit 0.1): convergence degrades as the grid is refined, as with a ` +
        `single-level iteration; check the coarse-grid correction`,
      details,
    );
  }
}

function judgeAsymptotic(
  input: StudyInput,
  strict: Strictness,
  tol: { ratio: number; settle: number },
  emit: Emit,
): void {
  const quantities = input.quantities;
  const settle = quantities.map((q) => ({ name: q.name, ...settledOrders(q, input.h) }));
  const details = {
    tolerance: tol.ratio,
    settleTolerance: tol.settle,
    ratios: Object.fromEntries(quantities.map((q) => [q.name, q.asymptoticRatio])),
    orders: Object.fromEntries(settle.map((s) => [s.name, [s.previous, s.finest]])),
  };
  const rated = quantities.filter((q) => q.asymptoticRatio !== null);
  if (rated.length === 0) {
    emit(
      "asymptotic-range",
      "not-applicable",
      "no quantity had three grids with an observed order, so the GCI ratio is unknown",
      details,
    );
    return;
  }
  const off = rated.filter((q) => Math.abs(q.asymptoticRatio! - 1) > tol.ratio);
  const moving = settle.filter((s) =>
    s.previous !== null && s.finest !== null && Math.abs(s.finest - s.previous) > tol.settle
  );
  const list = (qs: QuantityRecord[]) =>
    qs.map((q) => `${q.name} ${q.asymptoticRatio!.toFixed(3)}`).join(", ");
  if (off.length === 0 && moving.length === 0) {
    emit(
      "asymptotic-range",
      "pass",
      `GCI_23/(r^p·GCI_12) is within 1 ± ${tol.ratio} for every quantity (${list(rated)})` +
        (settle.some((s) => s.previous !== null)
          ? ` and the observed orders have settled within ${tol.settle}`
          : ""),
      details,
    );
    return;
  }
  const parts: string[] = [];
  if (off.length > 0) {
    parts.push(`GCI_23/(r^p·GCI_12) is outside 1 ± ${tol.ratio} for ${list(off)}`);
  }
  if (moving.length > 0) {
    parts.push(
      `the observed order still moves between the last two grid triples for ${
        moving.map((s) => `${s.name} (${f2(s.previous)} → ${f2(s.finest)})`).join(", ")
      }`,
    );
  }
  emit(
    "asymptotic-range",
    strict === "fail" ? "fail" : "warn",
    `${parts.join("; ")}: these quantities are not yet in the asymptotic range, so their GCI is ` +
      `not reliable — refine further`,
    details,
  );
}

/** Observed orders of a quantity from the finest three grids and from the three before. */
function settledOrders(
  q: QuantityRecord,
  h: number[] | undefined,
): { finest: number | null; previous: number | null } {
  const finest = q.order;
  if (!h || h.length !== q.values.length) return { finest, previous: null };
  const usable = q.values.map((v, i) => (v === null ? -1 : i)).filter((i) => i >= 0);
  if (usable.length < 4) return { finest, previous: null };
  const [c, m, f] = usable.slice(-4, -1);
  const r = celikThreeGrid({
    fine: { h: h[f], value: q.values[f]! },
    medium: { h: h[m], value: q.values[m]! },
    coarse: { h: h[c], value: q.values[c]! },
  });
  return { finest, previous: r.order };
}
