/**
 * Telling a sensor log from a trial sheet by its columns and the step between its first rows
 * (common practice: loggers record every 1–15 s, hand-written trials are minutes apart).
 */
import { describe, expect, test } from 'vitest';
import { readDelimited } from '@/app/_lib/imports/read-delimited';
import { suggestMapping } from '@/app/_lib/imports/auto-map';
import { logMappingFrom, suggestShape } from '@/app/_lib/imports/suggest-shape';
import { fixture } from './helpers';

async function shapeOf(name: string) {
  const t = await readDelimited(fixture(name));
  const s = suggestMapping(t.header, t.rows.slice(0, 50) as (string | number | null)[][], t.dialect.decimal);
  return { t, s, shape: suggestShape(s, t.dialect.decimal, t.header, t.rows as (string | number | null)[][], t.lines) };
}

describe('suggestShape', () => {
  test('a logger dump at 15 s is a sensor log, mapped with log fields only (fixtures/import/sensor-log-plateaus.csv)', async () => {
    const { s, shape } = await shapeOf('sensor-log-plateaus.csv');
    expect(shape).toMatchObject({ shape: 'sensorLog', medianIntervalS: 15 });
    expect(shape.reason).toBe('Its rows are 15 s apart: a sensor log, to be split into steady periods.');
    const m = logMappingFrom(s, '.');
    expect(m?.columns.map((c) => c.field)).toEqual(['time', 'inletTemp', 'outletTemp', 'flow', 'ambientTemp']);
  });

  test('trials 20 min apart stay a trial sheet, though they have the same columns (fixtures/import/trials-metadata.csv)', async () => {
    const { shape } = await shapeOf('trials-metadata.csv');
    expect(shape.shape).toBe('trialSheet');
  });

  test('bucket volume or fill-time columns make a trial sheet (fixtures/import/trials-de.csv)', async () => {
    const { shape } = await shapeOf('trials-de.csv');
    expect(shape).toMatchObject({ shape: 'trialSheet', reason: 'It has bucket volume or fill-time columns: one row per trial.' });
  });

  test('a short log, or one without flow, is not taken for a sensor log', async () => {
    const rows = Array.from({ length: 10 }, (_, i) => [`2026-06-01 08:00:${String(i).padStart(2, '0')}`, '14.5', '30.1', '9.0']);
    const header = ['timestamp', 'T_in [C]', 'T_out [C]', 'flow [l/min]'];
    const s = suggestMapping(header, rows);
    expect(suggestShape(s, '.', header, rows, rows.map((_, i) => i + 2))).toMatchObject({ shape: 'trialSheet', reason: 'Too few timed rows to be a sensor log.' });
    const noFlow = suggestMapping(header.slice(0, 3), rows.map((r) => r.slice(0, 3)));
    expect(suggestShape(noFlow, '.', header.slice(0, 3), rows.map((r) => r.slice(0, 3)), rows.map((_, i) => i + 2)).shape).toBe('trialSheet');
  });
});
