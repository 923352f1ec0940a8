/**
 * Fills in every default of {@link SolveOptions} and refuses unknown keys and bad values.
 *
 * @module
 */
import type {
  CoarseOperatorName,
  CycleName,
  InterpolationName,
  RestrictionName,
  SmootherName,
  SolveOptions,
} from "./options.ts";

/** Registered smoother names, in the order reports list them. */
export const SMOOTHER_NAMES: readonly SmootherName[] = [
  "jacobi",
  "gauss-seidel",
  "red-black",
  "line-x",
  "line-y",
  "alternating-line",
];
/** Registered restriction names. */
export const RESTRICTION_NAMES: readonly RestrictionName[] = [
  "injection",
  "half-weighting",
  "full-weighting",
];
/** Interpolation names. */
export const INTERPOLATION_NAMES: readonly InterpolationName[] = ["bilinear", "operator-dependent"];
/** Registered cycle names. */
export const CYCLE_NAMES: readonly CycleName[] = ["V", "W", "F", "fmg"];

/** {@link SolveOptions} with every default filled in (see `options.ts` for each default). */
export interface ResolvedSolveOptions {
  /** Discretization. */
  scheme: { upwind: boolean };
  /** Cycle type, sweeps and FMG settings. */
  cycle: {
    type: CycleName;
    pre: number;
    post: number;
    fmgCycle: "V" | "W" | "F";
    fmgCyclesPerLevel: number;
  };
  /** Smoother name and Jacobi weight. */
  smoother: { name: SmootherName; omega: number };
  /** Restriction and interpolation ("auto": see `interpolationFor` in hierarchy.ts). */
  transfer: { restriction: RestrictionName; interpolation: InterpolationName | "auto" };
  /** Coarsening and the coarsest-grid solve. */
  coarse: {
    /** "auto": Galerkin for a problem with a conductivity, rediscretization otherwise. */
    operator: CoarseOperatorName | "auto";
    maxDirectUnknowns: number;
    semiCoarsening: boolean;
    maxLevels: number;
  };
  /** Stopping rules. */
  stop: { tolerance: number; maxCycles: number; divergenceFactor: number };
  /** Handling of singular problems. */
  singular: "refuse" | "mean-zero";
  /** Initial guess, if any. */
  initialGuess: Float64Array | undefined;
}

const GROUPS: Record<string, readonly string[]> = {
  scheme: ["upwind"],
  cycle: ["type", "pre", "post", "fmgCycle", "fmgCyclesPerLevel"],
  smoother: ["name", "omega"],
  transfer: ["restriction", "interpolation"],
  coarse: ["operator", "maxDirectUnknowns", "semiCoarsening", "maxLevels"],
  stop: ["tolerance", "maxCycles", "divergenceFactor"],
};
const TOP_KEYS = [...Object.keys(GROUPS), "singular", "initialGuess"];

function refuse(path: string, value: unknown, what: string): never {
  throw new RangeError(`Invalid solver option ${path}: ${what}, got ${JSON.stringify(value)}`);
}

function oneOf<T extends string>(path: string, value: unknown, names: readonly T[]): T {
  if (typeof value !== "string" || !(names as readonly string[]).includes(value)) {
    refuse(path, value, `unknown name; valid names are ${names.join(", ")}`);
  }
  return value as T;
}

function integer(path: string, value: unknown, min: number): number {
  if (typeof value !== "number" || !Number.isInteger(value) || value < min) {
    refuse(path, value, `must be an integer ≥ ${min}`);
  }
  return value;
}

function positive(path: string, value: unknown, below?: number): number {
  if (typeof value !== "number" || !(value > 0) || !Number.isFinite(value)) {
    refuse(path, value, "must be a finite number > 0");
  }
  if (below !== undefined && !(value < below)) refuse(path, value, `must be < ${below}`);
  return value;
}

function bool(path: string, value: unknown): boolean {
  if (typeof value !== "boolean") refuse(path, value, "must be true or false");
  return value;
}

/**
 * Returns the fully defaulted options of a solve.
 *
 * Defaults: central scheme; V(2,1) cycles (FMG uses one V per level); red–black Gauss–Seidel
 * (ω = 0.8 for Jacobi); full weighting; coarse operators "auto" (Galerkin for a problem with a
 * conductivity, rediscretized otherwise) and interpolation "auto" (operator-dependent for those
 * Galerkin hierarchies, bilinear otherwise), direct solve at ≤ 81
 * unknowns, semi-coarsening allowed, at most 50 levels; tolerance 1e-10, 100 cycles, divergence
 * factor 1e3; singular problems refused; no initial guess.
 *
 * @param options Partial options, nested by role.
 * @returns The options with every field present.
 * @throws {RangeError} For an unknown key (naming its dotted path and the valid keys), an unknown
 * component name (listing the valid names), or a bad value.
 *
 * @example
 * ```ts
 * import { resolveOptions } from "./resolve_options.ts";
 * const o = resolveOptions({ cycle: { type: "W" } });
 * if (o.cycle.pre !== 2 || o.smoother.name !== "red-black") throw new Error("defaults");
 * ```
 */
