import { describe, expect, test } from 'vitest';
import { overviewIndices } from '../../../analysis/reduce/channel-overview';
import { mulberry32 } from '../../../analysis/fit/random';

/** A 1 Hz log of three channels with one-sample spikes at random places (a glitching probe, a pump hiccup). */
function log(n: number, seed: number) {
  const rand = mulberry32(seed);
  const t = new Float64Array(n), a = new Float64Array(n), b = new Float64Array(n), c = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = i;
    a[i] = 15 + 0.5 * Math.sin(i / 3000) + 0.02 * (rand() - 0.5);
    b[i] = 40 + 8 * Math.sin(i / 1200) + 0.02 * (rand() - 0.5);
    c[i] = 2.5e-4 * (1 + 0.2 * Math.sin(i / 5000)) + 1e-7 * (rand() - 0.5);
  }
  const spike = () => 1 + Math.floor(rand() * (n - 2));
  const spikes = { aHi: spike(), bLo: spike(), bHi: spike(), cLo: spike() };
  a[spikes.aHi] = 30; b[spikes.bLo] = 5; b[spikes.bHi] = 99; c[spikes.cLo] = 0;
  return { t, a, b, c, spikes };
}

const argMin = (y: ArrayLike<number>) => { let k = -1; for (let i = 0; i < y.length; i++) if (Number.isFinite(y[i]) && (k < 0 || y[i] < y[k])) k = i; return k; };
const argMax = (y: ArrayLike<number>) => { let k = -1; for (let i = 0; i < y.length; i++) if (Number.isFinite(y[i]) && (k < 0 || y[i] > y[k])) k = i; return k; };

describe('overviewIndices (one time base for several LTTB-reduced channels)', () => {
  // Issue 7: logs are reduced for display to ≤ 2,000 points, keeping extremes and endpoints
  // (LTTB after Steinarsson 2013, with each bucket's min and max: lttb-extremes.ts).
  test.each([[1_000_000, 2000, 1], [200_003, 2000, 2], [50_000, 500, 3], [10_000, 17, 4]])(
    'keeps at most maxPoints samples, both endpoints and every channel’s minimum and maximum (n = %i, max %i)',
    (n, max, seed) => {
      const { t, a, b, c, spikes } = log(n, seed);
      const idx = overviewIndices(t, [a, b, c], max);
      const kept = new Set(idx);
      expect(idx.length).toBeLessThanOrEqual(max);
      expect(idx[0]).toBe(0);
      expect(idx[idx.length - 1]).toBe(n - 1);
      for (let k = 1; k < idx.length; k++) expect(idx[k]).toBeGreaterThan(idx[k - 1]);
      for (const y of [a, b, c]) {
        expect(kept.has(argMin(y))).toBe(true);
        expect(kept.has(argMax(y))).toBe(true);
      }
      for (const s of Object.values(spikes)) expect(kept.has(s)).toBe(true);
    },
  );

  test('a log already short enough comes back whole', () => {
    const { t, a, b, c } = log(1500, 5);
    expect(Array.from(overviewIndices(t, [a, b, c], 2000))).toEqual(Array.from({ length: 1500 }, (_, i) => i));
  });

  test('missing readings (NaN) are skipped by their channel and a missing channel (null) is ignored', () => {
    const { t, a, b } = log(100_000, 6);
    for (let i = 40_000; i < 41_000; i++) a[i] = NaN;
    const idx = overviewIndices(t, [a, b, null], 2000);
    expect(idx.length).toBeLessThanOrEqual(2000);
    expect(new Set(idx).has(argMax(a))).toBe(true);
    expect(new Set(idx).has(argMin(b))).toBe(true);
  });

  test.each([
    [() => overviewIndices([0, 1, 2], [[1, 2]], 20), /channel 0 has 2 samples/],
    [() => overviewIndices([0, 2, 1], [[1, 2, 3]], 20), /non-decreasing/],
    [() => overviewIndices([0, NaN, 2], [[1, 2, 3]], 20), /x\[1\] must be a finite number/],
    [() => overviewIndices([0, 1, 2], [[1, 2, 3], [1, 2, 3], [1, 2, 3]], 16), /at least 17 for 3 channel/],
  ])('refuses malformed input with a message naming it (%#)', (f, msg) => expect(f).toThrow(msg));
});
