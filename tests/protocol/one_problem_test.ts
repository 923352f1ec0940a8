/**
 * The one sampled-problem type (problem/) against the wire: every library case, sampled on both
 * layouts, is written as a request in every encoding, checked against the field mapping of
 * docs/protocol.md ("Request": `coefficients` a–e and m, `source`, `conservative` k11/k12/k22,
 * bx/by/sigma and `faces`, `grid.x`/`grid.y`, `boundary`) decoded path by path here, read back,
 * and compared array by array, bit for bit where the encoding keeps every bit. Writing the read
 * problem again gives the same text: the wire is the outside reference of the mapping both ways.
 */
import assert from "node:assert/strict";
import { type CompiledCase, libraryIds, loadCase } from "../../cases/mod.ts";
import {
  type ArrayEncoding,
  buildSolveRequest,
  decodeArray,
  PROTOCOL_VERSION,
  PROTOCOL_VERSION_2,
  type ProtocolVersion,
  readSolveRequest,
  type RequestDetails,
  serializeMessage,
  solveRequestBytes,
  validateMessage,
  version1Misses,
} from "../../harness/protocol/mod.ts";
import { expressionTexts, sampleCase } from "../../harness/solvers/mod.ts";
import { faceCounts, pointCount, type SampledProblem, SIDES } from "../../problem/mod.ts";

/** An encoding of the arrays: plain numbers, base64, or base64 with the constant form. */
interface Encoding {
  name: string;
  encoding: ArrayEncoding;
  constants: boolean;
  /** Whether every bit survives (JSON numbers and the constant form drop the sign of a zero). */
  exact: boolean;
}

const ENCODINGS: Encoding[] = [
  { name: "numbers", encoding: "numbers", constants: false, exact: false },
  { name: "base64", encoding: "base64", constants: false, exact: true },
  { name: "base64 + constants", encoding: "base64", constants: true, exact: false },
];

function details(c: CompiledCase, e: Encoding, protocol: ProtocolVersion): RequestDetails {
  return {
    id: `${c.id}/r`,
    caseId: c.id,
    expressions: expressionTexts(c.formulas),
    scheme: "central",
    tolerance: 1e-10,
    timeLimitSeconds: 5,
    encoding: e.encoding,
    constants: e.constants,
    protocol,
  };
}

/** Same values bit for bit (`exact`), or equal as numbers (±0 alike), with the same length. */
function sameArray(got: Float64Array, want: Float64Array, exact: boolean, path: string): void {
  assert.equal(got.length, want.length, `${path}: length`);
  for (let k = 0; k < want.length; k++) {
    const same = exact ? Object.is(got[k], want[k]) : got[k] === want[k];
    if (!same) assert.fail(`${path}[${k}]: ${got[k]} on the wire, ${want[k]} sampled`);
  }
}

/** An optional array of the one type, with its documented meaning of absence (zeros). */
const orZeros = (v: Float64Array | undefined, length: number) => v ?? new Float64Array(length);

/**
 * The wire paths of docs/protocol.md and the arrays of the sampled problem they must carry
 * (written here from the protocol document, not from request.ts).
 */
function wireMapping(p: SampledProblem, protocol: ProtocolVersion): [string, Float64Array][] {
  const layout = p.layout ?? "vertex";
  const n = pointCount(layout, p.nx, p.ny);
  const rows: [string, Float64Array][] = [["/source", p.f]];
  if (p.conductivity) {
    const faces = faceCounts(layout, p.nx, p.ny);
    const k = p.conductivity;
    rows.push(
      ["/conservative/k11", p.a],
      ["/conservative/k22", p.c],
      // the one type holds m = 2·k12 at the points; halving a double is exact
      ["/conservative/k12", orZeros(p.m, n).map((v) => v / 2)],
      ["/conservative/bx", p.b],
      ["/conservative/by", p.d],
      ["/conservative/sigma", p.e],
      ["/conservative/faces/x/k11", k.alongX.k11],
      ["/conservative/faces/x/k12", orZeros(k.alongX.k12, faces.x)],
      ["/conservative/faces/y/k12", orZeros(k.alongY.k12, faces.y)],
      ["/conservative/faces/y/k22", k.alongY.k22],
    );
  } else {
    for (const name of ["a", "b", "c", "d", "e"] as const) {
      rows.push([`/coefficients/${name}`, p[name]]);
    }
    if (protocol === PROTOCOL_VERSION_2) rows.push(["/coefficients/m", orZeros(p.m, n)]);
  }
  if (p.coordinates && protocol === PROTOCOL_VERSION_2) {
    rows.push(["/grid/x", p.coordinates.x], ["/grid/y", p.coordinates.y]);
  }
  for (const side of SIDES) {
    const b = p.boundary[side];
    if (b.kind === "periodic") continue;
    rows.push([`/boundary/${side}/values`, b.values]);
    if (b.kind === "robin") {
      rows.push([`/boundary/${side}/alpha`, b.alpha], [`/boundary/${side}/beta`, b.beta]);
    }
  }
  return rows;
}

