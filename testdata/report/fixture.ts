/**
 * TEST DATA — a hand-written generator of a small, realistic {@link CampaignResult} for the report,
 * baseline and result-reading tests. Nothing here is measured: errors follow C·h^p with a small
 * smooth perturbation, residual histories are geometric, and times follow a power of the number of
 * unknowns. The observed orders, GCI figures and summary are computed from those invented numbers
 * with the textbook formulas so that the fixture is self-consistent.
 *
 * Two cases, two solvers, four grids. The external solver `team-gs` carries a seeded defect: its
 * Robin boundary treatment is first order, so its order verdict fails on `robin-variable`, and its
 * finest solve on that case fails to converge.
 *
 * Run `./node_modules/.bin/deno run --allow-write testdata/report/fixture.ts` to rewrite
 * `testdata/report/result.json` from this generator.
 *
 * @module
 */
import type {
  CampaignResult,
  CaseInfo,
  NormSet,
  OrderRecord,
  QuantityRecord,
  Region,
  SolveRecord,
  SolverInfo,
  StudyRecord,
  Verdict,
} from "../../harness/result/mod.ts";

/** Options of {@link makeFixtureResult}. */
export interface FixtureOptions {
  /** Put markup into every free-text field (titles, notes, formulas, reasons). Default false. */
  hostile?: boolean;
  /** Multiply the external solver's iteration counts by this. Default 1. */
  iterationScale?: number;
  /** Multiply the external solver's times by this. Default 1. */
  timeScale?: number;
  /** Multiply every time (both solvers) by this, as a slower machine would. Default 1. */
  machineScale?: number;
  /** Order the external solver reaches on `poisson-sine`. Default 2. */
  poissonOrder?: number;
}

/** Markup that must never run when a report shows it. */
export const HOSTILE_TEXT = `<img src=x onerror=alert(1)></svg><script>alert("x")</script>`;

const GRIDS = [9, 17, 33, 65];
const REGIONS: Region[] = ["all", "interior", "boundary"];
const NORMS: (keyof NormSet)[] = ["max", "l2", "l1"];

interface Plan {
  caseId: string;
  solver: string;
  order: number;
  constant: number;
  /** Iterations per grid (null: no count). */
  iterations: (number | null)[];
  factor: number;
  /** Seconds = base · unknowns^exponent. */
  timeBase: number;
  timeExponent: number;
  /** Grid index (0 = coarsest) whose solve fails, or -1. */
  failAt: number;
}

function solveRecord(plan: Plan, k: number, o: Required<FixtureOptions>): SolveRecord {
  const nx = GRIDS[k];
  const h = 1 / (nx - 1);
  const unknowns = nx * nx;
  const external = plan.solver !== "reference";
  const timeScale = o.machineScale * (external ? o.timeScale : 1);
  const seconds = plan.timeBase * Math.pow(unknowns, plan.timeExponent) * timeScale;
  const iterations = plan.iterations[k] === null
    ? null
    : Math.round(plan.iterations[k]! * (external ? o.iterationScale : 1));
  if (k === plan.failAt) {
    const history = Array.from({ length: 40 }, (_, i) => Math.pow(0.999, i) * 3.0);
    return {
      caseId: plan.caseId,
      solver: plan.solver,
      nx,
      ny: nx,
      h,
      unknowns,
      status: "failed",
      reason: "the solver stopped after 20000 iterations without reaching the tolerance" +
        (o.hostile ? " " + HOSTILE_TEXT : ""),
      residualHistory: history,
      iterations: 20000,
      converged: false,
      stopReason: "iteration limit",
      averageFactor: 0.999,
      asymptoticFactor: 0.9995,
      seconds,
      stderrTail: o.hostile ? HOSTILE_TEXT : "warning: iteration limit reached\n",
    };
  }
  const base = plan.constant * Math.pow(h, plan.order) * (1 + 0.8 * h);
  const errors = {} as Record<Region, NormSet>;
  for (const [i, region] of REGIONS.entries()) {
    const scale = region === "boundary" ? 0.4 : 1 - 0.05 * i;
    errors[region] = { max: base * scale, l2: base * scale * 0.5, l1: base * scale * 0.4 };
  }
  // a geometric history that reaches 1e-10 in the given number of iterations, with a wobble
  const count = iterations ?? 0;
  const factor = count > 0 ? Math.pow(1e-10, 1 / count) : plan.factor;
  const history = [1];
  for (let i = 0; i < count; i++) {
    history.push(Number((history[i] * factor * (1 + 0.04 * Math.sin(i + k))).toPrecision(4)));
  }
  return {
    caseId: plan.caseId,
    solver: plan.solver,
    nx,
    ny: nx,
    h,
    unknowns,
    status: "ok",
    errors,
    quantities: { mean: 4 / (Math.PI * Math.PI) + 0.3 * Math.pow(h, plan.order) },
    residualHistory: history,
    iterations,
    converged: true,
    stopReason: "relative residual below 1e-10",
    averageFactor: Number(factor.toPrecision(4)),
    asymptoticFactor: Number((factor * 1.02).toPrecision(4)),
    seconds,
    solverSeconds: seconds * 0.9,
    differenceFromReference: external ? base * 0.1 : null,
    description: {
      name: plan.solver,
      notes: o.hostile ? HOSTILE_TEXT : "test data",
      // what an external solver reports with each reply (invented)
      ...(external
        ? { solver: { name: "team-gs", version: "0.9.1", build: o.hostile ? HOSTILE_TEXT : "4f2a9c1" } }
        : {}),
    },
  };
}

