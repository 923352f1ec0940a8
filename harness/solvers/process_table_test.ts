import assert from "node:assert/strict";
import {
  descendantsOf,
  parseProcessTable,
  parseProcStat,
  type ProcessEntry,
  readProcessTable,
} from "./process_table.ts";

Deno.test("parseProcStat() reads pid, parent, group, state and start time of a /proc stat line", async (t) => {
  // rows: lines as Linux 6 writes them; fields per proc_pid_stat(5): 1 pid, 2 (comm), 3 state,
  // 4 ppid, 5 pgrp, 22 starttime
  const rows: [string, ProcessEntry][] = [
    [
      "1 (process_api) S 0 0 0 0 -1 4194560 43067 198150770 0 6750 1011 3108 759046 211284 10 " +
      "-10 16 0 20 47611904 3065 18446744073709551615 1 1 0 0 0 0 0 4096 1256 0 0 0 17 1 0 0 " +
      "0 0 0 0 0 0 0 0 0 0 0",
      { pid: 1, ppid: 0, pgrp: 0, state: "S", startTime: 20 },
    ],
    [
      "10 (kworker/0:0H-events_highpri) I 2 0 0 0 -1 69238880 0 0 0 0 0 0 0 0 0 -20 1 0 20 0 0 " +
      "18446744073709551615 0 0 0 0 0 0 0 2147483647 0 1 0 0 17 0 0 0 0 0 0 0 0 0 0 0 0 0 0",
      { pid: 10, ppid: 2, pgrp: 0, state: "I", startTime: 20 },
    ],
  ];
  for (const [line, entry] of rows) {
    await t.step(line.slice(0, line.indexOf(")") + 1), () => {
      assert.deepEqual(parseProcStat(line), entry);
    });
  }
  await t.step("a name holding spaces and parentheses (a program may name itself so)", () => {
    const line = "4242 (a) S 1 2 3) Z 4241 4242 4242 0 -1 0 0 0 0 0 0 0 0 0 20 0 1 0 777 0 0";
    assert.deepEqual(parseProcStat(line), {
      pid: 4242,
      ppid: 4241,
      pgrp: 4242,
      state: "Z",
      startTime: 777,
    });
  });
  await t.step("text that is no stat line gives undefined", () => {
    for (const line of ["", "--marked--", "/proc/12/environ", "12 (x) S 1 2", "x (y) S 1 2 3"]) {
      assert.equal(parseProcStat(line), undefined, line);
    }
  });
});

Deno.test("parseProcessTable() reads the stat lines and, after the separator, the marked pids", () => {
  const stat = (pid: number, ppid: number) =>
    `${pid} (p) S ${ppid} ${pid} ${pid} 0 -1 0 0 0 0 0 0 0 0 0 20 0 1 0 ${pid * 10} 0 0`;
  const text = [stat(5, 1), stat(6, 5), "--marked--", "/proc/6/environ", "junk", ""].join("\n");
  const table = parseProcessTable(text);
  assert.deepEqual([...table.entries.keys()], [5, 6]);
  assert.equal(table.entries.get(6)?.startTime, 60);
  assert.deepEqual([...table.marked], [6]);
});

Deno.test("descendantsOf() follows parent pids down from the root, never up or sideways", async (t) => {
  const p = (pid: number, ppid: number): ProcessEntry => ({
    pid,
    ppid,
    pgrp: pid,
    state: "S",
    startTime: 0,
  });
  const table = new Map(
    [p(1, 0), p(10, 1), p(11, 10), p(12, 11), p(13, 10), p(20, 1), p(21, 20)].map((e) => [
      e.pid,
      e,
    ]),
  );
  await t.step("children, grandchildren and great-grandchildren, nearest first", () => {
    assert.deepEqual(descendantsOf(10, table).map((e) => e.pid), [11, 13, 12]);
  });
  await t.step("a process with no children has no descendants", () => {
    assert.deepEqual(descendantsOf(12, table), []);
  });
  await t.step("a pid not in the table has none", () => {
    assert.deepEqual(descendantsOf(99, table), []);
  });
  await t.step("a loop (pids reused while the table was read) ends", () => {
    const loop = new Map([[30, p(30, 31)], [31, p(31, 30)]]);
    assert.deepEqual(descendantsOf(30, loop).map((e) => e.pid), [31]);
  });
});

Deno.test("readProcessTable() lists a child of this process and finds it by the mark in its environment", async () => {
  const mark = `GRIDPROOF_TABLE_TEST=${crypto.randomUUID()}`;
  const [name, value] = mark.split("=");
  const marked = new Deno.Command("sleep", { args: ["30"], env: { [name]: value } }).spawn();
  const plain = new Deno.Command("sleep", { args: ["30"] }).spawn();
  try {
    const table = await readProcessTable({ mark });
    assert.ok(table, "/proc is readable on Linux");
    assert.equal(table.entries.get(marked.pid)?.ppid, Deno.pid);
    assert.equal(table.entries.get(plain.pid)?.ppid, Deno.pid);
    assert.deepEqual([...table.marked], [marked.pid]);
    const unmarked = await readProcessTable();
    assert.equal(unmarked?.marked.size, 0);
  } finally {
    marked.kill();
    plain.kill();
    await marked.status;
    await plain.status;
  }
});
