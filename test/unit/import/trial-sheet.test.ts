import { describe, expect, test } from 'vitest';
import { readDelimited } from '@/app/_lib/imports/read-delimited';
import { suggestMapping } from '@/app/_lib/imports/auto-map';
import { importTrialSheet, type CellTable } from '@/app/_lib/imports/import-trial-sheet';
import { checkTrialRow, trialRowSchema } from '@/app/_lib/rigs/trial-rule';
import type { ConfirmedMappingInput } from '@/app/_lib/imports/apply-mapping';
import type { DecimalSeparator } from '@/app/_lib/imports/detect-dialect';
import { fixture } from './helpers';

const GAL = 3.785411784e-3; // m³, NIST SP 811 B.8 (exact)
const LPM = 1e-3 / 60; // m³/s per L/min

/** The page's default: take every suggestion as confirmed. */
function acceptSuggestions(t: CellTable, decimal: DecimalSeparator, extra: Partial<ConfirmedMappingInput> = {}): ConfirmedMappingInput {
  const s = suggestMapping(t.header, t.rows.slice(0, 20), decimal);
  return {
    shape: 'trialSheet',
    decimal,
    columns: s.columns.filter((c) => c.field).map((c) => ({ column: c.column, header: c.header, field: c.field!, unit: c.unit ?? undefined })),
    ...extra,
  };
}

