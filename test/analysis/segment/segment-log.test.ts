import { describe, expect, test } from 'vitest';
import { PRESETS, resolveCriteria } from '../../../analysis/segment/steady-criteria';
import { segmentLog, segmentLogSteps } from '../../../analysis/segment/segment-log';
import { SlidingSum } from '../../../analysis/segment/window-sums';
import { blockMeans, segmentStats } from '../../../analysis/segment/segment-stats';
import { generatePlateauLog, mulberry32 } from '../../../analysis/segment/synthetic-log';

const LPM = 1e-3 / 60; // m³/s per L/min

const threePlateaus = () => generatePlateauLog([
  { durationS: 1800, inletTempC: 15, outletTempC: 40, flowM3PerS: 15 * LPM, ambientTempC: 20 },
  { durationS: 1800, inletTempC: 15, outletTempC: 30, flowM3PerS: 30 * LPM, ambientTempC: 20 },
  { durationS: 1800, inletTempC: 15, outletTempC: 50, flowM3PerS: 7.5 * LPM, ambientTempC: 21 },
], { seed: 3, tauS: 60, noise: { tempK: 0.02, flowFraction: 0.002 } });

describe('presets carry the numbers of DOMAIN.md §2.4', () => {
  test('laboratory, after ASHRAE 93 [12]: dTout/dt < 0.05 K/min, Tin ±1.0 K or ±2 %, flow ±2 % or ±0.005 gpm, ambient ±1.5 K, 15 min', () => {
    const c = PRESETS.laboratory;
    expect(c.maxOutletSlopeKPerS! * 60).toBeCloseTo(0.05, 12);
    expect([c.inletTolK, c.inletTolFraction, c.flowTolFraction, c.ambientTolK, c.minDurationS]).toEqual([1.0, 0.02, 0.02, 1.5, 900]);
    // 0.005 US gpm = 0.005 × 3.785411784 L / 60 s (NIST SP 811 B.8)
    expect(c.flowTolAbsM3PerS).toBeCloseTo(3.154509820e-7, 15);
  });

  test('collector, after ISO 9806 as described in [11]: flow ±1 %, Tin ±0.1 K, 30-s means, ≥ 15 min and ≥ 4 transit times', () => {
    const c = PRESETS.collector;
    expect([c.flowTolFraction, c.inletTolK, c.blockS, c.checkBlockMeans, c.minDurationS, c.minDurationTransits]).toEqual([0.01, 0.1, 30, true, 900, 4]);
  });

  test('field (our proposal): |dTout/dt| within 0.1–0.2 K/min, flow CV < 2 %, ≥ 5 min after ≥ 3 transit times', () => {
    const c = PRESETS.field;
    expect(c.maxOutletSlopeKPerS! * 60).toBeGreaterThanOrEqual(0.1);
    expect(c.maxOutletSlopeKPerS! * 60).toBeLessThanOrEqual(0.2);
    expect([c.maxFlowCv, c.minDurationS, c.settlingTransits]).toEqual([0.02, 300, 3]);
  });

  test('edits make the criteria "custom"; the same value keeps the preset name', () => {
    expect(resolveCriteria('field', { maxFlowCv: 0.03 })).toMatchObject({ preset: 'custom', maxFlowCv: 0.03, minDurationS: 300 });
    expect(resolveCriteria('field', { maxFlowCv: 0.02 }).preset).toBe('field');
  });

  test.each([
    [{ windowS: 0 }, 'windowS must be a number greater than 0, got 0'],
    [{ inletTolK: -1 }, 'inletTolK must be a number of 0 or more (or null), got -1'],
    [{ minDurationS: Number.NaN }, 'minDurationS must be a number greater than 0, got NaN'],
  ])('refuses %j with a RangeError that echoes it', (edit, message) => {
    expect(() => resolveCriteria('laboratory', edit)).toThrow(new RangeError(message));
  });
});

