import assert from "node:assert/strict";
import { DescendantWatch, MARK_VARIABLE } from "./descendants.ts";

/**
 * Starts `script` under `sh` as the leader of a new process group (as solvers are started), with
 * a mark in its environment and a watch on it; the script prints the pids it wants checked.
 */
function leader(script: string, options: { intervalMs: number }) {
  const mark = crypto.randomUUID();
  const child = new Deno.Command("setsid", {
    args: ["sh", "-c", script],
    env: { [MARK_VARIABLE]: mark },
    stdin: "null",
    stdout: "piped",
  }).spawn();
  const watch = new DescendantWatch(child.pid, mark, options);
  const killGroup = () => {
    try {
      Deno.kill(-child.pid, "SIGKILL");
    } catch {
      // the group is gone
    }
  };
  return { child, watch, killGroup };
}

/** Whether `pid` runs now (a zombie does not), asked of `ps`. */
async function runsNow(pid: number): Promise<boolean> {
  const ps = await new Deno.Command("ps", { args: ["-o", "stat=", "-p", String(pid)] }).output();
  return ps.success && !new TextDecoder().decode(ps.stdout).trim().startsWith("Z");
}

/** Whether `pid` still runs after a few tries (a killed process takes a moment to go). */
async function runs(pid: number): Promise<boolean> {
  for (let tries = 0; tries < 30; tries++) {
    if (!await runsNow(pid)) return false;
    await new Promise((r) => setTimeout(r, 100));
  }
  return true;
}

Deno.test("end() ends a descendant that left the group and lost its parent, found by its mark", async () => {
  // `setsid sleep` leaves the group; the shell exits at once, so no parent chain is left; the
  // interval is too long for a look before the end: only the mark can find it
  const { child, watch, killGroup } = leader(
    "setsid sleep 300 </dev/null >/dev/null 2>&1 & echo $!",
    { intervalMs: 600_000 },
  );
  const pid = Number(new TextDecoder().decode((await child.output()).stdout));
  // a process of the same kind that is no descendant: it must be left alone
  const bystander = new Deno.Command("sleep", { args: ["300"] }).spawn();
  try {
    assert.ok(pid > 0);
    const ended = await watch.end(killGroup);
    assert.deepEqual(ended, { tracked: true, inGroup: [], outside: [pid] });
    assert.equal(await runs(pid), false, `sleep ${pid} still runs`);
    assert.equal(
      await runsNow(bystander.pid),
      true,
      "a process that is no descendant was signalled",
    );
  } finally {
    bystander.kill();
    await bystander.status;
  }
});

Deno.test("a look while the solver runs records a descendant that left the group and dropped its mark", async () => {
  // `env -i` empties the environment: the parent chain, seen while the shell waits, is the only
  // trace; the shell's 1.5 s allow several looks 50 ms apart, also on a busy machine
  const { child, watch, killGroup } = leader(
    "env -i setsid sleep 300 </dev/null >/dev/null 2>&1 & echo $!; sleep 1.5",
    { intervalMs: 50 },
  );
  const pid = Number(new TextDecoder().decode((await child.output()).stdout));
  assert.ok(pid > 0);
  assert.ok(watch.recorded.includes(pid), `recorded ${watch.recorded}`);
  const ended = await watch.end(killGroup);
  assert.deepEqual(ended.outside, [pid]);
  assert.equal(await runs(pid), false, `sleep ${pid} still runs`);
});

Deno.test("end() kills the group and names its members that were still running", async () => {
  const { child, watch, killGroup } = leader("sleep 300 & echo $!; exec sleep 300", {
    intervalMs: 600_000,
  });
  const reader = child.stdout.pipeThrough(new TextDecoderStream()).getReader();
  const pid = Number((await reader.read()).value);
  const ended = await watch.end(killGroup);
  assert.deepEqual(ended, { tracked: true, inGroup: [pid], outside: [] });
  assert.equal((await child.status).signal, "SIGKILL");
  assert.equal(await runs(pid), false, `sleep ${pid} still runs`);
  await reader.cancel();
});