/** Least-squares slope of log y against log x. */
function slope(x: number[], y: number[]): number {
  const lx = x.map(Math.log);
  const ly = y.map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / lx.length;
  const my = ly.reduce((a, b) => a + b, 0) / ly.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < lx.length; i++) {
    num += (lx[i] - mx) * (ly[i] - my);
    den += (lx[i] - mx) ** 2;
  }
  return num / den;
}

function orders(solves: SolveRecord[]): OrderRecord[] {
  const out: OrderRecord[] = [];
  for (const region of REGIONS) {
    for (const norm of NORMS) {
      const pairwise: (number | null)[] = [];
      for (let k = 1; k < solves.length; k++) {
        const a = solves[k - 1].errors?.[region][norm];
        const b = solves[k].errors?.[region][norm];
        pairwise.push(
          a && b ? Math.log(a / b) / Math.log(solves[k - 1].h / solves[k].h) : null,
        );
      }
      const ok = solves.filter((s) => s.errors).slice(-3);
      const order = ok.length >= 2
        ? slope(ok.map((s) => s.h), ok.map((s) => s.errors![region][norm]))
        : null;
      const last = pairwise.filter((p): p is number => p !== null).slice(-2);
      out.push({
        region,
        norm,
        pairwise,
        fitted: {
          order,
          low: order === null ? null : order - 0.04,
          high: order === null ? null : order + 0.04,
          points: ok.length,
        },
        asymptotic: last.length === 2 && Math.abs(last[1] - last[0]) < 0.1,
      });
    }
  }
  return out;
}

function quantity(solves: SolveRecord[]): QuantityRecord {
  const exact = 4 / (Math.PI * Math.PI);
  const values = solves.map((s) => s.quantities?.mean ?? null);
  const ok = values.filter((v): v is number => v !== null);
  if (ok.length < 3) {
    return {
      name: "mean",
      label: "mean of u over the domain",
      exact,
      values,
      order: null,
      extrapolated: null,
      gciFine: null,
      gciCoarse: null,
      safetyFactor: null,
      asymptoticRatio: null,
      celik: null,
      leastSquares: null,
      covered: null,
    };
  }
  const [f3, f2, f1] = ok.slice(-3);
  const r = 2;
  const p = Math.log((f3 - f2) / (f2 - f1)) / Math.log(r);
  const rp = Math.pow(r, p);
  const fs = 1.25;
  // Roache (1994): GCI_fine = Fs·|ε|/(r^p − 1), ε = (f2 − f1)/f1 (published formula)
  const gciFine = fs * Math.abs((f2 - f1) / f1) / (rp - 1);
  const gciCoarse = fs * Math.abs((f3 - f2) / f2) / (rp - 1);
  const extrapolated = f1 + (f1 - f2) / (rp - 1);
  return {
    name: "mean",
    label: "mean of u over the domain",
    exact,
    values,
    order: p,
    extrapolated,
    gciFine,
    gciCoarse,
    safetyFactor: fs,
    asymptoticRatio: gciCoarse / (rp * gciFine),
    celik: {
      order: p,
      extrapolated,
      relativeError: Math.abs((f1 - f2) / f1),
      extrapolatedRelativeError: Math.abs((extrapolated - f1) / extrapolated),
      gciFine,
      convergence: "monotone",
    },
    leastSquares: ok.length >= 4
      ? { fit: "power", order: p, extrapolated, uncertainty: gciFine * f1, safetyFactor: fs }
      : null,
    covered: Math.abs(f1 - exact) <= gciFine * Math.abs(f1),
  };
}