export function resolveOptions(options: SolveOptions = {}): ResolvedSolveOptions {
  if (typeof options !== "object" || options === null) refuse("options", options, "not an object");
  const raw = options as Record<string, unknown>;
  for (const key of Object.keys(raw)) {
    if (!TOP_KEYS.includes(key)) {
      refuse(key, raw[key], `unknown key; valid keys are ${TOP_KEYS.join(", ")}`);
    }
    const members = GROUPS[key];
    if (members === undefined || raw[key] === undefined) continue;
    const group = raw[key];
    if (typeof group !== "object" || group === null) refuse(key, group, "must be an object");
    for (const sub of Object.keys(group)) {
      if (!members.includes(sub)) {
        refuse(
          `${key}.${sub}`,
          (group as Record<string, unknown>)[sub],
          `unknown key; valid keys of ${key} are ${members.join(", ")}`,
        );
      }
    }
  }
  const scheme = options.scheme ?? {};
  const cycle = options.cycle ?? {};
  const smoother = options.smoother ?? {};
  const transfer = options.transfer ?? {};
  const coarse = options.coarse ?? {};
  const stop = options.stop ?? {};
  const operator = coarse.operator === undefined
    ? "auto"
    : oneOf("coarse.operator", coarse.operator, ["rediscretize", "galerkin"]);
  const interpolation = transfer.interpolation === undefined
    ? "auto"
    : oneOf("transfer.interpolation", transfer.interpolation, INTERPOLATION_NAMES);
  const restriction = oneOf(
    "transfer.restriction",
    transfer.restriction ?? "full-weighting",
    RESTRICTION_NAMES,
  );
  if (interpolation === "operator-dependent" && operator === "rediscretize") {
    refuse(
      "transfer.interpolation",
      interpolation,
      'operator-dependent interpolation needs Galerkin coarse operators; set coarse.operator to "galerkin" or use "bilinear"',
    );
  }
  if (interpolation === "operator-dependent" && restriction !== "full-weighting") {
    refuse(
      "transfer.restriction",
      restriction,
      "with operator-dependent interpolation the restriction is its transpose; leave transfer.restriction at full-weighting or use bilinear interpolation",
    );
  }
  const pre = integer("cycle.pre", cycle.pre ?? 2, 0);
  const post = integer("cycle.post", cycle.post ?? 1, 0);
  if (pre + post < 1) refuse("cycle.pre", pre, "pre + post must be at least 1 sweep");
  const singular = options.singular ?? "refuse";
  if (singular !== "refuse" && singular !== "mean-zero") {
    refuse("singular", singular, 'valid values are "refuse", "mean-zero"');
  }
  const guess = options.initialGuess;
  if (guess !== undefined && !(guess instanceof Float64Array)) {
    refuse("initialGuess", typeof guess, "must be a Float64Array");
  }
  return {
    scheme: { upwind: bool("scheme.upwind", scheme.upwind ?? false) },
    cycle: {
      type: oneOf("cycle.type", cycle.type ?? "V", CYCLE_NAMES),
      pre,
      post,
      fmgCycle: oneOf("cycle.fmgCycle", cycle.fmgCycle ?? "V", ["V", "W", "F"]),
      fmgCyclesPerLevel: integer("cycle.fmgCyclesPerLevel", cycle.fmgCyclesPerLevel ?? 1, 1),
    },
    smoother: {
      name: oneOf("smoother.name", smoother.name ?? "red-black", SMOOTHER_NAMES),
      omega: positive("smoother.omega", smoother.omega ?? 0.8, 2),
    },
    transfer: { restriction, interpolation },
    coarse: {
      operator,
      maxDirectUnknowns: integer("coarse.maxDirectUnknowns", coarse.maxDirectUnknowns ?? 81, 1),
      semiCoarsening: bool("coarse.semiCoarsening", coarse.semiCoarsening ?? true),
      maxLevels: integer("coarse.maxLevels", coarse.maxLevels ?? 50, 1),
    },
    stop: {
      tolerance: positive("stop.tolerance", stop.tolerance ?? 1e-10, 1),
      maxCycles: integer("stop.maxCycles", stop.maxCycles ?? 100, 1),
      divergenceFactor: positive("stop.divergenceFactor", stop.divergenceFactor ?? 1e3),
    },
    singular,
    initialGuess: guess,
  };
}