describe('trial sheets saved by LibreOffice, mapped and converted to SI', () => {
  test('German semicolon CSV with decimal commas (fixtures/import/trials-de.csv)', async () => {
    const t = await readDelimited(fixture('trials-de.csv'), { fileName: 'trials-de.csv' });
    const r = importTrialSheet(t, acceptSuggestions(t, t.dialect.decimal), { file: 'trials-de.csv' });
    expect(r.errorCount).toBe(0);
    expect(r.okCount).toBe(5);
    const first = r.rows[0];
    expect(first.ok).toBe(true);
    if (!first.ok) return;
    expect(first.line).toBe(2);
    expect(first.row.time).toEqual({ kind: 'datetime', iso: '2026-05-02T10:15:00', epochS: Date.UTC(2026, 4, 2, 10, 15) / 1000 });
    expect(first.row.inletTempC).toBeCloseTo(14.2, 12);
    expect(first.row.outletTempC).toBeCloseTo(38.6, 12);
    expect(first.row.ambientTempC).toBeCloseTo(17.5, 12);
    expect(first.row.bucketVolumeM3).toBeCloseTo(0.01, 15);
    expect(first.row.fillTimesS).toEqual([42.3, 41.8]);
    // V̇ = V / t̄ (DOMAIN.md §2.1): 10 L / 42.05 s
    expect(first.row.flowM3PerS).toBeCloseTo(0.01 / 42.05, 15);
    expect(first.row.flowSource).toBe('bucket');
    expect(first.row.notes).toBe('Holz nachgelegt');
  });

  test('°F, US gallons and month-first dates (fixtures/import/trials-imperial.csv)', async () => {
    const t = await readDelimited(fixture('trials-imperial.csv'));
    const m = acceptSuggestions(t, '.');
    expect(m.columns.map((c) => c.unit)).toEqual(['datetime', 'degF', 'degF', 'gal', 's', 's', 'degF', undefined]);
    const r = importTrialSheet(t, m);
    expect(r.errorCount).toBe(0);
    const first = r.rows[0];
    if (!first.ok) throw new Error('row 2 should pass');
    // t/°C = (t/°F − 32)/1.8 (NIST SP 811 B.9): 59 °F = 15 °C, 104 °F = 40 °C, 66.2 °F = 19 °C
    expect(first.row.inletTempC).toBeCloseTo(15, 12);
    expect(first.row.outletTempC).toBeCloseTo(40, 12);
    expect(first.row.ambientTempC).toBeCloseTo(19, 12);
    expect(first.row.bucketVolumeM3).toBeCloseTo(5 * GAL, 15);
    expect(first.row.flowM3PerS).toBeCloseTo((5 * GAL) / 74.8, 15);
    expect(first.row.time).toMatchObject({ kind: 'datetime', iso: '2026-05-14T09:40:00' });
    const second = r.rows[1];
    if (!second.ok) throw new Error('row 3 should pass');
    expect(second.row.outletTempC).toBeCloseTo(37, 12); // 98.6 °F = 37 °C (SP 811 B.9)
  });

  test('ambiguous slashed dates are errors until the engineer chooses the order, then they read', async () => {
    const t = await readDelimited('date,inlet (°C),outlet (°C),flow (L/min)\n05/02/2026 10:00,15,35,10\n');
    const ask = importTrialSheet(t, acceptSuggestions(t, '.'));
    expect(ask.rows[0].issues.map((i) => [i.column, i.message])).toEqual([['date', '"05/02/2026 10:00" could be day/month or month/day; choose the date order']]);
    const dmy = importTrialSheet(t, acceptSuggestions(t, '.', { dateOrder: 'dmy' })).rows[0];
    expect(dmy.ok && dmy.row.time).toMatchObject({ iso: '2026-02-05T10:00:00' });
  });

  test('metadata lines above the header and clock times (fixtures/import/trials-metadata.csv)', async () => {
    const t = await readDelimited(fixture('trials-metadata.csv'));
    const r = importTrialSheet(t, acceptSuggestions(t, '.'));
    expect(r.rows.map((x) => x.line)).toEqual([6, 7, 8, 9]);
    const first = r.rows[0];
    if (!first.ok) throw new Error('line 6 should pass');
    expect(first.row.time).toEqual({ kind: 'clock', iso: '13:05:00', epochS: 13 * 3600 + 5 * 60 });
    expect(first.row.flowM3PerS).toBeCloseTo(6.1 * LPM, 15);
    expect(first.row.flowSource).toBe('meter');
  });

  test('the validation table of fixtures/import/trials-errors.csv: what and where, line by line', async () => {
    const t = await readDelimited(fixture('trials-errors.csv'), { fileName: 'trials-errors.csv' });
    const r = importTrialSheet(t, acceptSuggestions(t, '.'), { file: 'trials-errors.csv' });
    const byLine = new Map(r.rows.map((x) => [x.line, x]));
    const issues = (line: number) => byLine.get(line)!.issues.map((i) => [i.severity, i.code, i.column ?? null, i.message]);
    expect(byLine.get(2)).toMatchObject({ ok: true, issues: [] });
    expect(issues(3)).toEqual([['error', 'unreadable_cell', 'outlet (°C)', '"n/a" is not a number']]);
    expect(issues(4)).toEqual([['error', 'invalid', 'outlet (°C)', 'outlet temperature is missing']]);
    expect(issues(5)).toEqual([['error', 'invalid', 'fill 1 (s)', 'a fill time must be more than 0 s']]);
    expect(byLine.get(6)!.ok).toBe(true);
    expect(issues(6)).toEqual([['warning', 'outlet_below_inlet', 'outlet (°C)', 'outlet 14.1 °C is below inlet 15.2 °C: check the sensors are not swapped']]);
    expect(issues(7)).toEqual([
      ['warning', 'short_fill', 'fill 1 (s)', 'fill 1 took 2.4 s, under 3 s: use a bigger bucket'],
      ['warning', 'short_fill', 'fill 1 (s)', 'fill 2 took 2.5 s, under 3 s: use a bigger bucket'],
    ]);
    expect(issues(8)).toEqual([['warning', 'above_boiling', 'outlet (°C)', 'outlet 104 °C is at or above 100 °C: water that hot flashes to steam when released']]);
    const nine = byLine.get(9)!;
    expect(nine.ok && nine.row.outletTempC).toBeCloseTo(35, 12); // 95 °F = 35 °C (SP 811 B.9)
    expect(issues(10)).toEqual([['error', 'incomplete', 'bucket (L)', 'fill times without a bucket volume']]);
    // the one trial rule: a temperature outside −40…150 °C is a sensor or unit mistake (app/_lib/rigs/trial-rule.ts)
    expect(issues(11)).toEqual([['error', 'invalid', 'inlet (°C)', 'inlet temperature -300 °C is outside −40…150 °C']]);
    expect(issues(12)).toEqual([['error', 'unreadable_cell', 'time', 'day 31 does not exist in 2026-02']]);
    // the one trial rule: zero flow is refused on every path, as the API always did (a dead-headed coil)
    expect(byLine.get(13)!.ok).toBe(false);
    expect(issues(13)).toEqual([['error', 'invalid', 'flow (L/min)', 'flow must be more than 0 (zero flow through a heated coil is a dead-headed coil: steam risk)']]);
    expect(issues(14)).toEqual([['error', 'extra_cell', 'J', 'a value ("x") in column J, which has no header']]);
    expect(r).toMatchObject({ okCount: 5, errorCount: 8, warningCount: 3 });
    expect(r.notices).toEqual([
      'column "outlet (°C)" mixes units: 10 cells in °C (lines 2, 5, 6, 7, 8, …), 1 cell in °F (line 9); each cell was converted by its own unit — check that the column is one quantity',
    ]);
  });
});

