import { describe, expect, test } from 'vitest';
import { FUELS, woodNetCalorificValueMJPerKg } from '../../../analysis/cost/fuels';
import { costPerDegree, savingFraction, usefulHeatCost, usefulThermsFromBill } from '../../../analysis/cost/useful-heat-cost';
import { fuelEfficiency } from '../../../analysis/cost/fuel-efficiency';
import { buildCostSheet } from '../../../analysis/cost/build-cost';
import { payback } from '../../../analysis/cost/payback';
import { convert } from '../../../analysis/units/parse-quantity';

const GAL15000 = 15000 * 3.785411784e-3;

describe('cost per useful therm with EIA factors (DOMAIN.md §6; prices are the illustrative inputs of its table)', () => {
  test.each([
    // fuel, price, efficiency, $/useful therm, $/°F for 15,000 gal — DOMAIN.md §6 table (computed), EIA factors [24]
    ['natural-gas', 1.5, 0.82, 1.83, 2.29],
    ['propane', 3.0, 0.82, 4.0, 5.0],
    ['electric-resistance', 0.15, 1, 4.4, 5.49],
    ['heat-pump', 0.15, 5, 0.88, 1.1],
    ['wood', 250, 0.3, 4.17, 5.21],
  ] as const)('%s at %s per unit, η/COP %s → %s per useful therm, %s per °F', (fuel, price, eff, perTherm, perF) => {
    const c = usefulHeatCost({ fuel, pricePerUnit: price, efficiency: eff });
    expect(c.perUsefulTherm).toBeCloseTo(perTherm, 2);
    expect(costPerDegree(GAL15000, c.perUsefulTherm, 20).perDegF).toBeCloseTo(perF, 1);
    expect(c.basis).toBe('HHV');
  });
  test('check value #16: $0.15/kWh COP 5 → $0.879; propane $3.00/gal η 0.82 → $4.00 per useful therm (EIA [24], computed)', () => {
    expect(usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.15, efficiency: 5 }).perUsefulTherm).toBeCloseTo(0.879, 3);
    expect(usefulHeatCost({ fuel: 'propane', pricePerUnit: 3, efficiency: 0.82 }).perUsefulTherm).toBeCloseTo(4.0, 2);
  });
  test('check value #15: DOE Atlanta table, $2,810 vs $530 → saving 81.1 %; ≈ 2,248 useful therms at η 0.8 ([4e], computed)', () => {
    expect(savingFraction(2810, 530) * 100).toBeCloseTo(81.1, 1);
    expect(usefulThermsFromBill(2810, 1, 0.8)).toBeCloseTo(2248, 6);
  });
  test('EIA heat contents: propane 91,452 Btu/gal, 1 kWh = 3,412 Btu, 1 therm = 100,000 Btu, cord ≈ 20 MMBtu', () => {
    expect(convert(FUELS.propane.heatContentJ, 'J', 'Btu')).toBeCloseTo(91452, 6);
    expect(convert(FUELS['electric-resistance'].heatContentJ, 'J', 'Btu')).toBeCloseTo(3412, 0);
    expect(convert(FUELS['natural-gas'].heatContentJ, 'J', 'therm')).toBeCloseTo(1, 12);
    expect(convert(FUELS.wood.heatContentJ, 'J', 'MMBtu')).toBeCloseTo(20, 9);
  });
  test.each([
    [{ fuel: 'propane', pricePerUnit: -1 }, /pricePerUnit/],
    [{ fuel: 'propane', pricePerUnit: 3, efficiency: 1.2 }, /efficiency/],
    [{ fuel: 'heat-pump', pricePerUnit: 0.1, efficiency: 0 }, /cop/],
    [{ fuel: 'coal', pricePerUnit: 3 }, /fuel must be one of/],
  ] as const)('refuses %j', (i, msg) => expect(() => usefulHeatCost(i as never)).toThrow(msg));
});

