import assert from "node:assert/strict";
import { Buffer } from "node:buffer";
import {
  decodeArray,
  encodeArray,
  readSolveRequest,
  solveRequestBytes,
} from "../../harness/protocol/mod.ts";
import { expressionTexts, sampleCase } from "../../harness/solvers/mod.ts";
import { testCase } from "./_case.ts";
import { findScipyPython, runWithInput } from "../../testing/mod.ts";

// Values with awkward bit patterns: signed zero, subnormal, extremes, non-terminating decimals.
const SAMPLES = new Float64Array([
  0,
  -0,
  1,
  -1.5,
  0.1,
  1 / 3,
  Math.PI,
  5e-324,
  2.2250738585072014e-308,
  Number.MAX_VALUE,
  -Number.MAX_VALUE,
  Number.EPSILON,
  123456789.123456789,
]);

function sameBits(a: Float64Array, b: Float64Array): void {
  assert.equal(a.length, b.length);
  assert.deepEqual(
    new Uint8Array(a.buffer, a.byteOffset, a.byteLength),
    new Uint8Array(b.buffer, b.byteOffset, b.byteLength),
  );
}

Deno.test("encodeArray() writes 1.0 as the eight little-endian bytes 00 00 00 00 00 00 f0 3f", () => {
  // derived: IEEE 754 binary64 of 1.0 is 0x3FF0000000000000; little-endian puts 0x3F last,
  // and base64 of 00 00 00 00 00 00 F0 3F is "AAAAAAAA8D8=" (RFC 4648 alphabet).
  assert.deepEqual(encodeArray(new Float64Array([1]), "base64"), { base64: "AAAAAAAA8D8=" });
  assert.deepEqual(Array.from(decodeArray({ base64: "AAAAAAAA8D8=" }, "/v")), [1]);
});

Deno.test("base64 round trip keeps every bit, including -0, subnormals and extremes", () => {
  sameBits(decodeArray(encodeArray(SAMPLES, "base64"), "/v"), SAMPLES);
});

Deno.test("numbers round trip through JSON text keeps every value exactly", () => {
  const wire = JSON.parse(JSON.stringify(encodeArray(SAMPLES, "numbers")));
  const back = decodeArray(wire, "/v");
  // JSON has no -0: it comes back as 0, the only allowed difference
  for (let k = 0; k < SAMPLES.length; k++) assert.equal(back[k], SAMPLES[k] === 0 ? 0 : SAMPLES[k]);
});

Deno.test("base64 decoding agrees with node:buffer readDoubleLE, an independent decoder", () => {
  const wire = encodeArray(SAMPLES, "base64") as { base64: string };
  const buf = Buffer.from(wire.base64, "base64");
  assert.equal(buf.length, SAMPLES.length * 8);
  for (let k = 0; k < SAMPLES.length; k++) {
    assert.ok(Object.is(buf.readDoubleLE(8 * k), SAMPLES[k]), `value ${k}`);
  }
  // and the other direction: bytes written by writeDoubleLE decode to the same numbers
  const out = Buffer.alloc(SAMPLES.length * 8);
  SAMPLES.forEach((v, k) => out.writeDoubleLE(v, 8 * k));
  sameBits(decodeArray({ base64: out.toString("base64") }, "/v"), SAMPLES);
});

Deno.test("base64 agrees with Python's struct '<d' (little-endian float64) in both directions", async (t) => {
  const python = await findScipyPython();
  if (!python) {
    console.log("skipped: no python3 found");
    return;
  }
  const wire = encodeArray(SAMPLES, "base64") as { base64: string };
  const script = [
    "import base64, struct, sys, json",
    "raw = base64.b64decode(sys.stdin.read())",
    "vals = struct.unpack('<%dd' % (len(raw) // 8), raw)",
    "print(json.dumps([v.hex() for v in vals]))",
    "print(base64.b64encode(struct.pack('<%dd' % len(vals), *vals)).decode())",
  ].join("\n");
  const out = await runWithInput([python, "-c", script], wire.base64);
  const [hexLine, backLine] = out.stdout.trim().split("\n");
  await t.step("Python reads the same numbers (compared as exact hex floats)", () => {
    const hex: string[] = JSON.parse(hexLine);
    for (let k = 0; k < SAMPLES.length; k++) {
      // Python's float.hex is exact; parse it back with the hex-float rule m·2^e
      const m = /^(-?)0x([01])\.([0-9a-f]+)p([+-]\d+)$/.exec(hex[k]);
      assert.ok(m, hex[k]);
      const mantissa = parseInt(m[2], 16) + parseInt(m[3], 16) / 16 ** m[3].length;
      const value = (m[1] === "-" ? -1 : 1) * mantissa * 2 ** Number(m[4]);
      assert.ok(Object.is(value, SAMPLES[k]) || (value === 0 && SAMPLES[k] === 0), hex[k]);
    }
  });
  await t.step("Python's re-encoding decodes to the same bits here", () => {
    sameBits(decodeArray({ base64: backLine }, "/v"), SAMPLES);
  });
});

