/**
 * Benchmark of the case engine (issue 3), side by side in one run:
 *
 * 1. The derived source term f = a·u_xx + c·u_yy + e·u of the benchmark case (unit square,
 *    a = 1 + 0.5·sin(2πx)·sin(2πy), b = d = 0, c = 1 + 0.25·cos(πxy), e = −(1 + xy),
 *    u = sin(πx)·sin(πy)·exp(xy)) as a point function: our compiled function vs the same formula
 *    written out by hand in TypeScript vs mathjs's own compiled `evaluate` of the simplified tree.
 * 2. Sampling every input of that case (a, b, c, d, e, f and the boundary data) at n = 2048
 *    (4.2 M nodes): row sampler on one thread vs rows split between this thread and a worker.
 * 3. Building the whole library with the operator check (issue 12, item 13: a·c > 0 and finite
 *    values on the whole domain) against the same builds with a 2 × 2 check lattice and no
 *    refinement, which cost next to nothing: the difference is what the check adds.
 *
 * Run: ./node_modules/.bin/deno run --allow-read --allow-env --allow-sys --allow-hrtime bench/cases_bench.ts
 *
 * @module
 */
import { buildCase, type CaseFile, libraryFiles } from "../cases/mod.ts";
import { loadMath, mathjsEvaluator } from "../cases/_mathjs.ts";

const benchCase: CaseFile = {
  id: "bench",
  title: "benchmark case",
  motivation: "benchmark",
  manufactured: "benchmark",
  domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
  coefficients: {
    a: "1 + 0.5*sin(2*pi*x)*sin(2*pi*y)",
    b: "0",
    c: "1 + 0.25*cos(pi*x*y)",
    d: "0",
    e: "-(1 + x*y)",
  },
  exact: "sin(pi*x)*sin(pi*y)*exp(x*y)",
  boundary: {
    west: { kind: "dirichlet" },
    east: { kind: "neumann" },
    south: { kind: "dirichlet" },
    north: { kind: "robin", alpha: 1, beta: 0.5 },
  },
  expected: { central: { formal: 2 } },
  tags: [],
  grids: [16, 32],
};

/** The same source term written out by hand (shared factors computed once, as a person would). */
function handWritten(x: number, y: number): number {
  const pi = Math.PI;
  const S = Math.sin(pi * x), C = Math.cos(pi * x);
  const T = Math.sin(pi * y), D = Math.cos(pi * y);
  const E = Math.exp(x * y);
  const u = S * T * E;
  const uxx = E * T * (-pi * pi * S + 2 * pi * y * C + y * y * S);
  const uyy = E * S * (-pi * pi * T + 2 * pi * x * D + x * x * T);
  const a = 1 + 0.5 * Math.sin(2 * pi * x) * Math.sin(2 * pi * y);
  const c = 1 + 0.25 * Math.cos(pi * x * y);
  const e = -(1 + x * y);
  return a * uxx + c * uyy + e * u;
}

const math = await loadMath();
const c = await buildCase(benchCase, { origin: "bench" });
const simplifiedSource = math.parse(c.formulas.source);
const viaMathjs = mathjsEvaluator(simplifiedSource);
const scope = { x: 0, y: 0 };
const mathjsPoint = (x: number, y: number) => {
  scope.x = x;
  scope.y = y;
  return viaMathjs(scope);
};

// sanity: all three compute the same numbers
let worst = 0;
for (let k = 0; k < 1000; k++) {
  const x = (k % 37) / 36, y = (k % 41) / 40;
  const want = handWritten(x, y);
  worst = Math.max(worst, Math.abs(c.source(x, y) - want), Math.abs(mathjsPoint(x, y) - want));
}

function timePoints(
  f: (x: number, y: number) => number,
  n: number,
): { seconds: number; sum: number } {
  const h = 1 / n;
  let sum = 0;
  const t0 = performance.now();
  for (let j = 0; j <= n; j++) {
    const y = j * h;
    for (let i = 0; i <= n; i++) sum += f(i * h, y);
  }
  return { seconds: (performance.now() - t0) / 1000, sum };
}