function verdict(
  plan: Plan,
  criterion: string,
  status: Verdict["status"],
  reason: string,
  details?: Record<string, unknown>,
): Verdict {
  const v: Verdict = { caseId: plan.caseId, solver: plan.solver, criterion, status, reason };
  if (details) v.details = details;
  return v;
}

function study(plan: Plan, solves: SolveRecord[], o: Required<FixtureOptions>): StudyRecord {
  const ord = orders(solves);
  const q = quantity(solves);
  const tol = 0.1;
  const verdicts: Verdict[] = [];
  // one order verdict per norm on all points, as the campaign gives them (the max norm first)
  for (const norm of NORMS) {
    const record = ord.find((r) => r.region === "all" && r.norm === norm)!;
    const seen = record.fitted.order ?? NaN;
    const ok = Math.abs(seen - 2) <= tol;
    const word = norm === "max" ? "max" : norm.toUpperCase();
    verdicts.push(
      verdict(
        plan,
        "order",
        ok ? "pass" : "fail",
        ok
          ? `observed order ${seen.toFixed(2)} of the ${word}-norm error is within ${tol} of 2`
          : `observed order ${seen.toFixed(2)} of the ${word}-norm error is below the expected 2 ` +
            `by more than ${tol}: check the boundary treatment` +
            (o.hostile ? " " + HOSTILE_TEXT : ""),
        { norm, region: "all", expected: 2, observed: seen, tolerance: tol },
      ),
    );
  }
  const failed = solves.filter((s) => s.status === "failed");
  verdicts.push(
    failed.length === 0
      ? verdict(plan, "convergence", "pass", "every solve reached its tolerance")
      : verdict(
        plan,
        "convergence",
        "fail",
        `${failed.length} solve did not converge: ` +
          failed.map((s) => `${s.nx}×${s.ny}: ${s.reason}`).join("; "),
      ),
  );
  const external = plan.solver !== "reference";
  verdicts.push(
    external
      ? verdict(
        plan,
        "grid-independence",
        "warn",
        "iterations grow with the number of unknowns (exponent 0.98): expected for Gauss–Seidel, " +
          "not a defect",
      )
      : verdict(
        plan,
        "grid-independence",
        "pass",
        "iterations do not grow with the grid (exponent 0.02)",
      ),
  );
  verdicts.push(
    q.order === null
      ? verdict(plan, "asymptotic-range", "not-applicable", "fewer than three grids converged")
      : verdict(plan, "asymptotic-range", "pass", "GCI ratio is within 5 % of 1"),
  );
  const unknowns = solves.map((s) => s.unknowns);
  return {
    caseId: plan.caseId,
    solver: plan.solver,
    grids: [...GRIDS],
    h: GRIDS.map((n) => 1 / (n - 1)),
    expectedOrder: 2,
    orderTolerance: tol,
    orders: ord,
    quantities: [q],
    coverage: q.covered === null ? null : q.covered ? 1 : 0,
    scaling: {
      iterationsExponent: external ? 0.98 : 0.02,
      factorExponent: external ? 0.01 : 0,
      timeExponent: slope(unknowns, solves.map((s) => s.seconds)),
      gridIndependent: !external,
      problems: failed.map((s) => `${s.nx}×${s.ny}: ${s.reason}`),
    },
    verdicts,
  };
}

function caseInfo(id: string, title: string, hostile: boolean): CaseInfo {
  const robin = id === "robin-variable";
  return {
    id,
    title: hostile ? `${title} ${HOSTILE_TEXT}` : title,
    motivation: hostile
      ? HOSTILE_TEXT
      : robin
      ? "variable conductivity with a convective (Robin) side, as in a fin"
      : "the model problem every solver must pass",
    origin: "test data",
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    parameters: { k: robin ? 1.5 : 1 },
    tags: robin ? ["variable-coefficients", "robin"] : ["poisson"],
    expected: { order: 2 },
    formulas: {
      a: robin ? "1 + 0.5*x*y" : "1",
      b: "0",
      c: robin ? "1 + 0.5*x*y" : "1",
      d: "0",
      e: "0",
      exact: hostile ? HOSTILE_TEXT : "sin(pi*x)*sin(pi*y)",
      source: "-2*pi^2*sin(pi*x)*sin(pi*y)",
      boundary: robin
        ? { west: "0", east: "u_x + 2*u = g", south: "0", north: "0" }
        : { west: "0", east: "0", south: "0", north: "0" },
    },
    boundaryKinds: robin
      ? { west: "dirichlet", east: "robin", south: "dirichlet", north: "dirichlet" }
      : { west: "dirichlet", east: "dirichlet", south: "dirichlet", north: "dirichlet" },
  };
}

