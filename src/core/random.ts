/**
 * Deterministic pseudo-random numbers, so synthetic data (demo workbooks, tests, benchmarks) are
 * reproducible from a seed. mulberry32 (T. Ettinger, public domain) and the Box–Muller transform
 * (Box & Muller 1958, Ann. Math. Statist. 29, 610).
 */

/** A uniform generator on [0, 1) from a 32-bit seed. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A standard normal deviate from a uniform source. */
export function gaussian(random: () => number): number {
  const u = Math.max(random(), 1e-300);
  const v = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
