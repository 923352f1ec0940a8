/**
 * Sampling a compiled case onto a vertex-centred grid: coefficient and source arrays from the
 * fused row sampler, boundary values from the per-side point functions, then the checks every
 * problem must pass before a solve (finite values everywhere, ellipticity a·c > 0 at every node).
 *
 * Small grids are sampled on the calling thread; large ones can split their rows across Deno
 * workers writing into SharedArrayBuffer-backed arrays (the workers receive the generated source
 * text of the sampler, which was produced from the checked expression tree only).
 *
 * @module
 */
import type { BoundaryCondition, Domain, Problem, Side } from "../reference-solver/mod.ts";
import type { RowSampler } from "./compile.ts";
import type { CaseBoundary, PointFn } from "./types.ts";

/** What sampling needs from a compiled case. */
export interface SamplerSpec {
  id: string;
  origin: string;
  domain: Domain;
  /**
   * The fast path: a fused row sampler writing a, b, c, d, e, f (in that order), and its source
   * text (workers compile it). Absent: the point functions are called node by node.
   */
  problemSampler?: { source: string; run: RowSampler };
  /** a, b, c, d, e, f as point functions (the problem's fields; see `CompiledCase.sample`). */
  pointFunctions: Record<(typeof FIELDS)[number], PointFn>;
  /** The coefficient of u_xy; absent when it is 0 everywhere. */
  mixed?: PointFn;
  /** The conservative form: K at the edge midpoints (see `ConservativeTerms`). */
  conductivity?: {
    faceX: { k11: PointFn; k12: PointFn };
    faceY: { k12: PointFn; k22: PointFn };
    /** Whether k12 is not 0 somewhere (a full tensor). */
    tensor: boolean;
  };
  boundary: Record<Side, CaseBoundary>;
}

/** Largest grid accepted: 2^27 nodes (1 GiB per array set of 8 arrays). */
export const MAX_NODES = 2 ** 27;

/** The fields of a problem in sampler output order. */
export const FIELDS = ["a", "b", "c", "d", "e", "f"] as const;

/** Checks nx and ny; throws RangeError naming the bad value. */
export function checkGridSize(nx: number, ny: number): void {
  for (const [name, v] of [["nx", nx], ["ny", ny]] as const) {
    if (!Number.isInteger(v) || v < 2) {
      throw new RangeError(`${name} must be an integer of at least 2, found ${v}`);
    }
  }
  if ((nx + 1) * (ny + 1) > MAX_NODES) {
    throw new RangeError(
      `grid ${nx}×${ny} has more than ${MAX_NODES} nodes; choose a smaller grid`,
    );
  }
}

function spacing(domain: Domain, nx: number, ny: number) {
  return { hx: (domain.x1 - domain.x0) / nx, hy: (domain.y1 - domain.y0) / ny };
}

/** Samples one side's boundary data (ordered by increasing coordinate, corners included). */
export function sampleSide(
  data: PointFn,
  side: Side,
  domain: Domain,
  nx: number,
  ny: number,
): Float64Array {
  const { hx, hy } = spacing(domain, nx, ny);
  const alongY = side === "west" || side === "east";
  const count = alongY ? ny + 1 : nx + 1;
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const x = alongY ? (side === "west" ? domain.x0 : domain.x1) : domain.x0 + k * hx;
    const y = alongY ? domain.y0 + k * hy : (side === "south" ? domain.y0 : domain.y1);
    out[k] = data(x, y);
  }
  return out;
}

function boundaryConditions(
  spec: SamplerSpec,
  nx: number,
  ny: number,
): Record<Side, BoundaryCondition> {
  const out = {} as Record<Side, BoundaryCondition>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const b = spec.boundary[side];
    if (b.kind === "periodic") {
      out[side] = { kind: "periodic" };
      continue;
    }
    const values = sampleSide(b.data, side, spec.domain, nx, ny);
    out[side] = b.kind === "robin"
      ? {
        kind: "robin",
        alpha: sampleSide(b.alpha!, side, spec.domain, nx, ny),
        beta: sampleSide(b.beta!, side, spec.domain, nx, ny),
        values,
      }
      : { kind: b.kind, values };
  }
  return out;
}

function label(spec: SamplerSpec): string {
  return spec.origin === "library" ? `case "${spec.id}"` : `case "${spec.id}" (${spec.origin})`;
}

/**
 * Checks a sampled problem: every value finite, a·c > 0 at every node.
 *
 * @throws {RangeError} naming the case, the node (i, j), its coordinates, the field and values
 */
