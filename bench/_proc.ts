/**
 * Reads a Linux /proc file through `cat`: Deno refuses `/proc/self/status`, `/proc/<pid>/status`
 * and `/proc/loadavg` to `--allow-read` alone (it asks for `--allow-all`), while a `cat` child
 * (`--allow-run=cat`) may read them.
 *
 * @module
 */

/** The text of a /proc file, or null where it cannot be read (no cat, no /proc). */
export function procText(path: string): string | null {
  try {
    const out = new Deno.Command("cat", { args: [path] }).outputSync();
    return out.success ? new TextDecoder().decode(out.stdout) : null;
  } catch {
    return null;
  }
}

/** VmHWM (peak resident size) of this process in bytes, or null where it cannot be read. */
export function peakResidentBytes(): number | null {
  const m = /VmHWM:\s+(\d+)\s+kB/.exec(procText(`/proc/${Deno.pid}/status`) ?? "");
  return m === null ? null : Number(m[1]) * 1024;
}
