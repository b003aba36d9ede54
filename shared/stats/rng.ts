/**
 * A small seeded generator (mulberry32), so that a seed always gives the same sequence: the
 * demo history and the test generators use it. Not for anything secret.
 * Example: const next = rng(42); next() // a number in [0, 1)
 */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
