// Seeded random numbers for demo and benchmark data, so every run draws the
// same values.

/** mulberry32: a tiny seeded generator with good equidistribution for test data. */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by Box–Muller on a seeded uniform. */
export function seededNormal(uniform: () => number): () => number {
  return () => {
    // 1 − u keeps the logarithm's argument in (0, 1].
    const u = 1 - uniform();
    const v = uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}
