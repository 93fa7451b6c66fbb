/**
 * The cost-sheet block of a study against DOMAIN.md §6 and its check values (§8): prices are the
 * brief's illustrative inputs; heat contents are the EIA factors of analysis/cost/fuels.
 */
import { describe, expect, test } from 'vitest';
import { costExport, costView } from '../../../app/_lib/forecasts/cost-sheet';
import { DomainError } from '../../../app/_lib/server/errors';
import { costsSheet } from '../../../app/_lib/exports/result-sheets';
import type { StudyBlock } from '../../../entities/study';

const THERM_J = 105_505_585.262; // 100,000 Btu_IT (NIST SP 811)

describe('cost per useful therm, per degree and of the heat', () => {
  test('check value #16: $0.15/kWh at COP 5 → $0.879, propane $3.00/gal at η 0.82 → $4.00 per useful therm (EIA factors [24], computed)', () => {
    const hp = costView({ fuel: 'heat-pump', price: 0.15, efficiency: 5, heatFrom: 'pool', poolVolume: '15000 gal', rise: '1 degF' });
    expect(hp.perUsefulTherm).toBeCloseTo(0.879, 3);
    expect(hp.efficiencyIsCop).toBe(true);
    const lp = costView({ fuel: 'propane', price: 3, efficiency: 0.82, heatFrom: 'pool', poolVolume: '15000 gal', rise: '1 degF' });
    expect(lp.perUsefulTherm).toBeCloseTo(4.0, 2);
    // per useful kWh: 1 kWh = 3,412 Btu (EIA [24]) → 4.00 × 3,412 / 100,000
    expect(lp.perUsefulKWh).toBeCloseTo(4.0 * 0.03412, 3);
  });

  test('check value #15: 2,248 useful therms of gas at $1/therm and η 0.8 cost the $2,810 of the DOE Atlanta uncovered pool ([4e], computed)', () => {
    const c = costView({ fuel: 'natural-gas', price: 1, efficiency: 0.8, heatFrom: 'energy', heat: '2248 therm' });
    expect(c.heatCost).toBeCloseTo(2810, 6);
    expect(c.fuelQuantity).toBeCloseTo(2810, 6); // therms bought
    expect(c.perDegF).toBeNull();
  });

  test.each([
    // fuel, price, η/COP, $/°F for 15,000 gal — DOMAIN.md §6 table (8.33 Btu/(gal·°F); we use IF97 water at 25 °C, 0.3 % lower)
    ['natural-gas', 1.5, 0.82, 2.29],
    ['propane', 3.0, 0.82, 5.0],
    ['electric-resistance', 0.15, 1, 5.49],
    ['heat-pump', 0.15, 5, 1.1],
    ['wood', 250, 0.3, 5.21],
  ] as const)('%s at %s per unit and %s: %s per °F for 15,000 gal', (fuel, price, eff, perF) => {
    const c = costView({ fuel, price, efficiency: eff, heatFrom: 'pool', poolVolume: '15000 gal', rise: '10 degF' });
    expect(c.perDegF!).toBeCloseTo(perF, 1);
    expect(c.perK!).toBeCloseTo(c.perDegF! * 1.8, 9);
    // check value #8: 15,000 gal take 124,950 Btu (1.2495 therm) per °F; 10 °F → 12.5 therm
    expect(c.heatJ / THERM_J).toBeCloseTo(12.495, 1);
    expect(c.heatCost).toBeCloseTo(c.perDegF! * 10, 9);
  });

  test('takes the pool and the rise from a forecast block of the study (68 → 82 °F of 15,000 gal with propane ≈ 14 × $5.00)', () => {
    const blocks: StudyBlock[] = [{ id: 'fc1', kind: 'forecast', data: { poolVolume: '15000 gal', startTemp: '68 degF', targetTemp: '82 degF', hours: 48, flow: '3 gpm' } }];
    const c = costView({ fuel: 'propane', price: 3, efficiency: 0.82, heatFrom: 'forecast', forecastBlockId: 'fc1' }, blocks);
    expect(c.riseK!).toBeCloseTo(14 / 1.8, 9);
    expect(c.volumeM3!).toBeCloseTo(15000 * 3.785411784e-3, 9); // NIST SP 811 gallon
    expect(c.heatCost).toBeCloseTo(70, 0); // DOMAIN.md §6 table: $5.00 per °F
    // fuel bought = useful heat / (91,452 Btu/gal × 0.82), EIA [24]
    expect(c.fuelQuantity).toBeCloseTo((c.heatJ / 1055.05585262) / (91452 * 0.82), 6);
  });

  test.each([
    [{ fuel: 'propane', heatFrom: 'pool', poolVolume: '15000 gal', rise: '10 degF' }, /price: enter the price of propane per gal/],
    [{ fuel: 'propane', price: 3, heatFrom: 'forecast', forecastBlockId: 'nope' }, /forecastBlockId: pick a forecast block/],
    [{ fuel: 'propane', price: 3, heatFrom: 'pool', poolVolume: 'a lot', rise: '10 degF' }, /poolVolume/],
    [{ fuel: 'propane', price: 3, heatFrom: 'pool', poolVolume: '15000 gal', rise: '10 gal' }, /rise/],
    [{ fuel: 'propane', price: 3, efficiency: 1.2, heatFrom: 'energy', heat: '10 therm' }, /efficiency must be at most 1/],
    [{ fuel: 'coal', price: 3 }, /fuel/],
  ])('bad settings get a message naming the field (%#)', (data, msg) => {
    let err: unknown;
    try {
      costView(data as Record<string, unknown>);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(DomainError);
    expect((err as DomainError).kind).toBe('invalid');
    expect((err as DomainError).message).toMatch(msg);
    expect(Object.keys((err as DomainError).details.fields as object)).toHaveLength(1);
  });

  test('cautions travel with every cost: losses left out, field efficiency and CO for burners, GFCI and COP for heat pumps (DOMAIN.md §5, §6)', () => {
    const gas = costView({ fuel: 'natural-gas', price: 1.5, heatFrom: 'energy', heat: '1 therm' }).cautions.join(' ');
    expect(gas).toMatch(/leave out the losses/);
    expect(gas).toMatch(/50–75 %/);
    expect(gas).toMatch(/carbon monoxide/);
    expect(gas).toMatch(/analysis aid/);
    const hp = costView({ fuel: 'heat-pump', price: 0.15, efficiency: 9, heatFrom: 'energy', heat: '1 therm' }).cautions.join(' ');
    expect(hp).toMatch(/GFCI/);
    expect(hp).toMatch(/COP of 9 is outside the usual 1–7/);
    expect(hp).not.toMatch(/carbon monoxide/);
  });

  test('goes to the Costs sheet with per-degree money in the reader’s degree', () => {
    const v = costView({ fuel: 'propane', price: 3, efficiency: 0.82, currency: 'USD', heatFrom: 'pool', poolVolume: '15000 gal', rise: '10 degF' });
    const us = costsSheet({ currency: 'USD', running: [costExport('Cost sheet (block 3)', v)] }, 'us');
    const row = (s: typeof us, item: string) => s.rows.find((r) => r.item === item)!;
    expect(row(us, 'Cost per useful therm (100,000 Btu delivered)').amount).toBeCloseTo(4.0, 2);
    expect(row(us, 'Cost per degree of the pool').per).toBe('USD/°F');
    expect(row(us, 'Cost per degree of the pool').amount).toBeCloseTo(5.0, 1);
    const si = costsSheet({ currency: 'USD', running: [costExport('Cost sheet (block 3)', v)] }, 'si');
    expect(row(si, 'Cost per degree of the pool').per).toBe('USD/K');
    expect(row(si, 'Cost per degree of the pool').amount).toBeCloseTo(5.0 * 1.8, 1);
  });
});