export function checkSampled(spec: SamplerSpec, problem: Problem): void {
  const { nx, ny, domain } = problem;
  const { hx, hy } = spacing(domain, nx, ny);
  const row = nx + 1;
  const where = (k: number) => {
    const i = k % row;
    const j = (k - i) / row;
    return `node (i=${i}, j=${j}) at (x, y) = (${domain.x0 + i * hx}, ${domain.y0 + j * hy})`;
  };
  const names: Record<string, string> = {
    a: "coefficients.a",
    b: "coefficients.b",
    c: "coefficients.c",
    d: "coefficients.d",
    e: "coefficients.e",
    f: "the derived source term f",
  };
  for (const field of FIELDS) {
    const v = problem[field];
    for (let k = 0; k < v.length; k++) {
      if (!Number.isFinite(v[k])) {
        throw new RangeError(
          `${label(spec)}: ${names[field]} is ${v[k]} at ${where(k)} on the ${nx}×${ny} grid; ` +
            "change the expression so it is finite on the closed domain",
        );
      }
    }
  }
  const { a, c } = problem;
  for (let k = 0; k < a.length; k++) {
    if (!(a[k] * c[k] > 0)) {
      throw new RangeError(
        `${label(spec)}: the operator is not elliptic at ${where(k)}: a = ${a[k]}, c = ${c[k]}, ` +
          `a·c = ${a[k] * c[k]} (must be > 0); fix coefficients.a or coefficients.c`,
      );
    }
  }
  for (const side of ["west", "east", "south", "north"] as const) {
    const bc = problem.boundary[side];
    if (bc.kind === "periodic") continue;
    const values = bc.values;
    for (let k = 0; k < values.length; k++) {
      if (!Number.isFinite(values[k])) {
        const along = side === "west" || side === "east" ? "y" : "x";
        const h = along === "y" ? hy : hx;
        const start = along === "y" ? domain.y0 : domain.x0;
        throw new RangeError(
          `${label(spec)}: boundary data on the ${side} side is ${values[k]} at node ${k} ` +
            `(${along} = ${start + k * h}) on the ${nx}×${ny} grid; the exact solution or its ` +
            "derivative is not finite there",
        );
      }
    }
  }
}

/**
 * Samples a case onto an nx × ny grid on the calling thread and checks it.
 *
 * @throws {RangeError} for a bad grid size, non-finite values or a non-elliptic operator
 */
export function sampleProblem(spec: SamplerSpec, nx: number, ny: number): Problem {
  checkGridSize(nx, ny);
  const size = (nx + 1) * (ny + 1);
  const arrays = FIELDS.map(() => new Float64Array(size));
  const { hx, hy } = spacing(spec.domain, nx, ny);
  if (spec.problemSampler) {
    spec.problemSampler.run(spec.domain.x0, hx, nx, spec.domain.y0, hy, 0, ny + 1, arrays);
  } else {
    FIELDS.forEach((field, k) => {
      fillNodes(
        arrays[k],
        spec.pointFunctions[field],
        spec.domain.x0,
        hx,
        nx,
        spec.domain.y0,
        hy,
        ny,
      );
    });
  }
  return finish(spec, nx, ny, arrays);
}

/** Values of `fn` at x0 + i·hx, y0 + j·hy for 0 ≤ i ≤ nx, 0 ≤ j ≤ ny, x fastest. */
function fillNodes(
  out: Float64Array,
  fn: PointFn,
  x0: number,
  hx: number,
  nx: number,
  y0: number,
  hy: number,
  ny: number,
): Float64Array {
  for (let j = 0, k = 0; j <= ny; j++) {
    const y = y0 + j * hy;
    for (let i = 0; i <= nx; i++, k++) out[k] = fn(x0 + i * hx, y);
  }
  return out;
}

/** K at the edge midpoints of an nx × ny grid (the reference solver's `Conductivity`). */
function sampleConductivity(
  spec: NonNullable<SamplerSpec["conductivity"]>,
  domain: Domain,
  nx: number,
  ny: number,
): NonNullable<Problem["conductivity"]> {
  const { hx, hy } = spacing(domain, nx, ny);
  const along = (fn: PointFn, x0: number, mx: number, y0: number, my: number) =>
    fillNodes(new Float64Array((mx + 1) * (my + 1)), fn, x0, hx, mx, y0, hy, my);
  // edges along x: nx per row, ny + 1 rows, midpoints at x0 + (i + ½)hx
  const xEdges = (fn: PointFn) => along(fn, domain.x0 + hx / 2, nx - 1, domain.y0, ny);
  const yEdges = (fn: PointFn) => along(fn, domain.x0, nx, domain.y0 + hy / 2, ny - 1);
  return {
    alongX: {
      k11: xEdges(spec.faceX.k11),
      ...(spec.tensor ? { k12: xEdges(spec.faceX.k12) } : {}),
    },
    alongY: {
      k22: yEdges(spec.faceY.k22),
      ...(spec.tensor ? { k12: yEdges(spec.faceY.k12) } : {}),
    },
  };
}

function finish(spec: SamplerSpec, nx: number, ny: number, arrays: Float64Array[]): Problem {
  const [a, b, c, d, e, f] = arrays;
  const problem: Problem = {
    domain: { ...spec.domain },
    nx,
    ny,
    a,
    b,
    c,
    d,
    e,
    f,
    boundary: boundaryConditions(spec, nx, ny),
  };
  const { hx, hy } = spacing(spec.domain, nx, ny);
  if (spec.mixed) {
    problem.m = fillNodes(
      new Float64Array(a.length),
      spec.mixed,
      spec.domain.x0,
      hx,
      nx,
      spec.domain.y0,
      hy,
      ny,
    );
  }
  if (spec.conductivity) {
    problem.conductivity = sampleConductivity(spec.conductivity, spec.domain, nx, ny);
  }
  copyPeriodicImages(problem);
  checkSampled(spec, problem);
  return problem;
}