Deno.test("base64 carries NaN and Infinity, which the reply checks then refuse", () => {
  const special = new Float64Array([NaN, Infinity, -Infinity]);
  const back = decodeArray(encodeArray(special, "base64"), "/v");
  assert.ok(Number.isNaN(back[0]));
  assert.equal(back[1], Infinity);
  assert.equal(back[2], -Infinity);
});

Deno.test("decodeArray() refuses what the schema cannot see, naming the path", async (t) => {
  await t.step("a byte count that is not a multiple of 8", () => {
    assert.throws(
      () => decodeArray({ base64: "AAAA" }, "/values"),
      (e: Error) =>
        e instanceof RangeError && /\/values\/base64: decodes to 3 bytes/.test(e.message),
    );
  });
  await t.step("text that is not base64", () => {
    assert.throws(
      () => decodeArray({ base64: "@@@@" }, "/source"),
      (e: Error) =>
        e instanceof RangeError && /\/source\/base64: is not valid base64/.test(e.message),
    );
  });
  await t.step("a string inside a number array", () => {
    assert.throws(
      () => decodeArray([1, "2"], "/values"),
      (e: Error) => e instanceof RangeError && /\/values\/1: must be a number/.test(e.message),
    );
  });
  await t.step("neither form", () => {
    assert.throws(
      () => decodeArray("1,2,3", "/values"),
      (e: Error) => e instanceof RangeError && /array of numbers or an object/.test(e.message),
    );
  });
});

Deno.test("the constant form expands to n copies, into a kept buffer when one is given", () => {
  const wire = { constant: -0.75, length: 5 };
  assert.deepEqual(decodeArray(wire, "/coefficients/d"), new Float64Array(5).fill(-0.75));
  const kept = new Map<string, Float64Array>();
  const first = decodeArray(wire, "/coefficients/d", undefined, kept);
  const second = decodeArray({ constant: 2, length: 5 }, "/coefficients/d", undefined, kept);
  assert.equal(second, first, "the same buffer serves the next request");
  assert.deepEqual(second, new Float64Array(5).fill(2));
  const longer = decodeArray({ constant: 1, length: 7 }, "/coefficients/d", undefined, kept);
  assert.notEqual(longer, first, "another length gets its own buffer");
  assert.equal(longer.length, 7);
});

Deno.test("a request sends constant coefficients as one number and reads back every value", async (t) => {
  // testCase(): a = 1 + x varies, c = 1, d = 0.5, e = −1 are constant (its constantCoefficients)
  const sampled = sampleCase(testCase(), 4, 8, "vertex");
  const details = {
    id: "r",
    caseId: "test-exp",
    expressions: expressionTexts(testCase().formulas),
    scheme: "central" as const,
    tolerance: 1e-10,
    timeLimitSeconds: 10,
    encoding: "base64" as const,
    constants: true,
  };
  const roundTrip = (problem: typeof sampled) => {
    const text = new TextDecoder().decode(solveRequestBytes(problem, details).bytes());
    return { wire: JSON.parse(text), read: readSolveRequest(text).problem };
  };
  await t.step("named constants and scanned ones alike", () => {
    const { wire, read } = roundTrip(sampled);
    assert.deepEqual(wire.coefficients.c, { constant: 1, length: 45 });
    assert.deepEqual(wire.coefficients.e, { constant: -1, length: 45 });
    assert.ok("base64" in wire.coefficients.a);
    for (const k of ["a", "b", "c", "d", "e"] as const) {
      sameBits(read[k], sampled[k]);
    }
  });
  await t.step("a named value the array does not hold is not trusted", () => {
    // a stale hint: c is 1 everywhere but named as 3; a is named constant but varies
    const stale = { ...sampled, constantCoefficients: { c: 3, a: 1 } };
    const { wire, read } = roundTrip(stale);
    assert.deepEqual(wire.coefficients.c, { constant: 1, length: 45 }, "found by looking");
    assert.ok("base64" in wire.coefficients.a);
    sameBits(read.a, sampled.a);
  });
});
