import assert from "node:assert/strict";
import type { SolveRecord } from "../result/mod.ts";
import { JournalWriter, readJournal, repairJournal, solveKey } from "./journal.ts";

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
  w.append(record(8), "digest");
  w.append(record(16), "digest");
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

Deno.test("a resumed journal drops a torn last line before appending, so no record is glued", () => {
  const dir = Deno.makeTempDirSync();
  const path = `${dir}/journal.jsonl`;
  const w = JournalWriter.open(path, { kind: "campaign", fingerprint: "f", startedAt: "now" });
  w.append(record(8), "digest");
  w.close();
  Deno.writeTextFileSync(path, '{"kind":"solve","rec', { append: true });
  const first = readJournal(Deno.readTextFileSync(path), path);
  assert.equal(repairJournal(path, first), '{"kind":"solve","rec');
  const again = JournalWriter.open(path);
  again.append(record(16), "digest");
  again.close();
  // a second resume reads both records: before the repair the new record was glued to the torn
  // line and the second read refused the journal
  const second = readJournal(Deno.readTextFileSync(path), path);
  assert.deepEqual(second.records.map((r) => r.nx), [8, 16]);
  assert.equal(second.torn, null);
  Deno.removeSync(dir, { recursive: true });
});

Deno.test("readJournal() refuses damaged records and names the line", async (t) => {
  const head = JSON.stringify({ kind: "campaign", fingerprint: "f", startedAt: "now" });
  const read = (line: string) => () => readJournal(`${head}\n${line}\n`, "j.jsonl");
  await t.step("a null line", () => {
    assert.throws(read("null"), /j\.jsonl: line 2 is not a journal entry/);
  });
  await t.step("a record with a field missing", () => {
    const r: Partial<SolveRecord> = record(8);
    delete r.h;
    assert.throws(
      read(JSON.stringify({ kind: "solve", record: r })),
      /line 2 has a solve record whose field h is missing \(expected a positive number\)/,
    );
  });
  await t.step("an unknown kind", () => {
    assert.throws(read('{"kind":"other"}'), /line 2 has kind "other"/);
  });
});