describe('segmentLog finds the steady plateaus of a known log', () => {
  const log = threePlateaus();
  const setPoints = [[40, 15], [30, 30], [50, 7.5]];

  test.each(['laboratory', 'collector', 'field'] as const)('%s: three segments, each inside its plateau, means at the set-points', (preset) => {
    const r = segmentLog(log, preset);
    expect(r.segments).toHaveLength(3);
    r.segments.forEach((s, k) => {
      const start = log.plateauStarts[k], end = (log.plateauStarts[k + 1] ?? log.timeS.length) - 1;
      // the set-point changes at `start`; a segment may run at most a few samples into the next transition
      expect(s.startIndex).toBeGreaterThanOrEqual(start);
      expect(s.endIndex).toBeLessThanOrEqual(end + 3);
      expect(s.durationS).toBeGreaterThanOrEqual(r.criteria.minDurationS);
      // first-order approach with τ = 60 s: what is left of a 10–20 K step after the settling seen here is < 0.05 K
      expect(Math.abs(s.mean.outletTempC - setPoints[k][0])).toBeLessThan(0.05);
      expect(Math.abs(s.mean.flowM3PerS / LPM - setPoints[k][1]) / setPoints[k][1]).toBeLessThan(0.002);
      expect(s.n).toBe(s.endIndex - s.startIndex + 1);
      expect(s.criteria).toBe(r.criteria);
      expect(s.blockStdError).not.toBeNull();
    });
    expect(r.rejected).toEqual([]);
    expect(r.gaps).toEqual([]);
  });

  test('the laboratory segments hold the ASHRAE limits over the whole period, not only per window', () => {
    for (const s of segmentLog(log, 'laboratory').segments) {
      expect(Math.abs(s.outletSlopeKPerS) * 60).toBeLessThan(0.05);
      expect(s.maxDeviation.inletK).toBeLessThanOrEqual(1.0);
      expect(s.maxDeviation.flowFraction).toBeLessThanOrEqual(0.02);
      expect(s.maxDeviation.ambientK!).toBeLessThanOrEqual(1.5);
    }
  });

  test('a steady outlet rising at 0.1 K/min fails the laboratory limit (0.05 K/min) but passes the field one (0.15 K/min)', () => {
    const n = 1800;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const ramp = {
      timeS: t,
      inletTempC: new Float64Array(n).fill(15),
      outletTempC: t.map((x) => 30 + (0.1 / 60) * x),
      flowM3PerS: new Float64Array(n).fill(10 * LPM),
    };
    expect(segmentLog(ramp, 'laboratory').segments).toEqual([]);
    const field = segmentLog(ramp, 'field').segments;
    expect(field).toHaveLength(1);
    expect(field[0].outletSlopeKPerS * 60).toBeCloseTo(0.1, 10);
  });

  test('a plateau shorter than the minimum is rejected with the reason', () => {
    const short = generatePlateauLog([
      { durationS: 1200, inletTempC: 15, outletTempC: 40, flowM3PerS: 15 * LPM },
      { durationS: 800, inletTempC: 15, outletTempC: 30, flowM3PerS: 30 * LPM },
    ], { seed: 2 });
    const r = segmentLog(short, 'laboratory');
    expect(r.segments).toHaveLength(1);
    expect(r.rejected).toHaveLength(1);
    expect(r.rejected[0].reason).toMatch(/^steady for \d+ s, shorter than the minimum 900 s$/);
  });

  test('settling from transit times: the field preset drops 3 transit times from the start of each run', () => {
    const withTransit = segmentLog(log, resolveCriteria('field', { transitTimeS: 40 }));
    const without = segmentLog(log, 'field');
    withTransit.segments.forEach((s, k) => expect(s.startTimeS - without.segments[k].startTimeS).toBeGreaterThanOrEqual(120 - 1));
  });

  test('a gap in the time base splits a plateau and is reported', () => {
    const keep = Array.from(log.timeS.keys()).filter((i) => i < 900 || i >= 960);
    const pick = (a: Float64Array) => Float64Array.from(keep, (i) => a[i]);
    const gapped = { timeS: pick(log.timeS), inletTempC: pick(log.inletTempC), outletTempC: pick(log.outletTempC), flowM3PerS: pick(log.flowM3PerS) };
    const r = segmentLog(gapped, 'field');
    expect(r.gaps).toEqual([{ afterIndex: 899, gapS: 61 }]);
    expect(r.maxGapS).toBe(5);
    for (const s of r.segments) expect(s.startTimeS >= 960 || s.endTimeS <= 899).toBe(true);
  });

  test('a run whose inlet drifts beyond ±1 K of its mean is cut so no period exceeds it', () => {
    const n = 3600;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const drifting = {
      timeS: t,
      inletTempC: t.map((x) => 15 + (3 / 3600) * x), // 3 K over an hour: 0.25 K per 300-s window
      outletTempC: t.map((x) => 35 + (3 / 3600) * x), // 0.05 K/min: at the laboratory limit
      flowM3PerS: new Float64Array(n).fill(10 * LPM),
    };
    const r = segmentLog(drifting, resolveCriteria('laboratory', { maxOutletSlopeKPerS: 0.1 / 60 }));
    expect(r.segments.length).toBeGreaterThanOrEqual(1);
    for (const s of r.segments) expect(s.maxDeviation.inletK).toBeLessThanOrEqual(1.0);
  });

  test('collector: tolerances apply to 30-s means, so sample noise beyond ±0.1 K still passes when the means hold', () => {
    const rnd = mulberry32(9);
    const n = 2400;
    const noisy = {
      timeS: Float64Array.from({ length: n }, (_, i) => i),
      inletTempC: Float64Array.from({ length: n }, () => 20 + 0.25 * (2 * rnd() - 1)),
      outletTempC: Float64Array.from({ length: n }, () => 40 + 0.02 * (2 * rnd() - 1)),
      flowM3PerS: Float64Array.from({ length: n }, () => 5 * LPM * (1 + 0.002 * (2 * rnd() - 1))),
    };
    expect(segmentLog(noisy, 'collector').segments).toHaveLength(1);
    expect(segmentLog(noisy, resolveCriteria('collector', { averagingS: 0 })).segments).toEqual([]);
  });
});

