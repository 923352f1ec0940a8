/**
 * Child process of `fresh_process.ts`: in a fresh Deno process, samples the bench problem at the n
 * given as its one argument, solves it twice with the defaults, and prints one JSON line with both
 * solve times and the process's peak resident size (VmHWM) before sampling, after sampling and
 * after the first solve. Deno refuses to read `/proc/self/status` without `--allow-all`, so the
 * status file is read by `cat /proc/<pid>/status` (run with `--allow-run=cat`).
 *
 * @module
 */
import { solve } from "../reference-solver/mod.ts";
import { benchProblem } from "./bench_problem.ts";
import { peakResidentBytes } from "./_proc.ts";

function peakBytes(): number {
  const bytes = peakResidentBytes();
  if (bytes === null) throw new Error("VmHWM cannot be read (no cat or no /proc/<pid>/status)");
  return bytes;
}

const n = Number(Deno.args[0]);
const before = peakBytes();
const { problem } = benchProblem(n);
const sampled = peakBytes();
let t0 = performance.now();
const first = solve(problem);
const firstSeconds = (performance.now() - t0) / 1000;
const solved = peakBytes();
t0 = performance.now();
const second = solve(problem);
const secondSeconds = (performance.now() - t0) / 1000;
if (!first.converged || !second.converged) throw new Error(`bench solve at n = ${n} failed`);
console.log(JSON.stringify({ before, sampled, solved, firstSeconds, secondSeconds }));
