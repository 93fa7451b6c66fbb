/**
 * Seeded uniform pseudo-random numbers in [0, 1): the mulberry32 generator (32-bit state, period
 * 2³²), adequate for resampling and multi-start, not for cryptography.
 *
 * @param seed - any integer (taken modulo 2³²)
 * @returns a function giving the next number on each call
 * @example const rand = mulberry32(42); rand() // same value on every run
 */
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