describe('segment statistics', () => {
  test('sample SD by Welford: 2, 4, 4, 4, 5, 5, 7, 9 has mean 5 and s = √(32/7) (textbook example, from memory)', () => {
    const y = [2, 4, 4, 4, 5, 5, 7, 9];
    const t = y.map((_, i) => i);
    const s = segmentStats({ timeS: t, inletTempC: y, outletTempC: y, flowM3PerS: y }, 0, 7, 2);
    expect(s.mean.inletTempC).toBeCloseTo(5, 14);
    expect(s.sd.inletTempC).toBeCloseTo(Math.sqrt(32 / 7), 14);
    expect(s.mean.ambientTempC).toBeNull();
  });

  test('standard error from block means (DOMAIN.md §2.3): blocks of 2 s → means 3, 4, 5, 8 → SE = s/√4', () => {
    const y = [2, 4, 4, 4, 5, 5, 7, 9];
    const t = y.map((_, i) => i);
    expect(blockMeans(t, y, 0, 7, 2)).toEqual([3, 4, 5, 8]);
    const s = segmentStats({ timeS: t, inletTempC: y, outletTempC: y, flowM3PerS: y }, 0, 7, 2);
    const m = [3, 4, 5, 8], mean = 5, sd = Math.sqrt(m.reduce((a, x) => a + (x - mean) ** 2, 0) / 3);
    expect(s.blocks).toBe(4);
    expect(s.blockStdError!.inletTempC).toBeCloseTo(sd / 2, 14);
  });

  test('a last block with too few samples is left out', () => {
    expect(blockMeans([0, 1, 2, 3, 4], [1, 1, 3, 3, 9], 0, 4, 2)).toEqual([1, 3]);
  });

  test('least-squares slopes in K/s', () => {
    const t = [0, 60, 120, 180];
    const s = segmentStats({ timeS: t, inletTempC: [15, 15, 15, 15], outletTempC: [30, 30.05, 30.1, 30.15], flowM3PerS: [1, 1, 1, 1] }, 0, 3, 60);
    expect(s.outletSlopeKPerS * 60).toBeCloseTo(0.05, 12);
    expect(s.inletSlopeKPerS).toBe(0);
  });
});

