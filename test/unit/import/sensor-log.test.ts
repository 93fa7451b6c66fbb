import { describe, expect, test } from 'vitest';
import { openDelimited, readDelimited } from '@/app/_lib/imports/read-delimited';
import { createSensorLogBuilder } from '@/app/_lib/imports/sensor-log';
import type { ConfirmedMappingInput } from '@/app/_lib/imports/apply-mapping';
import { segmentLog } from '@/analysis/segment/segment-log';
import { fixture, importErrorOf } from './helpers';

const LPM = 1e-3 / 60; // m³/s per L/min

const logMapping = (header: string[]): ConfirmedMappingInput => ({
  shape: 'sensorLog',
  columns: [
    { column: 0, header: header[0], field: 'time', unit: 'datetime' },
    { column: 1, header: header[1], field: 'inletTemp', unit: 'degC' },
    { column: 2, header: header[2], field: 'outletTemp', unit: 'degC' },
    { column: 3, header: header[3], field: 'flow', unit: 'L/min' },
    ...(header[4] ? [{ column: 4, header: header[4], field: 'ambientTemp' as const, unit: 'degC' as const }] : []),
  ],
});

describe('sensor logs: rows → SI column arrays', () => {
  test('the fixture log streams in, converts and segments into its three set-points (fixtures/import/sensor-log-plateaus.csv)', async () => {
    const src = await openDelimited(fixture('sensor-log-plateaus.csv'), { batchSize: 50 });
    const b = createSensorLogBuilder(logMapping(src.header), src.header, { file: 'sensor-log-plateaus.csv' });
    for await (const batch of src.batches()) b.add(batch);
    const log = b.finish();
    expect(log.n).toBe(120);
    expect(log.rejectedCount).toBe(0);
    expect(log.timeOrigin).toEqual({ kind: 'datetime', iso: '2026-06-02T09:00:00', epochS: Date.UTC(2026, 5, 2, 9) / 1000 });
    expect(log.timeS[1]).toBe(15);
    expect(log.lines[0]).toBe(2);
    expect(log.flowM3PerS[0]).toBeCloseTo(9.6954 * LPM, 15);
    const seg = segmentLog(log, 'field');
    // set-points written by the generator: outlet 30 / 33 / 36 °C at 9 / 12 / 15 L/min
    expect(seg.segments.map((s) => [Math.round(s.mean.outletTempC), Math.round(s.mean.flowM3PerS / LPM)])).toEqual([[30, 9], [33, 12], [36, 15]]);
  });

  test('bad rows are left out and reported with line and column; the rest goes on', async () => {
    const text = [
      'time_s,T_in [C],T_out [C],flow [l/min]',
      '0,15,30,10', '1,15,30,10', '2,15,oops,10', '3,15,30,', '1,15,30,10', '4,-400,30,10', '5,15,30,10',
    ].join('\n');
    const t = await readDelimited(text);
    const b = createSensorLogBuilder({
      shape: 'sensorLog',
      columns: [
        { column: 0, header: 'time_s', field: 'time', unit: 's' },
        { column: 1, header: 'T_in [C]', field: 'inletTemp', unit: 'degC' },
        { column: 2, header: 'T_out [C]', field: 'outletTemp', unit: 'degC' },
        { column: 3, header: 'flow [l/min]', field: 'flow', unit: 'L/min' },
      ],
    }, t.header);
    b.add(t);
    const log = b.finish();
    expect(Array.from(log.timeS)).toEqual([0, 1, 5]);
    expect(Array.from(log.lines)).toEqual([2, 3, 8]);
    expect(log.rejectedCount).toBe(4);
    expect(log.issues.map((i) => [i.line, i.column, i.message])).toEqual([
      [4, 'T_out [C]', '"oops" is not a number'],
      [5, 'flow [l/min]', 'flow is missing or not a number'],
      [6, 'time_s', 'time does not increase (1 s after 1 s); the sample is left out'],
      [7, 'T_in [C]', 'inlet temperature is below absolute zero'],
    ]);
  });

  test('clock times roll over midnight', async () => {
    const t = await readDelimited('clock,in,out,flow (gpm)\n23:59:58,15,30,4\n23:59:59,15,30,4\n00:00:00,15,30,4\n00:00:01,15,30,4\n');
    const b = createSensorLogBuilder({
      shape: 'sensorLog',
      columns: [
        { column: 0, header: 'clock', field: 'time', unit: 'datetime' },
        { column: 1, header: 'in', field: 'inletTemp', unit: 'degC' },
        { column: 2, header: 'out', field: 'outletTemp', unit: 'degC' },
        { column: 3, header: 'flow (gpm)', field: 'flow', unit: 'gpm' },
      ],
    }, t.header);
    b.add(t);
    const log = b.finish();
    expect(Array.from(log.timeS)).toEqual([0, 1, 2, 3]);
    expect(log.timeOrigin).toEqual({ kind: 'clock', iso: '23:59:58' });
    // 1 US gpm = 3.785411784 L/min (NIST SP 811 B.8, gallon = 231 in³)
    expect(log.flowM3PerS[0]).toBeCloseTo((4 * 3.785411784e-3) / 60, 15);
  });

  test('a trial-sheet mapping is refused for a log, naming what is missing', async () => {
    const e = await importErrorOf(() => createSensorLogBuilder({ shape: 'sensorLog', columns: [{ column: 0, header: 'in', field: 'inletTemp', unit: 'degC' }, { column: 1, header: 'out', field: 'outletTemp', unit: 'degC' }] }, ['in', 'out'], { file: 'log.csv' }));
    expect(e.code).toBe('missing_column');
    expect(e.message).toBe('log.csv: no column is mapped to time, flow');
  });
});
