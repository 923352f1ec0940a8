import assert from "node:assert/strict";
import { LOCK_FILE, lockFolder } from "./folder_lock.ts";

Deno.test("lockFolder() admits one campaign per folder and takes over a stale lock (issue 12, item 2)", async (t) => {
  const dir = await Deno.makeTempDir();
  await t.step("a second writer is refused while the first runs", () => {
    const first = lockFolder(dir);
    assert.equal(first.staleFrom, null);
    assert.throws(() => lockFolder(dir), /in use by another gridproof campaign \(process \d+\)/);
    first.release();
    assert.throws(() => Deno.statSync(`${dir}/${LOCK_FILE}`), Deno.errors.NotFound);
  });
  await t.step("a lock left by a process that no longer runs is taken over", () => {
    // pid 2^22 + 1 is above Linux's largest pid (pid_max ≤ 2^22), so no process has it
    Deno.writeTextFileSync(`${dir}/${LOCK_FILE}`, `${2 ** 22 + 1}\n`);
    const lock = lockFolder(dir);
    assert.equal(lock.staleFrom, 2 ** 22 + 1);
    lock.release();
  });
  await Deno.remove(dir, { recursive: true });
});
