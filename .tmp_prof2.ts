import { loadCase } from "./cases/mod.ts";
import { encodeArray } from "./harness/protocol/mod.ts";
const c = await loadCase("smooth-baseline");
const p = c.sample(1024, 1024);
console.log(p.a.buffer.constructor.name, p.a.length);
for (let r = 0; r < 3; r++) {
  let t = performance.now(); encodeArray(p.a, "base64"); console.log("sampled", performance.now() - t);
  const plain = new Float64Array(p.a); t = performance.now(); encodeArray(plain, "base64"); console.log("plain", performance.now() - t);
  t = performance.now(); JSON.stringify({x: encodeArray(plain, "base64")}); console.log("plain+stringify", performance.now() - t);
  const s = encodeArray(plain, "base64") as {base64: string}; t = performance.now(); const j = '{"x":{"base64":"' + s.base64 + '"}}'; JSON.parse(j); console.log("parse", performance.now() - t);
}