describe('fuel efficiency, stated basis', () => {
  test('20 lb of propane ≈ 430,000 Btu HHV (21,500 Btu/lb, DOMAIN.md §1.7); η on both bases with HHV/LHV 1.088 [26]', () => {
    const hv = convert(21500, 'Btu/lb', 'J/kg');
    const fuelKg = convert(20, 'lb', 'kg');
    const r = fuelEfficiency(convert(300000, 'Btu', 'J'), fuelKg, hv, 'HHV', 21500 / 19770);
    expect(convert(r.fuelEnergyJ, 'J', 'Btu')).toBeCloseTo(430000, -1);
    expect(r.efficiency).toBeCloseTo(300000 / 430000, 6);
    expect(r.other!.basis).toBe('LHV');
    expect(r.other!.efficiency).toBeCloseTo((300000 / 430000) * 1.0875, 3);
    expect(r.exceedsFuelEnergy).toBe(false);
  });
  test('wood net calorific value vs moisture: GCV 19.8 MJ/kg, h 6 % → 18.5, 14.3, 12.2, 8.0 MJ/kg (Bioenergy Lists [28], computed)', () => {
    expect(woodNetCalorificValueMJPerKg(19.8, 0)).toBeCloseTo(18.5, 1);
    expect(woodNetCalorificValueMJPerKg(19.8, 0.2)).toBeCloseTo(14.3, 1);
    expect(woodNetCalorificValueMJPerKg(19.8, 0.3)).toBeCloseTo(12.2, 1);
    expect(woodNetCalorificValueMJPerKg(19.8, 0.5)).toBeCloseTo(8.0, 1);
  });
  test('delivered above fuel energy is flagged', () => {
    expect(fuelEfficiency(2e6, 1, 1e6, 'LHV').exceedsFuelEnergy).toBe(true);
    expect(() => fuelEfficiency(1, 0, 1, 'HHV')).toThrow(/fuelQuantity/);
  });
});

describe('build-cost sheet and payback', () => {
  test('subtotals by sub-assembly, tax on taxable lines only, exact cents', () => {
    const s = buildCostSheet([
      { subassembly: 'coil', description: 'copper tube, 50 ft', quantity: 1, unitCost: 119.99 },
      { subassembly: 'coil', description: 'fittings', quantity: 3, unitCost: 19.99 },
      { subassembly: 'valves and relief', description: 'relief valve', quantity: 1, unitCost: 32.5 },
      { subassembly: 'labour', description: 'hours', quantity: 6, unitCost: 25, taxable: false },
    ], 0.0825);
    expect(s.lines[1].extended).toBe(59.97);
    expect(s.subtotals).toEqual([
      { subassembly: 'coil', subtotal: 179.96 },
      { subassembly: 'valves and relief', subtotal: 32.5 },
      { subassembly: 'labour', subtotal: 150 },
    ]);
    expect(s.subtotal).toBe(362.46);
    expect(s.tax).toBe(17.53); // 212.46 × 0.0825 = 17.528
    expect(s.total).toBe(379.99);
  });
  test('refuses negative quantities naming the line', () => {
    expect(() => buildCostSheet([{ subassembly: 'x', description: '', quantity: -1, unitCost: 2 }], 0)).toThrow(/items\[0\]\.quantity/);
    expect(() => buildCostSheet([], 1.5)).toThrow(/taxRate/);
  });
  test('payback: extra cost / annual saving; never when there is no saving', () => {
    const j = 1000 * 105505585.262;
    const p = payback({ capitalCost: 1000, annualUsefulHeatJ: j, perUsefulThermThis: 0.88, perUsefulThermOther: 1.83, lifeYears: 10 });
    expect(p.annualSaving).toBeCloseTo(950, 9);
    expect(p.years!).toBeCloseTo(1000 / 950, 12);
    expect(p.capitalPerUsefulTherm!).toBeCloseTo(0.1, 12);
    expect(payback({ capitalCost: 1000, annualUsefulHeatJ: j, perUsefulThermThis: 2, perUsefulThermOther: 1 }).years).toBeNull();
  });
});
