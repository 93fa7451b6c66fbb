import { describe, expect, test } from 'vitest';
import { generatePlateauLog, resolveCriteria, segmentLog } from '../../../analysis/segment';
import { liveSteadyState } from '../../../analysis/segment/live-steady';

// Two plateaus of 10 minutes (our synthetic log, analysis/segment/synthetic-log.ts), read by the field preset
// (|dTout/dt| < 0.15 K/min over 2 min, flow CV < 2 %, at least 5 min: DOMAIN.md §2.4)
const log = generatePlateauLog(
  [
    { durationS: 600, inletTempC: 15, outletTempC: 60, flowM3PerS: 1e-4 },
    { durationS: 600, inletTempC: 15, outletTempC: 45, flowM3PerS: 2e-4 },
  ],
  { intervalS: 1, tauS: 20, seed: 5 },
);
const field = resolveCriteria('field');
const upTo = (n: number) => ({ timeS: log.timeS.subarray(0, n), inletTempC: log.inletTempC.subarray(0, n), outletTempC: log.outletTempC.subarray(0, n), flowM3PerS: log.flowM3PerS.subarray(0, n) });

describe('the live steady-state signal', () => {
  test('waiting with fewer than three samples', () => {
    expect(liveSteadyState(upTo(2), field).state).toBe('waiting');
  });
  test('as the log grows: steady (too short) → record → changed after the step → steady again', () => {
    const at = (n: number) => liveSteadyState(upTo(n), field);
    expect(at(250).state).toBe('steady');
    expect(at(250).steadyForS).toBeLessThan(300);
    expect(at(590).state).toBe('record');
    expect(at(590).current!.durationS).toBeGreaterThanOrEqual(300);
    expect(at(640).state).toBe('changed');
    expect(at(1000).state).toMatch(/steady|record/);
  });
  test('a segment is final only once later windows cannot reach it, and then it is what segmentLog finds on the whole log', () => {
    expect(liveSteadyState(upTo(650), field).final).toHaveLength(0);
    const later = liveSteadyState(upTo(900), field);
    expect(later.final).toHaveLength(1);
    const whole = segmentLog(log, field).segments[0];
    expect(later.final[0].startIndex).toBe(whole.startIndex);
    expect(later.final[0].endIndex).toBe(whole.endIndex);
    expect(later.final[0].mean.outletTempC).toBeCloseTo(60, 0);
  });
});