/** Builds the fixture result (deterministic: the same options give the same object). */
export function makeFixtureResult(options: FixtureOptions = {}): CampaignResult {
  const o: Required<FixtureOptions> = {
    hostile: options.hostile ?? false,
    iterationScale: options.iterationScale ?? 1,
    timeScale: options.timeScale ?? 1,
    machineScale: options.machineScale ?? 1,
    poissonOrder: options.poissonOrder ?? 2,
  };
  const mg = [7, 8, 9, 9];
  const gs = [60, 230, 900, 3500];
  const plans: Plan[] = [
    {
      caseId: "poisson-sine",
      solver: "reference",
      order: 2,
      constant: 0.21,
      iterations: mg,
      factor: 0.07,
      timeBase: 2e-5,
      timeExponent: 1.0,
      failAt: -1,
    },
    {
      caseId: "poisson-sine",
      solver: "team-gs",
      order: o.poissonOrder,
      constant: 0.26,
      iterations: gs,
      factor: 0.99,
      timeBase: 1e-6,
      timeExponent: 1.9,
      failAt: -1,
    },
    {
      caseId: "robin-variable",
      solver: "reference",
      order: 2,
      constant: 0.35,
      iterations: mg,
      factor: 0.09,
      timeBase: 2.5e-5,
      timeExponent: 1.0,
      failAt: -1,
    },
    {
      caseId: "robin-variable",
      solver: "team-gs",
      order: 1,
      constant: 0.5,
      iterations: [70, 260, 1000, 20000],
      factor: 0.99,
      timeBase: 1e-6,
      timeExponent: 1.9,
      failAt: 3,
    },
  ];
  const solves: SolveRecord[] = [];
  const studies: StudyRecord[] = [];
  for (const plan of plans) {
    const these = GRIDS.map((_, k) => solveRecord(plan, k, o));
    solves.push(...these);
    studies.push(study(plan, these, o));
  }
  const solvers: SolverInfo[] = [
    {
      name: "reference",
      kind: "reference",
      layout: "vertex",
      scheme: "central",
      description: { smoother: "red-black Gauss–Seidel", cycle: "V(2,1)" },
    },
    {
      name: "team-gs",
      kind: "external",
      command: ["python3", "examples/python/gauss_seidel.py", "--tol", "1e-10"],
      layout: "vertex",
      scheme: "central",
      description: { version: "0.9.1", notes: o.hostile ? HOSTILE_TEXT : "lexicographic sweeps" },
      // invented digests (TEST DATA): what the harness would have read before the campaign
      build: {
        solverFile: { path: "solvers.json", sha256: "1".repeat(64), bytes: 412 },
        files: [
          { path: "/usr/bin/python3", sha256: "2".repeat(64), bytes: 6_890_080 },
          {
            path: o.hostile ? HOSTILE_TEXT : "examples/python/gauss_seidel.py",
            sha256: "3".repeat(64),
            bytes: 5_321,
          },
        ],
      },
    },
  ];
  const all = studies.flatMap((s) => s.verdicts);
  const count = (status: Verdict["status"]) => all.filter((v) => v.status === status).length;
  const fail = count("fail");
  const result = {
    format: "gridproof-result",
    version: 1,
    tool: { name: "gridproof", version: "0.1.0" },
    createdAt: "2025-01-15T10:30:00.000Z",
    environment: { deno: "2.9.6", os: "linux", arch: "x86_64", cpus: 2, hostname: "ci-runner-3" },
    configuration: {
      cases: ["poisson-sine", "robin-variable"],
      grids: [...GRIDS],
      jobs: 2,
      orderTolerance: 0.1,
      requireGridIndependence: false,
    },
    cases: [
      caseInfo("poisson-sine", "Poisson with a sine solution", o.hostile),
      caseInfo("robin-variable", "Variable conductivity with a Robin side", o.hostile),
    ],
    solvers,
    solves,
    studies,
    baselineVerdicts: [],
    summary: {
      pass: count("pass"),
      fail,
      warn: count("warn"),
      notApplicable: count("not-applicable"),
      exitCode: fail > 0 ? 1 : 0,
    },
  } satisfies CampaignResult;
  return result;
}

if (import.meta.main) {
  const path = new URL("./result.json", import.meta.url);
  await Deno.writeTextFile(path, JSON.stringify(makeFixtureResult(), null, 2) + "\n");
}
