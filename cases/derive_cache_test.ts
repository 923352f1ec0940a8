import assert from "node:assert/strict";
import { loadCase } from "./load.ts";
import { derivationOf } from "./derivation.ts";
import { derivationKey, readCacheEntry, writeCacheEntry } from "./derive_cache.ts";
import type { CompiledCase } from "./types.ts";

// The reference for every comparison is the same case derived without the cache (mathjs parse,
// differentiate, our compiler): a cached derivation must give bit-identical samples (exact
// identity, compared with Object.is so that -0 and NaN count too).

function sameArrays(label: string, p: ArrayLike<number>, q: ArrayLike<number>): void {
  assert.equal(p.length, q.length, `${label}: length`);
  for (let k = 0; k < p.length; k++) {
    if (!Object.is(p[k], q[k])) assert.fail(`${label}[${k}]: ${p[k]} against ${q[k]}`);
  }
}

function sameSamples(a: CompiledCase, b: CompiledCase, nx: number, ny: number): void {
  const p = a.sample(nx, ny) as unknown as Record<string, unknown>;
  const q = b.sample(nx, ny) as unknown as Record<string, unknown>;
  assert.deepEqual(Object.keys(p).sort(), Object.keys(q).sort());
  const walk = (label: string, u: unknown, v: unknown) => {
    if (u instanceof Float64Array && v instanceof Float64Array) sameArrays(label, u, v);
    else if (typeof u === "object" && u !== null && typeof v === "object" && v !== null) {
      for (const k of Object.keys(u)) {
        walk(`${label}.${k}`, (u as Record<string, unknown>)[k], (v as Record<string, unknown>)[k]);
      }
    } else if (typeof u !== "function") assert.deepEqual(u, v, label);
  };
  walk("problem", p, q);
  sameArrays("exact", a.sampleExact(nx, ny), b.sampleExact(nx, ny));
}

async function entries(folder: string): Promise<string[]> {
  const names: string[] = [];
  for await (const e of Deno.readDir(folder)) if (e.name.endsWith(".json")) names.push(e.name);
  return names.sort();
}

Deno.test("a cached derivation gives the uncached case's samples, formulas and expectations exactly", async () => {
  const cacheDir = await Deno.makeTempDir();
  try {
    // one case per operator form: five-point with convection, mixed term, flux form with interfaces
    for (const id of ["variable-all", "mixed-derivative", "layered-jump-100"]) {
      const plain = await loadCase(id);
      const cold = await loadCase(id, { cacheDir });
      const warm = await loadCase(id, { cacheDir });
      for (const kase of [cold, warm]) {
        sameSamples(plain, kase, 32, 32);
        sameSamples(plain, kase, 17, 9);
        assert.deepEqual(kase.formulas, plain.formulas);
        assert.deepEqual(kase.tex, plain.tex);
        assert.deepEqual(kase.expected, plain.expected);
        assert.deepEqual(kase.constantCoefficients, plain.constantCoefficients);
        assert.deepEqual(kase.expressions, plain.expressions);
      }
      assert.deepEqual(derivationOf(warm), derivationOf(plain));
    }
    assert.equal((await entries(cacheDir)).length, 3);
  } finally {
    await Deno.remove(cacheDir, { recursive: true });
  }
});

Deno.test("a changed case text or parameter misses the cache, and each gives its own uncached result", async () => {
  const dir = await Deno.makeTempDir();
  const cacheDir = `${dir}/cache`;
  try {
    const file = `${dir}/case.json`;
    const text = await Deno.readTextFile(new URL("./library/boundary-layer.json", import.meta.url));
    await Deno.writeTextFile(file, text);
    const first = await loadCase(file, { cacheDir });
    assert.equal((await entries(cacheDir)).length, 1);
    // one coefficient changed in the text: a new entry, and the case is the changed one
    const changed = JSON.parse(text);
    changed.coefficients = { ...changed.coefficients, e: "-2" };
    await Deno.writeTextFile(file, JSON.stringify(changed));
    const second = await loadCase(file, { cacheDir });
    assert.equal((await entries(cacheDir)).length, 2);
    sameSamples(await loadCase(file), second, 16, 16);
    assert.notDeepEqual(first.sample(16, 16).e, second.sample(16, 16).e);
    // another parameter value is another derivation
    const widths = Object.keys(changed.parameters ?? {});
    assert.ok(widths.length > 0, "boundary-layer has a parameter");
    const parameters = { [widths[0]]: 0.2 };
    const third = await loadCase(file, { cacheDir, parameters });
    assert.equal((await entries(cacheDir)).length, 3);
    sameSamples(await loadCase(file, { parameters }), third, 16, 16);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("a corrupt or foreign cache entry is ignored and rewritten", async () => {
  const cacheDir = await Deno.makeTempDir();
  try {
    const plain = await loadCase("robin-all");
    await loadCase("robin-all", { cacheDir });
    const [name] = await entries(cacheDir);
    const path = `${cacheDir}/${name}`;
    const good = await Deno.readTextFile(path);
    const key = name.slice(0, -".json".length);
    assert.ok(await readCacheEntry(cacheDir, key));
    const outer = JSON.parse(good);
    const tampered = [
      "{ not json",
      good.slice(0, good.length >> 1),
      // the body altered without its digest
      JSON.stringify({ ...outer, body: outer.body.replace(/"value":\d/, '"value":7') }),
      // a well-formed entry under another key
      JSON.stringify({ ...outer, key: "0".repeat(64) }),
    ];
    for (const bad of tampered) {
      await Deno.writeTextFile(path, bad);
      assert.equal(await readCacheEntry(cacheDir, key), undefined);
      sameSamples(plain, await loadCase("robin-all", { cacheDir }), 16, 16);
      assert.ok(await readCacheEntry(cacheDir, key), "the entry is written again");
    }
    // a valid entry of another case, stored under this case's name, is foreign
    const other = await loadCase("smooth-baseline", { cacheDir });
    const otherKey = await derivationKey(other.file!, other.parameters);
    const otherText = await Deno.readTextFile(`${cacheDir}/${otherKey}.json`);
    await Deno.writeTextFile(path, otherText);
    assert.equal(await readCacheEntry(cacheDir, key), undefined);
    sameSamples(plain, await loadCase("robin-all", { cacheDir }), 16, 16);
  } finally {
    await Deno.remove(cacheDir, { recursive: true });
  }
});

Deno.test("cache entries keep -0, NaN and infinite numbers", async () => {
  const cacheDir = await Deno.makeTempDir();
  try {
    const kase = await loadCase("smooth-baseline");
    const derivation = structuredClone(derivationOf(kase)!);
    const specials = [-0, NaN, Infinity, -Infinity];
    derivation.regions[0].source = {
      kind: "operator",
      op: "+",
      args: specials.map((value) => ({ kind: "number", value })),
    };
    const key = "f".repeat(64);
    await writeCacheEntry(cacheDir, key, {
      derivation,
      formulas: { text: kase.formulas, tex: kase.tex },
    });
    const read = await readCacheEntry(cacheDir, key);
    const source = read!.derivation.regions[0].source;
    assert.equal(source.kind, "operator");
    if (source.kind !== "operator") return;
    source.args.forEach((a, k) => {
      assert.equal(a.kind, "number");
      if (a.kind === "number") assert.ok(Object.is(a.value, specials[k]), `${a.value}`);
    });
  } finally {
    await Deno.remove(cacheDir, { recursive: true });
  }
});
