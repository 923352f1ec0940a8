import assert from "node:assert/strict";
import { fileDigest, solverBuild } from "./solver_build.ts";

/** GNU coreutils' sha256sum, an implementation independent of ours (Debian's coreutils). */
async function sha256sum(path: string): Promise<string> {
  const out = await new Deno.Command("sha256sum", { args: [path], stdout: "piped" }).output();
  return new TextDecoder().decode(out.stdout).split(" ")[0];
}

Deno.test("fileDigest() agrees with sha256sum on a file larger than one read", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const path = `${dir}/solver.bin`;
    const bytes = new Uint8Array(300_000).map((_, k) => (k * 7919) % 251);
    await Deno.writeFile(path, bytes);
    const digest = (await fileDigest(path))!;
    assert.equal(digest.sha256, await sha256sum(path));
    assert.equal(digest.bytes, 300_000);
    assert.equal(await fileDigest(`${dir}/missing`), undefined);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("solverBuild() digests the solver file, the program and the script its command names", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(`${dir}/solvers.json`, "{}");
    await Deno.mkdir(`${dir}/src`);
    await Deno.writeTextFile(`${dir}/src/main.py`, "print('hi')\n");
    const record = await solverBuild({
      name: "s",
      command: ["/bin/sh", "main.py", "--tol", "1e-10"],
      cwd: "src",
      solverFileDir: dir,
      mode: "once",
      encoding: "numbers",
      layout: "vertex",
      scheme: "central",
      timeLimitSeconds: 10,
      skipCases: [],
      maxReplyMiB: 1,
    }, `${dir}/solvers.json`);
    assert.equal(record.solverFile!.sha256, await sha256sum(`${dir}/solvers.json`));
    assert.deepEqual(record.files.map((f) => f.sha256), [
      await sha256sum("/bin/sh"),
      await sha256sum(`${dir}/src/main.py`),
    ]);
    assert.equal(record.unread, undefined);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
