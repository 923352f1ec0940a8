import assert from "node:assert/strict";
import { LineScanner } from "./line_scanner.ts";
import { readReply } from "./reply.ts";
import { solutionReplyBytes } from "./request.ts";

const expect = {
  id: "r1",
  layout: "vertex" as const,
  nx: 3,
  ny: 2,
  domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
};

/** The reply line scanned by a LineScanner, and its text. */
function scanned(
  values: Float64Array,
): { parsed: ReturnType<LineScanner["finish"]>; text: string } {
  const bytes = solutionReplyBytes("r1", values, {
    encoding: "base64",
    iterations: 4,
    residualHistory: [1, 0.1],
  }).bytes();
  const scanner = new LineScanner();
  const end = scanner.scan(bytes);
  const line = bytes.subarray(0, end);
  return { parsed: scanner.finish(line), text: new TextDecoder().decode(line) };
}

Deno.test("readReply() reads a reply parsed on the way as it reads the same reply's text", () => {
  // derived: both ways must give the same decoded reply (the values are the ones written)
  const values = new Float64Array(12).map((_, k) => k / 3);
  const { parsed, text } = scanned(values);
  assert.ok(parsed, "the scanner parsed the line");
  const fast = readReply(parsed, expect);
  const plain = readReply(text, expect);
  assert.ok(fast.ok && plain.ok);
  assert.deepEqual(fast, plain);
  if (fast.ok && fast.reply.type === "solution") assert.deepEqual(fast.reply.values, values);
});

Deno.test("readReply() checks a reply parsed on the way like any other", () => {
  // derived: 11 values on a 3×2 vertex grid (12 nodes), and a NaN at node 5 (i=1, j=1)
  const short = scanned(new Float64Array(11)).parsed;
  assert.ok(short);
  const count = readReply(short, expect);
  assert.ok(!count.ok && /values has 11 entries/.test(count.reason), JSON.stringify(count));
  const nan = new Float64Array(12);
  nan[5] = NaN;
  const bad = scanned(nan).parsed;
  assert.ok(bad);
  const check = readReply(bad, expect);
  assert.ok(
    !check.ok && /values\[5\] is NaN \(node i=1, j=1/.test(check.reason),
    check.ok ? "" : check.reason,
  );
});
