/**
 * A small seeded pseudo-random generator for reproducible tests: mulberry32 (Tommy Ettinger's
 * 32-bit generator, public domain) and standard normal deviates by the Box–Muller transform. Not
 * for cryptography.
 *
 * @module
 */
/** Returns a function giving uniform deviates in [0, 1) from a 32-bit seed (mulberry32). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Returns a function giving standard normal deviates (Box–Muller) from a uniform generator. */
export function normalDeviates(uniform: () => number): () => number {
  return () => {
    // 1 − u lies in (0, 1], so the logarithm is finite
    const u = 1 - uniform();
    const v = uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}
