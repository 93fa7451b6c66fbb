import { describe, expect, test } from 'vitest';
import { lttb, lttbIndices } from '../../../analysis/reduce/lttb';
import { mulberry32 } from '../../../analysis/fit/random';

/**
 * A line-by-line rendering of the algorithm as Steinarsson (2013, "Downsampling Time Series for
 * Visual Representation", §4.2 and the reference implementation printed with it) states it: bucket
 * size every = (n − 2)/(threshold − 2), bucket i spans [⌊i·every⌋ + 1, ⌊(i + 1)·every⌋ + 1), the
 * next bucket's mean is the third vertex, triangle area ½|(ax − cx)(by − ay) − (ax − bx)(cy − ay)|.
 * Written here independently of the library, with plain arrays and no shared code.
 */
function paperLttb(xs: number[], ys: number[], threshold: number): number[] {
  const n = xs.length;
  if (threshold >= n || threshold === 0) return xs.map((_, i) => i);
  const sampled: number[] = [0];
  const every = (n - 2) / (threshold - 2);
  let a = 0;
  for (let i = 0; i < threshold - 2; i++) {
    let avgX = 0, avgY = 0;
    let avgStart = Math.floor((i + 1) * every) + 1;
    let avgEnd = Math.floor((i + 2) * every) + 1;
    avgEnd = avgEnd < n ? avgEnd : n;
    const len = avgEnd - avgStart;
    for (; avgStart < avgEnd; avgStart++) { avgX += xs[avgStart]; avgY += ys[avgStart]; }
    avgX /= len; avgY /= len;
    let from = Math.floor(i * every) + 1;
    const to = Math.floor((i + 1) * every) + 1;
    let maxArea = -1, next = from;
    for (; from < to; from++) {
      const area = Math.abs((xs[a] - avgX) * (ys[from] - ys[a]) - (xs[a] - xs[from]) * (avgY - ys[a])) * 0.5;
      if (area > maxArea) { maxArea = area; next = from; }
    }
    sampled.push(next);
    a = next;
  }
  sampled.push(n - 1);
  return sampled;
}

function noisySeries(n: number, seed: number): { x: number[]; y: number[] } {
  const rand = mulberry32(seed);
  const x: number[] = [], y: number[] = [];
  for (let i = 0; i < n; i++) { x.push(i * 2); y.push(20 + 10 * Math.sin(i / 40) + (rand() - 0.5) * 3); }
  return { x, y };
}

describe('lttb', () => {
  // Steinarsson 2013 §4.2: the first and last points are always selected.
  test.each([3, 10, 100, 999])('keeps the first and last points and returns exactly %i points', (target) => {
    const { x, y } = noisySeries(5000, 7);
    const idx = lttbIndices(x, y, target);
    expect(idx.length).toBe(target);
    expect(idx[0]).toBe(0);
    expect(idx[target - 1]).toBe(4999);
  });

  // Steinarsson 2013 §4.2 (the algorithm as printed); the rendering above.
  test.each([[1000, 50, 1], [1001, 37, 2], [20, 7, 3], [12345, 500, 4]])(
    'selects the same points as the paper’s algorithm (n = %i, target = %i, seed %i)',
    (n, target, seed) => {
      const { x, y } = noisySeries(n, seed);
      expect(Array.from(lttbIndices(x, y, target))).toEqual(paperLttb(x, y, target));
    },
  );

  // Worked by hand from the paper's rule: one bucket {1, 2, 3} between (0, 0) and (4, 0); twice the
  // area with vertex j is 4·|y_j|, so the 9 at index 2 wins.
  test('picks the point making the largest triangle, worked by hand', () => {
    expect(Array.from(lttbIndices([0, 1, 2, 3, 4], [0, 5, 9, -5, 0], 3))).toEqual([0, 2, 4]);
  });

  test('returns a short series whole (common practice: nothing to reduce)', () => {
    const r = lttb(new Float64Array([1, 2, 3]), [4, 5, 6], 10);
    expect(Array.from(r.indices)).toEqual([0, 1, 2]);
    expect(Array.from(r.x)).toEqual([1, 2, 3]);
    expect(Array.from(r.y)).toEqual([4, 5, 6]);
  });

  test('reads typed arrays and returns the coordinates of the kept indices', () => {
    const { x, y } = noisySeries(3000, 9);
    const r = lttb(Float64Array.from(x), Float64Array.from(y), 100);
    r.indices.forEach((i, k) => { expect(r.x[k]).toBe(x[i]); expect(r.y[k]).toBe(y[i]); });
    expect(Array.from(r.indices)).toEqual(paperLttb(x, y, 100));
  });

  test('keeps only the endpoints for a target of 2', () => {
    expect(Array.from(lttbIndices([0, 1, 2, 3], [1, 9, 9, 1], 2))).toEqual([0, 3]);
  });

  // STYLE.md §10: malformed input throws and echoes the bad value.
  test.each([
    [[0, 1, 2], [0, 1], 3, RangeError, /same length/],
    [[0, 1, 2], [0, Number.NaN, 2], 3, TypeError, /y\[1\].*NaN/],
    [[0, Infinity, 2], [0, 1, 2], 3, TypeError, /x\[1\]/],
    [[0, 2, 1], [0, 1, 2], 3, RangeError, /non-decreasing.*x\[2\] = 1/],
    [[0, 1, 2], [0, 1, 2], 1, RangeError, /at least 2, got 1/],
    [[0, 1, 2], [0, 1, 2], 2.5, RangeError, /got 2.5/],
  ] as const)('refuses malformed input %#', (x, y, target, type, message) => {
    expect(() => lttbIndices(x as readonly number[] as number[], y as readonly number[] as number[], target)).toThrow(type);
    expect(() => lttbIndices(x as readonly number[] as number[], y as readonly number[] as number[], target)).toThrow(message);
  });
});
