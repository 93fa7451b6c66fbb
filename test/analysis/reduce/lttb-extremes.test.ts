import { describe, expect, test } from 'vitest';
import { lttbExtremes, lttbExtremesIndices } from '../../../analysis/reduce/lttb-extremes';
import { lttbIndices } from '../../../analysis/reduce/lttb';
import { DISPLAY_MAX_POINTS, reduceForDisplay } from '../../../analysis/reduce';
import { mulberry32 } from '../../../analysis/fit/random';

function spikySeries(n: number, seed: number): { x: Float64Array; y: Float64Array; hi: number; lo: number } {
  const rand = mulberry32(seed);
  const x = new Float64Array(n), y = new Float64Array(n);
  for (let i = 0; i < n; i++) { x[i] = i; y[i] = 40 + 5 * Math.sin(i / 500) + (rand() - 0.5); }
  // one-sample spikes at random places, as a boil-over or a glitching probe gives
  const hi = 1 + Math.floor(rand() * (n - 2)), lo = 1 + Math.floor(rand() * (n - 2));
  y[hi] = 99.5; y[lo] = -3;
  return { x, y, hi, lo };
}

function argMin(y: ArrayLike<number>): number { let k = 0; for (let i = 1; i < y.length; i++) if (y[i] < y[k]) k = i; return k; }
function argMax(y: ArrayLike<number>): number { let k = 0; for (let i = 1; i < y.length; i++) if (y[i] > y[k]) k = i; return k; }

describe('lttbExtremes', () => {
  // Issue 7 requirement ("it keeps extremes and endpoints"); endpoints as in Steinarsson 2013 §4.2.
  test.each([[10_000, 5, 1], [10_000, 100, 2], [100_003, 2000, 3], [7, 5, 4], [50_000, 2000, 5], [50_000, 6, 6]])(
    'keeps the endpoints and the global minimum and maximum (n = %i, target = %i, seed %i)',
    (n, target, seed) => {
      const { x, y } = spikySeries(n, seed);
      const idx = Array.from(lttbExtremesIndices(x, y, target));
      expect(idx.length).toBeLessThanOrEqual(target);
      expect(idx[0]).toBe(0);
      expect(idx[idx.length - 1]).toBe(n - 1);
      expect(idx).toContain(argMin(y));
      expect(idx).toContain(argMax(y));
    },
  );

  test('keeps one-sample spikes that plain LTTB may drop, and returns strictly ascending indices', () => {
    const { x, y, hi, lo } = spikySeries(200_000, 11);
    const idx = Array.from(lttbExtremesIndices(x, y, 200));
    expect(idx).toContain(hi);
    expect(idx).toContain(lo);
    for (let k = 1; k < idx.length; k++) expect(idx[k]).toBeGreaterThan(idx[k - 1]);
  });

  // Our construction: every bucket also contributes its own min and max, so the reduced series
  // spans the same y range as the raw one on every bucket, not only globally.
  test('keeps the minimum and maximum of every bucket and every plain-LTTB point', () => {
    const { x, y } = spikySeries(9_002, 12);
    const target = 302; // 100 buckets of 90 points
    const idx = new Set(lttbExtremesIndices(x, y, target));
    for (let b = 0; b < 100; b++) {
      const from = 1 + b * 90;
      const slice = y.subarray(from, from + 90);
      expect(idx.has(from + argMin(slice))).toBe(true);
      expect(idx.has(from + argMax(slice))).toBe(true);
    }
    for (const i of lttbIndices(x, y, 102)) expect(idx.has(i)).toBe(true);
  });

  test('returns a series of target points or fewer whole (common practice)', () => {
    const r = lttbExtremes([0, 1, 2, 3, 4], [3, 1, 4, 1, 5], 5);
    expect(Array.from(r.indices)).toEqual([0, 1, 2, 3, 4]);
    expect(Array.from(r.y)).toEqual([3, 1, 4, 1, 5]);
  });

  test('refuses a target below 5, which cannot hold both endpoints and both extremes (our policy)', () => {
    expect(() => lttbExtremesIndices([0, 1, 2, 3, 4, 5], [0, 1, 2, 3, 4, 5], 4)).toThrow(/at least 5, got 4/);
  });
});

describe('reduceForDisplay', () => {
  test('passes a series of at most 2,000 points through unchanged (issue 7 display limit)', () => {
    const { x, y } = spikySeries(DISPLAY_MAX_POINTS, 1);
    const r = reduceForDisplay(x, y);
    expect(r.reduced).toBe(false);
    expect(r.x.length).toBe(DISPLAY_MAX_POINTS);
  });

  test('reduces a longer series to at most 2,000 points, keeping extremes by default (issue 7)', () => {
    const { x, y } = spikySeries(1_000_000, 2);
    const r = reduceForDisplay(x, y);
    expect(r.reduced).toBe(true);
    expect(r.x.length).toBeLessThanOrEqual(DISPLAY_MAX_POINTS);
    expect(Math.max(...r.y)).toBe(99.5);
    expect(Math.min(...r.y)).toBe(-3);
    expect(r.x[0]).toBe(0);
    expect(r.x[r.x.length - 1]).toBe(999_999);
  });

  test('uses plain LTTB with exactly maxPoints points when asked (Steinarsson 2013)', () => {
    const { x, y } = spikySeries(10_000, 3);
    const r = reduceForDisplay(x, y, { maxPoints: 300, keepExtremes: false });
    expect(Array.from(r.indices)).toEqual(Array.from(lttbIndices(x, y, 300)));
  });
});
