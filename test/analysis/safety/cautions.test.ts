import { describe, expect, test } from 'vitest';
import { deadHeadingCaution, mergeCautions, sourceAboveBoilingCaution, temperatureCautions } from '../../../analysis/safety/cautions';

describe('temperature cautions (DOMAIN.md §5, §3.7)', () => {
  test.each([
    [38, []],
    [40, []],
    [40.5, ['spa-limit']], // CPSC 104 °F / UL 1563 40 °C spa limit
    [50, ['scald', 'spa-limit']], // 49 °C (120 °F) scald caution
    [61, ['scald-seconds', 'scald', 'spa-limit']], // 60 °C (140 °F) burns in < 5 s, check value #18 [39]
    [96, ['near-boiling', 'scald-seconds', 'scald', 'spa-limit']],
  ])('%s °C raises %j', (t, codes) => {
    expect(temperatureCautions(t, 'outlet').map((c) => c.code)).toEqual(codes);
  });
  test('each caution carries level, threshold, value and a message that defers to local codes', () => {
    const [c] = temperatureCautions(61, 'pool');
    expect(c).toMatchObject({ level: 'danger', thresholdC: 60, valueC: 61, where: 'pool' });
    expect(c.message).toMatch(/local codes/);
  });
  test('dead-heading caution is a danger', () => {
    expect(deadHeadingCaution('step 2')).toMatchObject({ code: 'dead-heading', level: 'danger' });
  });
  test('a source above boiling raises its own caution', () => {
    expect(sourceAboveBoilingCaution(150, 99.97)?.code).toBe('above-boiling-source');
    expect(sourceAboveBoilingCaution(90, 99.97)).toBeNull();
  });
  test('merging keeps the highest value per code and place, most severe first', () => {
    const m = mergeCautions(temperatureCautions(45, 'outlet'), temperatureCautions(52, 'outlet'));
    expect(m.map((c) => [c.code, c.valueC])).toEqual([['scald', 52], ['spa-limit', 52]]);
  });
  test('NaN is a TypeError', () => expect(() => temperatureCautions(Number.NaN, 'x')).toThrow(TypeError));
});

import { planCautions } from '../../../analysis/safety/plan-check';

describe('test-plan check (DOMAIN.md §5 dead-heading)', () => {
  test('zero flow or a closed valve on a heated coil is a danger; an unheated step is not', () => {
    const c = planCautions([
      { flowM3PerS: 1e-4 },
      { flowM3PerS: 0, label: 'shut-off test' },
      { flowM3PerS: 1e-4, valveClosed: true },
      { flowM3PerS: 0, heated: false },
    ]);
    expect(c.map((x) => x.where)).toEqual(['shut-off test', 'step 3']);
    expect(c.every((x) => x.level === 'danger' && x.code === 'dead-heading')).toBe(true);
  });
  test('a NaN flow is a TypeError naming the step', () => {
    expect(() => planCautions([{ flowM3PerS: Number.NaN }])).toThrow(/steps\[0\]\.flowM3PerS/);
  });
});