/**
 * On a periodic axis the last node line is the image of the first (x1 − x0 is the period): its
 * values are copied from there, so the images agree bit for bit whatever rounding the two
 * abscissae gave (the case engine has checked at load that the functions repeat).
 */
function copyPeriodicImages(problem: Problem): void {
  const { nx, ny, boundary } = problem;
  const row = nx + 1;
  const arrays = [problem.a, problem.b, problem.c, problem.d, problem.e, problem.f];
  if (problem.m) arrays.push(problem.m);
  const K = problem.conductivity;
  if (boundary.west.kind === "periodic") {
    for (const v of arrays) for (let j = 0; j <= ny; j++) v[j * row + nx] = v[j * row];
    for (const v of [K?.alongY.k22, K?.alongY.k12]) {
      for (let j = 0; v !== undefined && j < ny; j++) v[j * row + nx] = v[j * row];
    }
    for (const side of ["south", "north"] as const) {
      const bc = boundary[side];
      if (bc.kind === "periodic") continue;
      bc.values[nx] = bc.values[0];
      if (bc.kind === "robin") bc.alpha[nx] = bc.alpha[0], bc.beta[nx] = bc.beta[0];
    }
  }
  if (boundary.south.kind === "periodic") {
    for (const v of arrays) for (let i = 0; i <= nx; i++) v[ny * row + i] = v[i];
    for (const v of [K?.alongX.k11, K?.alongX.k12]) {
      for (let i = 0; v !== undefined && i < nx; i++) v[ny * nx + i] = v[i];
    }
    for (const side of ["west", "east"] as const) {
      const bc = boundary[side];
      if (bc.kind === "periodic") continue;
      bc.values[ny] = bc.values[0];
      if (bc.kind === "robin") bc.alpha[ny] = bc.alpha[0], bc.beta[ny] = bc.beta[0];
    }
  }
}

/** Options of {@link sampleProblemParallel}. */
export interface ParallelOptions {
  /**
   * Threads sharing the rows, the calling thread included: part 0 runs here, the others in Deno
   * workers. Default: 2 (this thread and one worker, i.e. both cores of a two-core machine).
   */
  threads?: number;
  /** Grids with fewer nodes than this are sampled on the calling thread alone. Default: 2^17. */
  minNodes?: number;
}

/**
 * Samples a case with its rows split between the calling thread and Deno workers
 * (SharedArrayBuffer-backed arrays); small grids fall back to {@link sampleProblem}.
 */
export async function sampleProblemParallel(
  spec: SamplerSpec,
  nx: number,
  ny: number,
  options: ParallelOptions = {},
): Promise<Problem> {
  checkGridSize(nx, ny);
  const threads = options.threads ?? 2;
  const minNodes = options.minNodes ?? 2 ** 17;
  if (!Number.isInteger(threads) || threads < 1 || threads > 64) {
    throw new RangeError(`threads must be an integer from 1 to 64, found ${threads}`);
  }
  const size = (nx + 1) * (ny + 1);
  if (size < minNodes || threads === 1 || !spec.problemSampler) return sampleProblem(spec, nx, ny);
  const problemSampler = spec.problemSampler;
  const buffers = FIELDS.map(() => new SharedArrayBuffer(size * 8));
  const arrays = buffers.map((b) => new Float64Array(b));
  const { hx, hy } = spacing(spec.domain, nx, ny);
  const rows = ny + 1;
  const share = (w: number) => Math.floor((w * rows) / threads);
  const jobs: Promise<void>[] = [];
  // start the workers first, then do this thread's share while they run
  for (let w = 1; w < threads; w++) {
    const j0 = share(w);
    const j1 = share(w + 1);
    if (j1 <= j0) continue;
    jobs.push(runWorker({
      source: problemSampler.source,
      x0: spec.domain.x0,
      hx,
      nx,
      y0: spec.domain.y0,
      hy,
      j0,
      j1,
      buffers,
    }));
  }
  problemSampler.run(spec.domain.x0, hx, nx, spec.domain.y0, hy, 0, share(1), arrays);
  await Promise.all(jobs);
  return finish(spec, nx, ny, arrays);
}

/** The message a sampling worker receives. */
export interface WorkerJob {
  source: string;
  x0: number;
  hx: number;
  nx: number;
  y0: number;
  hy: number;
  j0: number;
  j1: number;
  buffers: SharedArrayBuffer[];
}

function runWorker(job: WorkerJob): Promise<void> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL("./_sample_worker.ts", import.meta.url), { type: "module" });
    worker.onmessage = (event: MessageEvent<{ ok: boolean; error?: string }>) => {
      worker.terminate();
      if (event.data.ok) resolve();
      else reject(new Error(`sampling worker failed: ${event.data.error}`));
    };
    worker.onerror = (event) => {
      event.preventDefault();
      worker.terminate();
      reject(new Error(`sampling worker failed: ${event.message}`));
    };
    worker.postMessage(job);
  });
}