const median = (v: number[]) => [...v].sort((p, q) => p - q)[Math.floor(v.length / 2)];
const rounds = 7;
const n = 512;
const times: Record<string, number[]> = { compiled: [], hand: [], mathjs: [] };
let checksum = 0;
for (let r = 0; r < rounds; r++) {
  // interleaved so that machine noise hits all three alike
  const a = timePoints(c.source, n);
  const b = timePoints(handWritten, n);
  times.compiled.push(a.seconds);
  times.hand.push(b.seconds);
  checksum += a.sum - b.sum;
  if (r < 3) times.mathjs.push(timePoints(mathjsPoint, n / 4).seconds * 16);
}
const points = (n + 1) ** 2;
const ns = (s: number) => ((s / points) * 1e9).toFixed(1);
const compiled = median(times.compiled), hand = median(times.hand), viaMath = median(times.mathjs);

console.log(
  `Derived source term, point function, ${points} points, median of ${rounds} interleaved rounds`,
);
console.log(`  compiled (ours)      ${ns(compiled)} ns/point`);
console.log(
  `  hand-written TS      ${ns(hand)} ns/point   compiled/hand time ratio ${
    (compiled / hand).toFixed(2)
  }`,
);
console.log(
  `  mathjs evaluate      ${ns(viaMath)} ns/point   mathjs/compiled ${
    (viaMath / compiled).toFixed(0)
  }×`,
);
console.log(
  `  largest difference between the three: ${worst.toExponential(2)} (checksum ${
    checksum.toExponential(2)
  })`,
);

// grid sampling: every input of the case at n = 2048
const big = 2048;
const sync: number[] = [];
const parallel: number[] = [];
const handGrid: number[] = [];
for (let r = 0; r < 3; r++) {
  let t0 = performance.now();
  c.sample(big, big);
  sync.push((performance.now() - t0) / 1000);
  t0 = performance.now();
  await c.sampleAsync(big, big, { threads: 2 });
  parallel.push((performance.now() - t0) / 1000);
  // hand-written loop filling only f, for scale
  t0 = performance.now();
  const f = new Float64Array((big + 1) ** 2);
  const h = 1 / big;
  for (let j = 0; j <= big; j++) {
    const y = j * h;
    for (let i = 0; i <= big; i++) f[j * (big + 1) + i] = handWritten(i * h, y);
  }
  handGrid.push((performance.now() - t0) / 1000);
}
console.log(
  `Sampling all inputs (a, b, c, d, e, f, boundary data; checks included) at n = ${big}, ${
    (big + 1) ** 2
  } nodes, median of 3`,
);
console.log(`  one thread (row sampler)      ${median(sync).toFixed(3)} s`);
console.log(
  `  this thread + 1 worker (shared) ${median(parallel).toFixed(3)} s   speed-up ${
    (median(sync) / median(parallel)).toFixed(2)
  }×`,
);
console.log(`  hand-written loop, f only     ${median(handGrid).toFixed(3)} s`);

// building the library: the operator check against a nearly free one (every build compiles new
// functions, so each round is as cold as a command-line run)
const files = await libraryFiles();
const buildLibrary = async (operatorCheck?: { intervals: number; refinements: number }) => {
  const t0 = performance.now();
  for (const file of files) {
    await buildCase(file, { origin: "library", ...(operatorCheck ? { operatorCheck } : {}) });
  }
  return (performance.now() - t0) / 1000;
};
await buildLibrary();
const withCheck: number[] = [];
const nearlyFree: number[] = [];
for (let r = 0; r < 7; r++) {
  withCheck.push(await buildLibrary());
  nearlyFree.push(await buildLibrary({ intervals: 2, refinements: 0 }));
}
const added = median(withCheck) - median(nearlyFree);
console.log(
  `Building the library (${files.length} cases), median of 7 interleaved rounds`,
);
console.log(`  with the operator check               ${(median(withCheck) * 1e3).toFixed(0)} ms`);
console.log(
  `  2 × 2 check lattice, no refinement    ${(median(nearlyFree) * 1e3).toFixed(0)} ms   ` +
    `the check adds ${(added * 1e3).toFixed(0)} ms (${
      (added * 1e3 / files.length).toFixed(1)
    } ms a case)`,
);
