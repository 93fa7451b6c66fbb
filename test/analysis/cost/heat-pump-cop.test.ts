import { describe, expect, test } from 'vitest';
import { copAtAirTemp, type CopPoint } from '../../../analysis/cost/heat-pump-cop';
import { usefulHeatCost } from '../../../analysis/cost/useful-heat-cost';

// An illustrative user table (not a rating of any unit): COP falls as the air cools (DOMAIN.md §6 [2, 2b]).
// Air temperatures near the rating points recalled in DOMAIN.md §4 (80.6 °F ≈ 27 °C, 50 °F = 10 °C; from memory).
const TABLE: CopPoint[] = [{ airTempC: 27, cop: 5 }, { airTempC: 10, cop: 3.5 }, { airTempC: 18, cop: 4.3 }];

describe('heat-pump COP by air temperature (DOMAIN.md §6)', () => {
  test.each([
    [27, 5], [10, 3.5], [18, 4.3], // the rows, in any order
    [14, 3.9], [22.5, 4.65], // linear between rows (computed)
  ])('%s °C air → COP %s', (t, cop) => {
    const r = copAtAirTemp(TABLE, t);
    expect(r.cop).toBeCloseTo(cop, 12);
    expect(r).toMatchObject({ clamped: false, note: null });
  });
  test('outside the table the end value is held, with a note', () => {
    const cold = copAtAirTemp(TABLE, 4);
    expect(cold).toMatchObject({ cop: 3.5, clamped: true });
    expect(cold.note).toMatch(/4 °C air is below the COP table \(10–27 °C\): the COP at 10 °C is used/);
    expect(copAtAirTemp(TABLE, 35)).toMatchObject({ cop: 5, clamped: true });
  });
  test('a one-row table is a single COP, held everywhere else', () => {
    expect(copAtAirTemp([{ airTempC: 27, cop: 5 }], 27)).toMatchObject({ cop: 5, clamped: false });
    expect(copAtAirTemp([{ airTempC: 27, cop: 5 }], 20)).toMatchObject({ cop: 5, clamped: true });
  });
  test.each([
    [[], 20, /at least one row/],
    [[{ airTempC: 10, cop: 0 }], 20, /copTable\[0\]\.cop/],
    [[{ airTempC: Number.NaN, cop: 3 }], 20, /copTable\[0\]\.airTempC/],
    [[{ airTempC: 10, cop: 3 }, { airTempC: 10, cop: 4 }], 20, /repeats the air temperature 10/],
    [TABLE, Number.NaN, /airTempC/],
  ])('refuses %j at %s °C', (table, t, msg) => expect(() => copAtAirTemp(table as CopPoint[], t)).toThrow(msg));
});

describe('useful-heat cost with a COP table (DOMAIN.md §6, EIA factors [24])', () => {
  test('at a table row it equals the single-COP cost: $0.15/kWh, COP 5 → $0.879 per useful therm (check value #16)', () => {
    const r = usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.15, copTable: TABLE, airTempC: 27 });
    expect(r.perUsefulTherm).toBeCloseTo(0.879, 3);
    expect(r.perUsefulTherm).toBe(usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.15, efficiency: 5 }).perUsefulTherm);
    expect(r.copAtAir).toMatchObject({ cop: 5, clamped: false });
  });
  test('cold air costs more: COP 3.9 at 14 °C → $0.15 × 29.31 / 3.9 per useful therm (computed)', () => {
    const r = usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.15, copTable: TABLE, airTempC: 14 });
    expect(r.efficiency).toBeCloseTo(3.9, 12);
    expect(r.perUsefulTherm).toBeCloseTo((0.15 * 29.31) / 3.9, 3);
  });
  test('a clamped reading carries its note into the result', () => {
    expect(usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.15, copTable: TABLE, airTempC: 2 }).copAtAir?.note).toMatch(/below the COP table/);
  });
  test('the single-COP call is unchanged and has no table reading', () => {
    expect('copAtAir' in usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.15, efficiency: 5 })).toBe(false);
  });
  test.each([
    [{ fuel: 'propane', pricePerUnit: 3, copTable: TABLE, airTempC: 20 }, /heat-pump fuel only/],
    [{ fuel: 'heat-pump', pricePerUnit: 0.15, copTable: TABLE, airTempC: 20, efficiency: 4 }, /not both/],
    [{ fuel: 'heat-pump', pricePerUnit: 0.15, copTable: TABLE }, /airTempC is required/],
    [{ fuel: 'heat-pump', pricePerUnit: 0.15, airTempC: 20 }, /airTempC is used only with copTable/],
  ] as const)('refuses %j', (i, msg) => expect(() => usefulHeatCost(i as never)).toThrow(msg));
});
