import assert from "node:assert/strict";
import { messageBytes } from "../protocol/mod.ts";
import { GroupProcess } from "./process.ts";

/** A child that copies stdin to stdout, in whatever pieces the pipes give. */
function echo(): GroupProcess {
  return GroupProcess.start({
    argv: [
      Deno.execPath(),
      "eval",
      "--quiet",
      "await Deno.stdin.readable.pipeTo(Deno.stdout.writable)",
    ],
    cwd: Deno.cwd(),
  });
}

function values(n: number, seed: number): Float64Array {
  return new Float64Array(n).map((_, k) => Math.sin(seed + k) * 10 ** ((k % 30) - 15));
}

Deno.test("readLine() parses a base64 line as it arrives, gives other lines as text, then the end", async () => {
  // derived: the values must come back exactly as written (base64 of float64 is lossless), and
  // every other line as its own text
  const v = values(50000, 1);
  const w = values(3, 2);
  const proc = echo();
  try {
    const wrote = proc.write([
      messageBytes({ type: "solution", values: v, more: { w } }).bytes(),
      new TextEncoder().encode('\n{"n":[1,2]}\ntail'),
    ]).then(() => proc.closeStdin());
    const first = await proc.readLine(1 << 22, { parse: true });
    assert.equal(first.kind, "message");
    if (first.kind !== "message") return;
    const message = first.message;
    const wire = message.value as { values: { base64: string }; more: { w: { base64: string } } };
    assert.deepEqual(message.decoded.get(wire.values.base64), v);
    assert.deepEqual(message.decoded.get(wire.more.w.base64), w);
    assert.deepEqual(await proc.readLine(1 << 22, { parse: true }), { kind: "line", text: "" });
    assert.deepEqual(await proc.readLine(1 << 22), { kind: "line", text: '{"n":[1,2]}' });
    const end = await proc.readLine(1 << 22);
    assert.equal(end.kind, "eof");
    if (end.kind === "eof") assert.equal(new TextDecoder().decode(end.partial), "tail");
    await wrote;
  } finally {
    proc.killGroup();
    await proc.status;
    await proc.release();
  }
});

Deno.test("readLine() without parse gives a base64 line as its text", async () => {
  // derived: the text is the line as written, newline removed
  const line = messageBytes({ values: values(10, 3) }).bytes();
  const proc = echo();
  try {
    await proc.write(line);
    await proc.closeStdin();
    const read = await proc.readLine(1 << 20);
    assert.deepEqual(read, { kind: "line", text: new TextDecoder().decode(line.subarray(0, -1)) });
  } finally {
    proc.killGroup();
    await proc.status;
    await proc.release();
  }
});

Deno.test("readLine() stops at the size limit, and readAll() returns everything to the end", async () => {
  // common practice: a limit guards the harness's memory; the bytes read are the bytes written
  const proc = echo();
  try {
    const writing = proc.write(new TextEncoder().encode("x".repeat(300000) + "\n"));
    assert.deepEqual(await proc.readLine(1000), { kind: "overflow", limit: 1000 });
    proc.killGroup();
    await writing;
  } finally {
    proc.killGroup();
    await proc.status;
    await proc.release();
  }
  const again = echo();
  try {
    const line = messageBytes({ a: values(300000, 4), b: values(200000, 5) });
    const reading = again.readAll(1 << 26);
    // pieces share two buffers in turn: each must be written before the one after it is made
    const wrote = await again.write(line.pieces());
    await again.closeStdin();
    assert.equal(wrote.written, line.byteLength);
    const all = await reading;
    assert.equal(all.kind, "data");
    const expected = line.bytes();
    if (all.kind === "data") {
      assert.equal(all.bytes.length, expected.length);
      assert.ok(all.bytes.every((b, k) => b === expected[k]), "the bytes arrived as written");
    }
  } finally {
    again.killGroup();
    await again.status;
    await again.release();
  }
});

Deno.test("settle() gives all the leader wrote once it exits, though a process it left holds stdout open", async () => {
  // the background `sleep` inherits stdout: the end of stdout comes only once it is ended
  const proc = GroupProcess.start({
    argv: ["/bin/sh", "-c", "printf 'the reply'; sleep 300 & echo \"sleep $!\" >&2; exit 0"],
    cwd: Deno.cwd(),
  });
  try {
    const read = await proc.settle(proc.readAll(1 << 20), 60_000);
    assert.equal(read?.kind, "data");
    if (read?.kind === "data") assert.equal(new TextDecoder().decode(read.bytes), "the reply");
    assert.equal(proc.exitStatus?.code, 0);
    await proc.stderrDone;
    const sleep = Number(/sleep (\d+)/.exec(proc.stderr.text())?.[1]);
    assert.deepEqual(await proc.end(), { tracked: true, inGroup: [sleep], outside: [] });
  } finally {
    await proc.end();
    await proc.release();
  }
});
