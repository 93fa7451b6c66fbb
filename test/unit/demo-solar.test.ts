import { describe, expect, test } from 'vitest';
import { collectorTest } from '../../analysis/performance/collector-test';
import { resolveCriteria, segmentLog } from '../../analysis/segment';
import { collectorPeriod } from '../../app/_lib/imports/log-trials';
import { segmentChannels } from '../../app/_lib/imports/log-channels';
import { SOLAR_CURVE, SOLAR_LOG_DAY, SOLAR_LOG_MAPPING, solarLogCsv } from '../../fixtures/demo-solar';

/** The logged day's channels in SI, read straight from the CSV (the import's own reader is tested in test/app/sensor-import.test.ts). */
function channels() {
  const rows = solarLogCsv().trim().split('\n').slice(1).map((l) => l.split(','));
  const col = (j: number, k = 1) => Float64Array.from(rows, (r) => Number(r[j]) * k);
  const t0 = Date.parse(rows[0][0]);
  return {
    rows,
    ch: segmentChannels({
      timeS: Float64Array.from(rows, (r) => (Date.parse(r[0]) - t0) / 1000), inletTempC: col(4), outletTempC: col(5), flowM3PerS: col(6, 1 / 60_000),
      ambientTempC: col(2), irradianceWPerM2: col(1), windMPerS: col(3),
    }),
  };
}

describe('demo solar collector: the logged day', () => {
  test('is deterministic and bounded: the same 10-s file on every machine, 4,680 rows with the mapped columns', () => {
    const csv = solarLogCsv();
    expect(csv).toBe(solarLogCsv());
    const lines = csv.trim().split('\n');
    expect(lines.length - 1).toBe((SOLAR_LOG_DAY.hours * 3600) / SOLAR_LOG_DAY.stepS);
    expect(lines[0].split(',')).toEqual(SOLAR_LOG_MAPPING.columns.map((c) => c.header));
  });

  test('the ISO 9806 steadiness preset finds its seventeen steady periods, and the steady-state fit of them covers the invented curve with its 95 % intervals, leaving out the cloudy one', () => {
    const { ch } = channels();
    const seg = segmentLog(ch, resolveCriteria('collector'));
    expect(seg.segments).toHaveLength(17);
    const trials = seg.segments.map((s) => {
      const sun = collectorPeriod(ch, s.startIndex, s.endIndex, s.mean);
      return { flowM3PerS: s.mean.flowM3PerS, inletTempC: s.mean.inletTempC, outletTempC: s.mean.outletTempC, ambientTempC: s.mean.ambientTempC!, irradianceWPerM2: sun.irradianceWPerM2!, windMPerS: sun.windMPerS, spread: sun.spread };
    });
    const r = collectorTest({ areaM2: SOLAR_CURVE.areaM2, areaBasis: 'gross', trials });
    if (!r.ok) throw new Error(r.reason);
    // the truth is the invented curve the file was made from (fixtures/demo-solar.ts), in the ISO 9806 steady-state form
    for (const [e, truth] of [[r.eta0, SOLAR_CURVE.eta0!], [r.a1WPerM2K, SOLAR_CURVE.a1WPerM2K], [r.a2WPerM2K2, SOLAR_CURVE.a2WPerM2K2]] as const) {
      expect(e.ciLow).toBeLessThan(truth);
      expect(e.ciHigh).toBeGreaterThan(truth);
    }
    expect(r.n).toBe(16);
    // inside the test conditions of the standard (irradiance above 800 W/m², wind 2–4 m/s, four inlets, the first near the air): no warnings
    expect(r.warnings).toEqual([]);
    // ISO 9806 steady-state limits: irradiance within ±50 W/m² of the period mean (DOMAIN.md §2.4)
    expect(r.excluded).toEqual([{ index: 8, reasons: [expect.stringMatching(/irradiance varied by [\d.]+ W\/m² \(limit ±50\)/)] }]);
  });
});