describe('segmentLog: degenerate input (STYLE.md §10)', () => {
  const ok = { timeS: [0, 1, 2], inletTempC: [1, 1, 1], outletTempC: [2, 2, 2], flowM3PerS: [1, 1, 1] };

  test.each([
    [{ ...ok, inletTempC: [1, 1] }, RangeError, 'inletTempC has 2 samples but timeS has 3'],
    [{ ...ok, outletTempC: [2, Number.NaN, 2] }, RangeError, 'outletTempC[1] is NaN, not a finite number'],
    [{ ...ok, timeS: [0, 2, 2] }, RangeError, 'timeS must increase: timeS[2] = 2 after 2'],
    [{ ...ok, ambientTempC: [1, 2] }, RangeError, 'ambientTempC has 2 samples but timeS has 3'],
  ])('refuses bad channels with the index and value', (log, type, message) => {
    expect(() => segmentLog(log, 'field')).toThrow(new type(message));
  });

  test('a missing channel is a TypeError', () => {
    const { flowM3PerS: _, ...rest } = ok;
    void _;
    expect(() => segmentLog(rest as typeof ok, 'field')).toThrow(new TypeError('flowM3PerS is required (an array of numbers)'));
  });

  test('fewer than three samples give no segments, not an error', () => {
    expect(segmentLog({ timeS: [0, 1], inletTempC: [1, 1], outletTempC: [2, 2], flowM3PerS: [1, 1] }, 'field').segments).toEqual([]);
  });
});

describe('segmentLogSteps: the same segmentation in slices', () => {
  test('run to the end it returns what segmentLog returns, and it pauses on a long log (ours: slices of 65,536 samples)', () => {
    const log = generatePlateauLog(Array.from({ length: 60 }, (_, k) => ({
      durationS: 1200, inletTempC: 15, outletTempC: 30 + (k % 7) * 3, flowM3PerS: (9 + (k % 5) * 3) * LPM, ambientTempC: 20,
    })), { seed: 9, tauS: 60, noise: { tempK: 0.02, flowFraction: 0.002 } });
    for (const preset of ['laboratory', 'collector', 'field'] as const) {
      const steps = segmentLogSteps(log, preset);
      let r = steps.next(), pauses = 0;
      while (!r.done) { pauses++; r = steps.next(); }
      expect(pauses).toBeGreaterThanOrEqual(2); // 72,000 samples: at least the window pass and the run pass pause once
      expect(r.value).toEqual(segmentLog(log, preset));
      expect(r.value.segments.length).toBeGreaterThan(10);
    }
  });

  test('a sliding window sum is the difference of prefix sums, bit for bit (the same additions in the same order)', () => {
    const rnd = mulberry32(4);
    const a = Float64Array.from({ length: 5000 }, () => 20 + rnd() * 1e3), b = Float64Array.from({ length: 5000 }, () => rnd() - 0.5);
    const prefix = new Float64Array(a.length + 1);
    for (let i = 0; i < a.length; i++) prefix[i + 1] = prefix[i] + (a[i] - a[0]) * (b[i] - b[0]);
    const w = new SlidingSum(a, a[0], b, b[0]);
    let s = 0;
    for (let i = 0; i < a.length; i++) {
      if (i === 2500) { w.restart(); s = i; } // a new span: the window starts empty at i
      w.add(i);
      while (i - s >= 37) w.drop(s++);
      expect(w.sum).toBe(prefix[i + 1] - prefix[s]);
    }
  });
});
