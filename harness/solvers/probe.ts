/**
 * Checks an external solver's adapter with a few tiny requests: each boundary kind, both array
 * encodings, each declared process mode; for a solver that speaks protocol version 2 also a
 * conservative request (K varying at the faces, one interface) and a mixed-term request. Returns
 * the checks as data (the CLI prints them).
 *
 * @module
 */
import type { ArrayEncoding } from "../protocol/mod.ts";
import { createExternalSolver } from "./external.ts";
import { type ProbeBoundarySet, probeCase } from "./probe_cases.ts";
import { type ProbeFormCase, probeFormCase } from "./probe_cases_v2.ts";
import type { CompiledCase } from "../../cases/types.ts";
import type { ExternalSolverSpec, SolveOutcome } from "./types.ts";

/** What a failing version 2 probe points at. */
const VERSION_2_FIELDS: Record<ProbeFormCase, string> = {
  conservative: "conservative.faces, the conormal flux on Neumann sides",
  mixed: "coefficients.m",
  "robin-varying": "Robin alpha and beta as arrays at the side's points",
};

/** One probe request and what came of it. */
export interface ProbeCheck {
  mode: "once" | "session";
  encoding: ArrayEncoding;
  /**
   * The boundary set of the plain probe case, or the version 2 probe ("conservative", "mixed",
   * "robin-varying").
   */
  boundary: ProbeBoundarySet | ProbeFormCase;
  /** false for the encoding the solver file does not declare: a failure there is only noted. */
  required: boolean;
  status: "pass" | "fail" | "not-applicable";
  reason?: string;
  /** Wall time of the solve seen by the harness. */
  seconds: number;
  /** The solver's own time, when reported. */
  solverSeconds: number | null;
  /** Largest |u_h − u| over the points, relative to max |u| (a check of ordering and scaling). */
  relativeError?: number;
}

/** The whole probe of one solver. */
export interface ProbeReport {
  solver: string;
  checks: ProbeCheck[];
  /** Session start-up (hello to ready), when a session was probed. */
  sessionStartupSeconds: number | null;
  /** Mean harness wall time minus solver-reported time, per mode, over passing checks. */
  overheadSeconds: { once: number | null; session: number | null };
  /** true when every required check passed or was not applicable. */
  passed: boolean;
}

/** Largest relative error accepted on the probe grid (8 × 16): far above any consistent scheme's. */
export const PROBE_ERROR_LIMIT = 0.05;

function relativeError(c: CompiledCase, o: SolveOutcome): number {
  let err = 0;
  let scale = 0;
  for (let k = 0; k < o.values.length; k++) {
    const exact = c.exact(o.x[k], o.y[k]);
    err = Math.max(err, Math.abs(o.values[k] - exact));
    scale = Math.max(scale, Math.abs(exact));
  }
  return err / scale;
}

/**
 * Probes a solver.
 *
 * @param spec the solver (its `mode` decides which modes are probed unless `modes` is given)
 * @param options `solverFileDir`; `modes` to probe (default: the declared mode); per-request time
 *   limit `timeLimitSeconds` (default: the smaller of the solver's and 15 s)
 * @returns every check and the overhead figures
 *
 * @example
 * ```ts ignore
 * import { probeSolver } from "./probe.ts";
 * const report = await probeSolver(spec, { solverFileDir: "." });
 * report.passed;
 * ```
 */
export async function probeSolver(
  spec: ExternalSolverSpec,
  options: { solverFileDir: string; modes?: ("once" | "session")[]; timeLimitSeconds?: number },
): Promise<ProbeReport> {
  const modes = options.modes ?? [spec.mode];
  const limit = options.timeLimitSeconds ?? Math.min(spec.timeLimitSeconds, 15);
  const encodings: ArrayEncoding[] = [
    spec.encoding,
    spec.encoding === "numbers" ? "base64" : "numbers",
  ];
  const checks: ProbeCheck[] = [];
  let sessionStartupSeconds: number | null = null;
  for (const mode of modes) {
    for (const encoding of encodings) {
      const solver = createExternalSolver(
        { ...spec, mode, encoding, timeLimitSeconds: limit, skipCases: [] },
        { solverFileDir: options.solverFileDir },
      );
      try {
        const probes: [ProbeBoundarySet | ProbeFormCase, CompiledCase][] = [
          ["dirichlet", probeCase("dirichlet")],
          ["neumann", probeCase("neumann")],
          ["robin", probeCase("robin")],
        ];
        if (spec.protocol === 2) {
          probes.push(["conservative", await probeFormCase("conservative")]);
          probes.push(["mixed", await probeFormCase("mixed")]);
          probes.push(["robin-varying", await probeFormCase("robin-varying")]);
        }
        for (const [boundary, c] of probes) {
          const o = await solver.solve({
            case: c,
            nx: 8,
            ny: 16,
            scheme: spec.scheme,
            tolerance: 1e-10,
          });
          const check: ProbeCheck = {
            mode,
            encoding,
            boundary,
            required: encoding === spec.encoding,
            status: o.status === "ok" ? "pass" : o.status === "failed" ? "fail" : "not-applicable",
            seconds: o.seconds,
            solverSeconds: o.solverSeconds,
          };
          if (o.reason) check.reason = o.reason;
          if (o.status === "ok") {
            check.relativeError = relativeError(c, o);
            if (!(check.relativeError <= PROBE_ERROR_LIMIT)) {
              check.status = "fail";
              check.reason = `the solution is far from the exact one (largest relative error ` +
                `${
                  check.relativeError.toPrecision(3)
                } > ${PROBE_ERROR_LIMIT} on an 8×16 grid): check ` +
                `the point order (x fastest), the layout and the boundary conventions in docs/protocol.md` +
                (boundary in VERSION_2_FIELDS
                  ? `, and the version 2 fields (${VERSION_2_FIELDS[boundary as ProbeFormCase]})`
                  : "");
            }
          }
          const startup = o.description?.startupSeconds;
          if (mode === "session" && typeof startup === "number") sessionStartupSeconds ??= startup;
          checks.push(check);
        }
      } finally {
        await solver.close();
      }
    }
  }
  const overhead = (mode: "once" | "session") => {
    const rows = checks.filter((c) => c.mode === mode && c.status === "pass");
    if (rows.length === 0) return null;
    return rows.reduce((s, c) => s + (c.seconds - (c.solverSeconds ?? 0)), 0) / rows.length;
  };
  return {
    solver: spec.name,
    checks,
    sessionStartupSeconds,
    overheadSeconds: { once: overhead("once"), session: overhead("session") },
    passed: checks.every((c) => !c.required || c.status !== "fail"),
  };
}
