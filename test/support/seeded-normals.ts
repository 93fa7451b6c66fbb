/** Deterministic N(0, 1) draws (mulberry32 + Box–Muller), so every run of a test sees the same data. */
import { mulberry32 } from '../../analysis/fit/random';

/**
 * @param seed any integer
 * @param n how many draws
 * @example seededNormals(7, 3) // the same three numbers on every machine
 */
export function seededNormals(seed: number, n: number): number[] {
  const next = mulberry32(seed);
  return Array.from({ length: n }, () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next()));
}

/** A stream of N(0, 1) draws from one seed, for simulations that need many. */
export function normalStream(seed: number): () => number {
  const next = mulberry32(seed);
  return () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
}
