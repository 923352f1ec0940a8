import assert from "node:assert/strict";
import type { SolveRecord } from "../result/types.ts";
import { JournalWriter, readJournal, solveKey } from "./journal.ts";

function record(nx: number): SolveRecord {
  return {
    caseId: "c",
    solver: "s",
    nx,
    ny: nx,
    h: 1 / nx,
    unknowns: (nx + 1) ** 2,
    status: "ok",
    residualHistory: [1, 0.1],
    iterations: 1,
    converged: true,
    averageFactor: Number.NaN,
    asymptoticFactor: 0.1,
    seconds: 0.01,
  };
}

Deno.test("the journal keeps every appended solve and survives a torn last line", () => {
  const dir = Deno.makeTempDirSync();
  const path = `${dir}/journal.jsonl`;
  const w = JournalWriter.open(path, { kind: "campaign", fingerprint: "f", startedAt: "now" });
  w.append(record(8));
  w.append(record(16));
  w.close();
  // simulate a process killed in the middle of a write
  Deno.writeTextFileSync(path, '{"kind":"solve","rec', { append: true });
  const { header, records } = readJournal(Deno.readTextFileSync(path), path);
  assert.equal(header?.fingerprint, "f");
  assert.deepEqual(records.map((r) => r.nx), [8, 16]);
  // NaN is not JSON: it is stored as null
  assert.equal(records[0].averageFactor, null);
  assert.notEqual(solveKey(records[0]), solveKey(records[1]));
  Deno.removeSync(dir, { recursive: true });
});