describe('the row schema on its own (the same schema serves JSON and the hand-entry form)', () => {
  test('a flow reading or a bucket with fill times, nothing else', () => {
    expect(trialRowSchema.safeParse({ inletTempC: 15, outletTempC: 35, flowM3PerS: 2.5e-4 }).success).toBe(true);
    expect(trialRowSchema.safeParse({ inletTempC: 15, outletTempC: 35, bucketVolumeM3: 0.01, fillTimesS: [40] }).success).toBe(true);
    const none = trialRowSchema.safeParse({ inletTempC: 15, outletTempC: 35 });
    expect(none.success).toBe(false);
    expect(none.error?.issues[0].message).toBe('no flow: give a flow reading, or a bucket volume with at least one fill time');
    expect(trialRowSchema.safeParse({ inletTempC: 15, outletTempC: 35, bucketVolumeM3: 0.01 }).error?.issues[0].message).toBe('a bucket volume without any fill time');
  });

  test('the worked bucket example of DOMAIN.md §2.5: 18.93 L and 74.6 / 75.3 / 75.1 s give 0.2524 L/s = 15.14 L/min', () => {
    const r = checkTrialRow({ inletTempC: 15, outletTempC: 35, bucketVolumeM3: 18.93e-3, fillTimesS: [74.6, 75.3, 75.1] }, 7);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.row.flowM3PerS * 1000).toBeCloseTo(0.2524, 4);
    expect(r.row.flowM3PerS / LPM).toBeCloseTo(15.14, 2);
    expect(r.issues).toEqual([]);
  });

  test('a flow reading that disagrees with the bucket by more than 5 % is flagged, and the bucket flow wins', () => {
    const r = checkTrialRow({ inletTempC: 15, outletTempC: 35, bucketVolumeM3: 0.01, fillTimesS: [40], flowM3PerS: 2.0e-4 }, 3, { flowM3PerS: 'flow' });
    expect(r.ok && r.row.flowM3PerS).toBeCloseTo(2.5e-4, 15);
    expect(r.issues).toEqual([{ line: 3, severity: 'warning', code: 'flow_disagrees', field: 'flowM3PerS', column: 'flow', message: 'the flow reading differs from the bucket flow by 25 %; the bucket flow is used' }]);
  });

  test('a negative or zero flow is refused, as on every path (a dead-headed coil: DOMAIN.md §5)', () => {
    for (const flowM3PerS of [-1e-4, 0]) {
      const r = checkTrialRow({ inletTempC: 15, outletTempC: 35, flowM3PerS }, 4);
      expect(r.ok).toBe(false);
      expect(r.issues.map((i) => [i.field, i.message])).toEqual([['flowM3PerS', 'flow must be more than 0 (zero flow through a heated coil is a dead-headed coil: steam risk)']]);
    }
  });
});
