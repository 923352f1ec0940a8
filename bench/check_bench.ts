/**
 * Benchmark of the harness around the solver (issue 16, items 1 and 2), side by side in one run:
 * the wall time of `gridproof check` on the built-in library against one
 * `gridproof solve --case smooth-baseline --n 1024` (goal: ≤ 2×), with the derivation cache warm
 * and off; and `--jobs 1` against `--jobs 2` on a library campaign with grids to 512 (goal: jobs 2
 * at least 1.5× faster) and, with `--demo`, on the demonstration campaign. Each command runs as
 * its own process (what a user waits for), the variants interleaved, `--repeat` times; the median
 * is reported. The load average is printed before and after: the build machines are shared.
 *
 * Run: npm run bench:check [-- --repeat 3] [-- --demo] [-- --json]
 *
 * @module
 */
const args = Deno.args;
const repeat = Number(args[args.indexOf("--repeat") + 1]) || 3;
const demo = args.includes("--demo");
const json = args.includes("--json");

const DENO = Deno.execPath();
const CLI = new URL("../cli.ts", import.meta.url).pathname;
const PERMISSIONS = [
  "--quiet",
  "--allow-read",
  "--allow-write",
  "--allow-env",
  "--allow-run",
  "--allow-sys",
];
const scratch = await Deno.makeTempDir({ prefix: "gridproof-check-bench-" });
const cache = `${scratch}/derivations`;

interface Variant {
  name: string;
  argv: string[];
  /** The derivation cache folder, or "off". */
  cacheDir: string;
}

const LARGE = "smooth-baseline,variable-all,boundary-layer,high-frequency,rotated-anisotropy";
const variants: Variant[] = [
  {
    name: "solve n=1024",
    argv: ["solve", "--case", "smooth-baseline", "--n", "1024"],
    cacheDir: cache,
  },
  { name: "check library jobs 1 (cache warm)", argv: ["check", "--jobs", "1"], cacheDir: cache },
  { name: "check library jobs 1 (cache off)", argv: ["check", "--jobs", "1"], cacheDir: "off" },
  { name: "check library jobs 2 (cache warm)", argv: ["check", "--jobs", "2"], cacheDir: cache },
  {
    name: "check to 512 jobs 1",
    argv: ["check", "--cases", LARGE, "--grids", "64,128,256,512", "--jobs", "1"],
    cacheDir: cache,
  },
  {
    name: "check to 512 jobs 2",
    argv: ["check", "--cases", LARGE, "--grids", "64,128,256,512", "--jobs", "2"],
    cacheDir: cache,
  },
];
if (demo) {
  variants.push(
    { name: "demo jobs 1", argv: ["demo", "--jobs", "1"], cacheDir: cache },
    { name: "demo jobs 2", argv: ["demo", "--jobs", "2"], cacheDir: cache },
  );
}

async function loadAverage(): Promise<string> {
  try {
    // Deno refuses /proc files short of --allow-all; cat reads it for us (--allow-run)
    const out = await new Deno.Command("cat", { args: ["/proc/loadavg"], stdout: "piped" })
      .output();
    return new TextDecoder().decode(out.stdout).trim() ||
      "unknown (cat /proc/loadavg printed nothing)";
  } catch {
    return "not readable here; run cat /proc/loadavg beside the bench";
  }
}

let runs = 0;
async function wallSeconds(v: Variant): Promise<number> {
  const out = `${scratch}/out-${runs++}`;
  const argv = v.argv[0] === "solve" ? v.argv : [...v.argv, "--out", out];
  const started = performance.now();
  const child = await new Deno.Command(DENO, {
    args: ["run", ...PERMISSIONS, CLI, ...argv],
    env: { GRIDPROOF_CACHE_DIR: v.cacheDir, NO_COLOR: "1" },
    stdout: "null",
    stderr: "piped",
  }).output();
  const seconds = (performance.now() - started) / 1000;
  // check exits 1 when a verdict fails: still a finished run; 2 and signals are not
  if (child.code !== 0 && child.code !== 1) {
    throw new Error(
      `${v.name} exited with ${child.code}: ${new TextDecoder().decode(child.stderr).slice(-400)}`,
    );
  }
  await Deno.remove(out, { recursive: true }).catch(() => {});
  return seconds;
}

const before = await loadAverage();
// one unmeasured run fills the derivation cache (and the OS file cache)
await wallSeconds(variants[1]);
const times = new Map<string, number[]>(variants.map((v) => [v.name, []]));
for (let r = 0; r < repeat; r++) {
  for (const v of variants) times.get(v.name)!.push(await wallSeconds(v));
}
const after = await loadAverage();
await Deno.remove(scratch, { recursive: true });

const median = (xs: number[]) => {
  const s = [...xs].sort((p, q) => p - q);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const t = (name: string) => median(times.get(name)!);
const ratios = [
  {
    ratio: "check library jobs 1 (cache warm) / solve n=1024",
    value: t("check library jobs 1 (cache warm)") / t("solve n=1024"),
    goal: "≤ 2",
  },
  {
    ratio: "check library jobs 1 (cache off) / solve n=1024",
    value: t("check library jobs 1 (cache off)") / t("solve n=1024"),
    goal: "(before the cache)",
  },
  {
    ratio: "check library: jobs 1 / jobs 2 (cache warm)",
    value: t("check library jobs 1 (cache warm)") / t("check library jobs 2 (cache warm)"),
    goal: "≥ 1.5",
  },
  {
    ratio: "check to 512: jobs 1 / jobs 2",
    value: t("check to 512 jobs 1") / t("check to 512 jobs 2"),
    goal: "≥ 1.5",
  },
  ...(demo
    ? [{
      ratio: "demo: jobs 1 / jobs 2",
      value: t("demo jobs 1") / t("demo jobs 2"),
      goal: "≥ 1.5",
    }]
    : []),
];

if (json) {
  for (const v of variants) {
    console.log(JSON.stringify({ variant: v.name, seconds: times.get(v.name), median: t(v.name) }));
  }
  for (const r of ratios) console.log(JSON.stringify(r));
  console.log(JSON.stringify({ loadBefore: before, loadAfter: after, repeat }));
} else {
  console.log(`load average before: ${before}`);
  console.log(`cores: ${navigator.hardwareConcurrency}, repeats: ${repeat} (median wall time)`);
  console.log("variant | median s | runs s");
  for (const v of variants) {
    console.log(
      `${v.name} | ${t(v.name).toFixed(2)} | ${
        times.get(v.name)!.map((s) => s.toFixed(2)).join(" ")
      }`,
    );
  }
  console.log("ratio | measured | goal");
  for (const r of ratios) console.log(`${r.ratio} | ${r.value.toFixed(2)} | ${r.goal}`);
  console.log(`load average after: ${after}`);
}