/** The value at a JSON pointer of the parsed message. */
function at(message: unknown, path: string): unknown {
  let v = message;
  for (const key of path.slice(1).split("/")) v = (v as Record<string, unknown>)[key];
  return v;
}

/** Every array of the one type by a path of its own, absent optional ones as zeros. */
function arraysOf(p: SampledProblem): Map<string, Float64Array> {
  const layout = p.layout ?? "vertex";
  const n = pointCount(layout, p.nx, p.ny);
  const out = new Map<string, Float64Array>();
  for (const name of ["a", "b", "c", "d", "e", "f"] as const) out.set(name, p[name]);
  out.set("m", orZeros(p.m, n));
  if (p.conductivity) {
    const faces = faceCounts(layout, p.nx, p.ny);
    out.set("alongX.k11", p.conductivity.alongX.k11);
    out.set("alongX.k12", orZeros(p.conductivity.alongX.k12, faces.x));
    out.set("alongY.k12", orZeros(p.conductivity.alongY.k12, faces.y));
    out.set("alongY.k22", p.conductivity.alongY.k22);
  }
  if (p.coordinates) {
    out.set("coordinates.x", p.coordinates.x).set("coordinates.y", p.coordinates.y);
  }
  for (const side of SIDES) {
    const b = p.boundary[side];
    if (b.kind === "periodic") continue;
    out.set(`${side}.values`, b.values);
    if (b.kind === "robin") out.set(`${side}.alpha`, b.alpha).set(`${side}.beta`, b.beta);
  }
  return out;
}

/** The first suggested grid of a case, with the case's interval ratio. */
function firstGrid(c: CompiledCase): [number, number] {
  const n = c.grids[0];
  return [n, n * c.intervalRatio];
}

Deno.test("every library case on both layouts goes to the wire where docs/protocol.md says and reads back bit for bit", async (t) => {
  for (const id of libraryIds()) {
    const c = await loadCase(id);
    const [nx, ny] = firstGrid(c);
    for (const layout of ["vertex", "cell"] as const) {
      const sent = sampleCase(c, nx, ny, layout);
      const protocols: ProtocolVersion[] = version1Misses(sent) === undefined
        ? [PROTOCOL_VERSION, PROTOCOL_VERSION_2]
        : [PROTOCOL_VERSION_2];
      for (const protocol of protocols) {
        for (const e of ENCODINGS) {
          await t.step(`${id}, ${layout}, ${nx}×${ny}, ${protocol.slice(-1)}, ${e.name}`, () => {
            const d = details(c, e, protocol);
            const text = serializeMessage(buildSolveRequest(sent, d));
            // the piecewise writer gives the very same bytes
            assert.equal(new TextDecoder().decode(solveRequestBytes(sent, d).bytes()), text);
            const wire = JSON.parse(text);
            assert.deepEqual(validateMessage("solve", wire), []);
            for (const [path, want] of wireMapping(sent, protocol)) {
              const w = at(wire, path);
              // a Robin weight that is one value along the side goes as that number
              const values = typeof w === "number"
                ? new Float64Array(want.length).fill(w)
                : decodeArray(w, path);
              sameArray(values, want, e.exact, path);
            }
            const { problem: got } = readSolveRequest(text);
            assert.equal(got.layout, layout);
            assert.deepEqual([got.nx, got.ny, got.domain], [sent.nx, sent.ny, sent.domain]);
            if (protocol === PROTOCOL_VERSION_2) {
              assert.equal(got.form, sent.form);
              assert.deepEqual(got.interfaces, sent.interfaces ?? { x: [], y: [] });
              assert.equal(got.singular === true, sent.singular === true);
            }
            const before = arraysOf(sent);
            const after = arraysOf(got);
            if (protocol === PROTOCOL_VERSION) before.delete("m"), after.delete("m");
            if (protocol === PROTOCOL_VERSION) {
              before.delete("coordinates.x"), before.delete("coordinates.y");
            }
            assert.deepEqual([...after.keys()].sort(), [...before.keys()].sort());
            for (const [path, want] of before) sameArray(after.get(path)!, want, e.exact, path);
            for (const side of SIDES) {
              assert.equal(got.boundary[side].kind, sent.boundary[side].kind);
            }
            // the mapping is a fixed point: the read problem writes the same line again
            assert.equal(serializeMessage(buildSolveRequest(got, d)), text);
          });
        }
      }
    }
  }
});
